import { describe, expect, it } from 'vitest';
import { crsFromEpsg, crsFromProj4, resolveCrs, UnknownCrsError, WGS84 } from '../../src/crs/registry.js';
import { transformer } from '../../src/crs/transform.js';
import { geodesicDistance, geodesicLength, geodesicRingArea } from '../../src/crs/geodesy.js';
import { densify } from '../../src/crs/densify.js';

// Reference points, each with its source and tolerance (REFERENCES.md §7).
const POINTS = [
  {
    source: 'IOGP Guidance Note 7-2, Transverse Mercator example (British National Grid on OSGB36, no datum shift)',
    proj4: '+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +units=m',
    lonlat: [0.5, 50.5] as [number, number],
    en: [577274.99, 69740.5] as [number, number],
    tol: 0.01,
  },
  {
    source: 'UTM WGS84 zone 32N at (9°E, 45°N), agreed by three libraries (REFERENCES.md §7)',
    proj4: crsFromEpsg(32632).proj4,
    lonlat: [9, 45] as [number, number],
    en: [500000.0, 4982950.4002] as [number, number],
    tol: 0.001,
  },
];

describe('projections against published reference points', () => {
  for (const p of POINTS) {
    it(`${p.source}: forward and inverse`, () => {
      const t = transformer(WGS84, crsFromProj4(p.proj4));
      const en = t.forward(p.lonlat);
      expect(Math.abs(en[0] - p.en[0])).toBeLessThanOrEqual(p.tol);
      expect(Math.abs(en[1] - p.en[1])).toBeLessThanOrEqual(p.tol);
      const back = t.inverse(p.en);
      // 0.01 m is about 1.5e-7 degrees at these latitudes
      expect(Math.abs(back[0] - p.lonlat[0])).toBeLessThan(2e-7);
      expect(Math.abs(back[1] - p.lonlat[1])).toBeLessThan(2e-7);
    });
  }

  it('UTM south zones use a 10 000 km false northing (EPSG:32709 on the equator at the central meridian)', () => {
    // Definition of the UTM south zones: false easting 500 000 m, false northing 10 000 000 m (from memory, standard).
    const en = transformer(WGS84, crsFromEpsg(32709)).forward([-129, 0]);
    expect(en[0]).toBeCloseTo(500000, 3);
    expect(en[1]).toBeCloseTo(10_000_000, 3);
  });
});

describe('CRS registry', () => {
  it('resolves every WGS84 UTM zone north and south, and ETRS89 UTM 28N–38N', () => {
    for (let z = 1; z <= 60; z++) {
      expect(crsFromEpsg(32600 + z).proj4).toContain(`+zone=${z} `);
      expect(crsFromEpsg(32700 + z).proj4).toContain('+south');
    }
    for (let z = 28; z <= 38; z++) expect(crsFromEpsg(`EPSG:${25800 + z}`).name).toBe(`ETRS89 / UTM zone ${z}N`);
    expect(crsFromEpsg(4326)).toBe(WGS84);
  });

  it('names an unknown code and says how to supply a definition', () => {
    expect(() => crsFromEpsg(2193)).toThrow(UnknownCrsError);
    expect(() => crsFromEpsg(2193)).toThrow(/EPSG:2193.*proj4 definition/);
    expect(() => crsFromEpsg(32767)).toThrow(/user-defined/);
    expect(() => crsFromEpsg(32661)).toThrow(/EPSG:32661/); // UPS North, outside the list
  });

  it('accepts any proj4 string from the user', () => {
    const c = resolveCrs('+proj=tmerc +lat_0=0 +lon_0=7 +k=1 +x_0=0 +y_0=0 +ellps=WGS84 +units=m');
    expect(c.id).toBe('PROJ4');
    const en = transformer(WGS84, c).forward([7, 0]);
    expect(en[0]).toBeCloseTo(0, 6);
    expect(() => resolveCrs('utm zone 9')).toThrow(/not in Taperline's built-in list|proj4/);
  });
});

describe('geodesy (WGS84, Karney 2013 via geographiclib)', () => {
  it('JFK to LHR = 5 551 759.4003 m (GeographicLib documentation example)', () => {
    expect(geodesicDistance(-73.8, 40.6, -0.5, 51.6)).toBeCloseTo(5551759.4003, 3);
    expect(geodesicLength([-73.8, 40.6, -0.5, 51.6])).toBeCloseTo(5551759.4003, 3);
  });

  it('1°×1° cell between 45°N and 46°N = 8 686 494 956.7 m² (Snyder 1987, authalic closed form), parallels densified', () => {
    const ring: [number, number][] = [];
    for (let k = 0; k <= 1000; k++) ring.push([k / 1000, 45]);
    for (let k = 1000; k >= 0; k--) ring.push([k / 1000, 46]);
    ring.push([0, 45]);
    const area = geodesicRingArea(ring.flat());
    // densified at 1/1000°, geodesic edges still bow off the parallels by a hair: 1 m² tolerance
    expect(Math.abs(area - 8686494956.7)).toBeLessThan(1);
  });

  it('densify keeps the endpoints and bounds segment length', () => {
    const d = densify([[0, 0], [10, 0], [10, 5]], 3);
    expect(d[0]).toEqual([0, 0]);
    expect(d[d.length - 1]).toEqual([10, 5]);
    for (let k = 1; k < d.length; k++) expect(Math.hypot(d[k][0] - d[k - 1][0], d[k][1] - d[k - 1][1])).toBeLessThanOrEqual(3 + 1e-12);
  });
});
