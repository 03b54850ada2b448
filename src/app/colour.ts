/**
 * Colour ramps and raster colouring for display. Continuous grids use viridis (van der Walt & Smith,
 * matplotlib 2015; perceptually uniform and readable with common colour-vision deficiencies), sampled
 * at 11 published anchor colours and interpolated linearly in sRGB. Domains use a categorical set of
 * our own. No data is transparent; +∞ (unbounded β) gets its own colour and legend entry.
 */

export type RGB = [number, number, number];

// viridis at t = 0, 0.1, …, 1 (matplotlib's _viridis_data, rounded to 8 bits)
const VIRIDIS: RGB[] = [
  [68, 1, 84], [72, 36, 117], [65, 68, 135], [53, 95, 141], [42, 120, 142], [33, 145, 140],
  [34, 168, 132], [68, 191, 112], [122, 209, 81], [189, 223, 38], [253, 231, 37],
];

export const UNBOUNDED_COLOUR: RGB = [230, 57, 70];

export function viridis(t: number): RGB {
  const x = Math.min(1, Math.max(0, t)) * (VIRIDIS.length - 1);
  const k = Math.min(VIRIDIS.length - 2, Math.floor(x));
  const f = x - k;
  const a = VIRIDIS[k];
  const b = VIRIDIS[k + 1];
  return [Math.round(a[0] + (b[0] - a[0]) * f), Math.round(a[1] + (b[1] - a[1]) * f), Math.round(a[2] + (b[2] - a[2]) * f)];
}

export { DOMAIN_STYLES, type DomainStyle } from '../domains/styles.js';
import { DOMAIN_STYLES } from '../domains/styles.js';

export interface RampSpec {
  readonly min: number;
  readonly max: number;
  /** Reverse so that deeper/thicker reads naturally (optional). */
  readonly reverse?: boolean;
}

/** Robust display range: 2nd and 98th percentiles of finite values (sampled). */
export function displayRange(v: Float32Array): RampSpec {
  const sample: number[] = [];
  const step = Math.max(1, Math.floor(v.length / 50_000));
  for (let k = 0; k < v.length; k += step) if (Number.isFinite(v[k])) sample.push(v[k]);
  if (!sample.length) return { min: 0, max: 1 };
  sample.sort((a, b) => a - b);
  let min = sample[Math.floor(0.02 * (sample.length - 1))];
  let max = sample[Math.ceil(0.98 * (sample.length - 1))];
  if (!(max > min)) (min = sample[0]), (max = sample[sample.length - 1] + (sample[0] === sample[sample.length - 1] ? 1 : 0));
  return { min, max };
}

/** RGBA pixels for a block of a grid (rows i0..i1, j0..j1), no data transparent. */
export function colourBlock(
  v: Float32Array | Uint8Array,
  nx: number,
  i0: number,
  j0: number,
  w: number,
  h: number,
  mode: { kind: 'ramp'; ramp: RampSpec } | { kind: 'domains' },
): Uint8ClampedArray {
  const out = new Uint8ClampedArray(w * h * 4);
  const lut = new Uint8ClampedArray(256 * 3);
  for (let q = 0; q < 256; q++) {
    const c = viridis(q / 255);
    lut.set(c, q * 3);
  }
  const dom = new Map(DOMAIN_STYLES.map((d) => [d.code, d.colour]));
  for (let j = 0; j < h; j++) {
    for (let i = 0; i < w; i++) {
      const x = v[(j0 + j) * nx + i0 + i];
      const o = (j * w + i) * 4;
      if (mode.kind === 'domains') {
        const c = dom.get(x);
        if (!c) continue;
        out[o] = c[0];
        out[o + 1] = c[1];
        out[o + 2] = c[2];
        out[o + 3] = 255;
        continue;
      }
      if (x !== x) continue;
      if (x === Infinity) {
        out.set(UNBOUNDED_COLOUR, o);
        out[o + 3] = 255;
        continue;
      }
      let t = (x - mode.ramp.min) / (mode.ramp.max - mode.ramp.min);
      if (mode.ramp.reverse) t = 1 - t;
      const q = Math.round(Math.min(1, Math.max(0, t)) * 255) * 3;
      out[o] = lut[q];
      out[o + 1] = lut[q + 1];
      out[o + 2] = lut[q + 2];
      out[o + 3] = 255;
    }
  }
  return out;
}
