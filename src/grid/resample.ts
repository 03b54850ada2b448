/**
 * Bilinear, NaN-aware resampling onto another geometry, across CRSs when they differ.
 *
 * NaN rule: a target sample is NaN when any source sample with a non-zero bilinear weight is NaN, so
 * no data grows by at most one source cell and never spreads further. Fractional indices within
 * SNAP of an integer are snapped first, so resampling a grid onto itself copies it exactly.
 */

import { transformer } from '../crs/transform.js';
import { colToX, rowToY, xToCol, yToRow, type GridGeometry } from './geometry.js';
import { makeGrid, type Grid } from './grid.js';

const SNAP = 1e-6;

function snap(f: number): number {
  const r = Math.round(f);
  return Math.abs(f - r) < SNAP ? r : f;
}

/**
 * Sample a grid at fractional column fi, row fj. Inside the outer half cell of a cell-area grid the
 * edge value is extended (that area belongs to the edge cell); beyond the footprint, NaN.
 */
export function sampleBilinear(grid: Grid, fiIn: number, fjIn: number): number {
  const { nx, ny, registration } = grid.geometry;
  const v = grid.values;
  let fi = snap(fiIn);
  let fj = snap(fjIn);
  const lim = registration === 'area' ? 0.5 : SNAP;
  if (!(fi >= -lim && fi <= nx - 1 + lim && fj >= -lim && fj <= ny - 1 + lim)) return NaN;
  fi = Math.min(nx - 1, Math.max(0, fi));
  fj = Math.min(ny - 1, Math.max(0, fj));
  const i0 = Math.floor(fi);
  const j0 = Math.floor(fj);
  const tx = fi - i0;
  const ty = fj - j0;
  const i1 = tx > 0 ? i0 + 1 : i0;
  const j1 = ty > 0 ? j0 + 1 : j0;
  const a = v[j0 * nx + i0];
  if (tx === 0 && ty === 0) return a;
  const b = v[j0 * nx + i1];
  const c = v[j1 * nx + i0];
  const d = v[j1 * nx + i1];
  if (ty === 0) return a + (b - a) * tx; // NaN propagates by arithmetic
  if (tx === 0) return a + (c - a) * ty;
  return (a * (1 - tx) + b * tx) * (1 - ty) + (c * (1 - tx) + d * tx) * ty;
}

/** Resample `src` onto `target` (which may be in another CRS). */
export function resample(src: Grid, target: GridGeometry): Grid {
  const out = makeGrid(target);
  const t = transformer(target.crs, src.geometry.crs);
  const g = src.geometry;
  const { nx, ny } = target;
  for (let j = 0; j < ny; j++) {
    const y = rowToY(target, j);
    for (let i = 0; i < nx; i++) {
      const x = colToX(target, i);
      let sx = x;
      let sy = y;
      if (!t.identity) {
        const p = t.forward([x, y]);
        sx = p[0];
        sy = p[1];
      }
      out.values[j * nx + i] = sampleBilinear(src, xToCol(g, sx), yToRow(g, sy));
    }
  }
  return out;
}
