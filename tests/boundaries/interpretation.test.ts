// Interpretive rules on a synthetic margin built in the test (tests/helpers/synthetic-margin.ts):
// the oceanic limit's own threshold, Moho gaps as their own class, onlap apart from the oceanic limit,
// evidence per piece and per polygon border, honest ages and model masks, blocks, suspect picks.
// Expected positions follow from the profile's construction (where its thickness equals a threshold).
import { FILL_INSET } from '../../src/contour/marching-squares.js';
import { describe, expect, it } from 'vitest';
import { yToRow } from '../../src/grid/geometry.js';
import { pointSegmentDistance, type Ring } from '../../src/boundaries/planar.js';
import { runPipeline, type PipelineResult } from '../../src/pipeline.js';
import { DOMAIN_MOHO_GAP, FLAG_UNRESOLVED } from '../../src/domains/classify.js';
import { DERIVED } from '../../src/derive/grids.js';
import { outputFiles } from '../../src/export/outputs.js';
import { readGeoTiff } from '../../src/io/geotiff-read.js';
import { gaplessKm, inGap, OCEANIC_U, picksOnRows, thicknessKm, SYN_GEOMETRY as G, SYN_NX, SYN_NY, syntheticInputs, TAPER_U, uOf, xOfU, yOfRow, type Gap } from '../helpers/synthetic-margin.js';

const CELL = 1000;
const RIFT = 30; // Myr: young enough that the deepest oceanic cells would need older crust
const GAP_OCEAN: Gap = { u0: 70, u1: 80, j0: 20, j1: 40 }; // inside oceanic crust
const GAP_LIMIT: Gap = { u0: 30, u1: 40, j0: 118, j1: 132 }; // straddles the oceanic limit
const ROWS = [10, 35, 60, 85, 110, 150];
const ONLAP_U = OCEANIC_U + 15;

const distTo = (x: number, y: number, lines: Ring[]) => {
  let d = Infinity;
  for (const l of lines) for (let k = 0; k + 1 < l.length; k++) d = Math.min(d, pointSegmentDistance(x, y, l[k][0], l[k][1], l[k + 1][0], l[k + 1][1]));
  return d;
};
const lines = (r: PipelineResult, kind: string) => r.boundaries.pieces.filter((p) => p.kind === kind).map((p) => p.coords[0]);
const uAt = (x: number) => (x - xOfU(0)) / 1000;
const awayFromGaps = (x: number, y: number) => {
  const j = Math.round(yToRow(G, y));
  const u = uAt(x);
  return ![GAP_OCEAN, GAP_LIMIT].some((g) => u >= g.u0 - 2 && u <= g.u1 + 2 && j >= g.j0 - 2 && j <= g.j1 + 2) && j > 1 && j < SYN_NY - 2;
};

describe('interpretation on a synthetic margin: Moho gaps, thin first oceanic crust, onlap picks 15 km oceanward', () => {
  const inputs = syntheticInputs({ gaps: [GAP_OCEAN, GAP_LIMIT], picks: picksOnRows(ROWS, ONLAP_U).filter((p) => p.kind === 'onlap') });
  const r = runPipeline(inputs, { params: { oceanwardAzimuth: 90, riftAge: RIFT } });

  it('Moho-gap cells are their own class and add to no other domain’s area', () => {
    let gapCells = 0;
    for (let j = 0; j < SYN_NY; j++) {
      for (let i = 0; i < SYN_NX; i++) {
        if (!inGap([GAP_OCEAN, GAP_LIMIT], uOf(i), j)) continue;
        gapCells++;
        expect(r.classified.domains[j * SYN_NX + i]).toBe(DOMAIN_MOHO_GAP);
      }
    }
    expect(r.areas.total[DOMAIN_MOHO_GAP].cells).toBe(gapCells);
    const sum = r.areas.total.reduce((s, a) => s + a.cells, 0);
    expect(sum).toBe(SYN_NX * SYN_NY); // every cell counted once
  });

  it('the oceanic limit follows its own threshold (4 km), not the taper threshold (2 km)', () => {
    const got = lines(r, 'oceanic-limit');
    expect(got.length).toBeGreaterThan(0);
    for (const l of got) for (const [x, y] of l) if (awayFromGaps(x, y)) expect(Math.abs(uAt(x) - OCEANIC_U) * 1000).toBeLessThan(1);
    const taper = lines(r, 'crustal-taper-limit');
    for (const l of taper) for (const [x, y] of l) if (awayFromGaps(x, y)) expect(Math.abs(uAt(x) - TAPER_U) * 1000).toBeLessThan(1);
    expect(r.placedBy.oceanic).toBe('parameter oceanicThreshold = 4000 m');
    expect(r.placedBy.taper).toBe('parameter taperThreshold = 2000 m');
  });

  it('the COT zone spans the thin first oceanic crust thinner than the oceanic-crust threshold', () => {
    const at = (u: number, j: number) => r.classified.domains[j * SYN_NX + u + 130];
    expect(at(30, 60)).toBe(4); // 3.5 km of first oceanic crust: below the 4 km threshold → COT zone
    expect(at(10, 60)).toBe(4); // exhumed mantle
    expect(at(40, 60)).toBe(5); // 4.5 km: oceanic, flagged atypical (below 5 km)
    const cot = r.boundaries.pieces.filter((p) => p.kind === 'cot-zone');
    const outer = cot.map((c) => c.coords[0]);
    // the zone is 35 km wide along every row away from the gaps (filled rings keep FILL_INSET of a
    // cell off the samples, so edges placed exactly on a sample sit that far inside)
    for (const j of [5, 60, 100, 150]) {
      const y = yOfRow(j);
      const xs = outer.flat().filter(([, yy]) => Math.abs(yy - y) <= FILL_INSET * Math.abs(G.dy) + 1e-6).map(([x]) => uAt(x));
      expect(Math.abs(Math.min(...xs) - TAPER_U)).toBeLessThanOrEqual(FILL_INSET + 1e-6);
      expect(Math.abs(Math.max(...xs) - OCEANIC_U)).toBeLessThanOrEqual(FILL_INSET + 1e-6);
    }
  });

  it('lines stop at a Moho gap, never run along its edge, and the summary says where', () => {
    for (const kind of ['oceanic-limit', 'oldest-onlapped-crust']) {
      for (const l of lines(r, kind)) for (const [x, y] of l) expect(inGap([GAP_LIMIT], Math.round(uAt(x)), Math.round(yToRow(G, y)))).toBe(false);
    }
    const stops = r.boundaries.interruptions.filter((q) => q.kind === 'oceanic-limit' && q.cause === 'moho-gap');
    expect(stops.length).toBe(2); // the line enters the gap from the north and leaves it to the south
    for (const s of stops) {
      const j = yToRow(G, s.y);
      expect(Math.min(Math.abs(j - GAP_LIMIT.j0), Math.abs(j - GAP_LIMIT.j1))).toBeLessThanOrEqual(1.5);
    }
    const pieces = r.boundaries.pieces.filter((p) => p.kind === 'oceanic-limit' && p.properties.ends_at_moho_gap);
    expect(pieces.length).toBe(2);
    const summary = run(r).summary;
    expect((summary.lines_interrupted_by_moho_gap as { kind: string }[]).filter((q) => q.kind === 'oceanic-limit')).toHaveLength(2);
  });

  it('the onlap line follows the onlap picks and differs from the oceanic limit', () => {
    const onlap = lines(r, 'oldest-onlapped-crust');
    for (const row of ROWS) expect(distTo(xOfU(ONLAP_U), yOfRow(row), onlap)).toBeLessThan(CELL);
    for (const l of onlap) for (const [x, y] of l) if (awayFromGaps(x, y)) expect(Math.abs(uAt(x) - ONLAP_U)).toBeLessThan(1e-6);
    const pieces = r.boundaries.pieces.filter((p) => p.kind === 'oldest-onlapped-crust');
    const near = pieces.filter((p) => p.properties.evidence === 'picks');
    const proxy = pieces.filter((p) => p.properties.evidence === 'proxy');
    expect(near.length).toBeGreaterThan(0);
    expect(proxy.length).toBeGreaterThan(0);
    for (const p of proxy) expect(p.properties.proxy).toBe('oceanic-limit');
    for (const p of pieces) expect(p.properties.onlap_offset_km).toEqual([15, 15]);
  });

  it('without onlap picks the onlap line is the oceanic limit and says so', () => {
    const plain = runPipeline(syntheticInputs({ gaps: [GAP_OCEAN] }), { params: { oceanwardAzimuth: 90 } });
    const a = lines(plain, 'oldest-onlapped-crust');
    expect(a).toEqual(lines(plain, 'oceanic-limit'));
    for (const p of plain.boundaries.pieces.filter((q) => q.kind === 'oldest-onlapped-crust')) {
      expect(p.properties.evidence).toBe('proxy');
      expect(p.properties.proxy).toBe('oceanic-limit');
      expect(String(p.properties.rule)).toMatch(/no onlap picks/);
    }
  });

  it('ages only over oceanic crust and never older than the rift; deeper cells carry a depth anomaly instead', () => {
    const aMin = r.grids['oceanic-age-min']!;
    const aMax = r.grids['oceanic-age-max']!;
    const anomaly = r.grids['oceanic-depth-anomaly']!;
    let aged = 0;
    let anomalies = 0;
    for (let k = 0; k < aMin.length; k++) {
      const oceanic = r.classified.domains[k] === 5;
      if (!oceanic) {
        if (aMin[k] === aMin[k] || aMax[k] === aMax[k] || anomaly[k] === anomaly[k]) throw new Error(`age or anomaly outside oceanic crust at cell ${k}`);
        continue;
      }
      if (aMax[k] === aMax[k]) {
        aged++;
        expect(aMax[k]).toBeLessThanOrEqual(RIFT);
        expect(aMin[k]).toBeLessThanOrEqual(aMax[k]);
        expect(anomaly[k]).toBeNaN();
      } else if (anomaly[k] === anomaly[k]) {
        anomalies++;
        expect(anomaly[k]).toBeGreaterThan(0); // deeper than GDH1 allows at the rift age
      }
    }
    expect(aged).toBeGreaterThan(0);
    expect(anomalies).toBeGreaterThan(0);
    expect(r.applied.counts.ageOlderThanRift).toBe(anomalies);
    expect(r.applied.anomalyReference).toMatch(/rift age, 30 Myr/);
  });

  it('McKenzie, Airy and β grids are no data outside the continental domains', () => {
    for (const d of DERIVED.filter((q) => q.applies === 'continental')) {
      const v = r.grids[d.name]!;
      let outside = 0;
      for (let k = 0; k < v.length; k++) if ((r.classified.domains[k] < 1 || r.classified.domains[k] > 3) && v[k] === v[k]) outside++;
      expect(outside, d.name).toBe(0);
    }
    // and they exist over continental crust
    expect(r.grids['beta-crust']!.some((v) => v === v)).toBe(true);
    expect(r.grids['subsidence-residual']!.some((v) => v === v)).toBe(true);
  });

  it('no grid and no GeoJSON property holds ±∞: every output read back', async () => {
    const files = run(r).files;
    for (const [name, bytes] of Object.entries(files)) {
      if (name.endsWith('.tif')) {
        const { grid } = await readGeoTiff(bytes.slice().buffer, name);
        expect(grid.values.some((v) => v === Infinity || v === -Infinity), name).toBe(false);
      }
    }
    // JSON.stringify would silently turn ∞ into null: check the properties before writing
    const finite = (v: unknown, where: string): void => {
      if (typeof v === 'number') expect(Number.isFinite(v), where).toBe(true);
      else if (Array.isArray(v)) v.forEach((q) => finite(q, where));
      else if (v && typeof v === 'object') for (const [k, q] of Object.entries(v)) finite(q, `${where}.${k}`);
    };
    for (const p of r.boundaries.pieces) finite(p.properties, p.kind);
    finite(run(r).summary, 'summary');
  });
});

describe('a segment where thin continental crust meets thin first oceanic crust (no gap)', () => {
  // rows 0–79 as the standard profile (exhumed mantle), rows 80–159 without any crust thinner than 3 km
  const r = runPipeline(syntheticInputs({ profile: (u, row) => (row >= 80 ? gaplessKm(u) : thicknessKm(u)) }), { params: { oceanwardAzimuth: 90 } });
  const at = (u: number, j: number) => ({ d: r.classified.domains[j * SYN_NX + u + 130], f: r.classified.flags[j * SYN_NX + u + 130] });

  it('says it cannot resolve the transition there, and only there', () => {
    expect(r.warnings.join()).toMatch(/thin continental-side crust meets oceanic-range crust with no thinner gap/);
    for (const u of [-5, 0, 5]) {
      expect(at(u, 140).d, `u = ${u}`).toBe(4);
      expect(at(u, 140).f & FLAG_UNRESOLVED, `u = ${u}`).toBeTruthy();
    }
    expect(at(-30, 140).d).toBe(3); // 6.5 km hyperextended crust: still continental
    expect(at(15, 140).d).toBe(5); // 4.5 km: oceanic beyond the band
    expect(at(60, 140).d).toBe(5);
    // the standard segment keeps its domains: hyperextended crust beside the exhumed-mantle gap
    for (let j = 0; j < 70; j++) expect(at(-5, j).f & FLAG_UNRESOLVED, `row ${j}`).toBeFalsy();
    expect(at(-5, 20).d).toBe(3);
    expect(at(40, 20).d).toBe(5);
  });

  it('the taper and oceanic limits stop at the unresolved band instead of drawing a boundary there', () => {
    for (const kind of ['crustal-taper-limit', 'oceanic-limit']) {
      for (const l of lines(r, kind)) for (const [x, y] of l) expect(r.classified.flags[Math.round(yToRow(G, y)) * SYN_NX + Math.round(uAt(x)) + 130] & FLAG_UNRESOLVED).toBeFalsy();
      const rows = lines(r, kind).flat().map(([, y]) => yToRow(G, y));
      expect(Math.max(...rows), kind).toBeLessThan(90);
    }
    expect(r.boundaries.interruptions.some((q) => q.cause === 'unresolved' && q.kind === 'crustal-taper-limit')).toBe(true);
    expect((run(r).summary.lines_interrupted_by_unresolved_transition as unknown[]).length).toBeGreaterThan(0);
  });
});

describe('continental blocks', () => {
  // a 5 × 5 block of 8 km crust and a 2 × 2 spot of 3 km crust, both in the exhumed corridor
  const spots: { u: number; row: number; km: number }[] = [];
  for (let u = 12; u < 17; u++) for (let row = 70; row < 75; row++) spots.push({ u, row, km: 8 });
  for (let u = 8; u < 10; u++) for (let row = 20; row < 22; row++) spots.push({ u, row, km: 3 });
  const r = runPipeline(syntheticInputs({ spots }), { params: { oceanwardAzimuth: 90 } });

  it('only continental components at least the default minimum size are blocks; the summary lists them', () => {
    expect(r.params.minBlockCells).toBe(9);
    expect(r.classified.blocks).toHaveLength(1);
    expect(r.classified.blocks[0].cells).toBe(25);
    expect(r.classified.domains[72 * SYN_NX + 14 + 130]).toBe(3);
    expect(r.classified.domains[20 * SYN_NX + 8 + 130]).toBe(4); // the 4-cell spot is not a block: transition around it
    const s = run(r).summary.continental_blocks as { blocks: { cells: number; lon: number }[]; min_block_km2: number };
    expect(s.blocks).toHaveLength(1);
    expect(s.blocks[0].cells).toBe(25);
    expect(s.min_block_km2).toBeCloseTo(9, 1); // 9 cells of ~1 km² (UTM scale factor)
  });

  it('first oceanic crust between the two thresholds is part of the ocean, never a block', () => {
    // cells of 2–4 km oceanic crust are above the taper threshold but connected to the ocean
    for (const b of r.classified.blocks) expect(b.cells).toBeLessThan(100);
  });
});

describe('evidence per piece and per polygon border', () => {
  const r = runPipeline(syntheticInputs({ picks: picksOnRows(ROWS, null) }), { params: { oceanwardAzimuth: 90, farFromControl: 8000 } });

  it('the COT polygon reports the share of its border placed by picks, not "picks" for all of it', () => {
    const cot = r.boundaries.pieces.find((p) => p.kind === 'cot-zone')!;
    expect(cot.properties.evidence).toBe('mixed');
    const f = cot.properties.evidence_picks_fraction as number;
    // six picks on each border, each placing ±5 km of it: about 2 × 6 × 10 km of 2 × 160 km + ends
    expect(f).toBeGreaterThan(0.2);
    expect(f).toBeLessThan(0.5);
  });

  it('proxy pieces far from control are marked apart from proxy pieces near control', () => {
    const taper = r.boundaries.pieces.filter((p) => p.kind === 'crustal-taper-limit');
    const far = taper.filter((p) => p.properties.far_from_control);
    const near = taper.filter((p) => p.properties.evidence === 'proxy' && !p.properties.far_from_control);
    expect(far.length).toBeGreaterThan(0);
    expect(near.length).toBeGreaterThan(0);
    for (const p of far) expect(p.properties.control_distance_km as number).toBeGreaterThan(8);
    for (const p of far) expect(p.properties.evidence).toBe('proxy');
  });

  it('the summary says which threshold placed which line', () => {
    const s = run(r).summary.lines_placed_by as Record<string, string>;
    expect(s['crustal-taper-limit']).toMatch(/calibrated to 6 continental-limit picks/);
    expect(s['oceanic-limit']).toMatch(/calibrated to 6 oceanic-limit picks/);
    expect(s['necking-line']).toMatch(/neckingFraction/);
  });
});

describe('suspect picks', () => {
  const picks = picksOnRows(ROWS, null).map((p) => (p.kind === 'continental-limit' && p.row === 85 ? { ...p, u: TAPER_U + 20, id: 'bad' } : p));
  const inputs = syntheticInputs({ picks });
  const r = runPipeline(inputs, { params: { oceanwardAzimuth: 90 } });

  it('a pick displaced 20 km from the true line is flagged with its numbers; the others are not', () => {
    const bad = r.pickChecks.find((c) => c.id === 'bad')!;
    expect(bad.suspect).toBe(true);
    expect(bad.thickness_m).toBe(0); // 20 km oceanward of the taper limit: exhumed mantle
    expect(bad.trend_m).toBe(2000);
    expect(bad.departure_m).toBe(-2000);
    expect(bad.proxy_distance_m! / 1000).toBeCloseTo(20, 0);
    expect(bad.reasons.join()).toMatch(/0\.00 km against 2\.00 km/);
    expect(r.pickChecks.filter((c) => c.suspect).map((c) => c.id)).toEqual(['bad']);
    expect(r.warnings.join()).toMatch(/1 suspect pick/);
  });

  it('excluding it moves the taper limit back to within one cell of the truth', () => {
    const before = lines(r, 'crustal-taper-limit');
    const worstBefore = Math.max(...before.flat().map(([x]) => Math.abs(uAt(x) - TAPER_U)));
    expect(worstBefore).toBeGreaterThan(2); // the bad pick drags the line ≥ 2 cells oceanward
    const fixed = runPipeline(inputs, { params: { oceanwardAzimuth: 90 }, excludePicks: ['bad'] });
    const after = lines(fixed, 'crustal-taper-limit');
    for (const [x] of after.flat()) expect(Math.abs(uAt(x) - TAPER_U) * 1000).toBeLessThanOrEqual(CELL);
    expect(fixed.evidence.picks.find((q) => q.id === 'bad')!.excluded).toBe(true);
    expect(fixed.pickChecks.find((c) => c.id === 'bad')!.excluded).toBe(true);
    expect(run(fixed).summary.evidence).toMatchObject({ excluded_picks: ['bad'] });
  });
});

describe('reference thickness', () => {
  it('warns when the data suggest a tc0 more than the stated fraction away, with both values and the basis', () => {
    const r = runPipeline(syntheticInputs(), { params: { oceanwardAzimuth: 90, tc0: 38_000 } });
    const w = r.warnings.find((q) => /reference thickness/.test(q))!;
    expect(w).toMatch(/tc0 ≈ 35\.\d\d km \(95th percentile of crustal thickness/);
    expect(w).toMatch(/tc0 = 38\.00 km is in use/);
    const ok = runPipeline(syntheticInputs(), { params: { oceanwardAzimuth: 90, tc0: 35_000 } });
    expect(ok.warnings.some((q) => /reference thickness/.test(q))).toBe(false);
  });
});

const runs = new Map<PipelineResult, { files: Record<string, Uint8Array>; summary: Record<string, unknown> }>();
function run(r: PipelineResult) {
  const hit = runs.get(r);
  if (hit) return hit;
  const files = outputFiles(r, { version: 'test', time: '2026-01-01T00:00:00Z', tool: 'cli' });
  const out = { files, summary: JSON.parse(new TextDecoder().decode(files['summary.json'])) as Record<string, unknown> };
  runs.set(r, out);
  return out;
}

