import { describe, expect, it } from 'vitest';
import { lineCount, lineRange, ringArea, traceLevel, type Lines } from '../../src/contour/marching-squares.js';

function gridOf(nx: number, ny: number, f: (i: number, j: number) => number) {
  const values = new Float32Array(nx * ny);
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) values[j * nx + i] = f(i, j);
  return { values, nx, ny };
}
function vertices(l: Lines): [number, number][] {
  const out: [number, number][] = [];
  for (let k = 0; k < l.positions.length; k += 2) out.push([l.positions[k], l.positions[k + 1]]);
  return out;
}
/** Interpolated value at a vertex on a cell edge (linear along the edge). */
function valueOnEdge(g: { values: Float32Array; nx: number }, x: number, y: number): number {
  const at = (i: number, j: number) => g.values[j * g.nx + i];
  if (Number.isInteger(y)) {
    const i = Math.floor(x);
    const t = x - i;
    return t === 0 ? at(i, y) : at(i, y) * (1 - t) + at(i + 1, y) * t;
  }
  const j = Math.floor(y);
  const t = y - j;
  return at(x, j) * (1 - t) + at(x, j + 1) * t;
}

describe('marching squares: exactness (REFERENCES.md §8)', () => {
  it('a plane gives straight contours exact to rounding, one open line per level', () => {
    const g = gridOf(20, 15, (i, j) => 0.3 * i + 0.7 * j);
    for (const level of [1.05, 4.5, 9.99]) {
      const l = traceLevel(g, level);
      expect(lineCount(l)).toBe(1);
      expect(l.closed[0]).toBe(0);
      for (const [x, y] of vertices(l)) expect(Math.abs(0.3 * x + 0.7 * y - level)).toBeLessThan(1e-5);
    }
  });

  function coneArea(h: number, offset: number): number {
    const n = Math.ceil(8 / h);
    const nx = 2 * n + 2;
    const g = gridOf(nx, nx, (i, j) => -Math.hypot((i - n - offset) * h, (j - n - offset) * h));
    const l = traceLevel(g, -5.5, true); // {−r ≥ −5.5} = disc of radius 5.5
    expect(lineCount(l)).toBe(1);
    expect(l.closed[0]).toBe(1);
    return Math.abs(ringArea(l, 0)) * h * h;
  }

  it('a cone √(x²+y²) contoured at r = 5.5 on a unit grid, apex on a node: area 94.411140', () => {
    expect(coneArea(1, 0)).toBeCloseTo(94.41114, 4);
  });
  it('the same with the apex at a cell centre: area 94.4040', () => {
    expect(coneArea(1, 0.5)).toBeCloseTo(94.404, 3);
  });
  it('the area converges to πr² as O(h²)', () => {
    const exact = Math.PI * 5.5 * 5.5;
    const e1 = Math.abs(coneArea(0.5, 0) - exact);
    const e2 = Math.abs(coneArea(0.25, 0) - exact);
    const e3 = Math.abs(coneArea(0.125, 0) - exact);
    expect(e1 / e2).toBeGreaterThan(3.2);
    expect(e1 / e2).toBeLessThan(5);
    expect(e2 / e3).toBeGreaterThan(3.2);
    expect(e2 / e3).toBeLessThan(5);
  });
});

describe('marching squares: saddles (Nielson & Hamann 1991 asymptotic decider)', () => {
  // tl = 3, tr = 0, br = 1, bl = 0, level 0.8: B* = (3·1 − 0·0)/(3 + 1 − 0 − 0) = 0.75 < 0.8, so the two
  // above corners stay apart, although the cell-centre average (1.0) would have joined them.
  const g = { values: Float32Array.from([3, 0, 0, 1]), nx: 2, ny: 2 };
  // Which cell edges a segment joins: T(op, y=0), R(ight, x=1), B(ottom, y=1), L(eft, x=0).
  const edgesOf = (l: Lines, k: number) => {
    const [b, e] = lineRange(l, k);
    const side = (q: number) => {
      const x = l.positions[2 * q];
      const y = l.positions[2 * q + 1];
      return y === 0 ? 'T' : y === 1 ? 'B' : x === 0 ? 'L' : 'R';
    };
    return [side(b), side(e - 1)].sort().join('');
  };
  it('keeps the corners apart when B* < level: segments cut off the top-left and bottom-right corners', () => {
    const l = traceLevel(g, 0.8);
    expect(lineCount(l)).toBe(2);
    expect([edgesOf(l, 0), edgesOf(l, 1)].sort()).toEqual(['BR', 'LT']);
  });
  it('joins them when B* ≥ level (0.7): segments cut off the top-right and bottom-left corners', () => {
    const l = traceLevel(g, 0.7);
    expect(lineCount(l)).toBe(2);
    expect([edgesOf(l, 0), edgesOf(l, 1)].sort()).toEqual(['BL', 'RT']);
  });
});

describe('marching squares: invariants', () => {
  const bumpy = gridOf(30, 22, (i, j) => Math.sin(i * 0.4) * Math.cos(j * 0.3) * 10 + i * 0.2);
  const levels = [-3, 0, 2.5, 6];

  it('every vertex lies on a cell edge and interpolates to its level', () => {
    for (const level of levels) {
      const l = traceLevel(bumpy, level);
      for (const [x, y] of vertices(l)) {
        expect(Number.isInteger(x) || Number.isInteger(y)).toBe(true);
        expect(Math.abs(valueOnEdge(bumpy, x, y) - level)).toBeLessThan(1e-4);
      }
    }
  });

  it('rings close (first vertex = last vertex) and open lines end on the grid edge', () => {
    for (const level of levels) {
      const l = traceLevel(bumpy, level);
      for (let k = 0; k < lineCount(l); k++) {
        const [b, e] = lineRange(l, k);
        const first = [l.positions[2 * b], l.positions[2 * b + 1]];
        const last = [l.positions[2 * e - 2], l.positions[2 * e - 1]];
        if (l.closed[k]) expect(first).toEqual(last);
        else {
          for (const [x, y] of [first, last]) expect(x === 0 || y === 0 || x === 29 || y === 21).toBe(true);
        }
      }
    }
  });

  it('filled rings are all closed; outer rings have positive area, holes negative', () => {
    const l = traceLevel(bumpy, 2.5, true);
    for (let k = 0; k < lineCount(l); k++) expect(l.closed[k]).toBe(1);
    // total filled area equals the area from a fine point count of {f ≥ level} within the sample hull
    let area = 0;
    for (let k = 0; k < lineCount(l); k++) area += ringArea(l, k);
    expect(area).toBeGreaterThan(0);
  });

  it('a NaN hole stops lines; no line closes around it', () => {
    const g = gridOf(20, 15, (i, j) => 0.3 * i + 0.7 * j);
    g.values[7 * 20 + 10] = NaN;
    const level = 0.3 * 10 + 0.7 * 7 + 0.05; // passes through the hole
    const l = traceLevel(g, level);
    expect(lineCount(l)).toBe(2);
    for (let k = 0; k < 2; k++) expect(l.closed[k]).toBe(0);
    for (const [x, y] of vertices(l)) {
      // no vertex inside the four cells around the NaN sample
      expect(Math.abs(x - 10) < 1 && Math.abs(y - 7) < 1 && !(Math.abs(x - 10) === 1 || Math.abs(y - 7) === 1)).toBe(false);
    }
  });

  it('transposing the grid transposes the output; flipping it flips the output', () => {
    const t = gridOf(22, 30, (i, j) => bumpy.values[i * 30 + j]);
    const f = gridOf(30, 22, (i, j) => bumpy.values[(21 - j) * 30 + i]);
    const same = (p: [number, number][], q: [number, number][]) => {
      expect(p.length).toBe(q.length);
      for (const v of p) expect(q.some((w) => Math.abs(v[0] - w[0]) < 1e-5 && Math.abs(v[1] - w[1]) < 1e-5)).toBe(true);
    };
    for (const level of levels) {
      const base = vertices(traceLevel(bumpy, level));
      same(vertices(traceLevel(t, level)), base.map(([x, y]) => [y, x]));
      same(vertices(traceLevel(f, level)), base.map(([x, y]) => [x, 21 - y]));
    }
  });
});
