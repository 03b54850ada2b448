// The exact Euclidean distance transform (Felzenszwalb & Huttenlocher 2012) against brute force:
// the distance from each cell centre to the nearest seed cell centre, with unequal cell sides.
import { describe, expect, it } from 'vitest';
import { crsFromEpsg } from '../../src/crs/registry.js';
import { distanceTransform, markControl } from '../../src/grid/distance.js';
import type { GridGeometry } from '../../src/grid/geometry.js';

const geom = (nx: number, ny: number, dx: number, dy: number): GridGeometry => ({ nx, ny, x0: 0, y0: 0, dx, dy: -dy, registration: 'area', crs: crsFromEpsg(32631) });

function brute(g: GridGeometry, seeds: Uint8Array): Float64Array {
  const out = new Float64Array(g.nx * g.ny).fill(Infinity);
  for (let j = 0; j < g.ny; j++) for (let i = 0; i < g.nx; i++) {
    for (let b = 0; b < g.ny; b++) for (let a = 0; a < g.nx; a++) {
      if (!seeds[b * g.nx + a]) continue;
      const d = Math.hypot((i - a) * g.dx, (j - b) * g.dy);
      if (d < out[j * g.nx + i]) out[j * g.nx + i] = d;
    }
  }
  return out;
}

describe('distance transform', () => {
  it('equals the brute-force nearest-seed distance (Float32 rounding), square and unequal cells', () => {
    let s = 12345;
    const rand = () => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 4294967296);
    for (const [nx, ny, dx, dy, density] of [[37, 23, 1000, 1000, 0.02], [41, 19, 500, 1250, 0.05], [30, 30, 100, 100, 0.002], [13, 11, 1, 3, 0.3]] as const) {
      const g = geom(nx, ny, dx, dy);
      const seeds = new Uint8Array(nx * ny);
      for (let k = 0; k < seeds.length; k++) seeds[k] = rand() < density ? 1 : 0;
      seeds[Math.floor(rand() * seeds.length)] = 1;
      const got = distanceTransform(g, seeds);
      const want = brute(g, seeds);
      for (let k = 0; k < got.length; k++) expect(Math.abs(got[k] - want[k])).toBeLessThanOrEqual(want[k] * 1e-6 + 1e-6);
    }
  });

  it('is +∞ everywhere without seeds, and 0 on the cells a path and a point mark', () => {
    const g = geom(20, 10, 1000, 1000);
    expect(Array.from(distanceTransform(g, new Uint8Array(200))).every((v) => v === Infinity)).toBe(true);
    // a path along row 4 from column 2 to 15, and a point at column 18, row 8
    const marks = markControl(g, [[[2000, -4000], [15000, -4000]]], [[18000, -8000]]);
    const d = distanceTransform(g, marks);
    for (let i = 2; i <= 15; i++) expect(d[4 * 20 + i]).toBe(0);
    expect(d[8 * 20 + 18]).toBe(0);
    expect(d[0]).toBeCloseTo(Math.hypot(2000, 4000), 3);
    expect(d[9 * 20 + 0]).toBeCloseTo(Math.hypot(2000, 5000), 3);
  });
});
