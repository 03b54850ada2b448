/**
 * Every parameter of the pipeline in one typed object, with its unit, default, a one-line meaning and
 * where the default comes from. The app builds its parameter panel from PARAM_SPECS, the CLI documents
 * the params file from it, and the summary records the values used (defaults included).
 */

export type SedimentMode = 'compaction' | 'constant';
export type LithologyName = 'shale' | 'sandstone' | 'chalk' | 'shaly-sandstone' | 'custom';

export interface Params {
  tc0: number;
  rhoMantle: number;
  rhoCrust: number;
  rhoWater: number;
  sedimentMode: SedimentMode;
  lithology: LithologyName;
  customPhi0: number;
  customLambda: number;
  customRhoGrain: number;
  rhoSediment: number;
  lithosphereThickness: number;
  mantleTemperature: number;
  thermalExpansion: number;
  thermalTau: number;
  thermalForm: 'series' | 'first-term';
  riftAge: number | null;
  ageCurve: 'GDH1' | 'PS77';
  ageDepthUncertainty: number;
  mohoTolerance: number;
  basementTolerance: number;
  taperThreshold: number;
  oceanicThreshold: number;
  couplingThickness: number;
  neckingFraction: number;
  oceanicMin: number;
  oceanicMax: number;
  oceanwardAzimuth: number | null;
  minBlockArea: number;
  minBlockCells: number;
  tc0WarnFraction: number;
  pickReach: number;
  farFromControl: number;
  pickTrendTolerance: number;
  pickProxyDistance: number;
  smoothCells: number;
  simplifyTolerance: number;
}

export interface ParamSpec {
  readonly key: keyof Params;
  readonly label: string;
  readonly unit: string;
  readonly group: 'crust' | 'densities' | 'sediment' | 'subsidence' | 'age' | 'picks' | 'domains' | 'lines';
  readonly doc: string;
  readonly source: string;
  readonly min?: number;
  readonly max?: number;
  readonly choices?: readonly string[];
  readonly nullable?: boolean;
}

export const DEFAULT_PARAMS: Readonly<Params> = {
  tc0: 35_000,
  rhoMantle: 3300,
  rhoCrust: 2800,
  rhoWater: 1000,
  sedimentMode: 'compaction',
  lithology: 'shale',
  customPhi0: 0.55,
  customLambda: 2500,
  customRhoGrain: 2680,
  rhoSediment: 2400,
  lithosphereThickness: 125_000,
  mantleTemperature: 1333,
  thermalExpansion: 3.28e-5,
  thermalTau: 62.8,
  thermalForm: 'series',
  riftAge: null,
  ageCurve: 'GDH1',
  ageDepthUncertainty: 500,
  mohoTolerance: 500,
  basementTolerance: 50,
  taperThreshold: 2000,
  oceanicThreshold: 4000,
  couplingThickness: 10_000,
  neckingFraction: 0.8,
  oceanicMin: 5000,
  oceanicMax: 9000,
  oceanwardAzimuth: null,
  minBlockArea: 0,
  minBlockCells: 9,
  tc0WarnFraction: 0.05,
  pickReach: 5000,
  farFromControl: 25_000,
  pickTrendTolerance: 1500,
  pickProxyDistance: 10_000,
  smoothCells: 0,
  simplifyTolerance: 0,
};

export const PARAM_SPECS: readonly ParamSpec[] = [
  { key: 'tc0', label: 'Reference crustal thickness tc0', unit: 'm', group: 'crust', min: 5000, max: 80_000,
    doc: 'Unstretched continental crust; β = tc0/tc. Also McKenzie’s initial crustal thickness.', source: 'from memory: typical unstretched crust beside margins (30–40 km)' },
  { key: 'rhoMantle', label: 'Mantle density ρm', unit: 'kg/m³', group: 'densities', min: 2500, max: 4000,
    doc: 'One mantle density for the Airy balance, unloading and McKenzie’s ρ0.', source: 'common practice (Turcotte & Schubert use 3300)' },
  { key: 'rhoCrust', label: 'Crust density ρc', unit: 'kg/m³', group: 'densities', min: 2000, max: 3500,
    doc: 'Mean density of the crust.', source: 'common practice' },
  { key: 'rhoWater', label: 'Sea-water density ρw', unit: 'kg/m³', group: 'densities', min: 900, max: 1100,
    doc: 'Density of sea water and pore water.', source: 'common practice (1000–1030)' },
  { key: 'sedimentMode', label: 'Sediment density model', unit: '', group: 'sediment', choices: ['compaction', 'constant'],
    doc: 'Exponential compaction (Athy 1930) or one constant density.', source: 'Athy 1930; Sclater & Christie 1980' },
  { key: 'lithology', label: 'Compaction lithology', unit: '', group: 'sediment', choices: ['shale', 'sandstone', 'chalk', 'shaly-sandstone', 'custom'],
    doc: 'Porosity–depth parameters for the compaction model.', source: 'Sclater & Christie 1980 via Wangen 2010, Table 2.1' },
  { key: 'customPhi0', label: 'Custom surface porosity φ0', unit: '', group: 'sediment', min: 0, max: 0.95,
    doc: 'Used when the lithology is “custom”.', source: 'user choice' },
  { key: 'customLambda', label: 'Custom compaction length λ', unit: 'm', group: 'sediment', min: 100, max: 20_000,
    doc: 'Used when the lithology is “custom”: φ = φ0·exp(−z/λ).', source: 'user choice' },
  { key: 'customRhoGrain', label: 'Custom grain density', unit: 'kg/m³', group: 'sediment', min: 2000, max: 3200,
    doc: 'Used when the lithology is “custom”.', source: 'user choice' },
  { key: 'rhoSediment', label: 'Constant sediment density', unit: 'kg/m³', group: 'sediment', min: 1100, max: 3000,
    doc: 'Used when the sediment model is “constant”.', source: 'common practice (2200–2500 for post-rift sediment)' },
  { key: 'lithosphereThickness', label: 'Lithosphere thickness a', unit: 'm', group: 'subsidence', min: 50_000, max: 300_000,
    doc: 'Thickness of the thermal plate in McKenzie’s model.', source: 'McKenzie 1978 (125 km)' },
  { key: 'mantleTemperature', label: 'Base-plate temperature Tm', unit: '°C', group: 'subsidence', min: 800, max: 2000,
    doc: 'Temperature at the base of the plate.', source: 'McKenzie 1978 (1333 °C)' },
  { key: 'thermalExpansion', label: 'Thermal expansion α', unit: '1/°C', group: 'subsidence', min: 1e-6, max: 1e-4,
    doc: 'Volumetric thermal expansion coefficient.', source: 'McKenzie 1978 (3.28e-5)' },
  { key: 'thermalTau', label: 'Thermal time constant τ', unit: 'Myr', group: 'subsidence', min: 1, max: 500,
    doc: 'τ = a²/(π²κ); given explicitly (62.8 Myr in McKenzie’s set).', source: 'McKenzie 1978 (62.8 Myr)' },
  { key: 'thermalForm', label: 'Thermal subsidence form', unit: '', group: 'subsidence', choices: ['series', 'first-term'],
    doc: 'Whole Fourier series, or its first term (differs by up to ~740 m at large β).', source: 'McKenzie 1978' },
  { key: 'riftAge', label: 'Time since rifting ended', unit: 'Myr', group: 'subsidence', min: 0, max: 500, nullable: true,
    doc: 'Needed for the predicted depth, the residual and β from subsidence; empty = not computed.', source: 'user input (no default)' },
  { key: 'ageCurve', label: 'Age–depth curve', unit: '', group: 'age', choices: ['GDH1', 'PS77'],
    doc: 'Ocean depth against age for the indicative oceanic age.', source: 'Stein & Stein 1992 (GDH1); Parsons & Sclater 1977' },
  { key: 'ageDepthUncertainty', label: 'Depth uncertainty for ages', unit: 'm', group: 'age', min: 0, max: 3000,
    doc: 'Half-width of the depth band turned into the age range (residual depth anomalies, pick error).', source: 'common practice: residual depth anomalies of several hundred metres' },
  { key: 'mohoTolerance', label: 'Moho-above-basement tolerance', unit: 'm', group: 'picks', min: 0, max: 5000,
    doc: 'Moho above basement by less than this is zero crust (β unbounded); by more, a pick error.', source: 'a choice above typical pick noise' },
  { key: 'basementTolerance', label: 'Basement-above-seabed tolerance', unit: 'm', group: 'picks', min: 0, max: 1000,
    doc: 'Basement above seabed by less than this is outcropping basement (no sediment); by more, a pick error.', source: 'a choice above typical pick noise' },
  { key: 'taperThreshold', label: 'Crustal taper threshold', unit: 'm', group: 'domains', min: 0, max: 10_000,
    doc: 'Crust thinner than this is no longer counted as continental: places the crustal taper limit (where no continental-limit picks calibrate it).', source: 'a choice above typical pick noise, not a published constant' },
  { key: 'oceanicThreshold', label: 'Oceanic-crust threshold', unit: 'm', group: 'domains', min: 0, max: 20_000,
    doc: 'Crust at least this thick, connected to the oceanward edge, is oceanic: places the landward limit of oceanic crust (where no oceanic-limit picks calibrate it). Thinner crust between it and the taper limit is the COT zone.',
    source: 'a choice: thin first oceanic crust at magma-poor margins lies below the 6–7 km of normal oceanic crust (White et al. 1992: 7.1 ± 0.8 km), so the threshold sits below the typical range, yet well above the taper threshold so that exhumed mantle (whose serpentinisation base reads as a few km of “crust”) stays in the transition' },
  { key: 'couplingThickness', label: 'Coupling thickness', unit: 'm', group: 'domains', min: 1000, max: 30_000,
    doc: 'Thickness below which the whole crust is brittle (coupling line; necking/hyperextended limit).', source: 'Sutra et al. 2013 (~10 km), from memory' },
  { key: 'neckingFraction', label: 'Necking limit (fraction of tc0)', unit: '', group: 'domains', min: 0.3, max: 1,
    doc: 'Crust thinner than this fraction of tc0 is necked (β > 1/fraction).', source: 'common practice (0.8, β ≤ 1.25 proximal)' },
  { key: 'oceanicMin', label: 'Typical oceanic crust, minimum', unit: 'm', group: 'domains', min: 0, max: 20_000,
    doc: 'Oceanic crust thinner than this is flagged as atypical.', source: 'White, McKenzie & O’Nions 1992 (7.1 ± 0.8 km); Chen 1992 (~6 km)' },
  { key: 'oceanicMax', label: 'Typical oceanic crust, maximum', unit: 'm', group: 'domains', min: 0, max: 30_000,
    doc: 'Oceanic crust thicker than this is flagged as atypical (magmatic margins?).', source: 'White, McKenzie & O’Nions 1992' },
  { key: 'oceanwardAzimuth', label: 'Oceanward azimuth', unit: '° from grid north', group: 'domains', min: 0, max: 360, nullable: true,
    doc: 'Direction towards the ocean; empty = from a plane fit of water-loaded basement depth.', source: 'user input, or plane fit' },
  { key: 'minBlockArea', label: 'Minimum mapped continental block', unit: 'km²', group: 'domains', min: 0, max: 1e6,
    doc: 'Isolated continental blocks smaller than this (or than the minimum block cells) are not mapped as blocks: like thin cells, they take the domain of what encloses them (oceanic inside oceanic crust, else transition).', source: 'user choice (0 = only the cell-count limit applies)' },
  { key: 'minBlockCells', label: 'Minimum mapped block, cells', unit: 'cells', group: 'domains', min: 1, max: 1e6,
    doc: 'An isolated continental block must span at least this many analysis cells to be mapped.', source: 'a choice: 9 cells (3 × 3) — a smaller thick spot is not resolved by the grid and is more likely pick noise than a block' },
  { key: 'tc0WarnFraction', label: 'tc0 suggestion warning', unit: 'fraction', group: 'crust', min: 0, max: 1,
    doc: 'Warn when the data-based tc0 suggestion (95th percentile of crustal thickness) differs from tc0 by more than this fraction of tc0.', source: 'a choice: 5 % (1.75 km of 35 km) changes proximal β by 0.05' },
  { key: 'pickReach', label: 'Reach of a pick', unit: 'm', group: 'lines', min: 0, max: 100_000,
    doc: 'Line pieces within this distance of a pick are labelled as placed by picks; farther ones by the proxy.', source: 'a choice: about the lateral resolution of one 2D section' },
  { key: 'farFromControl', label: 'Far from control', unit: 'm', group: 'lines', min: 0, max: 500_000,
    doc: 'Proxy line pieces farther than this from every pick and seismic line are marked far from control (drawn dotted).', source: 'a choice: about the spacing of a regional 2D grid; beyond it a line is unconstrained interpolation' },
  { key: 'pickTrendTolerance', label: 'Suspect pick: thickness departure', unit: 'm', group: 'picks', min: 0, max: 50_000,
    doc: 'A pick whose crustal thickness departs from the along-strike trend of the other picks of its kind by more than this is flagged as suspect.', source: 'a choice: well above the ±0.5 km depth-conversion noise of a Moho pick (from memory)' },
  { key: 'pickProxyDistance', label: 'Suspect pick: distance from proxy', unit: 'm', group: 'picks', min: 0, max: 500_000,
    doc: 'A pick farther than this from the uncalibrated proxy line of its kind is flagged as suspect.', source: 'a choice: twice the reach of a pick' },
  { key: 'smoothCells', label: 'Grid smoothing before contouring', unit: 'cells', group: 'lines', min: 0, max: 20,
    doc: 'Half-width of a NaN-aware box smoothing of the grid before lines are traced (0 = none).', source: 'user choice' },
  { key: 'simplifyTolerance', label: 'Line simplification tolerance', unit: 'm', group: 'lines', min: 0, max: 10_000,
    doc: 'Douglas–Peucker tolerance for exported lines and the COT polygon, applied so that shared borders stay shared (0 = every contour vertex).', source: 'user choice' },
];

export class ParamError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ParamError';
  }
}

/** The known key nearest to a misspelt one (Levenshtein distance ≤ 3, or a case-insensitive match), or null. */
export function nearestKey(key: string, known: readonly string[]): string | null {
  let best: string | null = null;
  let bestD = Infinity;
  for (const k of known) {
    if (k.toLowerCase() === key.toLowerCase()) return k;
    const d = levenshtein(key.toLowerCase(), k.toLowerCase());
    if (d < bestD) (bestD = d), (best = k);
  }
  return bestD <= Math.min(3, Math.max(1, Math.floor(key.length / 3))) ? best : null;
}

function levenshtein(a: string, b: string): number {
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const cur = [i];
    for (let j = 1; j <= b.length; j++) cur[j] = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
    prev = cur;
  }
  return prev[b.length];
}

/** Merge user values over the defaults and validate; unknown keys and impossible values are errors. */
export function resolveParams(user: Partial<Record<string, unknown>> = {}, extraKeys?: readonly string[]): Params {
  const p: Record<string, unknown> = { ...DEFAULT_PARAMS };
  const known = new Map(PARAM_SPECS.map((s) => [s.key as string, s]));
  for (const [k, v] of Object.entries(user)) {
    const spec = known.get(k);
    if (!spec) {
      const near = nearestKey(k, [...known.keys(), ...(extraKeys ?? [])]);
      throw new ParamError(`unknown parameter "${k}"${near ? ` — did you mean "${near}"?` : ''} (taperline --help lists them all)`);
    }
    if (v === null || v === undefined || v === '') {
      if (!spec.nullable) throw new ParamError(`parameter ${k} needs a value`);
      p[k] = null;
      continue;
    }
    if (spec.choices) {
      if (typeof v !== 'string' || !spec.choices.includes(v)) throw new ParamError(`parameter ${k} must be one of ${spec.choices.join(', ')}; got ${JSON.stringify(v)}`);
      p[k] = v;
      continue;
    }
    // a JSON number, not a string that happens to parse ("0x8000" is not 32 768 m of crust)
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new ParamError(`parameter ${k} must be a number${spec.unit ? ` (${spec.unit})` : ''}; got ${JSON.stringify(v)}`);
    const n = v;
    if ((spec.min !== undefined && n < spec.min) || (spec.max !== undefined && n > spec.max)) {
      throw new ParamError(`parameter ${k} = ${n} ${spec.unit} is outside ${spec.min}…${spec.max} ${spec.unit}`.trim());
    }
    p[k] = n;
  }
  const q = p as unknown as Params;
  const fail = (m: string) => {
    throw new ParamError(m);
  };
  if (!(q.rhoMantle > q.rhoCrust)) fail(`mantle density (${q.rhoMantle}) must exceed crust density (${q.rhoCrust})`);
  if (!(q.rhoCrust > q.rhoWater)) fail(`crust density (${q.rhoCrust}) must exceed water density (${q.rhoWater})`);
  if (!(q.rhoMantle > q.rhoSediment && q.rhoSediment > q.rhoWater)) fail(`sediment density (${q.rhoSediment}) must lie between water and mantle densities`);
  if (!(q.customRhoGrain < q.rhoMantle)) fail('custom grain density must be below the mantle density');
  if (!(q.taperThreshold < q.couplingThickness)) fail(`taper threshold (${q.taperThreshold} m) must be below the coupling thickness (${q.couplingThickness} m)`);
  if (!(q.couplingThickness < q.neckingFraction * q.tc0)) fail(`coupling thickness (${q.couplingThickness} m) must be below the necking limit ${q.neckingFraction} × tc0 = ${q.neckingFraction * q.tc0} m`);
  if (!(q.oceanicMin < q.oceanicMax)) fail('typical oceanic thickness: minimum must be below maximum');
  if (q.tc0 >= q.lithosphereThickness) fail('reference crust must be thinner than the lithosphere');
  return q;
}
