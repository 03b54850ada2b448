/**
 * Ocean depth against crustal age, forward and inverse. Depth d in m (basement depth, water-loaded),
 * age t in Myr.
 *  - Parsons & Sclater 1977 (JGR 82): d = 2500 + 350·√t (young), d = 6400 − 3200·e^(−t/62.8) (old).
 *    We switch branches where they cross (≈ 26.27 Ma), so the curve is continuous and monotone.
 *  - Stein & Stein 1992, GDH1 (Nature 359): d = 2600 + 365·√t (t < 20), d = 5651 − 2473·e^(−0.0278·t).
 * Inverse: d shallower than the zero-age depth → 0; d at or beyond the asymptote → +Infinity (no
 * finite age: the caller reports it).
 */

import { brent } from './root.js';

export type AgeDepthCurve = 'GDH1' | 'PS77';

const ps77Young = (t: number) => 2500 + 350 * Math.sqrt(t);
const ps77Old = (t: number) => 6400 - 3200 * Math.exp(-t / 62.8);
/** Age where the two Parsons & Sclater branches cross (≈ 26.27 Ma). */
export const PS77_SWITCH = brent((t) => ps77Young(t) - ps77Old(t), 20, 40, 1e-12);

const gdhYoung = (t: number) => 2600 + 365 * Math.sqrt(t);
const gdhOld = (t: number) => 5651 - 2473 * Math.exp(-0.0278 * t);

export function depthFromAge(t: number, curve: AgeDepthCurve = 'GDH1'): number {
  if (t < 0) return NaN;
  if (curve === 'PS77') return t < PS77_SWITCH ? ps77Young(t) : ps77Old(t);
  return t < 20 ? gdhYoung(t) : gdhOld(t);
}

export function zeroAgeDepth(curve: AgeDepthCurve = 'GDH1'): number {
  return curve === 'PS77' ? 2500 : 2600;
}

export function asymptoticDepth(curve: AgeDepthCurve = 'GDH1'): number {
  return curve === 'PS77' ? 6400 : 5651;
}

/** Depths where the branches meet, computed once (the inverse runs per cell). */
const PS77_D_SWITCH = ps77Young(PS77_SWITCH);
const GDH1_D20_YOUNG = gdhYoung(20);
const GDH1_D20_OLD = gdhOld(20);

export function ageFromDepth(d: number, curve: AgeDepthCurve = 'GDH1'): number {
  if (d !== d) return NaN;
  if (curve === 'PS77') {
    if (d <= 2500) return 0;
    if (d >= 6400) return Infinity;
    if (d < PS77_D_SWITCH) return ((d - 2500) / 350) ** 2;
    return -62.8 * Math.log((6400 - d) / 3200);
  }
  if (d <= 2600) return 0;
  if (d >= 5651) return Infinity;
  // GDH1 steps by 0.4 m at 20 Ma; a depth inside that step maps to 20 Ma.
  if (d < GDH1_D20_YOUNG) return ((d - 2600) / 365) ** 2;
  if (d < GDH1_D20_OLD) return 20;
  return -Math.log((5651 - d) / 2473) / 0.0278;
}

/** Table spacing (m) and how near the asymptote (m) the table hands over to the formula. */
const TABLE_STEP = 0.5;
const TABLE_MARGIN = 200;

/**
 * ageFromDepth as a table: the inverse sampled every 0.5 m from the zero-age depth to 200 m short of
 * the asymptote and interpolated linearly; the formula itself nearer the asymptote (where the
 * logarithm bends too fast for a table) and within a step of GDH1's 0.4 m plateau at 20 Ma (which no
 * straight segment follows). Agrees with ageFromDepth within 2e-4 Myr
 * (tests/science/science.test.ts); derive calls it four times a cell.
 */
export function ageTable(curve: AgeDepthCurve = 'GDH1'): (d: number) => number {
  // one table per curve, made once: the same function every call (so callers' call sites stay monomorphic)
  let f = tables.get(curve);
  if (!f) tables.set(curve, (f = makeAgeTable(curve)));
  return f;
}

const tables = new Map<AgeDepthCurve, (d: number) => number>();

function makeAgeTable(curve: AgeDepthCurve): (d: number) => number {
  const d0 = zeroAgeDepth(curve);
  const dEnd = asymptoticDepth(curve) - TABLE_MARGIN;
  const m = Math.ceil((dEnd - d0) / TABLE_STEP);
  const t = new Float64Array(m + 1);
  for (let k = 0; k <= m; k++) t[k] = ageFromDepth(d0 + k * TABLE_STEP, curve);
  const last = d0 + m * TABLE_STEP; // at most TABLE_STEP beyond dEnd, still short of the asymptote
  const plateauLo = curve === 'GDH1' ? GDH1_D20_YOUNG - TABLE_STEP : Infinity;
  const plateauHi = curve === 'GDH1' ? GDH1_D20_OLD + TABLE_STEP : -Infinity;
  return (d: number): number => {
    if (!(d > d0)) return d === d ? 0 : NaN;
    if (d >= last || (d > plateauLo && d < plateauHi)) return ageFromDepth(d, curve);
    const x = (d - d0) / TABLE_STEP;
    const k = x | 0;
    return t[k] + (t[k + 1] - t[k]) * (x - k);
  };
}
