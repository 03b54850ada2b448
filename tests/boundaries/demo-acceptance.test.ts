// Acceptance on the invented demo: does the pipeline recover what the generator built in?
// (The generator's lines are the truth here; they are not published check values.)
// Compared away from the window border, the no-data areas and the Moho gap (two cells), and — for the
// taper and oceanic limits — away from the southern segment and the transfer zone, where thickness
// cannot resolve the transition by design (that is checked apart: it must be reported as unresolved).
import { describe, expect, it } from 'vitest';
import { BAD_PICK, DEMO_GEOMETRY, fromUV, generateDemoGrids, inCoverageGap, inMohoGap, inVolcanic, PICK_SIGMA_KM, toUV, truthLines } from '../../fixtures/demo-margin.js';
import { BLOCK, blockCentreU, TRANSFER_V } from '../../fixtures/demo-model.js';
import type { BoundaryPiece } from '../../src/boundaries/extract.js';
import { pointSegmentDistance } from '../../src/boundaries/planar.js';
import { FLAG_UNRESOLVED } from '../../src/domains/classify.js';
import { runDemo } from '../helpers/demo-run.js';

type P = [number, number];
const g = DEMO_GEOMETRY;
const CELL = 500;
const xmin = g.x0 - CELL / 2 + 2 * CELL;
const xmax = g.x0 + (g.nx - 0.5) * CELL - 2 * CELL;
const ymax = g.y0 + CELL / 2 - 2 * CELL;
const ymin = g.y0 + (g.ny - 0.5) * g.dy + 2 * CELL;
const NORTH_V = TRANSFER_V + 12; // north of the transfer zone: the segment thickness can resolve

/** Near a no-data area or the Moho gap (within two cells): lines stop or bend there by design. */
function nearGap(u: number, v: number, cells = 2): boolean {
  const r = (cells * CELL) / 1000;
  const at = (du: number, dv: number) => inCoverageGap(u + du, v + dv) || inVolcanic(u + du, v + dv) || inMohoGap(u + du, v + dv);
  if (at(0, 0)) return true;
  for (let q = 0; q < 16; q++) {
    const th = (q * Math.PI) / 8;
    if (at(r * Math.cos(th), r * Math.sin(th)) || at((r / 2) * Math.cos(th), (r / 2) * Math.sin(th))) return true;
  }
  return false;
}
const excluded = ([x, y]: P, northOnly: boolean, gapCells = 2) => {
  if (x < xmin || x > xmax || y < ymin || y > ymax) return true;
  const [u, v] = toUV(x, y);
  return nearGap(u, v, gapCells) || (northOnly && v < NORTH_V);
};

function distToPolylines(p: P, lines: P[][]): number {
  let d = Infinity;
  for (const l of lines) for (let k = 0; k < l.length - 1; k++) d = Math.min(d, pointSegmentDistance(p[0], p[1], l[k][0], l[k][1], l[k + 1][0], l[k + 1][1]));
  return d;
}

/** Hausdorff distance both ways, over points not excluded. */
function hausdorff(a: P[][], b: P[][], northOnly: boolean, skip: (p: P) => boolean = () => false): { ab: number; ba: number } {
  let ab = 0;
  let wa: P | null = null;
  for (const l of a) for (const p of l) if (!excluded(p, northOnly) && !skip(p)) { const d = distToPolylines(p, b); if (d > ab) (ab = d), (wa = p); }
  let ba = 0;
  let wb: P | null = null;
  for (const l of b) for (const p of l) if (!excluded(p, northOnly) && !skip(p)) { const d = distToPolylines(p, a); if (d > ba) (ba = d), (wb = p); }
  if (process.env.DEBUG_ACCEPT) console.log('worst', wa && toUV(...wa), ab, wb && toUV(...wb), ba);
  return { ab, ba };
}

const linesOf = (pieces: BoundaryPiece[], kind: string) => pieces.filter((p) => p.kind === kind).map((p) => p.coords[0] as P[]);
const truth = truthLines(0.1);
// limits of the transition: compared in the north only; necking and coupling lines everywhere
const cases: [string, keyof typeof truth, boolean][] = [
  ['crustal-taper-limit', 'crustal-taper-limit', true],
  ['oceanic-limit', 'oceanic-limit', true],
  ['oldest-onlapped-crust', 'oceanic-limit', true], // no onlap picks: the oceanic limit stands in, and says so
  ['necking-line', 'necking-line', false],
  ['coupling-line', 'coupling-line', false],
];

describe('demo acceptance: proxy only (no picks)', async () => {
  const r = await runDemo();

  for (const [kind, truthKind, northOnly] of cases) {
    it(`${kind} lies within one cell of the generator's line (Hausdorff both ways)`, () => {
      const got = linesOf(r.boundaries.pieces, kind);
      expect(got.length).toBeGreaterThan(0);
      const h = hausdorff(got, truth[truthKind] as P[][], northOnly);
      expect(h.ab).toBeLessThanOrEqual(CELL);
      expect(h.ba).toBeLessThanOrEqual(CELL);
    });
  }

  it('the COT zone polygon is bounded by the taper limit and the oceanic limit', () => {
    const cot = r.boundaries.pieces.filter((p) => p.kind === 'cot-zone');
    expect(cot.length).toBeGreaterThan(0);
    let worst = 0;
    for (const poly of cot) {
      for (const p of poly.coords[0] as P[]) {
        if (excluded(p, true, 4)) continue; // the polygon's border runs along the gaps' cell edges
        const d = Math.min(distToPolylines(p, truth['crustal-taper-limit'] as P[][]), distToPolylines(p, truth['oceanic-limit'] as P[][]));
        if (process.env.DEBUG_ACCEPT && d > CELL) console.log('cot far', toUV(p[0], p[1]), d);
        worst = Math.max(worst, d);
      }
    }
    expect(worst).toBeLessThanOrEqual(CELL);
  });

  it('domain areas in the northern segment are within 2% of the true areas', () => {
    const demo = generateDemoGrids();
    const got = new Array(7).fill(0);
    const want = new Array(7).fill(0);
    // cells within two cells of a no-data or Moho-gap edge are left out (their class is the gap's or
    // its neighbour's depending on a sample), not the gaps themselves
    const edgeOfGap = (u: number, v: number) => {
      const r = (2 * CELL) / 1000;
      const at = (du: number, dv: number) => `${inCoverageGap(u + du, v + dv)}${inVolcanic(u + du, v + dv)}${inMohoGap(u + du, v + dv)}`;
      const here = at(0, 0);
      return [[r, 0], [-r, 0], [0, r], [0, -r]].some(([du, dv]) => at(du, dv) !== here);
    };
    for (let k = 0; k < demo.domains.length; k++) {
      const p: P = [g.x0 + (k % g.nx) * g.dx, g.y0 + Math.floor(k / g.nx) * g.dy];
      const [u, v] = toUV(p[0], p[1]);
      if (p[0] < xmin || p[0] > xmax || p[1] < ymin || p[1] > ymax || v < NORTH_V || edgeOfGap(u, v)) continue;
      got[r.classified.domains[k]]++;
      want[demo.domains[k]]++;
    }
    for (const code of [1, 2, 3, 4, 5, 6]) {
      expect(want[code], `domain ${code} present`).toBeGreaterThan(200);
      expect(Math.abs(got[code] - want[code]) / want[code], `domain ${code}: ${got[code]} vs ${want[code]}`).toBeLessThan(0.02);
    }
  });

  it('the southern segment, where thin continental crust meets thin oceanic crust, is reported as unresolved', () => {
    expect(r.warnings.join()).toMatch(/thickness cannot resolve the transition in \d+ cells: thin continental-side crust meets oceanic-range crust/);
    let south = 0;
    let northern = 0;
    for (let k = 0; k < r.classified.flags.length; k++) {
      if (!(r.classified.flags[k] & FLAG_UNRESOLVED)) continue;
      const [, v] = toUV(g.x0 + (k % g.nx) * g.dx, g.y0 + Math.floor(k / g.nx) * g.dy);
      if (v < TRANSFER_V) south++;
      else if (v > NORTH_V) northern++;
    }
    expect(south).toBeGreaterThan(1000);
    expect(northern).toBe(0);
    expect(r.boundaries.interruptions.some((q) => q.cause === 'unresolved' && q.kind === 'crustal-taper-limit')).toBe(true);
  });

  it('finds the isolated continental block (the outer high)', () => {
    expect(r.classified.blocks).toHaveLength(1);
    const [bx, by] = fromUV(blockCentreU(), BLOCK.v);
    expect(Math.hypot(r.classified.blocks[0].x - bx, r.classified.blocks[0].y - by)).toBeLessThan(2 * CELL);
  });

  it('the oceanward direction is found by the plane fit (the generator dips towards 110°)', () => {
    expect(r.oceanward.source).toBe('plane-fit');
    expect(Math.abs(r.oceanward.azimuth - 110)).toBeLessThan(15);
  });
});

describe('demo acceptance with the interpreter picks', async () => {
  const r = await runDemo({ picks: true, lines: true });
  const bad = r.evidence.picks.find((q) => q.line === BAD_PICK.line && q.kind === BAD_PICK.kind)!;
  const [, badV] = toUV(bad.x, bad.y);
  const awayFromBad = (p: P) => Math.abs(toUV(p[0], p[1])[1] - badV) < 35;
  // picks scatter by σ along the line; between picks the calibrated line keeps that offset
  const TOL = 3 * PICK_SIGMA_KM * 1000 + CELL;

  it('flags the deliberately bad pick, and only it', () => {
    expect(r.pickChecks.filter((c) => c.suspect).map((c) => c.id)).toEqual([bad.id]);
  });

  for (const [kind, truthKind] of [['crustal-taper-limit', 'crustal-taper-limit'], ['oceanic-limit', 'oceanic-limit'], ['oldest-onlapped-crust', 'oldest-onlapped-crust']] as const) {
    it(`${kind} follows its picks: within 3σ of the picks' scatter and a cell of the truth, away from the bad pick`, () => {
      const h = hausdorff(linesOf(r.boundaries.pieces, kind), truth[truthKind] as P[][], true, awayFromBad);
      expect(h.ab).toBeLessThanOrEqual(TOL);
      expect(h.ba).toBeLessThanOrEqual(TOL);
    });
  }

  it('excluding the bad pick brings the taper limit back near the truth', async () => {
    const fixed = await runDemo({ picks: true, lines: true }, {}, [bad.id]);
    const h = hausdorff(linesOf(fixed.boundaries.pieces, 'crustal-taper-limit'), truth['crustal-taper-limit'] as P[][], true);
    expect(h.ab).toBeLessThanOrEqual(TOL);
    expect(h.ba).toBeLessThanOrEqual(TOL);
    const before = hausdorff(linesOf(r.boundaries.pieces, 'crustal-taper-limit'), truth['crustal-taper-limit'] as P[][], true);
    expect(before.ab).toBeGreaterThan(5000);
  });
});

describe('simplification keeps shared borders shared', async () => {
  const plain = await runDemo();
  const simple = await runDemo({}, { simplifyTolerance: 60 });
  const keyOf = (p: P) => `${p[0]},${p[1]}`;
  const ringsOf = (r: typeof plain) => r.boundaries.pieces.filter((q) => q.kind === 'cot-zone').flatMap((q) => q.coords.flat()) as P[];

  it('reduces vertices and keeps every original vertex within the tolerance', () => {
    const before = plain.boundaries.support.taper.flat();
    const after = simple.boundaries.support.taper;
    expect(after.flat().length).toBeLessThan(before.length * 0.7);
    for (const v of before) expect(distToPolylines(v as P, after as P[][])).toBeLessThanOrEqual(60 + 1e-6);
  });

  it('the COT polygon and the taper and oceanic limits still share exactly the same vertices', () => {
    for (const line of ['taper', 'oceanic'] as const) {
      const origLine = new Set(plain.boundaries.support[line].flat().map((v) => keyOf(v as P)));
      const origRing = new Set(ringsOf(plain).map(keyOf));
      const ringOnLine = new Set(ringsOf(simple).map(keyOf).filter((k) => origLine.has(k)));
      const lineOnRing = new Set(simple.boundaries.support[line].flat().map((v) => keyOf(v as P)).filter((k) => origRing.has(k)));
      expect(ringOnLine.size).toBeGreaterThan(20);
      expect([...ringOnLine].sort()).toEqual([...lineOnRing].sort());
    }
  });

  it('simplified lines still lie within one cell of the truth', () => {
    const h = hausdorff(linesOf(simple.boundaries.pieces, 'crustal-taper-limit'), truth['crustal-taper-limit'] as P[][], true);
    expect(h.ab).toBeLessThanOrEqual(CELL);
    expect(h.ba).toBeLessThanOrEqual(CELL);
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
    const r = runPipeline({ basement, moho }, { params: { oceanwardAzimuth: 110 } });
    expect(r.geometry.crs.id).toBe('EPSG:32709');
    expect(r.geometry.dx).toBe(610); // 0.0055° of latitude ≈ 611.6 m, rounded to 10 m
    expect(r.warnings.join()).toMatch(/geographic coordinates: analysed on WGS 84 \/ UTM zone 9S/);
    const got = linesOf(r.boundaries.pieces, 'crustal-taper-limit');
    if (process.env.DEBUG_ACCEPT) console.log('ll', got.length, got.flat().length, r.warnings, got.flat().filter((_, k) => k % 50 === 0).map((p) => toUV(p[0], p[1])));
    let worst = 0;
    let compared = 0;
    for (const l of got) {
      for (const p of l) {
        const [, v] = toUV(p[0], p[1]);
        if (excluded(p, true) || v > 80) continue; // the north end of the lon/lat window lies outside the demo
        worst = Math.max(worst, distToPolylines(p, truth['crustal-taper-limit'] as P[][]));
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(100);
    expect(worst).toBeLessThan(1000); // two resamplings (UTM → lon/lat → UTM) of 500–600 m cells
  });
});
