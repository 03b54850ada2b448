/**
 * McKenzie (1978, EPSL 40, 25–32) uniform instantaneous stretching of a plate of thickness a.
 * Water-loaded subsidence in metres; t is the time since rifting ended (Myr).
 *
 * Thermal subsidence is offered in two forms:
 *  - 'first-term': E0·(β/π)·sin(π/β)·(1 − e^(−t/τ)), the form usually quoted;
 *  - 'series' (default): the whole Fourier series Σ over odd n of E0·(1/n²)·(β/(nπ))·sin(nπ/β)·(1 − e^(−n²t/τ)).
 *    Its t → ∞ part sums in closed form, Σ_odd sin(nx)/n³ = πx(π − x)/8 with x = π/β, giving
 *    E0·π²·γ/8, so only the exponentially decaying part is summed term by term. At large β the
 *    two forms differ by several hundred metres.
 */

import { brent } from './root.js';

export interface McKenzieParams {
  /** Lithosphere (plate) thickness a, m. */
  readonly a: number;
  /** Initial crustal thickness tc (the reference thickness tc0 in Taperline), m. */
  readonly tc: number;
  /** Temperature at the base of the plate, °C. */
  readonly Tm: number;
  /** Thermal expansion coefficient, 1/°C. */
  readonly alpha: number;
  /** Mantle density at 0 °C (ρ0), kg/m³; the same mantle density as the Airy balance. */
  readonly rhoMantle: number;
  readonly rhoCrust: number;
  readonly rhoWater: number;
  /** Thermal time constant τ = a²/(π²κ), Myr (pass it explicitly: 62.8 in McKenzie's set). */
  readonly tau: number;
}

export type ThermalForm = 'first-term' | 'series';

/** McKenzie's own parameter set (REFERENCES.md §3); tc = 31.2 km is from memory. */
export const MCKENZIE_1978: McKenzieParams = {
  a: 125_000,
  tc: 31_200,
  Tm: 1333,
  alpha: 3.28e-5,
  rhoMantle: 3330,
  rhoCrust: 2800,
  rhoWater: 1000,
  tau: 62.8,
};

/** Initial (syn-rift) subsidence per unit γ = 1 − 1/β. */
export function initialSubsidencePerGamma(p: McKenzieParams): number {
  const { a, tc, Tm, alpha, rhoMantle: r0, rhoCrust: rc, rhoWater: rw } = p;
  return (a * ((r0 - rc) * (tc / a) * (1 - (alpha * Tm * tc) / (2 * a)) - (alpha * Tm * r0) / 2)) / (r0 * (1 - alpha * Tm) - rw);
}

/** Initial subsidence Si(β), m (McKenzie 1978). β = ∞ allowed. */
export function initialSubsidence(beta: number, p: McKenzieParams): number {
  return initialSubsidencePerGamma(p) * (beta === Infinity ? 1 : 1 - 1 / beta);
}

/** E0 = 4·a·ρ0·α·Tm / (π²(ρ0 − ρw)), m. */
export function thermalScale(p: McKenzieParams): number {
  return (4 * p.a * p.rhoMantle * p.alpha * p.Tm) / (Math.PI * Math.PI * (p.rhoMantle - p.rhoWater));
}

/** (β/(nπ))·sin(nπ/β), with its limit 1 at β = ∞. */
function sincTerm(beta: number, n: number): number {
  if (beta === Infinity) return 1;
  const x = (n * Math.PI) / beta;
  return Math.sin(x) / x;
}

/** Thermal (post-rift) subsidence St(β, t), m. */
export function thermalSubsidence(beta: number, t: number, p: McKenzieParams, form: ThermalForm = 'series'): number {
  // β ≤ 1 is no stretching (β < 1, crust thicker than the reference, is outside the model): no thermal subsidence.
  if (t <= 0 || beta <= 1) return 0;
  const E0 = thermalScale(p);
  if (form === 'first-term') return E0 * sincTerm(beta, 1) * -Math.expm1(-t / p.tau);
  const gamma = beta === Infinity ? 1 : 1 - 1 / beta;
  let decaying = 0;
  for (let n = 1; ; n += 2) {
    const e = Math.exp((-n * n * t) / p.tau);
    if (e < 1e-17) break;
    decaying += (sincTerm(beta, n) * e) / (n * n);
  }
  return E0 * ((Math.PI * Math.PI * gamma) / 8 - decaying);
}

/** Total water-loaded subsidence Si + St at time t after rifting. */
export function totalSubsidence(beta: number, t: number, p: McKenzieParams, form: ThermalForm = 'series'): number {
  return initialSubsidence(beta, p) + thermalSubsidence(beta, t, p, form);
}

export interface BetaInversion {
  /** β, or +Infinity when the subsidence reaches or exceeds the β = ∞ value. */
  readonly beta: number;
  /** 'ok' | 'beyond-infinite' (subsidence ≥ the β = ∞ value) | 'no-subsidence' (Y ≤ 0). */
  readonly status: 'ok' | 'beyond-infinite' | 'no-subsidence';
}

/**
 * Invert Si(β) + St(β, t) = Y for β on (1, ∞), solving in γ = 1 − 1/β ∈ (0, 1) with Brent's method.
 * Y at or beyond the β = ∞ value returns β = ∞ with status 'beyond-infinite' (never clamped silently).
 */
export function betaFromSubsidence(Y: number, t: number, p: McKenzieParams, form: ThermalForm = 'series'): BetaInversion {
  if (!(Y > 0)) return { beta: 1, status: 'no-subsidence' };
  const sMax = totalSubsidence(Infinity, t, p, form);
  if (Y >= sMax) return { beta: Infinity, status: 'beyond-infinite' };
  const f = (g: number) => totalSubsidence(g >= 1 ? Infinity : 1 / (1 - g), t, p, form) - Y;
  const g = brent(f, 0, 1, 1e-14);
  return { beta: g >= 1 ? Infinity : 1 / (1 - g), status: 'ok' };
}

/**
 * Whole grids at one t: total subsidence S and its inverse from tables, with no per-cell series
 * sums. S(γ) is smooth on γ = 1 − 1/β ∈ [0, 1] (the sinc terms tend to 1 at γ = 1), so a table of
 * `samples` + 1 values uniform in γ, linearly interpolated, is exact to h²/8·max|S''| (under 1e-5 m
 * at the default 16 384 samples; tests check 1e-4 m); the inverse γ(Y) is tabulated uniform in Y from the forward
 * table the same way. Where S is not monotone in β (possible for odd parameters) the inverse falls
 * back to Brent per cell. `total(β)` is S(β); `invert(Y)` is β (∞ at or beyond the β = ∞ value).
 */
export function makeBetaInverter(t: number, p: McKenzieParams, form: ThermalForm = 'series', samples = 16384): BetaInverter {
  // made once per parameter set (the last few kept): repeated runs with the same parameters get the
  // same functions back, so the per-cell call sites in derive stay monomorphic
  const key = JSON.stringify([t, p, form, samples]);
  let inv = inverters.get(key);
  if (inv) {
    inverters.delete(key); // most recent last
  } else {
    inv = buildBetaInverter(t, p, form, samples);
    if (inverters.size >= 8) inverters.delete(inverters.keys().next().value!);
  }
  inverters.set(key, inv);
  return inv;
}

export interface BetaInverter {
  readonly invert: (Y: number) => number;
  readonly total: (beta: number) => number;
  readonly sMax: number;
  readonly monotone: boolean;
}

const inverters = new Map<string, BetaInverter>();

function buildBetaInverter(t: number, p: McKenzieParams, form: ThermalForm, samples: number): BetaInverter {
  const ss = new Float64Array(samples + 1);
  for (let k = 0; k <= samples; k++) ss[k] = totalSubsidence(k === samples ? Infinity : 1 / (1 - k / samples), t, p, form);
  let monotone = true;
  for (let k = 1; k <= samples; k++) if (!(ss[k] > ss[k - 1])) monotone = false;
  const sMax = ss[samples];
  // γ(Y) on a uniform grid of Y over [0, sMax], from the forward table (piecewise-linear inverse)
  const inv = new Float64Array(samples + 1);
  if (monotone) {
    let q = 0;
    for (let k = 0; k <= samples; k++) {
      const y = ss[0] + ((sMax - ss[0]) * k) / samples;
      while (q < samples - 1 && ss[q + 1] < y) q++;
      inv[k] = (q + (y - ss[q]) / (ss[q + 1] - ss[q])) / samples;
    }
  }
  const total = (beta: number): number => {
    if (!(beta > 1)) return beta === beta ? ss[0] : NaN;
    const x = (beta === Infinity ? 1 : 1 - 1 / beta) * samples;
    const k = Math.min(samples - 1, Math.floor(x));
    return ss[k] + (ss[k + 1] - ss[k]) * (x - k);
  };
  const invert = (Y: number): number => {
    if (!(Y > 0)) return Y === Y ? 1 : NaN;
    if (Y >= sMax) return Infinity;
    if (!monotone) return betaFromSubsidence(Y, t, p, form).beta;
    const x = ((Y - ss[0]) / (sMax - ss[0])) * samples;
    if (x < 0) return 1;
    const k = Math.min(samples - 1, Math.floor(x));
    const g = inv[k] + (inv[k + 1] - inv[k]) * (x - k);
    return g >= 1 ? Infinity : 1 / (1 - g);
  };
  return { invert, total, sMax, monotone };
}
