// Acceptance on the invented demo: does the pipeline recover what the generator built in?
// (The generator's lines are the truth here; they are not published check values.)
import { describe, expect, it } from 'vitest';
import { DEMO_GEOMETRY, generateDemoGrids, HOLE, truthLines } from '../../fixtures/demo-margin.js';
import type { BoundaryPiece } from '../../src/boundaries/extract.js';
import { pointSegmentDistance } from '../../src/boundaries/planar.js';
import { runDemo } from '../helpers/demo-run.js';

type P = [number, number];
const g = DEMO_GEOMETRY;
const CELL = 500;
const xmin = g.x0 - CELL / 2 + 2 * CELL;
const xmax = g.x0 + (g.nx - 0.5) * CELL - 2 * CELL;
const ymax = g.y0 + CELL / 2 - 2 * CELL;
const ymin = g.y0 + (g.ny - 0.5) * g.dy + 2 * CELL;
const excluded = ([x, y]: P) => x < xmin || x > xmax || y < ymin || y > ymax || Math.hypot(x - HOLE.x, y - HOLE.y) < HOLE.r + 2 * CELL;

function distToPolylines(p: P, lines: P[][]): number {
  let d = Infinity;
  for (const l of lines) for (let k = 0; k < l.length - 1; k++) d = Math.min(d, pointSegmentDistance(p[0], p[1], l[k][0], l[k][1], l[k + 1][0], l[k + 1][1]));
  return d;
}

/** Hausdorff distance both ways, over points not excluded. */
function hausdorff(a: P[][], b: P[][]): { ab: number; ba: number } {
  let ab = 0;
  for (const l of a) for (const p of l) if (!excluded(p)) ab = Math.max(ab, distToPolylines(p, b));
  let ba = 0;
  for (const l of b) for (const p of l) if (!excluded(p)) ba = Math.max(ba, distToPolylines(p, a));
  return { ab, ba };
}

const linesOf = (pieces: BoundaryPiece[], kind: string) => pieces.filter((p) => p.kind === kind).map((p) => p.coords[0] as P[]);

describe('demo acceptance: proxy only (no picks)', async () => {
  const r = await runDemo();
  const truth = truthLines(100);
  const cases: [string, string][] = [
    ['crustal-taper-limit', 'crustal-taper-limit'],
    ['oceanic-limit', 'oceanic-limit'],
    ['oldest-onlapped-crust', 'oceanic-limit'], // no onlap picks: the oceanic limit stands in, and says so
    ['necking-line', 'necking-line'],
    ['coupling-line', 'coupling-line'],
  ];
  for (const [kind, truthKind] of cases) {
    it(`${kind} lies within one cell of the generator's line (Hausdorff both ways)`, () => {
      const got = linesOf(r.boundaries.pieces, kind);
      expect(got.length).toBeGreaterThan(0);
      const h = hausdorff(got, [truth[truthKind as keyof typeof truth] as P[]]);
      expect(h.ab).toBeLessThanOrEqual(CELL);
      expect(h.ba).toBeLessThanOrEqual(CELL);
    });
  }

  it('the COT zone polygon is bounded by the taper limit and the oceanic limit', () => {
    const cot = r.boundaries.pieces.filter((p) => p.kind === 'cot-zone');
    expect(cot.length).toBe(1);
    const outer = cot[0].coords[0] as P[];
    const t = truth['crustal-taper-limit'] as P[];
    const o = truth['oceanic-limit'] as P[];
    let worst = 0;
    for (const p of outer) if (!excluded(p)) worst = Math.max(worst, Math.min(distToPolylines(p, [t]), distToPolylines(p, [o])));
    expect(worst).toBeLessThanOrEqual(CELL);
  });

  it('domain areas are within 2% of the true areas', () => {
    const demo = generateDemoGrids();
    const trueCells = new Array(7).fill(0);
    for (const d of demo.domains) trueCells[d]++;
    for (const code of [1, 2, 3, 4, 5, 6]) {
      const got = r.areas.total[code].cells;
      expect(Math.abs(got - trueCells[code]) / trueCells[code], `domain ${code}: ${got} vs ${trueCells[code]}`).toBeLessThan(0.02);
    }
  });

  it('the oceanward direction is found by the plane fit (east, the generator dips east)', () => {
    expect(r.oceanward.source).toBe('plane-fit');
    expect(Math.abs(r.oceanward.azimuth - 90)).toBeLessThan(15);
  });
});

describe('geographic input grids', async () => {
  it('a lon/lat basement grid is analysed on the UTM zone of its centre, and the taper limit stays put', async () => {
    const { demoInputs } = await import('../helpers/demo-run.js');
    const { resample } = await import('../../src/grid/resample.js');
    const { WGS84 } = await import('../../src/crs/registry.js');
    const { runPipeline } = await import('../../src/pipeline.js');
    const inputs = await demoInputs();
    const ll = { nx: 500, ny: 330, x0: -130.55, y0: -34.15, dx: 0.0066, dy: -0.0055, registration: 'area' as const, crs: WGS84 };
    const basement = { name: 'basement_ll.tif', grid: resample(inputs.basement.grid, ll) };
    const moho = { name: 'moho_ll.tif', grid: resample(inputs.moho.grid, ll) };
    const r = runPipeline({ basement, moho }, { params: { oceanwardAzimuth: 90 } });
    expect(r.geometry.crs.id).toBe('EPSG:32709');
    expect(r.geometry.dx).toBe(610); // 0.0055° of latitude ≈ 611.6 m, rounded to 10 m
    expect(r.warnings.join()).toMatch(/geographic coordinates: analysed on WGS 84 \/ UTM zone 9S/);
    const truth = truthLines(100)['crustal-taper-limit'] as P[];
    const got = linesOf(r.boundaries.pieces, 'crustal-taper-limit');
    let worst = 0;
    for (const l of got) for (const p of l) if (!excluded(p) && Math.abs(p[1] - 6_125_000) < 80_000) worst = Math.max(worst, distToPolylines(p, [truth]));
    expect(worst).toBeLessThan(1000); // two resamplings (UTM → lon/lat → UTM) of 500–600 m cells
  });
});

describe('simplification keeps shared borders shared', async () => {
  const plain = await runDemo();
  const simple = await runDemo({}, { simplifyTolerance: 60 });
  const keyOf = (p: P) => `${p[0]},${p[1]}`;
  const ringOf = (r: typeof plain) => r.boundaries.pieces.find((q) => q.kind === 'cot-zone')!.coords.flat() as P[];

  it('reduces vertices and keeps every original vertex within the tolerance', () => {
    const before = plain.boundaries.support.taper.flat();
    const after = simple.boundaries.support.taper;
    expect(after.flat().length).toBeLessThan(before.length * 0.7);
    for (const v of before) expect(distToPolylines(v as P, after as P[][])).toBeLessThanOrEqual(60 + 1e-6);
  });

  it('the COT polygon and the taper and oceanic limits still share exactly the same vertices', () => {
    for (const line of ['taper', 'oceanic'] as const) {
      const origLine = new Set(plain.boundaries.support[line].flat().map((v) => keyOf(v as P)));
      const origRing = new Set(ringOf(plain).map(keyOf));
      const ringOnLine = new Set(ringOf(simple).map(keyOf).filter((k) => origLine.has(k)));
      const lineOnRing = new Set(simple.boundaries.support[line].flat().map((v) => keyOf(v as P)).filter((k) => origRing.has(k)));
      expect(ringOnLine.size).toBeGreaterThan(20);
      expect([...ringOnLine].sort()).toEqual([...lineOnRing].sort());
    }
  });

  it('simplified lines still lie within one cell of the truth', () => {
    const truth = truthLines(100)['crustal-taper-limit'] as P[];
    const h = hausdorff(linesOf(simple.boundaries.pieces, 'crustal-taper-limit'), [truth]);
    expect(h.ab).toBeLessThanOrEqual(CELL);
    expect(h.ba).toBeLessThanOrEqual(CELL);
  });
});
