// The app's pure text builders, in Node: number formats, labels, legend rows, readout rows, popup
// rows. Check values are the formats this project chose (stated here), not outside references.
import { describe, expect, it } from 'vitest';
import { DERIVED } from '../../src/derive/grids.js';
import { DOMAIN_STYLES } from '../../src/domains/styles.js';
import { COT_FILL } from '../../src/app/map/styles.js';
import { countOf, lonLat, num, withUnit } from '../../src/app/text/format.js';
import { GRID_LABELS, layerLabel } from '../../src/app/text/labels.js';
import { legendEntries, type LegendInput } from '../../src/app/text/legend.js';
import { boundaryRows, pickRows } from '../../src/app/text/popup.js';
import { readoutRows } from '../../src/app/text/readout.js';

describe('number formats', () => {
  it('metres read as km from 10 km, whole metres below; ages to 0.1 Ma; ratios to 0.01; fractions as %', () => {
    expect(withUnit(32_000, 'm')).toBe('32.0 km');
    expect(withUnit(9_999.6, 'm')).toBe('10,000 m');
    expect(withUnit(850.4, 'm')).toBe('850 m');
    expect(withUnit(-1234, 'm')).toBe('−1,234 m');
    expect(withUnit(123.456, 'Ma')).toBe('123.5 Ma');
    expect(withUnit(2.345, '')).toBe('2.35');
    expect(withUnit(0.42, 'fraction')).toBe('42 %');
    expect(withUnit(12.34, 'km')).toBe('12.3 km');
    expect(withUnit(1234.5, 'km²')).toBe('1,235 km²');
    expect(withUnit(NaN, 'm')).toBe('—');
    expect(num(Infinity)).toBe('∞');
  });
  it('positions with hemispheres; counts in words', () => {
    expect(lonLat(-129.123456, -35.5)).toBe('35.50000° S, 129.12346° W');
    expect(countOf(1, 'warning')).toBe('1 warning');
    expect(countOf(3, 'warning')).toBe('3 warnings');
    expect(countOf(0, 'warning')).toBe('no warnings');
  });
});

describe('labels', () => {
  it('every derived grid has a plain-word label with its unit', () => {
    for (const d of DERIVED) {
      expect(GRID_LABELS[d.name]).toMatch(/^[A-Zβγ]/);
      expect(layerLabel(d.name)).toMatch(/\((m|Ma|no unit)\)$/);
      expect(layerLabel(d.name)).not.toContain(d.name);
    }
    expect(layerLabel('beta-crust')).toBe('Stretching factor β (from crustal thickness) (no unit)');
  });
});

const present: LegendInput['present'] = { boundaries: [], farPieces: false, cot: false, licence: false, seismic: false, isochrons: false, pickKinds: [], suspectPicks: false, excludedPicks: false, plan: false };

describe('legend rows', () => {
  it('lists only what is on the map: no proposal symbols before a plan, only the pick kinds present', () => {
    const rows = legendEntries({ layer: 'crustal-thickness', ramp: { min: 0, max: 32_000 }, placedBy: null, farFromControlKm: 25, present: { ...present, boundaries: ['crustal-taper-limit'], pickKinds: ['onlap'] } });
    const labels = rows.map((r) => ('label' in r ? r.label : 'text' in r ? r.text : ''));
    expect(labels.join('|')).not.toMatch(/Proposed|Continental-limit pick|Isochron|Licence/);
    expect(labels).toContain('Crustal taper limit');
    expect(labels.some((l) => /^Onlap pick/.test(l))).toBe(true);
    const planned = legendEntries({ layer: 'domains', ramp: null, placedBy: null, farFromControlKm: 25, present: { ...present, plan: true } });
    expect(planned.some((r) => 'label' in r && r.label === 'Proposed dip line')).toBe(true);
  });
  it('a ramp has three ticks with units: low, middle, high', () => {
    const ramp = legendEntries({ layer: 'crustal-thickness', ramp: { min: 0, max: 32_000 }, placedBy: null, farFromControlKm: 25, present }).find((r) => r.type === 'ramp');
    expect(ramp).toEqual({ type: 'ramp', ticks: ['0 m', '16.0 km', '32.0 km'] });
  });
  it('the domain legend has every domain; the COT fill is far from every domain colour (RGB distance > 100)', () => {
    const rows = legendEntries({ layer: 'domains', ramp: null, placedBy: null, farFromControlKm: 25, present });
    expect(rows.filter((r) => r.type === 'fill')).toHaveLength(DOMAIN_STYLES.length);
    const cot = [1, 3, 5].map((k) => parseInt(COT_FILL.slice(k, k + 2), 16));
    for (const d of DOMAIN_STYLES) expect(Math.hypot(...d.colour.map((c, k) => c - cot[k])), d.name).toBeGreaterThan(100);
  });
});

describe('readout rows', () => {
  it('position, map position, cell, domain and every grid in words with units; rules instead of blanks', () => {
    const values = Object.fromEntries(DERIVED.map((d) => [d.name, NaN]));
    values['crustal-thickness'] = 24_500;
    const rows = readoutRows({ lon: -129, lat: -35, crs: 'EPSG:32709', xy: [500_000, 6_100_000], cell: { i: 3, j: 4, domain: 5, values } });
    const m = new Map(rows);
    expect(m.get('Position')).toBe('35.00000° S, 129.00000° W');
    expect(m.get('Map position (EPSG:32709)')).toBe('500,000 m E, 6,100,000 m N');
    expect(m.get('Grid cell')).toBe('column 3, row 4');
    expect(m.get('Domain')).toBe('Oceanic crust');
    expect(m.get('Crustal thickness')).toBe('24.5 km');
    expect(m.get('Stretching factor β (from crustal thickness)')).toBe('— (continental domains only)');
    expect(rows).toHaveLength(4 + DERIVED.length);
  });
  it('outside the grid says so', () => {
    expect(readoutRows({ lon: 0, lat: 0, crs: 'EPSG:32709', xy: [0, 0], cell: null }).at(-1)).toEqual(['Grid cell', 'outside the analysis grid']);
  });
});

describe('popup rows', () => {
  it('a boundary piece in words with units, no internal keys, null and false fields left out', () => {
    const rows = boundaryRows({ kind: 'crustal-taper-limit', placed_by: 'taperThreshold (2 km)', evidence: 'proxy', threshold_m: 2000, far_from_control: false, closed: false, length_km: 8.26, depth_age_max_ma: null, ends_at_moho_gap: false, threshold_range_m: '[1800,2400]' });
    expect(rows).toEqual([
      ['What', 'Crustal taper limit'],
      ['Placed by', 'taperThreshold (2 km)'],
      ['Evidence', 'thickness proxy'],
      ['Thickness threshold', '2,000 m'],
      ['Threshold along the piece (calibrated by picks)', '1,800 m to 2,400 m'],
      ['Far from any pick or seismic line', 'no'],
      ['Length (geodesic)', '8.3 km'],
    ]);
  });
  it('a pick with its checks in km', () => {
    const rows = new Map(pickRows({ id: 'VX-101/continental-limit', kind: 'continental-limit', line: 'VX-101', thickness_m: 2345, trend_m: 2100, departure_m: 245, proxy_distance_m: null, suspect: true, reasons: '["departs from its neighbours"]' }, false));
    expect(rows.get('Kind')).toBe('Continental-limit pick');
    expect(rows.get('Crustal thickness at the pick')).toBe('2.35 km');
    expect(rows.get('Distance from the uncalibrated line')).toBe('—');
    expect(rows.get('Status')).toBe('suspect: departs from its neighbours');
  });
});

describe('map image graticule labels', async () => {
  const { deg, graticuleStep } = await import('../../src/app/map-image.js');
  it('labels whole and half degrees with hemispheres (regression: 130°W read "13°W")', () => {
    expect(deg(-130, 'E', 'W')).toBe('130°W');
    expect(deg(-34.5, 'N', 'S')).toBe('34.5°S');
    expect(deg(0, 'E', 'W')).toBe('0°');
    expect(deg(10.25, 'E', 'W')).toBe('10.25°E');
  });
  it('picks a step giving at most eight lines across', () => {
    expect(graticuleStep(3.5)).toBe(0.5);
    expect(graticuleStep(40)).toBe(5);
    expect(graticuleStep(0.6)).toBe(0.1);
  });
});
