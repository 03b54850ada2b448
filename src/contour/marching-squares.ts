/**
 * Marching squares (the 2-D analogue of marching cubes, Lorensen & Cline 1987) on a row-major Float32
 * grid, in index space: sample (i, j) sits at x = i, y = j (rows increase downward).
 *
 * - A sample is "above" when value ≥ level.
 * - Isolines: cells with any NaN corner produce nothing, so lines stop at no data and at the grid
 *   edge and never close around a hole.
 * - Filled regions: NaN and the outside of the grid count as below, so every ring closes; rings run
 *   just inside the outermost valid samples there (FILL_INSET), and are made simple rings.
 * - Saddle cells are resolved with the asymptotic decider (Nielson & Hamann 1991): the bilinear saddle
 *   value B* = (f00·f11 − f10·f01)/(f00 + f11 − f10 − f01) decides whether the above corners join.
 * - Crossing points are computed once per cell edge in a canonical direction, so neighbouring cells
 *   produce bit-identical vertices; segments are oriented with the above side on the right (in x-right,
 *   y-down index space) and stitched through a hash of edge ids: linear in the number of segments.
 * Output: flat positions [x0, y0, x1, y1, ...] with start indices, and a closed flag per line.
 */

import { simpleRings, type Position } from '../geometry/rings.js';

export interface Lines {
  /** Flat vertex coordinates in index space (or map space once transformed). */
  readonly positions: Float64Array;
  /** Index of the first vertex of each line; line k runs to starts[k+1] (or the end). */
  readonly starts: Uint32Array;
  /** 1 where the line is a closed ring (first vertex repeated at the end). */
  readonly closed: Uint8Array;
}

export interface GridLike {
  readonly values: ArrayLike<number>;
  readonly nx: number;
  readonly ny: number;
}

/**
 * Filled rings never pass exactly through a sample: a choice of 1/1000 of a cell, far below any map
 * scale yet above 7-decimal rounding of exported coordinates. Without it a sample exactly at the
 * level, or a finite sample beside no data, puts crossings of several edges — of one ring or of a
 * hole and its shell — on one point: rings that touch, and polygon interiors cut apart (invalid per
 * GEOS). Isolines keep exact crossings (their tests check the interpolation to rounding).
 */
export const FILL_INSET = 1e-3;

/** Interpolation parameter of the level crossing between values p and q (0 at p, 1 at q). */
function crossT(p: number, q: number, level: number, inset: number): number {
  const fp = Number.isFinite(p);
  const fq = Number.isFinite(q);
  // with one side no data (filling), the ring runs (just inside) the finite sample
  const t = fp && fq ? (level - p) / (q - p) : !fp && !fq ? 0.5 : fp ? 0 : 1;
  return t < inset ? inset : t > 1 - inset ? 1 - inset : t;
}

interface Segments {
  from: number[]; // edge ids
  to: number[];
  pts: number[]; // x1, y1, x2, y2 per segment
}

/**
 * Trace the level set of `grid` at `level`. With fill = true, NaN counts as below and the grid is
 * surrounded by "below", so the result is closed rings bounding {value ≥ level}.
 */
export function traceLevel(grid: GridLike, level: number, fill = false): Lines {
  if (!fill) return traceLevels(grid, [level])[0];
  const { nx, ny } = grid;
  const v = grid.values;
  // For filling, work on a virtual grid padded by one sample of −∞ on every side.
  const pad = fill ? 1 : 0;
  const inset = fill ? FILL_INSET : 0;
  const W = nx + 2 * pad;
  const H = ny + 2 * pad;
  const at = (i: number, j: number): number => {
    const ii = i - pad;
    const jj = j - pad;
    if (ii < 0 || jj < 0 || ii >= nx || jj >= ny) return -Infinity;
    const x = v[jj * nx + ii];
    return fill && x !== x ? -Infinity : x;
  };
  const seg: Segments = { from: [], to: [], pts: [] };
  for (let j = 0; j < H - 1; j++) {
    for (let i = 0; i < W - 1; i++) {
      // corners: top-left, top-right, bottom-right, bottom-left (NaN is below when filling)
      cellSegments(seg, at(i, j), at(i + 1, j), at(i + 1, j + 1), at(i, j + 1), i, j, level, W, inset);
    }
  }
  return stitch(seg, pad);
}

/**
 * Isolines at several levels in one pass over the grid (the same crossings, saddle rule, segment
 * order and stitching as traceLevel, so each level's lines are identical to its own traceLevel
 * call). A cell is skipped unless some level lies in (min, max] of its corners, so the scan costs
 * about one read per sample whatever the number of levels.
 */
export function traceLevels(grid: GridLike, levels: readonly number[]): Lines[] {
  const { nx, ny } = grid;
  const v = grid.values;
  const order = levels.map((l, k) => [l, k] as const).sort((a, b) => a[0] - b[0]);
  const sorted = order.map((o) => o[0]);
  const segs: Segments[] = levels.map(() => ({ from: [], to: [], pts: [] }));
  const W = nx;
  const L = sorted.length;
  if (!L || nx < 2 || ny < 2) return levels.map(() => stitch({ from: [], to: [], pts: [] }, 0));
  const lo = sorted[0];
  const hi = sorted[L - 1];
  let q = 0;
  for (let j = 0; j < ny - 1; j++) {
    const top = j * nx;
    // the right-hand corners of one cell are the left-hand corners of the next
    let b = v[top];
    let c = v[top + nx];
    for (let i = 0; i < nx - 1; i++) {
      const a = b;
      const d = c;
      b = v[top + i + 1];
      c = v[top + nx + i + 1];
      if (a !== a || b !== b || c !== c || d !== d) continue; // isolines stop at no data
      const m1 = a < b ? a : b;
      const m2 = c < d ? c : d;
      const mn = m1 < m2 ? m1 : m2;
      const x1 = a > b ? a : b;
      const x2 = c > d ? c : d;
      const mx = x1 > x2 ? x1 : x2;
      if (mn >= hi || mx < lo) continue;
      // the first level above mn, found from the last cell's (neighbours differ little)
      while (q < L && sorted[q] <= mn) q++;
      while (q > 0 && sorted[q - 1] > mn) q--;
      // the levels with a crossing: mn < level <= mx
      for (let r = q; r < L && sorted[r] <= mx; r++) cellSegments(segs[order[r][1]], a, b, c, d, i, j, sorted[r], W);
    }
  }
  return segs.map((sg) => stitch(sg, 0));
}

const SX = new Float64Array(4);
const SY = new Float64Array(4);
const SID = new Float64Array(4);
const STYPE = new Uint8Array(4);

/**
 * The segments of one cell at one level, into scratch buffers (no allocation). The cell boundary is
 * walked clockwise on screen: top (tl→tr), right (tr→br), bottom (br→bl), left (bl→tl); a crossing is
 * an exit (above → below) or an entry. Edge ids on the lattice of width W: horizontal edge
 * (i,j)-(i+1,j) → 2(jW + i), vertical (i,j)-(i,j+1) → 2(jW + i) + 1. Crossings are computed in a
 * canonical direction (left to right, top to bottom) so neighbouring cells agree bit for bit.
 */
function cellSegments(seg: Segments, a: number, b: number, c: number, d: number, i: number, j: number, level: number, W: number, inset = 0): void {
  if (a !== a || b !== b || c !== c || d !== d) return; // isolines stop at no data (filling passes −∞ instead)
  const A = a >= level;
  const B = b >= level;
  const C = c >= level;
  const D = d >= level;
  if (A === B && B === C && C === D) return;
  const h0 = 2 * (j * W + i);
  let n = 0;
  if (A !== B) (SX[n] = i + crossT(a, b, level, inset)), (SY[n] = j), (SID[n] = h0), (STYPE[n++] = A ? 1 : 0);
  if (B !== C) (SX[n] = i + 1), (SY[n] = j + crossT(b, c, level, inset)), (SID[n] = h0 + 3), (STYPE[n++] = B ? 1 : 0); // vertical edge at i + 1
  if (C !== D) (SX[n] = i + crossT(d, c, level, inset)), (SY[n] = j + 1), (SID[n] = h0 + 2 * W), (STYPE[n++] = C ? 1 : 0);
  if (D !== A) (SX[n] = i), (SY[n] = j + crossT(a, d, level, inset)), (SID[n] = h0 + 1), (STYPE[n++] = D ? 1 : 0);
  if (n === 2) {
    const x = STYPE[0] === 1 ? 0 : 1;
    push(seg, SID[x], SID[1 - x], SX[x], SY[x], SX[1 - x], SY[1 - x]);
    return;
  }
  // Saddle (Nielson & Hamann's asymptotic decider): is the bilinear centre above? Separate above
  // corners: each exit pairs with the entry just before it; joined: with the one just after.
  const den = a + c - b - d;
  const centre = Number.isFinite(den) && den !== 0 ? (a * c - b * d) / den : (a + b + c + d) / 4;
  const joined = centre >= level;
  for (let k = 0; k < 4; k++) {
    if (STYPE[k] !== 1) continue;
    const e = joined ? (k + 1) % 4 : (k + 3) % 4;
    push(seg, SID[k], SID[e], SX[k], SY[k], SX[e], SY[e]);
  }
}

function push(s: Segments, from: number, to: number, x1: number, y1: number, x2: number, y2: number): void {
  s.from.push(from);
  s.to.push(to);
  s.pts.push(x1, y1, x2, y2);
}

/**
 * Join oriented segments end to start through a hash of edge ids (linear time), then clean each
 * line: repeated positions (a sample exactly at the level puts two crossings on one point) are
 * dropped, a line whose ends meet is closed, and filled rings are made simple (src/geometry/rings.ts).
 */
function stitch(s: Segments, pad: number): Lines {
  const m = s.from.length;
  const byFrom = new Map<number, number>();
  const byTo = new Map<number, number>();
  for (let k = 0; k < m; k++) {
    byFrom.set(s.from[k], k);
    byTo.set(s.to[k], k);
  }
  const used = new Uint8Array(m);
  const out: number[] = [];
  const starts: number[] = [];
  const closed: number[] = [];
  const emit = (line: Position[], isClosed: boolean) => {
    starts.push(out.length / 2);
    for (const [x, y] of line) out.push(x, y);
    closed.push(isClosed ? 1 : 0);
  };
  for (let k0 = 0; k0 < m; k0++) {
    if (used[k0]) continue;
    // Walk backwards to the start of an open line (or all the way round a ring).
    let first = k0;
    for (;;) {
      const prev = byTo.get(s.from[first]);
      if (prev === undefined || prev === k0 || used[prev]) break;
      first = prev;
    }
    const line: Position[] = [[s.pts[4 * first] - pad, s.pts[4 * first + 1] - pad]];
    let k = first;
    for (;;) {
      used[k] = 1;
      const p: Position = [s.pts[4 * k + 2] - pad, s.pts[4 * k + 3] - pad];
      const last = line[line.length - 1];
      if (p[0] !== last[0] || p[1] !== last[1]) line.push(p);
      const next = byFrom.get(s.to[k]);
      if (next === undefined || used[next]) break;
      k = next;
    }
    const ends = line.length > 2 && line[0][0] === line[line.length - 1][0] && line[0][1] === line[line.length - 1][1];
    if (pad > 0) {
      for (const r of simpleRings(line)) emit(r, true);
    } else if (line.length >= 2) emit(line, ends);
  }
  return { positions: Float64Array.from(out), starts: Uint32Array.from(starts), closed: Uint8Array.from(closed) };
}

/** Number of lines, and the vertex range [begin, end) of line k. */
export function lineCount(l: Lines): number {
  return l.starts.length;
}

export function lineRange(l: Lines, k: number): [number, number] {
  const begin = l.starts[k];
  const end = k + 1 < l.starts.length ? l.starts[k + 1] : l.positions.length / 2;
  return [begin, end];
}

/** Shoelace area of line k in its own coordinates (positive = clockwise on a y-down screen). */
export function ringArea(l: Lines, k: number): number {
  const [b, e] = lineRange(l, k);
  const p = l.positions;
  let s = 0;
  for (let q = b; q < e - 1; q++) s += p[2 * q] * p[2 * q + 3] - p[2 * q + 2] * p[2 * q + 1];
  return s / 2;
}
