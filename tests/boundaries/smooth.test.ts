// Grid smoothing before contouring, against the definition: the mean of the finite cells in the
// (2r+1)² window, computed directly (a NaN cell stays NaN).
import { describe, expect, it } from 'vitest';
import { smoothGrid } from '../../src/boundaries/smooth.js';

function direct(v: Float32Array, nx: number, ny: number, r: number): Float32Array {
  const out = new Float32Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      if (v[k] !== v[k]) {
        out[k] = NaN;
        continue;
      }
      let s = 0;
      let c = 0;
      for (let b = Math.max(0, j - r); b <= Math.min(ny - 1, j + r); b++) {
        for (let a = Math.max(0, i - r); a <= Math.min(nx - 1, i + r); a++) {
          const x = v[b * nx + a];
          if (x === x) (s += x), c++;
        }
      }
      out[k] = s / c;
    }
  }
  return out;
}

describe('smoothGrid', () => {
  it('equals the direct windowed mean of finite cells, edges and NaN holes included (tolerance 1e-3 m on ~30 km values)', () => {
    for (const [nx, ny, r] of [[37, 23, 1], [37, 23, 3], [5, 40, 4], [64, 1, 2]] as const) {
      const v = new Float32Array(nx * ny);
      let seed = 7;
      for (let k = 0; k < v.length; k++) {
        seed = (seed * 16807) % 2147483647;
        v[k] = seed % 17 === 0 ? NaN : 20_000 + (seed % 10_000);
      }
      const got = smoothGrid(v, nx, ny, r);
      const want = direct(v, nx, ny, r);
      for (let k = 0; k < v.length; k++) {
        if (want[k] !== want[k]) expect(got[k], `cell ${k}`).toBeNaN();
        else expect(Math.abs(got[k] - want[k]), `${nx}×${ny} r=${r} cell ${k}`).toBeLessThan(1e-3);
      }
    }
  });
  it('r = 0 returns the grid itself', () => {
    const v = new Float32Array([1, 2, 3]);
    expect(smoothGrid(v, 3, 1, 0)).toBe(v);
  });
});
