/**
 * Positions along strike (the direction perpendicular to oceanward) and linear interpolation of a
 * value between points sorted by it, held constant beyond the outermost points. Used by threshold
 * calibration (thickness at picks) and by the onlap line (offset at onlap picks).
 */

import type { Oceanward } from '../domains/direction.js';

/** Strike coordinate of a point: its projection on the unit vector (ey, −ex). */
export function strikeOf(o: Oceanward, x: number, y: number): number {
  return x * o.ey - y * o.ex;
}

/** Linear interpolation at strike s between points sorted by `strike`; constant beyond the ends. */
export function interpolateAlongStrike<T extends { readonly strike: number }>(points: readonly T[], s: number, value: (p: T) => number): number {
  if (!points.length) return NaN;
  if (s <= points[0].strike) return value(points[0]);
  const last = points[points.length - 1];
  if (s >= last.strike) return value(last);
  let lo = 0;
  let hi = points.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (points[mid].strike <= s) lo = mid;
    else hi = mid;
  }
  const a = points[lo];
  const b = points[hi];
  const span = b.strike - a.strike;
  return span > 0 ? value(a) + ((value(b) - value(a)) * (s - a.strike)) / span : value(a);
}
