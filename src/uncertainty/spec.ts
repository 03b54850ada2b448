/**
 * What a sweep varies and by how much: every knob with its default and the reason for it. A spec is
 * plain JSON (the CLI reads it from --uncertainty, the app from its panel, the project file keeps it).
 *
 * Parameters: each uncertain parameter is drawn from a normal distribution centred on the run's own
 * value with the standard deviation given here (0 = held fixed), then limited to the parameter's
 * allowed range (params.ts); how many draws were limited is reported.
 *
 * Surfaces: top basement and Moho each get a correlated random error e = σ(d)·Z, Z a unit-variance
 * field (field.ts) and d the distance to the nearest control (seismic line or pick, not excluded):
 *   σ(d) = σ_control + (σ_far − σ_control)·(1 − exp(−d/L))
 * small on the control, rising to σ_far over the length L (a choice: the shape of an exponential
 * variogram). Without any control, σ = σ_far everywhere. Depth conversion moves both surfaces with
 * one velocity model, so their errors share a part: Z_moho = ρ·Z_basement + √(1 − ρ²)·Z_2.
 */

import { PARAM_SPECS, ParamError, type Params } from '../params.js';

/** The one convention of every uncertainty figure (summary.ts), in words for the outputs and the app. */
export const CONVENTION =
  'Pq is what at least q % of the realisations reach: the P90 crustal taper limit is where continental crust reaches at least this far oceanward in 90 % of realisations; ' +
  'the P90 landward limit of oceanic crust, where oceanic crust reaches at least this far landward in 90 %; the P90 area or width, at least this much in 90 %. ' +
  'P90 is the cautious (low) case, P10 the generous one.';

export const SWEPT_PARAMS = ['tc0', 'rhoMantle', 'rhoCrust', 'taperThreshold', 'oceanicThreshold', 'riftAge'] as const;
export type SweptParam = (typeof SWEPT_PARAMS)[number];

export interface SurfaceError {
  /** Standard deviation on a control line or at a pick (m). */
  readonly sigmaControl: number;
  /** Standard deviation far from control (m). */
  readonly sigmaFar: number;
}

export interface UncertaintySpec {
  readonly realisations: number;
  readonly seed: number;
  /** Standard deviation of each swept parameter, in its own unit (0 = fixed). */
  readonly params: Readonly<Record<SweptParam, number>>;
  readonly basement: SurfaceError;
  readonly moho: SurfaceError;
  /** L: the distance from control over which σ rises to σ_far (m). */
  readonly rampLength: number;
  /** ℓ: the lag at which the errors' correlation falls to 1/e (m). */
  readonly correlationLength: number;
  /** ρ: the correlation between the basement and Moho errors (shared depth conversion). */
  readonly surfaceCorrelation: number;
}

export interface SpecDoc {
  readonly key: string;
  readonly unit: string;
  readonly doc: string;
  readonly source: string;
}

export const DEFAULT_SPEC: UncertaintySpec = {
  realisations: 200,
  seed: 1,
  params: { tc0: 2000, rhoMantle: 30, rhoCrust: 50, taperThreshold: 500, oceanicThreshold: 500, riftAge: 5 },
  basement: { sigmaControl: 50, sigmaFar: 250 },
  moho: { sigmaControl: 250, sigmaFar: 750 },
  rampLength: 15_000,
  correlationLength: 10_000,
  surfaceCorrelation: 0.6,
};

export const SPEC_DOCS: readonly SpecDoc[] = [
  { key: 'realisations', unit: '', doc: 'Number of realisations N (1–10 000).', source: 'a choice: 200 puts the P10/P90 within about 0.12 σ of their true place (sampling error of a 10 % quantile)' },
  { key: 'seed', unit: '', doc: 'Seed of the random numbers; the same seed gives the same output bytes.', source: 'a choice' },
  { key: 'params.tc0', unit: 'm', doc: 'σ of the reference crustal thickness. Moves the necking line and β.', source: 'from memory: unstretched crust beside margins is 30–40 km' },
  { key: 'params.rhoMantle', unit: 'kg/m³', doc: 'σ of the mantle density. Moves the isostatic diagnostics only: no domain rule uses it.', source: 'common practice (3250–3350 kg/m³)' },
  { key: 'params.rhoCrust', unit: 'kg/m³', doc: 'σ of the crust density. Moves the isostatic diagnostics only.', source: 'common practice (2750–2900 kg/m³)' },
  { key: 'params.taperThreshold', unit: 'm', doc: 'σ of the crustal taper threshold (where no picks calibrate it).', source: 'a choice: about the ±0.5 km noise of a depth-converted Moho pick (from memory)' },
  { key: 'params.oceanicThreshold', unit: 'm', doc: 'σ of the oceanic-crust threshold (where no picks calibrate it).', source: 'a choice: as the taper threshold, about the ±0.5 km noise of a Moho pick' },
  { key: 'params.riftAge', unit: 'Myr', doc: 'σ of the time since rifting (when a rift age is set). Moves the subsidence diagnostics and age ranges only.', source: 'a choice: stratigraphic dating of break-up unconformities is often good to a stage (±5 Myr)' },
  { key: 'basement.sigmaControl', unit: 'm', doc: 'σ of top basement on a seismic line or at a pick.', source: 'a choice: a basement pick on depth-converted seismic is good to tens of metres' },
  { key: 'basement.sigmaFar', unit: 'm', doc: 'σ of top basement far from control (gridding between lines).', source: 'a choice' },
  { key: 'moho.sigmaControl', unit: 'm', doc: 'σ of the Moho on a seismic line or at a pick.', source: 'a choice: the ±0.5 km depth-conversion noise of a Moho pick (from memory; as mohoTolerance) taken as two σ' },
  { key: 'moho.sigmaFar', unit: 'm', doc: 'σ of the Moho far from control (gravity-constrained or interpolated).', source: 'a choice: three times the σ on control. Larger values let thick spots bridge exhumed mantle and join the continental and oceanic sides more often (on the demo 0, 2, 7 and 22 of 40 realisations at 250, 500, 750 and 1 500 m)' },
  { key: 'rampLength', unit: 'm', doc: 'L in σ(d) = σc + (σf − σc)(1 − exp(−d/L)).', source: 'a choice: about half the spacing of a regional 2D grid' },
  { key: 'correlationLength', unit: 'm', doc: 'Lag at which the surface errors’ correlation falls to 1/e.', source: 'a choice: about the half-spacing of a regional 2D grid, the scale of gridding artefacts between lines' },
  { key: 'surfaceCorrelation', unit: '', doc: 'Correlation ρ between basement and Moho errors (one velocity model converts both); thickness error σ² = σb² + σm² − 2ρσbσm.', source: 'a choice' },
];

/** A spec from partial JSON over the defaults; throws ParamError naming the bad key. */
export function resolveSpec(raw: unknown, over: Partial<Pick<UncertaintySpec, 'realisations' | 'seed'>> = {}): UncertaintySpec {
  const obj = (raw ?? {}) as Record<string, unknown>;
  if (typeof obj !== 'object' || Array.isArray(obj)) throw new ParamError('the uncertainty spec must be a JSON object');
  const known = new Set(['realisations', 'seed', 'params', 'basement', 'moho', 'rampLength', 'correlationLength', 'surfaceCorrelation']);
  for (const k of Object.keys(obj)) if (!known.has(k)) throw new ParamError(`uncertainty spec: unknown key "${k}" (known: ${[...known].join(', ')})`);
  const num = (v: unknown, key: string, d: number, min: number, max: number, integer = false): number => {
    if (v === undefined) return d;
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new ParamError(`uncertainty spec: ${key} must be a number`);
    if (v < min || v > max) throw new ParamError(`uncertainty spec: ${key} = ${v} is outside ${min}–${max}`);
    if (integer && !Number.isInteger(v)) throw new ParamError(`uncertainty spec: ${key} must be a whole number`);
    return v;
  };
  const sub = (v: unknown, key: string): Record<string, unknown> => {
    if (v === undefined) return {};
    if (typeof v !== 'object' || v === null || Array.isArray(v)) throw new ParamError(`uncertainty spec: ${key} must be an object`);
    return v as Record<string, unknown>;
  };
  const p = sub(obj.params, 'params');
  for (const k of Object.keys(p)) if (!(SWEPT_PARAMS as readonly string[]).includes(k)) throw new ParamError(`uncertainty spec: params.${k} is not swept (swept: ${SWEPT_PARAMS.join(', ')})`);
  const params = Object.fromEntries(SWEPT_PARAMS.map((k) => [k, num(p[k], `params.${k}`, DEFAULT_SPEC.params[k], 0, 1e6)])) as Record<SweptParam, number>;
  const surface = (v: unknown, key: 'basement' | 'moho'): SurfaceError => {
    const s = sub(v, key);
    for (const k of Object.keys(s)) if (k !== 'sigmaControl' && k !== 'sigmaFar') throw new ParamError(`uncertainty spec: unknown key ${key}.${k}`);
    return { sigmaControl: num(s.sigmaControl, `${key}.sigmaControl`, DEFAULT_SPEC[key].sigmaControl, 0, 50_000), sigmaFar: num(s.sigmaFar, `${key}.sigmaFar`, DEFAULT_SPEC[key].sigmaFar, 0, 50_000) };
  };
  return {
    realisations: num(over.realisations ?? obj.realisations, 'realisations', DEFAULT_SPEC.realisations, 1, 10_000, true),
    seed: num(over.seed ?? obj.seed, 'seed', DEFAULT_SPEC.seed, 0, 2 ** 32 - 1, true),
    params,
    basement: surface(obj.basement, 'basement'),
    moho: surface(obj.moho, 'moho'),
    rampLength: num(obj.rampLength, 'rampLength', DEFAULT_SPEC.rampLength, 1, 1e7),
    correlationLength: num(obj.correlationLength, 'correlationLength', DEFAULT_SPEC.correlationLength, 0, 1e7),
    surfaceCorrelation: num(obj.surfaceCorrelation, 'surfaceCorrelation', DEFAULT_SPEC.surfaceCorrelation, -1, 1),
  };
}

/** A spec with no variance anywhere (every realisation is the deterministic run). */
export function zeroSpec(realisations: number, seed = 1): UncertaintySpec {
  return {
    ...DEFAULT_SPEC,
    realisations,
    seed,
    params: Object.fromEntries(SWEPT_PARAMS.map((k) => [k, 0])) as Record<SweptParam, number>,
    basement: { sigmaControl: 0, sigmaFar: 0 },
    moho: { sigmaControl: 0, sigmaFar: 0 },
  };
}

/** The parameters of one realisation: each swept one drawn about the run's value and kept in its range. */
export function sampleParams(base: Params, spec: UncertaintySpec, draw: () => number): { params: Params; limited: SweptParam[] } {
  const out: Params = { ...base };
  const limited: SweptParam[] = [];
  for (const k of SWEPT_PARAMS) {
    const z = draw(); // drawn for every parameter, so one parameter's σ never shifts another's draws
    const sd = spec.params[k];
    const v = base[k];
    if (sd === 0 || v === null) continue;
    const ps = PARAM_SPECS.find((s) => s.key === k)!;
    let x = v + sd * z;
    if (ps.min !== undefined && x < ps.min) (x = ps.min), limited.push(k);
    if (ps.max !== undefined && x > ps.max) (x = ps.max), limited.push(k);
    (out as unknown as Record<string, number>)[k] = x;
  }
  return { params: out, limited };
}
