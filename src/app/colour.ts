/**
 * Colour ramps and raster colouring for display. Continuous grids use viridis (van der Walt & Smith,
 * matplotlib 2015; perceptually uniform and readable with common colour-vision deficiencies) from
 * d3-scale-chromatic, a maintained colour library. Domains use a categorical set of
 * our own. No data is transparent. Shown grids hold no ±∞ (derive/applicability masks it); a raw +∞,
 * should one reach this, gets its own colour rather than the ramp's end.
 */

import { interpolateViridis } from 'd3-scale-chromatic';

export type RGB = [number, number, number];

export const UNBOUNDED_COLOUR: RGB = [230, 57, 70];

/** viridis from d3-scale-chromatic (van der Walt & Smith's matplotlib colormap, 256 published samples). */
export function viridis(t: number): RGB {
  const c = rgb(interpolateViridis(Math.min(1, Math.max(0, t))));
  return [c.r, c.g, c.b];
}

/** "#rrggbb" → channels. */
function rgb(hex: string): { r: number; g: number; b: number } {
  const n = parseInt(hex.slice(1), 16);
  return { r: (n >> 16) & 255, g: (n >> 8) & 255, b: n & 255 };
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
