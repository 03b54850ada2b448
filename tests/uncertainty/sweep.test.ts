// The uncertainty sweep against things outside it: with no variance it must reproduce the
// deterministic run bit for bit; with a Gaussian reference thickness only, on a linear thickness ramp,
// the P90/P50/P10 necking lines must sit at the normal quantiles (Φ⁻¹(0.9) = 1.2816, from any normal
// table, e.g. Abramowitz & Stegun 1964, Table 26.1); near a control line the taper limit must spread
// less than far from it (σ(d) rule); and the result must not depend on how the sweep is split.
import { describe, expect, it } from 'vitest';
import { WGS84 } from '../../src/crs/registry.js';
import { transformer } from '../../src/crs/transform.js';
import { readGeoJson } from '../../src/io/geojson-read.js';
import { readSweepPart, writeSweepPart } from '../../src/io/sweep-part.js';
import { InputError } from '../../src/io/errors.js';
import { runPipeline, type PipelineInputs } from '../../src/pipeline.js';
import { uncertaintyFiles } from '../../src/export/uncertainty.js';
import { resolveSpec, zeroSpec, SWEPT_PARAMS, type UncertaintySpec } from '../../src/uncertainty/spec.js';
import { mergeParts, summarise, exceedance } from '../../src/uncertainty/summary.js';
import { runSweepPart, sweepBase } from '../../src/uncertainty/sweep.js';
import { runSweep } from '../../src/uncertainty/run.js';
import type { Ring } from '../../src/boundaries/planar.js';
import { SYN_GEOMETRY, SYN_NY, syntheticInputs, xOfU, yOfRow, picksOnRows } from '../helpers/synthetic-margin.js';
import { demoInputs } from '../helpers/demo-run.js';
import { DEMO_PARAMS } from '../../fixtures/demo-margin.js';

const EAST = { oceanwardAzimuth: 90 };
const RUN = { version: 'test', time: '2026-01-01T00:00:00.000Z', tool: 'cli' as const };

/** A spec with only the given variances (everything else 0). */
function only(realisations: number, over: { params?: Partial<Record<(typeof SWEPT_PARAMS)[number], number>>; surfaces?: boolean }, seed = 1): UncertaintySpec {
  const z = zeroSpec(realisations, seed);
  const d = resolveSpec({});
  return { ...z, params: { ...z.params, ...over.params }, ...(over.surfaces ? { basement: d.basement, moho: d.moho } : {}) };
}

/** x of each line where it crosses the row's centre (the first crossing), NaN if none. */
function xAtRow(rings: Ring[], j: number): number {
  const y = yOfRow(j);
  let best = NaN;
  for (const r of rings) {
    for (let k = 1; k < r.length; k++) {
      const [x1, y1] = r[k - 1];
      const [x2, y2] = r[k];
      if ((y1 - y) * (y2 - y) > 0 || y1 === y2) continue;
      const x = x1 + ((x2 - x1) * (y - y1)) / (y2 - y1);
      if (!(x >= best)) best = x;
    }
  }
  return best;
}

/** A seismic line along a row, as a lines input. */
function lineOnRow(inputs: PipelineInputs, row: number): PipelineInputs {
  const t = transformer(SYN_GEOMETRY.crs, WGS84);
  const coords = [xOfU(-129), xOfU(129)].map((x) => t.forward([x, yOfRow(row)]));
  const text = JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: { name: `L${row}` }, geometry: { type: 'LineString', coordinates: coords } }] });
  return { ...inputs, lines: { name: 'lines.geojson', set: readGeoJson(text, 'lines.geojson') } };
}

describe('uncertainty sweep', () => {
  it('with zero variance every realisation is the deterministic run and every Pq line is its line, exactly (demo, picks calibrating both limits)', async () => {
    const inputs = await demoInputs({ picks: true, licence: true, isochrons: true, lines: true });
    const options = { params: { ...DEMO_PARAMS } };
    const det = runPipeline(inputs, options);
    const spec = zeroSpec(3);
    const base = sweepBase(inputs, options, spec);
    const part = runSweepPart(base, spec, 0, 3);
    for (let r = 0; r < 3; r++) {
      expect(part.cells[r].map((c) => c & 0x7f)).toEqual(det.classified.domains);
      expect(part.delta[r].every((d) => d === 0 || d === -32768)).toBe(true);
      expect(part.records[r].heldCells).toBe(0);
    }
    const u = summarise(base, spec, part);
    for (const l of u.lines) expect(l.rings).toEqual(det.boundaries.support[l.line]);
    expect(u.lines.filter((l) => l.p === 50).every((l) => l.rings.length > 0)).toBe(true);
    for (const a of u.licenceAreas!) {
      const km2 = det.areas.inLicence!.find((d) => d.code === a.code)!.km2;
      expect(a.km2.p90).toBeCloseTo(km2, 6);
      expect(a.km2.p10).toBeCloseTo(km2, 6);
    }
    // every domain probability is 0 or 1, and 1 exactly on the deterministic domain
    for (let k = 0; k < det.classified.domains.length; k += 97) expect(u.probability[det.classified.domains[k]][k]).toBe(1);
  });

  it('Gaussian tc0 only, linear ramp: P90/P50/P10 necking lines at the normal quantiles (N = 200, within 3 sampling standard errors)', () => {
    // the synthetic profile is linear from 35 km at u = −100 to 10 km at u = −60 (0.625 km per km);
    // the necking line is the 0.8·tc0 isoline, at u = −100 + (35 − 0.8·tc0)/0.625
    const sd = 2000;
    const spec = only(200, { params: { tc0: sd } }, 11);
    const { result: u } = runSweep(syntheticInputs(), { params: EAST }, spec);
    const slope = 0.625; // km of thickness per km along dip
    const u0 = -100 + (35 - 0.8 * 35) / slope;
    const sigmaU = (0.8 * sd) / 1000 / slope; // km
    const z90 = 1.2816; // Φ⁻¹(0.9)
    // P90: the continental side reaches at least this far oceanward in 90 %: the 10th percentile of the position
    const want = { 90: u0 - z90 * sigmaU, 50: u0, 10: u0 + z90 * sigmaU };
    // sampling standard error of a q-quantile: √(q(1 − q)/N)/φ(z_q)·σ (φ(1.2816) = 0.1755, φ(0) = 0.3989)
    const se = { 90: (Math.sqrt(0.09 / 200) / 0.1755) * sigmaU, 50: (Math.sqrt(0.25 / 200) / 0.3989) * sigmaU, 10: (Math.sqrt(0.09 / 200) / 0.1755) * sigmaU };
    for (const p of [90, 50, 10] as const) {
      const rings = u.lines.find((l) => l.line === 'necking' && l.p === p)!.rings;
      const xs = [20, 60, 100, 140].map((j) => (xAtRow(rings, j) - xOfU(0)) / 1000);
      for (const x of xs) expect(Math.abs(x - want[p])).toBeLessThan(3 * se[p] + 0.01);
    }
    // the taper and oceanic limits do not depend on tc0: all three percentiles coincide
    const taper = u.lines.filter((l) => l.line === 'taper');
    expect(taper[0].rings).toEqual(taper[1].rings);
    expect(taper[2].rings).toEqual(taper[1].rings);
  });

  it('with a control line, the taper limit spreads least where it crosses the line and more away from it (P90–P10 width ratio ≥ 2)', () => {
    const spec = only(60, { surfaces: true }, 5);
    const { result: u } = runSweep(lineOnRow(syntheticInputs(), 80), { params: EAST }, spec);
    const p90 = u.lines.find((l) => l.line === 'taper' && l.p === 90)!.rings;
    const p10 = u.lines.find((l) => l.line === 'taper' && l.p === 10)!.rings;
    const width = (rows: number[]) => {
      const w = rows.map((j) => xAtRow(p10, j) - xAtRow(p90, j)).filter((v) => v === v);
      expect(w.length).toBeGreaterThan(rows.length / 2);
      return w.reduce((s, v) => s + v, 0) / w.length;
    };
    const near = width([79, 80, 81]);
    const far = width([...Array.from({ length: 20 }, (_, q) => q + 5), ...Array.from({ length: 20 }, (_, q) => SYN_NY - 25 + q)]);
    expect(near).toBeGreaterThanOrEqual(0);
    expect(far / Math.max(near, 1)).toBeGreaterThanOrEqual(2);
  });

  it('same seed: same bytes; another seed: other bytes; two halves merged (also through the part file): the bytes of one run', () => {
    const inputs = syntheticInputs({ picks: picksOnRows([40, 120], null) });
    const options = { params: EAST };
    const spec = resolveSpec({}, { realisations: 8, seed: 3 });
    const det = runPipeline(inputs, options);
    const base = sweepBase(inputs, options, spec);
    const whole = summarise(base, spec, runSweepPart(base, spec, 0, 8));
    const bytes = (u: typeof whole) => uncertaintyFiles(det, u, RUN);
    const a = bytes(whole);
    const again = bytes(summarise(base, spec, runSweepPart(sweepBase(inputs, options, spec), spec, 0, 8)));
    expect(again).toEqual(a);
    const halves = [runSweepPart(base, spec, 4, 8), runSweepPart(base, spec, 0, 4)].map((p) => readSweepPart(writeSweepPart(p), 'part.bin'));
    expect(bytes(summarise(base, spec, mergeParts(halves, spec)))).toEqual(a);
    const other = resolveSpec({}, { realisations: 8, seed: 4 });
    const b = bytes(summarise(sweepBase(inputs, options, other), other, runSweepPart(sweepBase(inputs, options, other), other, 0, 8)));
    expect(b['uncertainty/lines.geojson']).not.toEqual(a['uncertainty/lines.geojson']);
    expect(b['uncertainty/probability-3-hyperextended-continental.tif']).not.toEqual(a['uncertainty/probability-3-hyperextended-continental.tif']);
  });

  it('refuses parts that do not fit: missing, repeated, from another spec, damaged files', () => {
    const inputs = syntheticInputs();
    const spec = resolveSpec({}, { realisations: 4, seed: 1 });
    const base = sweepBase(inputs, { params: EAST }, spec);
    const p0 = runSweepPart(base, spec, 0, 2);
    const p1 = runSweepPart(base, spec, 2, 4);
    expect(() => mergeParts([p0], spec)).toThrow(/realisations 2…3 are missing/);
    expect(() => mergeParts([p0, p0, p1], spec)).toThrow(/given twice/);
    const other = resolveSpec({ correlationLength: 5000 }, { realisations: 4, seed: 1 });
    const q1 = runSweepPart(sweepBase(inputs, { params: EAST }, other), other, 2, 4);
    expect(() => mergeParts([p0, q1], spec)).toThrow(/other inputs, parameters or spec/);
    const file = writeSweepPart(p0);
    expect(() => readSweepPart(file.subarray(0, file.length - 50), 'cut.bin')).toThrow(InputError);
    expect(() => readSweepPart(new TextEncoder().encode('not a part'), 'x.bin')).toThrow(/x.bin/);
  });

  it('spec: unknown keys and values out of range are refused by name; exceedance is the ⌈q·N⌉-th largest', () => {
    expect(() => resolveSpec({ sigma: 3 })).toThrow(/unknown key "sigma"/);
    expect(() => resolveSpec({ params: { neckingFraction: 0.1 } })).toThrow(/params.neckingFraction is not swept/);
    expect(() => resolveSpec({ surfaceCorrelation: 2 })).toThrow(/surfaceCorrelation = 2 is outside/);
    expect(() => resolveSpec({ realisations: 2.5 })).toThrow(/whole number/);
    const v = Array.from({ length: 10 }, (_, k) => k + 1);
    expect(exceedance(v, 90)).toBe(2); // at least 2 in 9 of 10
    expect(exceedance(v, 50)).toBe(6);
    expect(exceedance(v, 10)).toBe(10);
  });
});
