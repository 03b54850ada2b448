/** A grid: geometry plus Float32 values, row-major, NaN = no data. */

import { cellCount, validateGeometry, type GridGeometry } from './geometry.js';

export interface Grid {
  readonly geometry: GridGeometry;
  readonly values: Float32Array;
}

export function makeGrid(geometry: GridGeometry, values?: Float32Array): Grid {
  validateGeometry(geometry);
  const n = cellCount(geometry);
  if (values && values.length !== n) {
    throw new Error(`grid values length ${values.length} does not match ${geometry.nx} × ${geometry.ny} = ${n}`);
  }
  return { geometry, values: values ?? new Float32Array(n).fill(NaN) };
}

/** Value at integer column i, row j (NaN outside). */
export function valueAt(grid: Grid, i: number, j: number): number {
  const { nx, ny } = grid.geometry;
  if (i < 0 || j < 0 || i >= nx || j >= ny) return NaN;
  return grid.values[j * nx + i];
}

/** A grid with the same geometry and values mapped cell by cell (NaN in, NaN out unless f decides). */
export function mapGrid(grid: Grid, f: (v: number) => number): Grid {
  const out = new Float32Array(grid.values.length);
  const src = grid.values;
  for (let k = 0; k < src.length; k++) out[k] = f(src[k]);
  return { geometry: grid.geometry, values: out };
}
