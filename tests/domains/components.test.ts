// Connected components against their definition (4-connectivity): a breadth-first search on the
// mask written out plainly, and the numbering rule (labels in raster order of each component's first cell).
import { describe, expect, it } from 'vitest';
import { components } from '../../src/domains/components.js';

function reference(mask: Uint8Array, nx: number, ny: number): { labels: number[]; sizes: number[] } {
  const labels = new Array<number>(nx * ny).fill(0);
  const sizes = [0];
  for (let s = 0; s < nx * ny; s++) {
    if (!mask[s] || labels[s]) continue;
    const label = sizes.length;
    sizes.push(0);
    const queue = [s];
    labels[s] = label;
    while (queue.length) {
      const k = queue.shift()!;
      sizes[label]++;
      const i = k % nx;
      const j = Math.floor(k / nx);
      for (const [a, b] of [[i - 1, j], [i + 1, j], [i, j - 1], [i, j + 1]]) {
        if (a < 0 || b < 0 || a >= nx || b >= ny) continue;
        const q = b * nx + a;
        if (mask[q] && !labels[q]) (labels[q] = label), queue.push(q);
      }
    }
  }
  return { labels, sizes };
}

describe('components', () => {
  it('match a plain breadth-first search on random masks (U shapes, single rows and columns, dense and sparse)', () => {
    let seed = 11;
    for (const [nx, ny, p] of [[40, 30, 0.5], [60, 45, 0.62], [1, 40, 0.5], [40, 1, 0.5], [33, 70, 0.3], [25, 25, 1]] as const) {
      const mask = new Uint8Array(nx * ny);
      for (let k = 0; k < mask.length; k++) {
        seed = (seed * 16807) % 2147483647;
        mask[k] = seed / 2147483647 < p ? 1 : 0;
      }
      const got = components(mask, nx, ny);
      const want = reference(mask, nx, ny);
      expect(got.count, `${nx}×${ny}`).toBe(want.sizes.length - 1);
      expect(Array.from(got.labels)).toEqual(want.labels);
      expect(Array.from(got.sizes)).toEqual(want.sizes);
    }
  });
  it('match it on smooth masks with long runs that merge and split from row to row (as margin domains do)', () => {
    for (const [nx, ny, cut] of [[230, 170, 0.3], [170, 230, -0.4], [97, 301, 1.1]] as const) {
      const mask = new Uint8Array(nx * ny);
      for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) mask[j * nx + i] = Math.sin(i / 7) + Math.cos(j / 5) + Math.sin((i + 2 * j) / 11) > cut ? 1 : 0;
      const got = components(mask, nx, ny);
      const want = reference(mask, nx, ny);
      expect(got.count, `${nx}×${ny}`).toBe(want.sizes.length - 1);
      expect(Array.from(got.labels)).toEqual(want.labels);
      expect(Array.from(got.sizes)).toEqual(want.sizes);
    }
  });
  it('a U shape whose arms meet only at the bottom is one component', () => {
    // 1 0 1
    // 1 0 1
    // 1 1 1
    const got = components(new Uint8Array([1, 0, 1, 1, 0, 1, 1, 1, 1]), 3, 3);
    expect(got.count).toBe(1);
    expect(Array.from(got.labels)).toEqual([1, 0, 1, 1, 0, 1, 1, 1, 1]);
  });
});
