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

