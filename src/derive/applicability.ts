/**
 * The derived grids as shown and exported: each raw grid of derive() restricted to the domains where
 * its model applies (grids.ts `applies`), with no ±∞ anywhere.
 *  - continental grids (β, γ, McKenzie prediction and residual, β from subsidence, Airy): NaN outside
 *    the proximal, necking and hyperextended domains;
 *  - unbounded β (zero crust) and subsidence beyond McKenzie's β = ∞ are no data in their grids and
 *    recorded in the `unboundedBeta` mask (bit 1: zero crust, bit 2: subsidence beyond β = ∞);
 *  - oceanic ages: oceanic domain only, never older than the time since rifting ended (when given).
 *    A cell whose depth-derived age (central value, chosen curve) would be older reports no age but a
 *    residual depth anomaly instead: water-loaded depth minus the age–depth curve at the nearest
 *    isochron's age where isochrons are given, else at the oldest admissible age (the rift age).
 *    Where only the old end of the range is too old, it is capped at the rift age (counted).
 * Raw grids stay untouched (the interactive cache reuses them when only domain parameters change).
 */

import { ageFromDepth, depthFromAge } from '../science/age-depth.js';
import type { Params } from '../params.js';
import { isContinentalDomain } from '../domains/classify.js';
import type { Derived } from './derive.js';
import { DERIVED, type DerivedName } from './grids.js';

export const UNBOUNDED_ZERO_CRUST = 1;
export const UNBOUNDED_SUBSIDENCE = 2;

export interface AppliedCounts {
  /** Cells with zero crust (β from thickness unbounded), any domain. */
  zeroCrust: number;
  /** Continental cells that subside more than McKenzie's β = ∞ allows. */
  subsidenceBeyondInfinite: number;
  /** Oceanic cells whose depth-derived age would be older than the rift (anomaly reported instead). */
  ageOlderThanRift: number;
  /** Oceanic cells whose age range's old end was capped at the rift age. */
  ageCappedAtRift: number;
  /** Oceanic cells with no finite depth-derived age (beyond the curve's asymptote) and no rift age. */
  noFiniteAge: number;
  /** Oceanic cells carrying a residual depth anomaly. */
  depthAnomaly: number;
}

export interface Applied {
  readonly grids: Record<DerivedName, Float32Array>;
  readonly unboundedBeta: Uint8Array;
  readonly counts: AppliedCounts;
  readonly warnings: string[];
  /** Which reference age the depth anomaly uses, in words. */
  readonly anomalyReference: string | null;
}

export function applyDomains(derived: Derived, domains: Uint8Array, p: Params, isochronAge: Float32Array | null): Applied {
  const n = domains.length;
  const raw = derived.grids;
  const grids = {} as Record<DerivedName, Float32Array>;
  for (const d of DERIVED) {
    const v = raw[d.name];
    const out = new Float32Array(n);
    if (d.applies === 'all') {
      for (let k = 0; k < n; k++) out[k] = Number.isFinite(v[k]) ? v[k] : NaN;
    } else if (d.applies === 'continental') {
      for (let k = 0; k < n; k++) out[k] = isContinentalDomain(domains[k]) && Number.isFinite(v[k]) ? v[k] : NaN;
    } else out.fill(NaN); // oceanic grids: filled below
    grids[d.name] = out;
  }
  const counts: AppliedCounts = { zeroCrust: 0, subsidenceBeyondInfinite: 0, ageOlderThanRift: 0, ageCappedAtRift: 0, noFiniteAge: 0, depthAnomaly: 0 };
  const unboundedBeta = new Uint8Array(n);
  const bc = raw['beta-crust'];
  const bs = raw['beta-subsidence'];
  const ratio = grids['beta-ratio'];
  for (let k = 0; k < n; k++) {
    if (bc[k] === Infinity) {
      unboundedBeta[k] |= UNBOUNDED_ZERO_CRUST;
      counts.zeroCrust++;
      ratio[k] = NaN; // β_sub / ∞ reads as 0, which it is not
    }
    if (bs[k] === Infinity && isContinentalDomain(domains[k])) {
      unboundedBeta[k] |= UNBOUNDED_SUBSIDENCE;
      counts.subsidenceBeyondInfinite++;
    }
  }

  // Oceanic ages and depth anomalies.
  const Y = raw['water-loaded-basement'];
  const aMinRaw = raw['oceanic-age-min'];
  const aMaxRaw = raw['oceanic-age-max'];
  const aMin = grids['oceanic-age-min'];
  const aMax = grids['oceanic-age-max'];
  const anomaly = grids['oceanic-depth-anomaly'];
  const limit = p.riftAge ?? Infinity;
  const curve = p.ageCurve;
  for (let k = 0; k < n; k++) {
    if (domains[k] !== 5 || Y[k] !== Y[k]) continue;
    const a = ageFromDepth(Y[k], curve);
    if (a > limit || a === Infinity) {
      let ref = isochronAge ? isochronAge[k] : NaN;
      if (ref === ref) ref = Math.min(ref, limit);
      else ref = p.riftAge ?? NaN;
      if (p.riftAge !== null) counts.ageOlderThanRift++;
      else counts.noFiniteAge++;
      if (ref === ref) {
        anomaly[k] = Y[k] - depthFromAge(ref, curve);
        counts.depthAnomaly++;
      }
      continue;
    }
    aMin[k] = aMinRaw[k];
    let hi = aMaxRaw[k];
    if (hi > limit) {
      hi = limit;
      counts.ageCappedAtRift++;
    }
    aMax[k] = Number.isFinite(hi) ? hi : NaN;
  }

  const warnings: string[] = [];
  if (counts.subsidenceBeyondInfinite) {
    warnings.push(`${counts.subsidenceBeyondInfinite} continental cells subside more than McKenzie's β = ∞ allows: no β from subsidence there (see the unbounded-β mask)`);
  }
  if (counts.ageOlderThanRift) {
    warnings.push(
      `${counts.ageOlderThanRift} oceanic cells are deeper than the age–depth curve allows for crust younger than the rift (${p.riftAge} Myr): no age reported there, a residual depth anomaly instead`,
    );
  }
  const anomalyReference = counts.depthAnomaly
    ? isochronAge
      ? `${curve} depth at the nearest isochron's age${p.riftAge !== null ? `, at most the rift age (${p.riftAge} Myr)` : ''}`
      : `${curve} depth at the oldest admissible age (the rift age, ${p.riftAge} Myr)`
    : null;
  return { grids, unboundedBeta, counts, warnings, anomalyReference };
}
