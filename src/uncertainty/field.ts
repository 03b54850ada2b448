/**
 * Stationary Gaussian random fields of unit variance on the analysis grid, by the moving-average
 * method (Oliver 1995, "Moving averages for Gaussian simulation in two and three dimensions",
 * Mathematical Geology 27: white noise convolved with a kernel has as covariance the kernel's
 * autocorrelation). The kernel is separable, three box filters of w cells along each axis (a
 * quadratic B-spline); its autocorrelation is close to a Gaussian covariance
 * C(h) ≈ exp(−h²/ℓ²), and w is chosen from the user's correlation length ℓ (the lag at which the
 * correlation falls to 1/e) as the integer nearest √((ℓ/Δ)² + 1) for cell size Δ (the box-filter
 * variance (w² − 1)/12, three times, is ℓ²/4 per axis). `correlationAt` gives the exact correlation of
 * the discrete kernel, for tests and the summary. The noise is drawn on a grid padded by the kernel's
 * length so every cell of the result has full support (no edge effects), and the field is divided
 * by the kernel's root sum of squares, so its variance is exactly 1 in distribution.
 */

import type { Rng } from './random.js';

export interface FieldShape {
  readonly nx: number;
  readonly ny: number;
  /** Cell width and height in map units (metres). */
  readonly dx: number;
  readonly dy: number;
}

/** Box width (≥ 1 cells) for a correlation length ℓ on cells of size `cell` (an even width shifts the field half a cell: no matter for a stationary field). */
export function boxWidth(length: number, cell: number): number {
  return Math.max(1, Math.round(Math.sqrt((length / cell) ** 2 + 1)));
}

/** The 1D kernel: three boxes of w ones convolved (length 3w − 2). */
export function kernel1d(w: number): Float64Array {
  let k = new Float64Array([1]);
  for (let pass = 0; pass < 3; pass++) {
    const out = new Float64Array(k.length + w - 1);
    for (let a = 0; a < k.length; a++) for (let b = 0; b < w; b++) out[a + b] += k[a];
    k = out;
  }
  return k;
}

/** Exact correlation of the field along one axis at a lag of `lag` cells (kernel autocorrelation ÷ its value at 0). */
export function correlationAt(w: number, lag: number): number {
  const k = kernel1d(w);
  let c0 = 0;
  let c = 0;
  for (let a = 0; a < k.length; a++) {
    c0 += k[a] * k[a];
    if (a + lag < k.length) c += k[a] * k[a + lag];
  }
  return c / c0;
}

/** A generator of unit-variance fields for one grid shape and correlation length, reusing its buffers. */
export function fieldGenerator(shape: FieldShape, length: number): { readonly wx: number; readonly wy: number; fill(r: Rng, out: Float32Array): Float32Array } {
  const { nx, ny } = shape;
  const wx = boxWidth(length, Math.abs(shape.dx));
  const wy = boxWidth(length, Math.abs(shape.dy));
  const NX = nx + 3 * (wx - 1);
  const NY = ny + 3 * (wy - 1);
  const sumSq = (w: number) => kernel1d(w).reduce((s, v) => s + v * v, 0);
  const scale = 1 / Math.sqrt(sumSq(wx) * sumSq(wy));
  // noise, then rows filtered to nx wide, then columns filtered to ny tall
  const noise = new Float64Array(NX * NY);
  const rows = new Float64Array(nx * NY);
  const line = new Float64Array(Math.max(NX, NY));
  const tmp = new Float64Array(Math.max(NX, NY));
  /** Three running box sums of width w over src[0..len): the result, len − 3(w − 1) long (in tmp). */
  const box = (src: Float64Array, dst: Float64Array, n: number, w: number): number => {
    const m = n - (w - 1);
    let s = 0;
    for (let a = 0; a < w; a++) s += src[a];
    dst[0] = s;
    for (let a = 1; a < m; a++) {
      s += src[a + w - 1] - src[a - 1];
      dst[a] = s;
    }
    return m;
  };
  // src → tmp → src → tmp: the result ends in tmp
  const box3 = (src: Float64Array, len: number, w: number): Float64Array => {
    box(tmp, src, box(src, tmp, len, w), w);
    box(src, tmp, len - 2 * (w - 1), w);
    return tmp;
  };
  return {
    wx,
    wy,
    fill(r: Rng, out: Float32Array): Float32Array {
      for (let k = 0; k < noise.length; k++) noise[k] = r.normal();
      for (let j = 0; j < NY; j++) {
        for (let i = 0; i < NX; i++) line[i] = noise[j * NX + i];
        const res = box3(line, NX, wx);
        for (let i = 0; i < nx; i++) rows[j * nx + i] = res[i];
      }
      for (let i = 0; i < nx; i++) {
        for (let j = 0; j < NY; j++) line[j] = rows[j * nx + i];
        const res = box3(line, NY, wy);
        for (let j = 0; j < ny; j++) out[j * nx + i] = res[j] * scale;
      }
      return out;
    },
  };
}
