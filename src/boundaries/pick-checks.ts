/**
 * Consistency checks of interpreter picks (a pick that disagrees with its neighbours is more often a
 * mis-tie or a mis-pick than geology; the user decides, the tool only flags):
 *  - trend: the pick's crustal thickness (for onlap picks, its oceanward offset from the
 *    landward limit of oceanic crust) against the median of the up-to-four nearest other picks of
 *    its kind along strike (a median, so one bad neighbour does not flag the good ones). Flagged when
 *    it departs by more than pickTrendTolerance (offsets: pickProxyDistance). Needs two other picks.
 *  - proxy distance (continental-limit and oceanic-limit picks): how far the pick lies, along the
 *    oceanward direction, from the uncalibrated proxy line of its kind (the thickness isoline at the
 *    parameter's threshold, sides as the proxy decides them) at the pick's strike. Flagged beyond
 *    pickProxyDistance; not checked where the proxy line does not cross the pick's strike (it stops at
 *    a Moho gap or an unresolved transition). Onlap picks have no such check: onlap may lie tens of km
 *    from the oceanic limit.
 */

import type { Oceanward } from '../domains/direction.js';
import type { Params } from '../params.js';
import { rayHits, type Ring } from './planar.js';

export interface CheckablePick {
  readonly id: string;
  readonly kind: 'continental-limit' | 'oceanic-limit' | 'onlap';
  readonly line?: string;
  readonly x: number;
  readonly y: number;
  /** Crustal thickness at the pick (m), NaN if none. */
  readonly thickness: number;
  /** Onlap picks: oceanward offset from the oceanic limit (m), NaN if none. */
  readonly offset: number;
  /** Position along strike (m). */
  readonly strike: number;
  /** Excluded by the user: checked against the others, never a neighbour itself. */
  readonly excluded: boolean;
}

export interface PickCheck {
  readonly id: string;
  readonly kind: CheckablePick['kind'];
  readonly line: string | null;
  readonly x: number;
  readonly y: number;
  readonly thickness_m: number | null;
  /** What the neighbours say (median), in the checked quantity's unit (m). */
  readonly trend_m: number | null;
  readonly departure_m: number | null;
  readonly proxy_distance_m: number | null;
  readonly suspect: boolean;
  readonly excluded: boolean;
  readonly reasons: string[];
}

const median = (v: number[]) => {
  const s = [...v].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

export function checkPicks(picks: readonly CheckablePick[], proxy: { taper: Ring[]; oceanic: Ring[] }, oceanward: Oceanward, reach: number, p: Params): PickCheck[] {
  const out: PickCheck[] = [];
  for (const pk of picks) {
    const onlap = pk.kind === 'onlap';
    const value = (q: CheckablePick) => (onlap ? q.offset : q.thickness);
    const v = value(pk);
    const others = picks
      .filter((q) => q !== pk && !q.excluded && q.kind === pk.kind && Number.isFinite(value(q)))
      .sort((a, b) => Math.abs(a.strike - pk.strike) - Math.abs(b.strike - pk.strike))
      .slice(0, 4);
    const reasons: string[] = [];
    let trend: number | null = null;
    let departure: number | null = null;
    if (Number.isFinite(v) && others.length >= 2) {
      trend = median(others.map(value));
      departure = v - trend;
      const tol = onlap ? p.pickProxyDistance : p.pickTrendTolerance;
      if (Math.abs(departure) > tol) {
        reasons.push(
          onlap
            ? `offset from the oceanic limit ${(v / 1000).toFixed(1)} km against ${(trend / 1000).toFixed(1)} km at the nearest onlap picks (tolerance ${(tol / 1000).toFixed(1)} km)`
            : `crustal thickness ${(v / 1000).toFixed(2)} km against ${(trend / 1000).toFixed(2)} km at the nearest ${pk.kind} picks (tolerance ${(tol / 1000).toFixed(2)} km)`,
        );
      }
    }
    let proxyDistance: number | null = null;
    if (!onlap) {
      const lines = pk.kind === 'continental-limit' ? proxy.taper : proxy.oceanic;
      const hits = rayHits([pk.x, pk.y], [oceanward.ex, oceanward.ey], reach, lines);
      proxyDistance = hits.length ? Math.min(...hits.map(Math.abs)) : null;
      if (proxyDistance !== null && proxyDistance > p.pickProxyDistance) {
        reasons.push(`${(proxyDistance / 1000).toFixed(1)} km from the uncalibrated ${pk.kind === 'continental-limit' ? 'crustal taper limit' : 'oceanic limit'} (tolerance ${(p.pickProxyDistance / 1000).toFixed(1)} km)`);
      }
    }
    out.push({
      id: pk.id,
      kind: pk.kind,
      line: pk.line ?? null,
      x: pk.x,
      y: pk.y,
      thickness_m: Number.isFinite(pk.thickness) ? Math.round(pk.thickness) : null,
      trend_m: trend === null ? null : Math.round(trend),
      departure_m: departure === null ? null : Math.round(departure),
      proxy_distance_m: proxyDistance === null ? null : Math.round(proxyDistance),
      suspect: reasons.length > 0,
      excluded: pk.excluded,
      reasons,
    });
  }
  return out;
}
