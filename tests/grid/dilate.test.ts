// The 3 × 3 dilation against its definition written out plainly (a cell is set when any cell of its
// 3 × 3 neighbourhood on the grid is marked), on random and smooth code grids, thin grids included.
import { describe, expect, it } from 'vitest';
import { dilate8 } from '../../src/grid/dilate.js';

function reference(codes: Uint8Array, table: Uint8Array, nx: number, ny: number): number[] {
  const out: number[] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      let on = 0;
      for (let b = j - 1; b <= j + 1; b++) for (let a = i - 1; a <= i + 1; a++) if (a >= 0 && b >= 0 && a < nx && b < ny && table[codes[b * nx + a]]) on = 1;
      out.push(on);
    }
  }
  return out;
}

describe('dilate8', () => {
  it('equals the definition on random codes (0–6) for several tables and grid shapes, 1-wide grids included', () => {
    let seed = 5;
    const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    for (const [nx, ny] of [[40, 30], [1, 25], [25, 1], [1, 1], [2, 3], [57, 41]] as const) {
      const codes = new Uint8Array(nx * ny).map(() => Math.floor(rnd() * 7));
      for (const marked of [[1, 2, 3], [5], [], [0, 1, 2, 3, 4, 5, 6]]) {
        const table = new Uint8Array(7);
        for (const c of marked) table[c] = 1;
        expect(Array.from(dilate8(codes, table, nx, ny)), `${nx}×${ny} marking ${marked}`).toEqual(reference(codes, table, nx, ny));
      }
    }
  });
  it('equals it on smooth domains whose borders run in every direction', () => {
    const nx = 120;
    const ny = 90;
    const codes = new Uint8Array(nx * ny);
    for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) codes[j * nx + i] = Math.floor(3 + 2.9 * Math.sin(i / 9 + Math.cos(j / 7)));
    const table = new Uint8Array(7);
    table[5] = 1;
    expect(Array.from(dilate8(codes, table, nx, ny))).toEqual(reference(codes, table, nx, ny));
  });
});
