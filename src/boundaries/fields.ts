/**
 * Side fields: what the named lines are traced on. For a side S (a set of cells) and a threshold
 * L (one value or per cell), G = tc − L inside S (clamped to ≥ 0 when asked, so thin spots enclosed by
 * S draw no rings) and min(tc − L, −ε) outside S (crust of the other side can never be "above").
 * Between a cell of S and a cell outside S whose thickness is below L, G is tc − L on both ends, so
 * its zero crossing is exactly the thickness isoline at L. NaN stays NaN: lines stop there.
 */

import { isContinentalDomain } from '../domains/classify.js';

const EPS = 1e-3; // metres: keeps outside cells strictly below the level

/** A side as a lookup by domain code (1: the code belongs to the side), for `sideField`. */
export function sideOf(member: (code: number) => boolean): Uint8Array {
  const t = new Uint8Array(256);
  for (let c = 0; c < 256; c++) t[c] = member(c) ? 1 : 0;
  return t;
}

/**
 * G for the side of cells whose domain code is in `side` (see sideOf), written into `out` when given
 * (a buffer reused between fields) else a new grid.
 */
export function sideField(
  tc: Float32Array,
  domains: Uint8Array,
  side: Uint8Array,
  threshold: Float32Array | number,
  clampInside: boolean,
  out: Float32Array = new Float32Array(tc.length),
): Float32Array {
  const n = tc.length;
  const level = typeof threshold === 'number' ? null : threshold;
  const fixed = typeof threshold === 'number' ? threshold : 0;
  for (let k = 0; k < n; k++) {
    const t = tc[k];
    if (t !== t) {
      out[k] = NaN;
      continue;
    }
    const g = t - (level ? level[k] : fixed);
    out[k] = side[domains[k]] ? (clampInside && g < 0 ? 0 : g) : Math.min(g, -EPS);
  }
  return out;
}

/** One cell of a side field, exactly as `sideField` computes it (the sweep rebuilds single cells with it). */
export function sideValue(t: number, inside: boolean, level: number, clampInside: boolean): number {
  if (t !== t) return NaN;
  const g = t - level;
  return Math.fround(inside ? (clampInside && g < 0 ? 0 : g) : Math.min(g, -EPS));
}

/** The four thickness lines of a run, each the zero line of its side field. */
export type NamedLine = 'taper' | 'oceanic' | 'necking' | 'coupling';
export const NAMED_LINES: readonly NamedLine[] = ['taper', 'oceanic', 'necking', 'coupling'];

/** Continental side: proximal, necking and hyperextended continental crust (codes 1–3). */
export const CONTINENTAL_SIDE = sideOf(isContinentalDomain);
/** Oceanic side: oceanic crust (code 5). */
export const OCEANIC_SIDE = sideOf((c) => c === 5);

export interface LineLevels {
  readonly taper: Float32Array | number;
  readonly oceanic: Float32Array | number;
  readonly necking: number;
  readonly coupling: number;
}

/**
 * How each named line is traced: its side, its level, whether the side is clamped at 0 inside, and
 * whether cells the classifier could not resolve are no data for it (the taper and oceanic limits
 * are not drawn through them).
 */
export const LINE_RULES: Readonly<Record<NamedLine, { side: Uint8Array; clamp: boolean; skipUnresolved: boolean }>> = {
  taper: { side: CONTINENTAL_SIDE, clamp: true, skipUnresolved: true },
  oceanic: { side: OCEANIC_SIDE, clamp: true, skipUnresolved: true },
  necking: { side: CONTINENTAL_SIDE, clamp: false, skipUnresolved: false },
  coupling: { side: CONTINENTAL_SIDE, clamp: false, skipUnresolved: false },
};

/** The side field of a named line: `tc` for necking and coupling, `tcLimits` (unresolved cells NaN) for the limits. */
export function namedLineField(line: NamedLine, tc: Float32Array, tcLimits: Float32Array, domains: Uint8Array, levels: LineLevels, out?: Float32Array): Float32Array {
  const r = LINE_RULES[line];
  return sideField(r.skipUnresolved ? tcLimits : tc, domains, r.side, levels[line], r.clamp, out);
}
