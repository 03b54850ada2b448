/**
 * The oldest onlapped crust. Onlap of the oldest post-breakup strata onto basement is a stratigraphic
 * observation on seismic, not a thickness, so no thickness isoline is traced for it. The line is the
 * landward limit of oceanic crust moved along the oceanward direction by the offset seen at the
 * onlap picks: at each pick, the offset is its distance from the oceanic limit measured along the
 * oceanward direction (positive oceanward); between picks it is interpolated linearly along strike,
 * beyond the outermost picks it stays at the end value (as threshold calibration does). Each vertex
 * keeps its strike coordinate, so at a pick's strike the moved line passes through the pick.
 * Without onlap picks the offset is zero: the line is the oceanic limit, and says so.
 */

import type { Oceanward } from '../domains/direction.js';
import { rayHits, type Ring } from './planar.js';
import { interpolateAlongStrike, strikeOf } from './strike.js';

export { strikeOf };

export interface OnlapPoint {
  readonly x: number;
  readonly y: number;
  readonly strike: number;
  /** Oceanward offset from the oceanic limit (m). */
  readonly offset: number;
  readonly id: string;
}

/** Offset of each pick from the oceanic-limit lines along the oceanward direction (nearest crossing). */
export function onlapOffset(x: number, y: number, oceanic: Ring[], o: Oceanward, reach: number): number {
  const ts = rayHits([x, y], [o.ex, o.ey], reach, oceanic);
  if (!ts.length) return NaN;
  let best = ts[0];
  for (const t of ts) if (Math.abs(t) < Math.abs(best)) best = t;
  // the crossing is at P + t·e, so P lies −t beyond it along e
  return -best;
}

export function offsetAt(points: readonly OnlapPoint[], s: number): number {
  return points.length ? interpolateAlongStrike(points, s, (q) => q.offset) : 0;
}

/** The onlap line: every oceanic-limit line moved by the interpolated offset. Points sorted by strike. */
export function onlapLines(oceanic: Ring[], points: readonly OnlapPoint[], o: Oceanward): Ring[] {
  if (!points.length) return oceanic;
  return oceanic.map((l) =>
    l.map(([x, y]) => {
      const d = offsetAt(points, strikeOf(o, x, y));
      return [x + o.ex * d, y + o.ey * d] as [number, number];
    }),
  );
}
