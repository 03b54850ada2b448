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
 * Raw grids stay untouched (the interactive cache reuses them when only domain parameters change),
 * unless `inPlace` (a one-shot batch run): then each is masked where it lies and no copy is made.
 * Otherwise the grids that do not depend on the domains are masked once per set of raw grids and
 * shared by every run that reuses them: callers never write into a result's grids.
 */

import { ageFromDepth, asymptoticDepth, depthFromAge, type AgeDepthCurve } from '../science/age-depth.js';
import type { Params } from '../params.js';
import { isContinentalDomain } from '../domains/classify.js';
import { gridOf, type Derived } from './derive.js';
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
  /** The grids derive kept, masked (all of them unless the run kept only some). */
  readonly grids: Partial<Record<DerivedName, Float32Array>>;
  readonly unboundedBeta: Uint8Array;
  readonly counts: AppliedCounts;
  readonly warnings: string[];
  /** Which reference age the depth anomaly uses, in words. */
  readonly anomalyReference: string | null;
}

export function applyDomains(derived: Derived, domains: Uint8Array, p: Params, isochronAge: Float32Array | null, inPlace = false): Applied {
  const n = domains.length;
  const raw = derived.grids;
  const counts: AppliedCounts = { zeroCrust: 0, subsidenceBeyondInfinite: 0, ageOlderThanRift: 0, ageCappedAtRift: 0, noFiniteAge: 0, depthAnomaly: 0 };
  // the unbounded-β mask first: masking in place replaces the ∞ it reads
  const unboundedBeta = new Uint8Array(n);
  const bc = gridOf(raw, 'beta-crust');
  const bs = gridOf(raw, 'beta-subsidence');
  for (let k = 0; k < n; k++) {
    if (bc[k] === Infinity) {
      unboundedBeta[k] |= UNBOUNDED_ZERO_CRUST;
      counts.zeroCrust++;
    }
    if (bs[k] === Infinity && isContinentalDomain(domains[k])) {
      unboundedBeta[k] |= UNBOUNDED_SUBSIDENCE;
      counts.subsidenceBeyondInfinite++;
    }
  }
  const Y = gridOf(raw, 'water-loaded-basement');
  const aMinRaw = gridOf(raw, 'oceanic-age-min');
  const aMaxRaw = gridOf(raw, 'oceanic-age-max');
  // the continental cells as runs [start, end) in raster order, read by every continental grid below
  const runs = continentalRuns(domains);
  const shared = inPlace ? null : sharedOf(derived);
  const grids: Partial<Record<DerivedName, Float32Array>> = {};
  for (const d of DERIVED) {
    const v = raw[d.name];
    if (!v) continue;
    let out: Float32Array;
    if (d.applies === 'all') {
      // independent of the domains: one masked copy per set of raw grids, shared by the runs that reuse them (never written)
      out = shared ? (shared[d.name] ??= maskFinite(v, new Float32Array(n))) : maskFinite(v, v);
    } else {
      out = inPlace ? v : new Float32Array(n);
      if (d.applies === 'continental') maskContinental(v, runs, out);
      else if (d.name === 'oceanic-depth-anomaly') out.fill(NaN); // filled below; the ages are written below for every cell
    }
    grids[d.name] = out;
  }
  const ratio = grids['beta-ratio'];
  if (ratio) for (let k = 0; k < n; k++) if (unboundedBeta[k] & UNBOUNDED_ZERO_CRUST) ratio[k] = NaN; // β_sub / ∞ reads as 0, which it is not

  // Oceanic ages and depth anomalies.
  const aMin = gridOf(grids, 'oceanic-age-min');
  const aMax = gridOf(grids, 'oceanic-age-max');
  const anomaly = grids['oceanic-depth-anomaly'];
  const limit = p.riftAge ?? Infinity;
  const curve = p.ageCurve;
  const tooOld = olderThan(limit, curve);
  // every cell written (read raw first: in place, aMin/aMax are the raw grids)
  for (let k = 0; k < n; k++) {
    const lo = aMinRaw[k];
    let hi = aMaxRaw[k];
    aMin[k] = NaN;
    aMax[k] = NaN;
    const y = Y[k];
    if (domains[k] !== 5 || y !== y) continue;
    if (tooOld(y)) {
      let ref = isochronAge ? isochronAge[k] : NaN;
      if (ref === ref) ref = Math.min(ref, limit);
      else ref = p.riftAge ?? NaN;
      if (p.riftAge !== null) counts.ageOlderThanRift++;
      else counts.noFiniteAge++;
      if (ref === ref) {
        if (anomaly) anomaly[k] = y - depthFromAge(ref, curve);
        counts.depthAnomaly++;
      }
      continue;
    }
    aMin[k] = lo;
    if (hi > limit) {
      hi = limit;
      counts.ageCappedAtRift++;
    }
    aMax[k] = hi - hi === 0 ? hi : NaN;
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

/** out = v where finite, else NaN (x − x is 0 only for a finite x); returns out. */
function maskFinite(v: Float32Array, out: Float32Array): Float32Array {
  for (let k = 0; k < v.length; k++) {
    const x = v[k];
    out[k] = x - x === 0 ? x : NaN;
  }
  return out;
}

/** Runs [start, end) of continental cells in raster order, as pairs. */
function continentalRuns(domains: Uint8Array): Int32Array {
  const n = domains.length;
  let count = 0;
  for (let k = 0; k < n; k++) if (isContinentalDomain(domains[k]) && (k === 0 || !isContinentalDomain(domains[k - 1]))) count++;
  const runs = new Int32Array(2 * count);
  let q = 0;
  for (let k = 0; k < n; ) {
    if (!isContinentalDomain(domains[k])) {
      k++;
      continue;
    }
    runs[q++] = k;
    while (k < n && isContinentalDomain(domains[k])) k++;
    runs[q++] = k;
  }
  return runs;
}

/** out = v where the cell is continental (in one of the runs) and the value finite, else NaN; out may be v. */
function maskContinental(v: Float32Array, runs: Int32Array, out: Float32Array): void {
  let from = 0;
  for (let q = 0; q < runs.length; q += 2) {
    const a = runs[q];
    const b = runs[q + 1];
    out.fill(NaN, from, a);
    for (let k = a; k < b; k++) {
      const x = v[k];
      out[k] = x - x === 0 ? x : NaN;
    }
    from = b;
  }
  out.fill(NaN, from);
}

/** The domain-independent masked grids of one set of raw grids (interactive runs reuse the raw grids). */
const sharedGrids = new WeakMap<Derived, Partial<Record<DerivedName, Float32Array>>>();
function sharedOf(derived: Derived): Partial<Record<DerivedName, Float32Array>> {
  let s = sharedGrids.get(derived);
  if (!s) sharedGrids.set(derived, (s = {}));
  return s;
}

/**
 * Whether a water-loaded depth reads as older than `limit` (Myr) on the curve, or as no finite age:
 * exactly `ageFromDepth(d) > limit || ageFromDepth(d) === Infinity`, without the logarithm per
 * cell. The inverse is monotone, so depths more than 1 cm either side of the limit's depth are
 * decided by comparison; only those within 1 cm (rounding) go through the formula.
 */
export function olderThan(limit: number, curve: AgeDepthCurve): (d: number) => boolean {
  const asymptote = asymptoticDepth(curve);
  const exact = (d: number) => {
    const a = ageFromDepth(d, curve);
    return a > limit || a === Infinity;
  };
  if (limit < 0) return () => true; // every age is older
  if (!(limit < Infinity)) return (d) => d >= asymptote;
  const dl = depthFromAge(Math.max(0, limit), curve);
  if (!Number.isFinite(dl)) return exact;
  const below = dl - 0.01;
  const above = dl + 0.01;
  return (d) => (d < below ? d >= asymptote : d > above ? true : exact(d));
}
