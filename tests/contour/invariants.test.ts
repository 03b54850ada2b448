// Geometry invariants as property tests (fast-check) on random grids with NaN holes and samples
// exactly at the level: isolines have no zero-length segments and are closed exactly when their
// ends meet; filled rings and class polygons are valid per GEOS (through GDAL's OGR, an independent
// library) and per the OGC ring rules; every cell is counted once; blocks below the minimum go
// where the README says (they take the domain that encloses them).
import { execFileSync } from 'node:child_process';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lineCount, lineRange, traceLevel, traceLevels, type Lines } from '../../src/contour/marching-squares.js';
import { crsFromEpsg } from '../../src/crs/registry.js';
import { classify, FLAG_BLOCK } from '../../src/domains/classify.js';
import { oceanwardFromAzimuth } from '../../src/domains/direction.js';
import { polygonize } from '../../src/domains/polygonize.js';
import { signedArea, type Position } from '../../src/geometry/rings.js';
import type { GridGeometry } from '../../src/grid/geometry.js';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { outputFiles } from '../../src/export/outputs.js';
import { runPipeline } from '../../src/pipeline.js';
import { DEMO_PARAMS } from '../../fixtures/demo-margin.js';
import { demoInputs } from '../helpers/demo-run.js';
import { prng } from '../../fuzz/mutate.js';
import { GDAL_PYTHON, toolOrSkip } from '../helpers/tools.js';

const haveGdalPython = toolOrSkip('gdal-python');

/** Small grids of a few distinct values (so samples hit the level exactly) with NaN holes. */
const grids = fc
  .record({ nx: fc.integer({ min: 1, max: 9 }), ny: fc.integer({ min: 1, max: 9 }) })
  .chain(({ nx, ny }) =>
    fc.record({
      nx: fc.constant(nx),
      ny: fc.constant(ny),
      values: fc.array(fc.oneof({ weight: 6, arbitrary: fc.constantFrom(0, 1, 2, 3) }, { weight: 1, arbitrary: fc.constant(NaN) }), { minLength: nx * ny, maxLength: nx * ny }),
      level: fc.constantFrom(1, 2, 1.5),
    }),
  );

function lines(l: Lines): Position[][] {
  const out: Position[][] = [];
  for (let k = 0; k < lineCount(l); k++) {
    const [b, e] = lineRange(l, k);
    const line: Position[] = [];
    for (let q = b; q < e; q++) line.push([l.positions[2 * q], l.positions[2 * q + 1]]);
    out.push(line);
  }
  return out;
}

const same = (a: Position, b: Position) => a[0] === b[0] && a[1] === b[1];

/** Do segments ab and cd cross or touch anywhere but at shared ring neighbours? (exact orientation tests) */
function segmentsMeet(a: Position, b: Position, c: Position, d: Position): boolean {
  const o = (p: Position, q: Position, r: Position) => Math.sign((q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]));
  const on = (p: Position, q: Position, r: Position) => Math.min(p[0], q[0]) <= r[0] && r[0] <= Math.max(p[0], q[0]) && Math.min(p[1], q[1]) <= r[1] && r[1] <= Math.max(p[1], q[1]);
  // disjoint boxes never meet (and near-collinear segments apart are not judged by rounded signs)
  if (Math.max(a[0], b[0]) < Math.min(c[0], d[0]) || Math.max(c[0], d[0]) < Math.min(a[0], b[0])) return false;
  if (Math.max(a[1], b[1]) < Math.min(c[1], d[1]) || Math.max(c[1], d[1]) < Math.min(a[1], b[1])) return false;
  const [o1, o2, o3, o4] = [o(a, b, c), o(a, b, d), o(c, d, a), o(c, d, b)];
  if (o1 !== o2 && o3 !== o4) return true;
  return (o1 === 0 && on(a, b, c)) || (o2 === 0 && on(a, b, d)) || (o3 === 0 && on(c, d, a)) || (o4 === 0 && on(c, d, b));
}

/** OGC ring rules: closed, ≥ 4 positions, non-zero area, no repeated position, no edges meeting but neighbours at their shared vertex. */
function ringProblems(r: Position[]): string | null {
  if (r.length < 4) return `${r.length} positions`;
  if (!same(r[0], r[r.length - 1])) return 'not closed';
  if (signedArea(r) === 0) return 'zero area';
  const n = r.length - 1;
  const seen = new Set<string>();
  for (let k = 0; k < n; k++) {
    const key = `${r[k][0]},${r[k][1]}`;
    if (seen.has(key)) return `passes (${key}) twice`;
    seen.add(key);
  }
  for (let a = 0; a < n; a++) {
    for (let b = a + 2; b < n; b++) {
      if (a === 0 && b === n - 1) continue; // neighbours across the seam
      if (segmentsMeet(r[a], r[a + 1], r[b], r[b + 1])) return `edges ${a} and ${b} meet`;
    }
  }
  return null;
}

const wkt = (rings: Position[][]) => `POLYGON (${rings.map((r) => `(${r.map((p) => `${p[0]} ${p[1]}`).join(', ')})`).join(', ')})`;

/** GEOS's verdict through GDAL's OGR on many polygons in one call: the indices of the invalid ones. */
function invalidPerGeos(polygons: string[]): number[] {
  const script = 'import sys\nfrom osgeo import ogr\nogr.UseExceptions()\nfor k, line in enumerate(sys.stdin):\n    g = ogr.CreateGeometryFromWkt(line)\n    if not g.IsValid(): print(k)\n';
  const out = execFileSync(GDAL_PYTHON, ['-c', script], { input: polygons.join('\n') + '\n', encoding: 'utf8', stdio: ['pipe', 'pipe', 'ignore'] });
  return out.split('\n').filter(Boolean).map(Number);
}

describe('contour invariants (fast-check, 300 random grids each)', () => {
  it('isolines: no zero-length segment, every vertex on a cell edge, closed exactly when the ends meet', () => {
    fc.assert(
      fc.property(grids, ({ nx, ny, values, level }) => {
        const l = traceLevel({ values: Float32Array.from(values), nx, ny }, level);
        lines(l).forEach((line, k) => {
          expect(line.length).toBeGreaterThanOrEqual(2);
          for (let q = 1; q < line.length; q++) expect(same(line[q - 1], line[q])).toBe(false);
          for (const [x, y] of line) expect(Number.isInteger(x) || Number.isInteger(y)).toBe(true);
          expect(l.closed[k] === 1).toBe(line.length > 2 && same(line[0], line[line.length - 1]));
        });
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });

  it('all levels in one pass give each level exactly its own traceLevel lines', () => {
    fc.assert(
      fc.property(grids, ({ nx, ny, values }) => {
        const g = { values: Float32Array.from(values), nx, ny };
        const levels = [2, 0.5, 1, 2.5, 1.5];
        traceLevels(g, levels).forEach((l, k) => {
          const one = traceLevel(g, levels[k]);
          expect(Array.from(l.positions)).toEqual(Array.from(one.positions));
          expect(Array.from(l.starts)).toEqual(Array.from(one.starts));
          expect(Array.from(l.closed)).toEqual(Array.from(one.closed));
        });
      }),
      { numRuns: 200, seed: 11 },
    );
  });

  it('filled rings follow the OGC ring rules (exact test here, GEOS below)', () => {
    fc.assert(
      fc.property(grids, ({ nx, ny, values, level }) => {
        const l = traceLevel({ values: Float32Array.from(values), nx, ny }, level, true);
        for (const r of lines(l)) expect(ringProblems(r)).toBeNull();
        expect(Array.from(l.closed).every((c) => c === 1)).toBe(true);
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });

  it('class polygons count every cell once, with areas equal to their cell counts', () => {
    fc.assert(
      fc.property(grids, ({ nx, ny, values }) => {
        const keys = Uint8Array.from(values, (v) => (Number.isNaN(v) ? 9 : v));
        const polys = polygonize(keys, nx, ny);
        const counted = new Map<number, number>();
        for (const p of polys) {
          counted.set(p.key, (counted.get(p.key) ?? 0) + p.cells);
          for (const r of [p.outer, ...p.holes]) expect(ringProblems(r)).toBeNull();
        }
        const truth = new Map<number, number>();
        for (const k of keys) truth.set(k, (truth.get(k) ?? 0) + 1);
        expect(counted).toEqual(truth);
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });

  it.skipIf(!haveGdalPython)('filled rings and class polygons are valid per GEOS (GDAL OGR IsValid)', () => {
    const polygons: string[] = [];
    fc.assert(
      fc.property(grids, ({ nx, ny, values, level }) => {
        for (const r of lines(traceLevel({ values: Float32Array.from(values), nx, ny }, level, true))) polygons.push(wkt([r]));
        const keys = Uint8Array.from(values, (v) => (Number.isNaN(v) ? 9 : v));
        for (const p of polygonize(keys, nx, ny)) polygons.push(wkt([p.outer, ...p.holes]));
      }),
      { numRuns: 300, seed: 7 },
    );
    expect(polygons.length).toBeGreaterThan(500);
    const bad = invalidPerGeos(polygons);
    expect(bad.map((k) => polygons[k]).slice(0, 3)).toEqual([]);
  });
});

describe('blocks below the minimum (fast-check)', () => {
  const nx = 60;
  const ny = 20;
  const geometry: GridGeometry = { nx, ny, x0: 500_000, y0: 5_000_000, dx: 1000, dy: -1000, registration: 'area', crs: crsFromEpsg(32631) };
  const base = {
    geometry, valid: new Uint8Array(nx * ny).fill(1), taperLevel: 2000, oceanLevel: 4000, oceanward: oceanwardFromAzimuth(90),
    tc0: 35000, neckingFraction: 0.8, couplingThickness: 10000, oceanicMin: 5000, oceanicMax: 9000, minBlockArea: 0, minBlockCells: 9, cellAreaKm2: 1,
  };
  /** 32 km → 0 at i = 30, exhumed mantle (0 km) to i = 38, 7 km oceanic crust beyond. */
  const ramp = (i: number) => (i < 10 ? 32000 : i < 30 ? 32000 - (i - 10) * 1600 : i < 38 ? 0 : 7000);

  it('a thick spot of fewer cells than minBlockCells takes the domain that encloses it; one of at least that many is a block', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 4 }), fc.integer({ min: 1, max: 4 }), fc.integer({ min: 31, max: 33 }), fc.integer({ min: 2, max: 12 }), (w, h, i0, j0) => {
        const t = new Float32Array(nx * ny);
        for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) t[j * nx + i] = i >= i0 && i < i0 + w && j >= j0 && j < j0 + h ? 6000 : ramp(i);
        const without = classify({ ...base, thickness: Float32Array.from({ length: nx * ny }, (_, k) => ramp(k % nx)) });
        const c = classify({ ...base, thickness: t });
        const cell = (j0 + Math.floor(h / 2)) * nx + i0 + Math.floor(w / 2);
        if (w * h < base.minBlockCells) {
          expect(c.domains[cell]).toBe(without.domains[cell]);
          expect(c.flags[cell] & FLAG_BLOCK).toBe(0);
        } else {
          expect(c.flags[cell] & FLAG_BLOCK).toBeTruthy();
        }
      }),
      { numRuns: 60, seed: 5 },
    );
  });
});

describe.skipIf(!haveGdalPython)('demo with 2 % NaN speckle in the Moho', () => {
  it('every COT zone and domain polygon is valid per GEOS (regression: the COT polygon and 12 of 4 521 domain polygons were not)', async () => {
    const inputs = await demoInputs({ licence: true });
    const r = prng(2);
    const moho = Float32Array.from(inputs.moho.grid.values, (v) => (r() < 0.02 ? NaN : v));
    const result = runPipeline({ ...inputs, moho: { ...inputs.moho, grid: { ...inputs.moho.grid, values: moho } } }, { params: DEMO_PARAMS });
    const files = outputFiles(result, { version: 't', time: 'T', tool: 'cli' });
    const dir = mkdtempSync(join(tmpdir(), 'taperline-speckle-'));
    const script = [
      'import sys', 'from osgeo import ogr', 'ogr.UseExceptions()', 'bad = 0; n = 0',
      'for path in sys.argv[1:]:',
      '    ds = ogr.Open(path)  # kept: a layer outliving its dataset crashes the bindings',
      '    for f in ds.GetLayer(0):',
      '        g = f.GetGeometryRef()',
      '        if g is None or ogr.GT_Flatten(g.GetGeometryType()) not in (ogr.wkbPolygon, ogr.wkbMultiPolygon): continue',
      '        n += 1',
      '        if not g.IsValid(): bad += 1',
      'print(n, bad)',
    ].join('\n');
    const paths = ['domains-whole-grid.geojson', 'boundaries-whole-grid.geojson', 'domains.geojson'].filter((f) => files[f]).map((f) => {
      const path = join(dir, f);
      writeFileSync(path, files[f]);
      return path;
    });
    const [n, bad] = execFileSync(GDAL_PYTHON, ['-c', script, ...paths], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] }).trim().split(' ').map(Number);
    expect(n).toBeGreaterThan(1000);
    expect(bad).toBe(0);
  }, 120_000);
});
