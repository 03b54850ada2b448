/**
 * NaN-aware box smoothing of a grid (half-width r cells), used on the grid before lines are traced —
 * never on the lines. Separable running sums: O(n) time whatever r, O(nx) extra memory. NaN cells stay NaN and do not pull
 * their neighbours (each mean is over the finite cells in the window).
 */
export function smoothGrid(v: Float32Array, nx: number, ny: number, r: number): Float32Array {
  if (r <= 0) return v;
  // column sums over the rows j - r … j + r, kept for one output row at a time (O(nx) memory), then
  // a running sum along the row over those column sums
  const colSum = new Float64Array(nx);
  const colCnt = new Int32Array(nx);
  const out = new Float32Array(nx * ny);
  for (let j = -r; j < ny; j++) {
    const add = j + r;
    if (add < ny) {
      const base = add * nx;
      for (let i = 0; i < nx; i++) {
        const x = v[base + i];
        if (x === x) (colSum[i] += x), colCnt[i]++;
      }
    }
    const drop = j - r - 1;
    if (drop >= 0) {
      const base = drop * nx;
      for (let i = 0; i < nx; i++) {
        const x = v[base + i];
        if (x === x) (colSum[i] -= x), colCnt[i]--;
      }
    }
    if (j < 0) continue;
    let s = 0;
    let c = 0;
    const row = j * nx;
    for (let i = -r; i < nx; i++) {
      const a = i + r;
      if (a < nx) (s += colSum[a]), (c += colCnt[a]);
      const d = i - r - 1;
      if (d >= 0) (s -= colSum[d]), (c -= colCnt[d]);
      if (i >= 0) {
        const k = row + i;
        out[k] = v[k] === v[k] && c > 0 ? s / c : NaN;
      }
    }
  }
  return out;
}
