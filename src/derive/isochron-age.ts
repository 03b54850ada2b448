/**
 * Age of the nearest magnetic isochron at every cell: the reference age for residual depth anomalies
 * over oceanic crust. Isochrons are burnt into the grid (every half cell along each line), then a
 * two-pass 3-4 chamfer distance transform (Borgefors 1986) carries the nearest line's age outward.
 * The chamfer metric is within about 8 % of Euclidean distance, enough to choose the nearest line.
 * NaN where there are no isochrons on the grid.
 */

import { xToCol, yToRow, type GridGeometry } from '../grid/geometry.js';

export interface AgedLine {
  readonly coords: [number, number][];
  readonly age: number;
}

export function nearestIsochronAge(g: GridGeometry, lines: readonly AgedLine[]): Float32Array {
  const { nx, ny } = g;
  const n = nx * ny;
  const age = new Float32Array(n).fill(NaN);
  const dist = new Float64Array(n).fill(Infinity);
  const step = Math.abs(g.dx) / 2;
  for (const l of lines) {
    if (!Number.isFinite(l.age)) continue;
    for (let q = 0; q + 1 < l.coords.length; q++) {
      const [x0, y0] = l.coords[q];
      const [x1, y1] = l.coords[q + 1];
      const m = Math.max(1, Math.ceil(Math.hypot(x1 - x0, y1 - y0) / step));
      for (let s = 0; s <= m; s++) {
        const i = Math.round(xToCol(g, x0 + ((x1 - x0) * s) / m));
        const j = Math.round(yToRow(g, y0 + ((y1 - y0) * s) / m));
        if (i < 0 || j < 0 || i >= nx || j >= ny) continue;
        dist[j * nx + i] = 0;
        age[j * nx + i] = l.age;
      }
    }
  }
  const relax = (k: number, from: number, w: number) => {
    const d = dist[from] + w;
    if (d < dist[k]) (dist[k] = d), (age[k] = age[from]);
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      if (i > 0) relax(k, k - 1, 3);
      if (j > 0) {
        relax(k, k - nx, 3);
        if (i > 0) relax(k, k - nx - 1, 4);
        if (i < nx - 1) relax(k, k - nx + 1, 4);
      }
    }
  }
  for (let j = ny - 1; j >= 0; j--) {
    for (let i = nx - 1; i >= 0; i--) {
      const k = j * nx + i;
      if (i < nx - 1) relax(k, k + 1, 3);
      if (j < ny - 1) {
        relax(k, k + nx, 3);
        if (i < nx - 1) relax(k, k + nx + 1, 4);
        if (i > 0) relax(k, k + nx - 1, 4);
      }
    }
  }
  return age;
}
