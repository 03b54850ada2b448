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
    ['oldest-onlapped-crust', 'oceanic-limit'],
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
    const trueCells = new Array(6).fill(0);
    for (const d of demo.domains) trueCells[d]++;
    for (const code of [1, 2, 3, 4, 5]) {
      const got = r.areas.total[code].cells;
      expect(Math.abs(got - trueCells[code]) / trueCells[code], `domain ${code}: ${got} vs ${trueCells[code]}`).toBeLessThan(0.02);
    }
  });

  it('the oceanward direction is found by the plane fit (east, the generator dips east)', () => {
    expect(r.oceanward.source).toBe('plane-fit');
    expect(Math.abs(r.oceanward.azimuth - 90)).toBeLessThan(15);
  });
});
