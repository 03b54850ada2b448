/**
 * Geodesic (WGS84) area of every cell, for areas that must not depend on the map projection's scale
 * error. The exact geodesic area of one cell is computed on a coarse lattice of cells (every `step`
 * cells) and interpolated bilinearly between them: the projection's scale varies smoothly, so this is
 * exact to well under 1e-6 relative for margin-sized UTM grids (tests/grid/cell-area.test.ts).
 */

import { WGS84 } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import { geodesicRingArea } from '../crs/geodesy.js';
import { colToX, rowToY, type GridGeometry } from './geometry.js';

/** Geodesic area (m²) of the cell around sample (fi, fj) (fractional indices allowed). */
export function cellGeodesicArea(g: GridGeometry, fi: number, fj: number): number {
  const t = transformer(g.crs, WGS84);
  const ring: number[] = [];
  const corners: [number, number][] = [[-0.5, -0.5], [0.5, -0.5], [0.5, 0.5], [-0.5, 0.5], [-0.5, -0.5]];
  for (const [di, dj] of corners) {
    const p = t.forward([colToX(g, fi + di), rowToY(g, fj + dj)]);
    ring.push(p[0], p[1]);
  }
  return geodesicRingArea(ring);
}

/**
 * Cell areas one row at a time: the exact geodesic areas on the coarse lattice, interpolated along
 * a row on request, so a caller that only sums areas never holds a grid of them (8 bytes a cell).
 */
export interface CellAreaRows {
  readonly geometry: GridGeometry;
  /** Fill `out` (length nx) with the areas (m²) of row j. */
  row(j: number, out: Float64Array): void;
}

/**
 * For each index 0…n−1 along one axis: the two lattice nodes around it (lattice every `step`
 * indices, the last node on the last index) and the interpolation weight between them.
 */
function brackets(n: number, step: number, nodes: number): { lo: Int32Array; hi: Int32Array; t: Float64Array } {
  const lo = new Int32Array(n);
  const hi = new Int32Array(n);
  const t = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a0 = Math.min(nodes - 1, Math.floor(i / step));
    const a1 = Math.min(nodes - 1, a0 + 1);
    const i0 = Math.min(n - 1, a0 * step);
    const i1 = Math.min(n - 1, a1 * step);
    lo[i] = a0;
    hi[i] = a1;
    t[i] = i1 > i0 ? (i - i0) / (i1 - i0) : 0;
  }
  return { lo, hi, t };
}

export function cellAreaRows(g: GridGeometry, step = 16): CellAreaRows {
  const { nx, ny } = g;
  const li = Math.ceil((nx - 1) / step) + 1;
  const lj = Math.ceil((ny - 1) / step) + 1;
  const lattice = new Float64Array(li * lj);
  for (let b = 0; b < lj; b++) {
    for (let a = 0; a < li; a++) lattice[b * li + a] = cellGeodesicArea(g, Math.min(nx - 1, a * step), Math.min(ny - 1, b * step));
  }
  const cols = brackets(nx, step, li);
  const rows = brackets(ny, step, lj);
  return {
    geometry: g,
    row(j: number, out: Float64Array): void {
      const r0 = rows.lo[j] * li;
      const r1 = rows.hi[j] * li;
      const ty = rows.t[j];
      for (let i = 0; i < nx; i++) {
        const a0 = cols.lo[i];
        const a1 = cols.hi[i];
        const tx = cols.t[i];
        const top = lattice[r0 + a0] * (1 - tx) + lattice[r0 + a1] * tx;
        const bot = lattice[r1 + a0] * (1 - tx) + lattice[r1 + a1] * tx;
        out[i] = top * (1 - ty) + bot * ty;
      }
    },
  };
}

/** Geodesic area of each cell (m²), Float64Array, row-major. */
export function cellAreas(g: GridGeometry, step = 16): Float64Array {
  const rows = cellAreaRows(g, step);
  const out = new Float64Array(g.nx * g.ny);
  for (let j = 0; j < g.ny; j++) rows.row(j, out.subarray(j * g.nx, (j + 1) * g.nx));
  return out;
}

/** Mask of cells whose centre lies inside polygon rings given in the grid's CRS (even-odd, scanline). */
export function rasterizeRings(g: GridGeometry, rings: [number, number][][]): Uint8Array {
  const { nx, ny } = g;
  const mask = new Uint8Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    const y = rowToY(g, j);
    const xs: number[] = [];
    for (const ring of rings) {
      for (let a = 0, b = ring.length - 1; a < ring.length; b = a++) {
        const [xa, ya] = ring[a];
        const [xb, yb] = ring[b];
        if (ya > y !== yb > y) xs.push(((xb - xa) * (y - ya)) / (yb - ya) + xa);
      }
    }
    xs.sort((p, q) => p - q);
    for (let q = 0; q + 1 < xs.length; q += 2) {
      const i0 = Math.max(0, Math.ceil((xs[q] - g.x0) / g.dx));
      const i1 = Math.min(nx - 1, Math.floor((xs[q + 1] - g.x0) / g.dx));
      for (let i = i0; i <= i1; i++) {
        const x = colToX(g, i);
        if (x >= xs[q] && x <= xs[q + 1]) mask[j * nx + i] = 1;
      }
    }
  }
  return mask;
}
