/**
 * NaN-aware box smoothing of a grid (half-width r cells), used on the grid before lines are traced —
 * never on the lines. Separable running sums: O(n) whatever r. NaN cells stay NaN and do not pull
 * their neighbours (each mean is over the finite cells in the window).
 */
export function smoothGrid(v: Float32Array, nx: number, ny: number, r: number): Float32Array {
  if (r <= 0) return v;
  const sum = new Float64Array(nx * ny);
  const cnt = new Float64Array(nx * ny);
  // rows
  for (let j = 0; j < ny; j++) {
    let s = 0;
    let c = 0;
    const base = j * nx;
    for (let i = -r; i < nx; i++) {
      const add = i + r;
      if (add < nx) {
        const x = v[base + add];
        if (x === x) (s += x), c++;
      }
      const drop = i - r - 1;
      if (drop >= 0) {
        const x = v[base + drop];
        if (x === x) (s -= x), c--;
      }
      if (i >= 0) (sum[base + i] = s), (cnt[base + i] = c);
    }
  }
  const out = new Float32Array(nx * ny);
  // columns
  for (let i = 0; i < nx; i++) {
    let s = 0;
    let c = 0;
    for (let j = -r; j < ny; j++) {
      const add = j + r;
      if (add < ny) (s += sum[add * nx + i]), (c += cnt[add * nx + i]);
      const drop = j - r - 1;
      if (drop >= 0) (s -= sum[drop * nx + i]), (c -= cnt[drop * nx + i]);
      if (j >= 0) {
        const k = j * nx + i;
        out[k] = v[k] === v[k] && c > 0 ? s / c : NaN;
      }
    }
  }
  return out;
}
