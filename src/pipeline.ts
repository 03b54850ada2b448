/**
 * The one pure function both shells call: grids, evidence and parameters in; derived grids, domains,
 * boundaries, areas and a summary out. No files, no DOM, no clock (the caller passes `now`).
 */

import { crsFromEpsg, WGS84 } from './crs/registry.js';
import { transformer } from './crs/transform.js';
import { densify } from './crs/densify.js';
import { cellAreaRows, rasterizeRings, type CellAreaRows } from './grid/cell-area.js';
import { extentOf, sameGeometry, xToCol, yToRow, type GridGeometry } from './grid/geometry.js';
import type { Grid } from './grid/grid.js';
import { resample, sampleBilinear } from './grid/resample.js';
import { derive, gridOf, type Derived } from './derive/derive.js';
import { classify, FORCE_CONTINENTAL, FORCE_OCEANIC, FORCE_TRANSITION, type Classified } from './domains/classify.js';
import { applyDomains, type Applied } from './derive/applicability.js';
import { nearestIsochronAge } from './derive/isochron-age.js';
import type { DerivedName } from './derive/grids.js';
import { checkPicks, type PickCheck } from './boundaries/pick-checks.js';
import { onlapOffset, strikeOf } from './boundaries/onlap.js';
import { oceanwardFromAzimuth, oceanwardFromDepth, type Oceanward } from './domains/direction.js';
import { calibrateThreshold, type Calibration } from './boundaries/calibrate.js';
import { extractBoundaries, traceSideLine, type BoundaryResult, type Isochron, type Pick } from './boundaries/extract.js';
import { simplifyPath, type Ring } from './boundaries/planar.js';
import { smoothGrid } from './boundaries/smooth.js';
import { InputError } from './io/errors.js';
import type { GridReadReport } from './io/report.js';
import { expectKinds, type VectorSet } from './io/geojson-read.js';
import { resolveParams, type Params } from './params.js';

export interface InputMeta {
  readonly name: string;
  readonly bytes?: number;
  readonly sha256?: string;
}

export interface GridInput extends InputMeta {
  readonly grid: Grid;
  readonly report?: GridReadReport;
}

export interface VectorInput extends InputMeta {
  readonly set: VectorSet;
}

export interface PipelineInputs {
  readonly basement: GridInput;
  readonly moho: GridInput;
  readonly seabed?: GridInput | null;
  readonly licence?: VectorInput | null;
  readonly lines?: VectorInput | null;
  readonly picks?: VectorInput | null;
  readonly isochrons?: VectorInput | null;
  readonly crust?: VectorInput | null;
}

export interface PipelineOptions {
  readonly params?: Partial<Record<string, unknown>>;
  readonly onProgress?: (stage: string, fraction: number) => void;
  /** Reuse of the derived grids between runs, owned by the caller (see createPipelineCache). */
  readonly cache?: PipelineCache;
  /** Ids of picks the user excluded: shown and checked, never used to place a line or as control. */
  readonly excludePicks?: readonly string[];
  /**
   * A one-shot batch run: only these derived grids are kept in the result (with those the run itself
   * needs, derive NEEDED), and each is masked to its domains in place rather than copied, so the run
   * holds one copy of each kept grid and none of the others. Not with `cache` (that reuses raw grids).
   */
  readonly keepGrids?: ReadonlySet<DerivedName>;
  /** The oceanward direction to use instead of fitting it (the uncertainty sweep holds it fixed). */
  readonly oceanward?: Oceanward;
  /** Derive only what the domains read (crustal and sediment thickness): the sweep's realisations, with `oceanward` given. */
  readonly thicknessOnly?: boolean;
}

/** Parameters that only affect domains and lines: changing them does not recompute the derived grids. */
const LINE_ONLY: readonly (keyof Params)[] = [
  'taperThreshold', 'oceanicThreshold', 'couplingThickness', 'neckingFraction', 'oceanicMin', 'oceanicMax', 'oceanwardAzimuth', 'minBlockArea',
  'minBlockCells', 'tc0WarnFraction', 'pickReach', 'farFromControl', 'pickTrendTolerance', 'pickProxyDistance', 'smoothCells', 'simplifyTolerance',
];

export interface PipelineCache {
  projected?: { source: Float32Array; geometry: GridGeometry; values: Float32Array };
  areas?: CellAreaRows;
  /** Rasters of vector evidence (isochron ages, the licence mask): depend on the file and the grid only. */
  rasters?: Map<string, { source: VectorInput; geometry: GridGeometry; values: Float32Array | Uint8Array }>;
  /** Vector evidence in the analysis CRS (every part of every feature, densified): depends on the file and the CRS only. */
  mapped?: WeakMap<VectorInput, { crs: string; parts: Ring[][] }>;
  /** The data mask of a set of derived grids (basement, and seabed and sediment where given): depends on them only; never written. */
  valid?: WeakMap<Derived, Uint8Array>;
  /** The mean cell area (m²) of a geometry's cell-area rows. */
  meanCell?: WeakMap<CellAreaRows, number>;
  entry: { basement: Float32Array; moho: GridInput; seabed: GridInput | null; key: string; derived: Derived; mohoA: Float32Array; seabedA: Float32Array | null; warnings: string[] } | null;
}

/** A cache for interactive use: a parameter change that touches only domains or lines reuses the grids. */
export function createPipelineCache(): PipelineCache {
  return { entry: null };
}

function deriveKey(p: Params): string {
  return JSON.stringify(Object.entries(p).filter(([k]) => !LINE_ONLY.includes(k as keyof Params)));
}

export interface DomainArea {
  readonly code: number;
  readonly cells: number;
  readonly km2: number;
}

export interface PipelineResult {
  readonly params: Params;
  readonly geometry: GridGeometry;
  /** Raw derived grids (every model over every cell; may hold ±∞): for reuse, never for display. In a keepGrids run: the masked grids themselves. */
  readonly derived: Derived;
  /** The derived grids as shown and exported: each masked to the domains where its model applies, no ±∞. Every one, unless keepGrids chose. */
  readonly grids: Partial<Record<DerivedName, Float32Array>>;
  readonly applied: Applied;
  readonly classified: Classified;
  /** Consistency checks of every pick (excluded ones included). */
  readonly pickChecks: PickCheck[];
  /** Which parameter or which picks placed each thickness line, in words. */
  readonly placedBy: { taper: string; oceanic: string };
  readonly oceanward: Oceanward;
  readonly calibration: { taper: Calibration | null; ocean: Calibration | null };
  readonly boundaries: BoundaryResult;
  readonly areas: { readonly total: DomainArea[]; readonly inLicence: DomainArea[] | null };
  readonly licenceName: string | null;
  /** Vector evidence in the analysis CRS, for display and sections (picks include excluded ones, marked). */
  readonly evidence: { picks: Pick[]; lines: { name: string; coords: Ring[] }[]; isochrons: Isochron[]; licence: Ring[] | null };
  readonly inputs: PipelineInputs;
  /** The depth grids on the analysis grid (resampled where needed), metres positive down. */
  readonly analysis: { readonly seabed: Float32Array | null; readonly basement: Float32Array; readonly moho: Float32Array };
  readonly warnings: string[];
}

/** The analysis geometry: the basement grid's own, or for a degree grid a UTM grid of similar resolution. */
function analysisGrid(basement: GridInput, warnings: string[], cache?: PipelineCache): { geometry: GridGeometry; basementValues: Float32Array } {
  const g = basement.grid.geometry;
  if (g.crs.units !== 'degree') return { geometry: g, basementValues: basement.grid.values };
  const hit = cache?.projected?.source === basement.grid.values ? cache.projected : null;
  const e = extentOf(g);
  const lon = (e.xmin + e.xmax) / 2;
  const lat = (e.ymin + e.ymax) / 2;
  const zone = Math.min(60, Math.max(1, Math.floor((lon + 180) / 6) + 1));
  const utm = crsFromEpsg((lat >= 0 ? 32600 : 32700) + zone);
  warnings.push(`${basement.name} is in geographic coordinates: analysed on ${utm.name} (${utm.id}) so that lengths, spacings and areas are in metres`);
  if (hit) return { geometry: hit.geometry, basementValues: hit.values };
  const t = transformer(g.crs, utm);
  let xmin = Infinity, xmax = -Infinity, ymin = Infinity, ymax = -Infinity;
  for (let q = 0; q <= 20; q++) {
    for (const [x, y] of [[e.xmin + ((e.xmax - e.xmin) * q) / 20, e.ymin], [e.xmin + ((e.xmax - e.xmin) * q) / 20, e.ymax], [e.xmin, e.ymin + ((e.ymax - e.ymin) * q) / 20], [e.xmax, e.ymin + ((e.ymax - e.ymin) * q) / 20]]) {
      const [u, v] = t.forward([x, y]);
      xmin = Math.min(xmin, u); xmax = Math.max(xmax, u); ymin = Math.min(ymin, v); ymax = Math.max(ymax, v);
    }
  }
  // cell size: the grid's north–south spacing in metres (1° of latitude ≈ 111.2 km), rounded to 10 m
  const cell = Math.max(10, Math.round((Math.abs(g.dy) * 111_195) / 10) * 10);
  const nx = Math.max(1, Math.ceil((xmax - xmin) / cell));
  const ny = Math.max(1, Math.ceil((ymax - ymin) / cell));
  const geometry: GridGeometry = { nx, ny, x0: xmin + cell / 2, y0: ymax - cell / 2, dx: cell, dy: -cell, registration: 'area', crs: utm };
  const values = resample(basement.grid, geometry).values;
  if (cache) cache.projected = { source: basement.grid.values, geometry, values };
  return { geometry, basementValues: values };
}

/**
 * The pipeline up to the domains: analysis grid, derived grids, oceanward direction, evidence in the
 * analysis CRS, calibrated thresholds and the classification. `runPipeline` goes on from it; the
 * uncertainty sweep stops here for each realisation (so a realisation is classified exactly as a run is).
 */
export function runDomainStage(inputs: PipelineInputs, options: PipelineOptions = {}): DomainStage {
  const progress = options.onProgress ?? (() => {});
  const params = resolveParams(options.params ?? {});
  const warnings: string[] = [];
  // The analysis grid is the top-basement grid's geometry; a geographic (degree) basement grid is
  // first resampled onto the UTM zone of its centre, so that lengths, spacings and areas are metric.
  const { geometry, basementValues } = analysisGrid(inputs.basement, warnings, options.cache);
  const n = geometry.nx * geometry.ny;

  const key = deriveKey(params);
  const hit = options.cache?.entry;
  const reuse = hit && hit.basement === basementValues && hit.moho === inputs.moho && hit.seabed === (inputs.seabed ?? null) && hit.key === key ? hit : null;
  progress('resampling', 0.05);
  const onAnalysis = (inp: GridInput | null | undefined): Float32Array | null => {
    if (!inp) return null;
    if (sameGeometry(inp.grid.geometry, geometry)) return inp.grid.values;
    const r = resample(inp.grid, geometry).values;
    let valid = 0;
    for (let k = 0; k < n; k++) if (r[k] === r[k]) valid++;
    if (valid === 0) throw new InputError(inp.name, `does not overlap the top-basement grid (${inputs.basement.name})`);
    warnings.push(`${inp.name} resampled onto the analysis grid (${inputs.basement.name}); ${((100 * valid) / n).toFixed(1)}% of cells covered`);
    return r;
  };
  const moho = reuse ? reuse.mohoA : onAnalysis(inputs.moho)!;
  const seabed = reuse ? reuse.seabedA : onAnalysis(inputs.seabed);

  progress('derived grids', 0.15);
  if (options.keepGrids && options.cache) throw new Error('runPipeline: keepGrids is for one-shot runs, not with a cache');
  if (options.thicknessOnly && !options.oceanward) throw new Error('runDomainStage: thicknessOnly needs the oceanward direction given');
  const derived = reuse ? reuse.derived : derive({ seabed, basement: basementValues, moho }, params, options.keepGrids, options.thicknessOnly);
  if (options.cache && !reuse) {
    options.cache.entry = { basement: basementValues, moho: inputs.moho, seabed: inputs.seabed ?? null, key, derived, mohoA: moho, seabedA: seabed, warnings: [...warnings] };
  }
  let validMoho = 0;
  for (let k = 0; k < n; k++) if (moho[k] === moho[k] && basementValues[k] === basementValues[k]) validMoho++;
  if (validMoho > 0 && derived.flags.mohoAboveBasement > 0.5 * validMoho) {
    throw new InputError(
      inputs.moho.name,
      `lies above the top basement (${inputs.basement.name}) in ${((100 * derived.flags.mohoAboveBasement) / validMoho).toFixed(0)}% of cells: are the Moho and top-basement files swapped?`,
    );
  }
  warnings.push(...derived.warnings);
  if (reuse) for (const w of reuse.warnings) if (!warnings.includes(w)) warnings.push(w);
  if (Number.isFinite(derived.suggestedTc0) && Math.abs(derived.suggestedTc0 - params.tc0) > params.tc0WarnFraction * params.tc0) {
    warnings.push(
      `reference thickness: the data suggest tc0 ≈ ${(derived.suggestedTc0 / 1000).toFixed(2)} km (95th percentile of crustal thickness over the grid) ` +
        `while tc0 = ${(params.tc0 / 1000).toFixed(2)} km is in use, a difference of ${((100 * Math.abs(derived.suggestedTc0 - params.tc0)) / params.tc0).toFixed(1)} % ` +
        `(warning above ${(100 * params.tc0WarnFraction).toFixed(0)} %); tc0 was not changed — β, γ and the McKenzie grids depend on it`,
    );
  }

  progress('oceanward direction', 0.45);
  let oceanward: Oceanward;
  if (options.oceanward) oceanward = options.oceanward;
  else if (params.oceanwardAzimuth !== null) oceanward = oceanwardFromAzimuth(params.oceanwardAzimuth);
  else {
    const fit = oceanwardFromDepth(geometry, seabed ? gridOf(derived.grids, 'water-loaded-basement') : basementValues);
    if (fit) oceanward = fit;
    else {
      oceanward = oceanwardFromAzimuth(90);
      warnings.push('oceanward direction could not be fitted (too few cells): east (90°) assumed; set it explicitly');
    }
  }

  // Vector evidence into the analysis CRS.
  const toMap = (v: VectorInput, ring: [number, number][]): Ring => {
    const t = transformer(v.set.crs, geometry.crs);
    const dense = v.set.crs.id === WGS84.id ? densify(ring, 0.01) : ring;
    return dense.map((p) => t.forward(p) as [number, number]);
  };
  const check = (v: VectorInput | null | undefined, role: Parameters<typeof expectKinds>[1]) => {
    if (!v) return null;
    expectKinds(v.set, role);
    warnings.push(...v.set.warnings.map((w) => `${v.name}: ${w}`));
    return v;
  };
  const licenceIn = check(inputs.licence, 'licence');
  const linesIn = check(inputs.lines, 'lines');
  const picksIn = check(inputs.picks, 'picks');
  const isoIn = check(inputs.isochrons, 'isochrons');
  const crustIn = check(inputs.crust, 'crust');
  /** Every part of every feature in the analysis CRS, reused between interactive runs while the file and the CRS stay (never changed downstream). */
  const mapAll = (v: VectorInput): Ring[][] => {
    const crs = `${geometry.crs.id} ${geometry.crs.proj4}`;
    const hit = options.cache?.mapped?.get(v);
    if (hit && hit.crs === crs) return hit.parts;
    const parts = v.set.features.map((f) => f.parts.map((r) => toMap(v, r)));
    if (options.cache) (options.cache.mapped ??= new WeakMap()).set(v, { crs, parts });
    return parts;
  };
  const licence = licenceIn ? mapAll(licenceIn).flat() : null;
  const excluded = new Set(options.excludePicks ?? []);
  const allPicks = picksIn ? pickIdentities(picksIn, (r) => toMap(picksIn, r)[0], excluded) : [];
  for (const id of excluded) if (!allPicks.some((q) => q.id === id)) warnings.push(`excluded pick "${id}" is not in the picks file: nothing excluded for it`);
  const picks = allPicks.filter((q) => !q.excluded);
  if (picks.length < allPicks.length) warnings.push(`${allPicks.length - picks.length} pick${allPicks.length - picks.length > 1 ? 's' : ''} excluded by the user: ${allPicks.filter((q) => q.excluded).map((q) => q.id).join(', ')}`);
  const linesMapped = linesIn ? mapAll(linesIn) : [];
  const lines = linesIn ? linesIn.set.features.map((f, k) => ({ name: String(f.properties.name ?? `line ${k + 1}`), coords: linesMapped[k] })) : [];
  const isoMapped = isoIn ? mapAll(isoIn) : [];
  const isochrons: Isochron[] = isoIn
    ? isoIn.set.features.map((f, k) => ({ coords: isoMapped[k][0], age: Number(f.properties.age_ma), label: f.properties.label as string | undefined }))
    : [];

  /** A raster of a vector input, reused between interactive runs while the file and the grid stay. */
  function rasterOf<T extends Float32Array | Uint8Array>(key: string, source: VectorInput, make: () => T): T {
    const hit = options.cache?.rasters?.get(key);
    if (hit && hit.source === source && sameGeometry(hit.geometry, geometry)) return hit.values as T;
    const values = make();
    if (options.cache) (options.cache.rasters ??= new Map()).set(key, { source, geometry, values });
    return values;
  }

  progress('domains', 0.55);
  const tcRaw = gridOf(derived.grids, 'crustal-thickness');
  const tc = params.smoothCells > 0 ? smoothGrid(tcRaw, geometry.nx, geometry.ny, params.smoothCells) : tcRaw;
  const calibrate = (kind: Pick['kind'], fallback: number) => {
    const sel = picks.filter((q) => q.kind === kind);
    if (!sel.length) return null;
    const c = calibrateThreshold(geometry, tc, sel, oceanward, fallback);
    for (const s of c.skipped) warnings.push(`${kind} pick${s.line ? ` on ${s.line}` : ''} at (${s.x.toFixed(0)}, ${s.y.toFixed(0)}) not used: ${s.reason}`);
    return c.points.length ? c : null;
  };
  // Each thickness line has its own threshold: the taper threshold places the crustal taper limit,
  // the oceanic-crust threshold the landward limit of oceanic crust; picks of each kind calibrate
  // only their own line.
  const calTaper = calibrate('continental-limit', params.taperThreshold);
  const calOcean = calibrate('oceanic-limit', params.oceanicThreshold);
  const placedBy = {
    taper: calTaper ? `calibrated to ${calTaper.points.length} continental-limit pick${calTaper.points.length > 1 ? 's' : ''} (crustal thickness at each pick, interpolated along strike; taperThreshold not used)` : `parameter taperThreshold = ${params.taperThreshold} m`,
    oceanic: calOcean ? `calibrated to ${calOcean.points.length} oceanic-limit pick${calOcean.points.length > 1 ? 's' : ''} (crustal thickness at each pick, interpolated along strike; oceanicThreshold not used)` : `parameter oceanicThreshold = ${params.oceanicThreshold} m`,
  };
  if (params.taperThreshold > params.oceanicThreshold) {
    warnings.push(`the taper threshold (${params.taperThreshold} m) is above the oceanic-crust threshold (${params.oceanicThreshold} m): crust between them counts as both; the COT zone may vanish`);
  }

  let force: Uint8Array | undefined;
  if (crustIn) {
    force = new Uint8Array(n);
    for (const f of crustIn.set.features) {
      const mask = rasterizeRings(geometry, f.parts.map((r) => toMap(crustIn, r)));
      const code = f.properties.crust === 'continental' ? FORCE_CONTINENTAL : f.properties.crust === 'oceanic' ? FORCE_OCEANIC : FORCE_TRANSITION;
      for (let k = 0; k < n; k++) if (mask[k]) force[k] = code;
    }
  }
  // a cell has data when its basement does and, with a seabed grid, its seabed and sediment do (no pick error)
  let valid = options.cache?.valid?.get(derived);
  if (!valid) {
    valid = new Uint8Array(n);
    const b = basementValues;
    const sed = gridOf(derived.grids, 'sediment-thickness');
    for (let k = 0; k < n; k++) valid[k] = b[k] === b[k] && (!seabed || sed[k] === sed[k]) ? 1 : 0;
    if (options.cache) (options.cache.valid ??= new WeakMap()).set(derived, valid);
  }
  // a keepGrids run lets go of the sediment grid here unless asked for (only the mask above reads it)
  if (options.keepGrids && !options.keepGrids.has('sediment-thickness')) delete derived.grids['sediment-thickness'];
  // geodesic cell areas depend on the geometry only: reuse them between interactive runs; summed
  // row by row (never a grid of them)
  const areaRows = options.cache?.areas && sameGeometry(options.cache.areas.geometry, geometry) ? options.cache.areas : cellAreaRows(geometry);
  if (options.cache) options.cache.areas = areaRows;
  let meanCell = options.cache?.meanCell?.get(areaRows);
  if (meanCell === undefined) {
    const rowAreas = new Float64Array(geometry.nx);
    meanCell = 0;
    for (let j = 0; j < geometry.ny; j++) {
      areaRows.row(j, rowAreas);
      for (let i = 0; i < geometry.nx; i++) meanCell += rowAreas[i];
    }
    meanCell /= n;
    if (options.cache) (options.cache.meanCell ??= new WeakMap()).set(areaRows, meanCell);
  }
  const classifyAt = (taperLevel: Float32Array | number, oceanLevel: Float32Array | number) =>
    classify({
      geometry,
      thickness: tc,
      valid,
      taperLevel,
      oceanLevel,
      oceanward,
      tc0: params.tc0,
      neckingFraction: params.neckingFraction,
      couplingThickness: params.couplingThickness,
      oceanicMin: params.oceanicMin,
      oceanicMax: params.oceanicMax,
      minBlockArea: params.minBlockArea,
      minBlockCells: params.minBlockCells,
      cellAreaKm2: meanCell / 1e6,
      force,
    });
  const taperLevel = calTaper?.field ?? params.taperThreshold;
  const oceanLevel = calOcean?.field ?? params.oceanicThreshold;
  const classified = classifyAt(taperLevel, oceanLevel);
  warnings.push(...classified.warnings);
  return {
    params, geometry, warnings, derived, basementValues, moho, seabed, oceanward, licenceIn, licence, allPicks, picks, lines, isoIn, isochrons,
    tc, valid, areaRows, calTaper, calOcean, placedBy, taperLevel, oceanLevel, classified, classifyAt, rasterOf,
  };
}

/** What the domain stage hands on: the run so far, in the analysis CRS. */
export interface DomainStage {
  readonly params: Params;
  readonly geometry: GridGeometry;
  readonly warnings: string[];
  readonly derived: Derived;
  readonly basementValues: Float32Array;
  readonly moho: Float32Array;
  readonly seabed: Float32Array | null;
  readonly oceanward: Oceanward;
  readonly licenceIn: VectorInput | null;
  readonly licence: Ring[] | null;
  readonly allPicks: Pick[];
  readonly picks: Pick[];
  readonly lines: { name: string; coords: Ring[] }[];
  readonly isoIn: VectorInput | null;
  readonly isochrons: Isochron[];
  /** The crustal thickness the domains and lines are traced on (smoothed when smoothCells > 0). */
  readonly tc: Float32Array;
  readonly valid: Uint8Array;
  readonly areaRows: CellAreaRows;
  readonly calTaper: Calibration | null;
  readonly calOcean: Calibration | null;
  readonly placedBy: { taper: string; oceanic: string };
  readonly taperLevel: Float32Array | number;
  readonly oceanLevel: Float32Array | number;
  readonly classified: Classified;
  readonly classifyAt: (taperLevel: Float32Array | number, oceanLevel: Float32Array | number) => Classified;
  readonly rasterOf: <T extends Float32Array | Uint8Array>(key: string, source: VectorInput, make: () => T) => T;
}

export function runPipeline(inputs: PipelineInputs, options: PipelineOptions = {}): PipelineResult {
  const progress = options.onProgress ?? (() => {});
  const st = runDomainStage(inputs, options);
  const { params, geometry, warnings, derived, basementValues, moho, seabed, oceanward, licenceIn, licence, allPicks, picks, lines, isoIn, isochrons } = st;
  const { tc, areaRows, calTaper, calOcean, placedBy, taperLevel, oceanLevel, classified, classifyAt, rasterOf } = st;
  const rowAreas = new Float64Array(geometry.nx);

  // The grids as shown and exported: each model only where it applies.
  const isoAge = isochrons.length && seabed ? rasterOf('isochron-age', isoIn!, () => nearestIsochronAge(geometry, isochrons)) : null;
  const applied = applyDomains(derived, classified.domains, params, isoAge, Boolean(options.keepGrids));
  warnings.push(...applied.warnings);

  progress('areas', 0.7);
  const licenceMask = licence ? rasterOf('licence', licenceIn!, () => rasterizeRings(geometry, licence)) : null;
  const tally = (mask: Uint8Array | null): DomainArea[] => {
    const cells = new Float64Array(7);
    const m2 = new Float64Array(7);
    const nx = geometry.nx;
    for (let j = 0; j < geometry.ny; j++) {
      areaRows.row(j, rowAreas);
      for (let i = 0; i < nx; i++) {
        const k = j * nx + i;
        if (mask && !mask[k]) continue;
        const d = classified.domains[k];
        cells[d]++;
        m2[d] += rowAreas[i];
      }
    }
    return [0, 1, 2, 3, 4, 5, 6].map((code) => ({ code, cells: cells[code], km2: m2[code] / 1e6 }));
  };
  const areas = { total: tally(null), inLicence: licenceMask ? tally(licenceMask) : null };
  if (licence && licenceMask && !licenceMask.some((v) => v)) warnings.push(`${inputs.licence!.name}: the licence polygon does not overlap the analysis grid`);

  progress('boundaries', 0.8);
  const boundaries = extractBoundaries({
    geometry,
    thickness: tc,
    domains: classified.domains,
    flags: classified.flags,
    oceanward,
    taperLevel,
    oceanLevel,
    taperSource: placedBy.taper,
    oceanSource: placedBy.oceanic,
    params,
    picks,
    // control lines and the licence are only measured against: 1 m simplification keeps them exact enough and fast
    seismicLines: lines.flatMap((l) => l.coords).map((c) => simplifyPath(c, 1)),
    isochrons,
    licence: licence ? licence.map((r) => simplifyPath(r, 1)) : null,
    oceanicAgeMin: seabed ? gridOf(applied.grids, 'oceanic-age-min') : null,
    oceanicAgeMax: seabed ? gridOf(applied.grids, 'oceanic-age-max') : null,
  });
  for (const m of boundaries.missing) warnings.push(m.reason);
  for (const s of boundaries.onlap.skipped) warnings.push(`onlap pick ${s.id} not used: ${s.reason}`);

  progress('pick checks', 0.9);
  const pickChecks = allPicks.length ? checkAllPicks() : [];
  function checkAllPicks(): PickCheck[] {
    // the uncalibrated proxy lines: the same rules at the parameter thresholds, no picks
    const hasLimitPicks = allPicks.some((q) => q.kind !== 'onlap');
    const proxyDomains = hasLimitPicks ? (calTaper || calOcean ? classifyAt(params.taperThreshold, params.oceanicThreshold).domains : classified.domains) : null;
    const proxy = proxyDomains
      ? {
          taper: traceSideLine(geometry, tc, proxyDomains, 'continental', params.taperThreshold),
          oceanic: traceSideLine(geometry, tc, proxyDomains, 'oceanic', params.oceanicThreshold),
        }
      : { taper: [], oceanic: [] };
    const grid = { geometry, values: tc };
    const reach = Math.hypot(geometry.nx * geometry.dx, geometry.ny * geometry.dy);
    return checkPicks(
      allPicks.map((q) => ({
        id: q.id,
        kind: q.kind,
        line: q.line,
        x: q.x,
        y: q.y,
        excluded: Boolean(q.excluded),
        thickness: sampleBilinear(grid, xToCol(geometry, q.x), yToRow(geometry, q.y)),
        offset: q.kind === 'onlap' ? onlapOffset(q.x, q.y, boundaries.support.oceanic, oceanward, reach) : NaN,
        strike: strikeOf(oceanward, q.x, q.y),
      })),
      proxy,
      oceanward,
      reach,
      params,
    );
  }
  const suspects = pickChecks.filter((c) => c.suspect && !c.excluded);
  if (suspects.length) {
    warnings.push(`${suspects.length} suspect pick${suspects.length > 1 ? 's' : ''} (disagree with their neighbours or lie far from the proxy line): ${suspects.map((c) => `${c.id} — ${c.reasons.join('; ')}`).join(' | ')}. Check them on the seismic; exclude one to see the lines without it`);
  }
  progress('done', 1);
  return {
    params,
    geometry,
    derived,
    grids: applied.grids,
    applied,
    classified,
    pickChecks,
    placedBy,
    oceanward,
    calibration: { taper: calTaper, ocean: calOcean },
    boundaries,
    areas,
    licenceName: licenceIn ? String(licenceIn.set.features[0]?.properties.name ?? licenceIn.name) : null,
    evidence: { picks: allPicks, lines, isochrons, licence },
    inputs,
    analysis: { seabed, basement: basementValues, moho },
    warnings,
  };
}

/**
 * Picks with a stable identity (the feature's `id` property, else "line/kind", else "pick N" by
 * position in the file; repeats get "#2", "#3"), in the analysis CRS.
 */
function pickIdentities(v: VectorInput, at: (r: [number, number][]) => [number, number], excluded: Set<string>): Pick[] {
  const seen = new Map<string, number>();
  return v.set.features.map((f, k) => {
    const [x, y] = at(f.parts[0]);
    const kind = f.properties.kind as Pick['kind'];
    const line = f.properties.line !== undefined && f.properties.line !== null ? String(f.properties.line) : undefined;
    const given = f.properties.id;
    let id = typeof given === 'string' || typeof given === 'number' ? String(given) : line ? `${line}/${kind}` : `pick ${k + 1}`;
    const n = (seen.get(id) ?? 0) + 1;
    seen.set(id, n);
    if (n > 1) id = `${id}#${n}`;
    return { x, y, kind, line, id, excluded: excluded.has(id) };
  });
}
