/**
 * Distance from every cell centre to the nearest marked cell centre, in map units: the exact
 * Euclidean distance transform of Felzenszwalb & Huttenlocher (2012, "Distance transforms of sampled
 * functions", Theory of Computing 8: lower envelope of parabolas), one pass along rows and one along
 * columns, with the grid's own cell width and height. And a raster of the cells that control
 * features (seismic lines, picks) pass through, to measure from.
 */

import { xToCol, yToRow, type GridGeometry } from './geometry.js';

/** Squared 1D distance transform of f (0 at seeds, +∞ elsewhere) with sample spacing h, in place into d. */
function edt1d(f: Float64Array, n: number, h: number, d: Float64Array, v: Int32Array, z: Float64Array): void {
  const h2 = h * h;
  let k = 0;
  let first = -1;
  for (let q = 0; q < n; q++) if (f[q] < Infinity) { first = q; break; }
  if (first < 0) {
    for (let q = 0; q < n; q++) d[q] = Infinity;
    return;
  }
  v[0] = first;
  z[0] = -Infinity;
  z[1] = Infinity;
  for (let q = first + 1; q < n; q++) {
    if (f[q] === Infinity) continue;
    // intersection (index units) of the parabolas rooted at q and at the last kept one; z[0] = −∞ stops the loop
    let s = (f[q] / h2 + q * q - (f[v[k]] / h2 + v[k] * v[k])) / (2 * q - 2 * v[k]);
    while (s <= z[k]) {
      k--;
      s = (f[q] / h2 + q * q - (f[v[k]] / h2 + v[k] * v[k])) / (2 * q - 2 * v[k]);
    }
    k++;
    v[k] = q;
    z[k] = s;
    z[k + 1] = Infinity;
  }
  k = 0;
  for (let q = 0; q < n; q++) {
    while (z[k + 1] < q) k++;
    const p = v[k];
    d[q] = (q - p) * (q - p) * h2 + f[p];
  }
}

/** Distance (map units) from each cell centre to the nearest cell with seeds[k] ≠ 0; +∞ everywhere without seeds. */
export function distanceTransform(g: GridGeometry, seeds: Uint8Array): Float32Array {
  const { nx, ny } = g;
  const m = Math.max(nx, ny);
  const f = new Float64Array(m);
  const d = new Float64Array(m);
  const v = new Int32Array(m);
  const z = new Float64Array(m + 1);
  const sq = new Float64Array(nx * ny);
  // along rows
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) f[i] = seeds[j * nx + i] ? 0 : Infinity;
    edt1d(f, nx, Math.abs(g.dx), d, v, z);
    for (let i = 0; i < nx; i++) sq[j * nx + i] = d[i];
  }
  // along columns, on the row result
  const out = new Float32Array(nx * ny);
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) f[j] = sq[j * nx + i];
    edt1d(f, ny, Math.abs(g.dy), d, v, z);
    for (let j = 0; j < ny; j++) out[j * nx + i] = Math.sqrt(d[j]);
  }
  return out;
}

/**
 * Cells that paths (sampled every quarter cell along each segment) and points fall in. Parts outside
 * the grid mark nothing.
 */
export function markControl(g: GridGeometry, paths: readonly (readonly [number, number][])[], points: readonly (readonly [number, number])[]): Uint8Array {
  const { nx, ny } = g;
  const out = new Uint8Array(nx * ny);
  const mark = (x: number, y: number) => {
    const i = Math.round(xToCol(g, x));
    const j = Math.round(yToRow(g, y));
    if (i >= 0 && i < nx && j >= 0 && j < ny) out[j * nx + i] = 1;
  };
  const step = Math.min(Math.abs(g.dx), Math.abs(g.dy)) / 4;
  for (const path of paths) {
    if (path.length === 1) mark(path[0][0], path[0][1]);
    for (let k = 1; k < path.length; k++) {
      const [ax, ay] = path[k - 1];
      const [bx, by] = path[k];
      const len = Math.hypot(bx - ax, by - ay);
      const n = Math.max(1, Math.ceil(len / step));
      for (let s = 0; s <= n; s++) mark(ax + ((bx - ax) * s) / n, ay + ((by - ay) * s) / n);
    }
  }
  for (const [x, y] of points) mark(x, y);
  return out;
}
