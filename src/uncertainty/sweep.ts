/**
 * Realisations: the pipeline run again on perturbed surfaces and parameters, up to the domains, with
 * the four thickness lines' side fields. A sweep part holds realisations start…end − 1 of a spec:
 * what the summary needs of each (its crustal thickness as an offset from the deterministic run's,
 * its domains, its levels, the zone width at every station, its areas) and, per cell, how often each
 * line's side reached the cell and each domain held it. Parts are pure functions of (inputs, spec,
 * range), so they can run as separate jobs and be merged (merge.ts) into the result of one whole run.
 *
 * Held fixed in every realisation (choices, stated in the summary): the analysis grid, the seabed,
 * the oceanward direction of the deterministic run (the frame strike and dip are measured in), the
 * vector evidence (picks, lines, licence, isochrons, crust polygons). A realisation never creates a
 * pick error: where the perturbed Moho would rise above the perturbed basement (or the basement
 * above the seabed) and the unperturbed surfaces did not, it is set onto it (zero crust, outcropping
 * basement), and the cells so set are counted.
 */

import { rasterizeRings } from '../grid/cell-area.js';
import { distanceTransform, markControl } from '../grid/distance.js';
import { FLAG_UNRESOLVED } from '../domains/classify.js';
import { NAMED_LINES, namedLineField, type NamedLine } from '../boundaries/fields.js';
import { lineLevels } from '../boundaries/extract.js';
import { runDomainStage, type DomainStage, type GridInput, type PipelineInputs, type PipelineOptions } from '../pipeline.js';
import type { Params } from '../params.js';
import { fieldGenerator } from './field.js';
import { rng } from './random.js';
import { sampleParams, SWEPT_PARAMS, type SweptParam, type UncertaintySpec } from './spec.js';
import { firstCrossing, stationsOf, type Stations } from './stations.js';

/** Metres per unit of the stored thickness offset (Int16: ±32.767 km at 1 m; offsets beyond are limited and counted). */
export const DELTA_UNIT = 1;
export const DOMAIN_CODES = 7;
/** The stored offset of a cell without crustal thickness in that realisation. */
export const NO_THICKNESS = -32768;

export interface RealisationRecord {
  readonly index: number;
  /** The swept parameters drawn (null where the run has none, e.g. no rift age). */
  readonly params: Record<SweptParam, number | null>;
  readonly limited: SweptParam[];
  /** Calibration points of the limits, [strike, thickness] sorted by strike, or null where a parameter placed the line. */
  readonly taperPoints: [number, number][] | null;
  readonly oceanPoints: [number, number][] | null;
  /** Cells where the perturbation would have made a pick error and the surface was set onto the other. */
  readonly heldCells: number;
  /** Cells where oceanic-range crust ran unbroken to the landward edge, so thickness could not part the sides (classify.ts). */
  readonly joinedCells: number;
  /** Thickness offsets beyond the Int16 store, limited (cells). */
  readonly limitedOffsets: number;
  /** Zone width at each station (m), NaN where the ray does not cross both limits in order. */
  readonly widths: Float32Array;
  /** Area of each domain code (km², whole grid and inside the licence). */
  readonly areas: Float64Array;
  readonly licenceAreas: Float64Array | null;
}

export interface SweepPart {
  /** Identifies the inputs, base parameters and spec (without the range): parts merge only with the same key. */
  readonly key: string;
  readonly start: number;
  readonly end: number;
  readonly nx: number;
  readonly ny: number;
  readonly records: RealisationRecord[];
  /** Per realisation: crustal-thickness offset from the deterministic run (DELTA_UNIT m; from 0 where that run has none; NO_THICKNESS where this one has none) and domain code | 0x80 if unresolved. */
  readonly delta: Int16Array[];
  readonly cells: Uint8Array[];
  /** Per line: realisations whose side field is ≥ 0 at the cell, and those where it is no data. */
  readonly reach: Record<NamedLine, Uint16Array>;
  readonly noData: Record<NamedLine, Uint16Array>;
  /** Per domain code: realisations with the cell in that domain. */
  readonly domainCount: Uint16Array[];
}

/** One range of realisations as a thread is given it (the CLI's worker threads, the app's sub-workers). */
export interface SweepJob {
  readonly inputs: PipelineInputs;
  readonly options: Pick<PipelineOptions, 'params' | 'excludePicks'>;
  readonly spec: UncertaintySpec;
  readonly start: number;
  readonly end: number;
}

/** The deterministic run a sweep varies, and what every realisation shares. */
export interface SweepBase {
  readonly inputs: PipelineInputs;
  readonly options: PipelineOptions;
  readonly stage: DomainStage;
  readonly sigmaBasement: Float32Array;
  readonly sigmaMoho: Float32Array;
  readonly licenceMask: Uint8Array | null;
  readonly stations: Stations;
  readonly key: string;
}

/** Every array of a part (to transfer between threads, never copy). */
export function partArrays(p: SweepPart): ArrayBufferView[] {
  return [...p.delta, ...p.cells, ...p.records.flatMap((r) => [r.widths, r.areas, ...(r.licenceAreas ? [r.licenceAreas] : [])]), ...Object.values(p.reach), ...Object.values(p.noData), ...p.domainCount];
}

/** What a run is made of (inputs by name, size and checksum; resolved parameters; excluded picks): a sweep of another run is out of date. */
export function runKeyOf(inputs: PipelineInputs, params: Params, excludePicks: readonly string[] = []): string {
  const id = (v: { name: string; bytes?: number; sha256?: string } | null | undefined) => (v ? [v.name, v.bytes ?? null, v.sha256 ?? null] : null);
  return JSON.stringify({
    inputs: [inputs.basement, inputs.moho, inputs.seabed, inputs.licence, inputs.lines, inputs.picks, inputs.isochrons, inputs.crust].map(id),
    params,
    excluded: [...excludePicks],
  });
}

/** σ(d) of the spec for one surface, on the grid of distances to control. */
function sigmaGrid(distance: Float32Array, sc: number, sf: number, length: number): Float32Array {
  const out = new Float32Array(distance.length);
  for (let k = 0; k < out.length; k++) {
    const d = distance[k];
    out[k] = d === Infinity ? sf : sc + (sf - sc) * (1 - Math.exp(-d / length));
  }
  return out;
}

/** The deterministic domain stage and the per-cell error sizes of a spec. */
export function sweepBase(inputs: PipelineInputs, options: PipelineOptions, spec: UncertaintySpec): SweepBase {
  const stage = runDomainStage(inputs, { ...options, keepGrids: new Set() });
  const g = stage.geometry;
  const control = markControl(g, stage.lines.flatMap((l) => l.coords), stage.picks.map((q) => [q.x, q.y] as [number, number]));
  const distance = distanceTransform(g, control);
  const key = JSON.stringify({ grid: [g.nx, g.ny, g.x0, g.y0, g.dx, g.dy, g.crs.id], run: runKeyOf(inputs, stage.params, options.excludePicks), spec });
  return {
    inputs,
    options,
    stage,
    sigmaBasement: sigmaGrid(distance, spec.basement.sigmaControl, spec.basement.sigmaFar, spec.rampLength),
    sigmaMoho: sigmaGrid(distance, spec.moho.sigmaControl, spec.moho.sigmaFar, spec.rampLength),
    licenceMask: stage.licence ? rasterizeRings(g, stage.licence) : null,
    stations: stationsOf(g, stage.oceanward),
    key,
  };
}

/**
 * Realisations start…end − 1 of the spec. `onRealisation` is told after each (for progress; return
 * false to stop, and the part then ends at the last one done).
 */
export function runSweepPart(base: SweepBase, spec: UncertaintySpec, start: number, end: number, onRealisation?: (done: number) => boolean | void): SweepPart {
  if (!(Number.isInteger(start) && Number.isInteger(end) && start >= 0 && end <= spec.realisations && start <= end)) {
    throw new RangeError(`realisations ${start}…${end - 1} are not within 0…${spec.realisations - 1}`);
  }
  const st = base.stage;
  const g = st.geometry;
  const n = g.nx * g.ny;
  const zeroSurfaces = spec.basement.sigmaControl === 0 && spec.basement.sigmaFar === 0 && spec.moho.sigmaControl === 0 && spec.moho.sigmaFar === 0;
  const gen = zeroSurfaces ? null : fieldGenerator({ nx: g.nx, ny: g.ny, dx: g.dx, dy: g.dy }, spec.correlationLength);
  const z1 = new Float32Array(n);
  const z2 = new Float32Array(n);
  const bBuf = new Float32Array(n);
  const mBuf = new Float32Array(n);
  const rho = spec.surfaceCorrelation;
  const rho2 = Math.sqrt(Math.max(0, 1 - rho * rho));
  const tcDet = st.tc;
  const records: RealisationRecord[] = [];
  const delta: Int16Array[] = [];
  const cells: Uint8Array[] = [];
  const reach = Object.fromEntries(NAMED_LINES.map((l) => [l, new Uint16Array(n)])) as Record<NamedLine, Uint16Array>;
  const noData = Object.fromEntries(NAMED_LINES.map((l) => [l, new Uint16Array(n)])) as Record<NamedLine, Uint16Array>;
  const domainCount = Array.from({ length: DOMAIN_CODES }, () => new Uint16Array(n));
  const field = new Float32Array(n);
  const tcLimits = new Float32Array(n);
  const oceanField = new Float32Array(n);
  const b0 = st.basementValues;
  const m0 = st.moho;
  const s0 = st.seabed;
  const rowAreas = new Float64Array(g.nx);
  for (let r = start; r < end; r++) {
    const drawn = sampleParams(st.params, spec, rngStream(spec.seed, r, 'params'));
    // perturbed surfaces, into buffers reused between realisations (nothing of a realisation's stage
    // is kept past its own iteration)
    let held = 0;
    let basement = b0;
    let moho = m0;
    if (gen) {
      gen.fill(rng(spec.seed, r, 'basement'), z1);
      gen.fill(rng(spec.seed, r, 'moho'), z2);
      basement = bBuf;
      moho = mBuf;
      const sb = base.sigmaBasement;
      const sm = base.sigmaMoho;
      for (let k = 0; k < n; k++) {
        let b = b0[k] + sb[k] * z1[k];
        let m = m0[k] + sm[k] * (rho * z1[k] + rho2 * z2[k]);
        if (s0 && b < s0[k] && !(b0[k] < s0[k])) (b = s0[k]), held++;
        if (m < b && !(m0[k] < b0[k])) (m = b), held++;
        basement[k] = b;
        moho[k] = m;
      }
    }
    const inputs: PipelineInputs = {
      ...base.inputs,
      basement: onGrid(base.inputs.basement, g, basement),
      moho: onGrid(base.inputs.moho, g, moho),
      seabed: s0 && base.inputs.seabed ? onGrid(base.inputs.seabed, g, s0) : null,
    };
    const rs = runDomainStage(inputs, { ...base.options, params: { ...drawn.params } as Record<string, unknown>, keepGrids: new Set(), oceanward: st.oceanward, thicknessOnly: true, onProgress: undefined, cache: undefined });
    const dom = rs.classified.domains;
    const flags = rs.classified.flags;
    const tc = rs.tc;
    // store: thickness offset and domain code (| 0x80 where unresolved)
    const d = new Int16Array(n);
    const c = new Uint8Array(n);
    let limitedOffsets = 0;
    for (let k = 0; k < n; k++) {
      const t = tc[k];
      if (t !== t) d[k] = NO_THICKNESS;
      else {
        const off = Math.round((t - (tcDet[k] === tcDet[k] ? tcDet[k] : 0)) / DELTA_UNIT);
        if (off > 32767 || off < -32767) limitedOffsets++;
        d[k] = off > 32767 ? 32767 : off < -32767 ? -32767 : off;
      }
      const un = flags[k] & FLAG_UNRESOLVED;
      c[k] = dom[k] | (un ? 0x80 : 0);
      tcLimits[k] = un ? NaN : t;
      domainCount[dom[k]][k]++;
    }
    delta.push(d);
    cells.push(c);
    const levels = lineLevels(rs.params, rs.taperLevel, rs.oceanLevel);
    for (const line of NAMED_LINES) {
      const f = namedLineField(line, tc, tcLimits, dom, levels, line === 'oceanic' ? oceanField : field);
      const rc = reach[line];
      const nd = noData[line];
      for (let k = 0; k < n; k++) {
        const v = f[k];
        if (v !== v) nd[k]++;
        else if (v >= 0) rc[k]++;
      }
      // the taper field is still in `field` when the oceanic one is made (necking and coupling reuse it after)
      if (line === 'oceanic') records.push(finishRecord(r, rs, drawn, held, limitedOffsets, base, field, oceanField, rowAreas));
    }
    if (onRealisation && onRealisation(r - start + 1) === false) {
      return { key: base.key, start, end: r + 1, nx: g.nx, ny: g.ny, records, delta, cells, reach, noData, domainCount };
    }
  }
  return { key: base.key, start, end, nx: g.nx, ny: g.ny, records, delta, cells, reach, noData, domainCount };
}

function finishRecord(
  index: number,
  rs: DomainStage,
  drawn: { params: Params; limited: SweptParam[] },
  held: number,
  limitedOffsets: number,
  base: SweepBase,
  taper: Float32Array,
  ocean: Float32Array,
  rowAreas: Float64Array,
): RealisationRecord {
  const g = rs.geometry;
  const st = base.stations;
  const widths = new Float32Array(st.strike.length);
  for (let a = 0; a < widths.length; a++) {
    const tT = firstCrossing(st, a, taper, false);
    const tO = firstCrossing(st, a, ocean, true);
    widths[a] = tT === tT && tO === tO && tO >= tT ? tO - tT : NaN;
  }
  const areas = new Float64Array(DOMAIN_CODES);
  const licenceAreas = base.licenceMask ? new Float64Array(DOMAIN_CODES) : null;
  const dom = rs.classified.domains;
  const mask = base.licenceMask;
  for (let j = 0; j < g.ny; j++) {
    rs.areaRows.row(j, rowAreas);
    for (let i = 0; i < g.nx; i++) {
      const k = j * g.nx + i;
      areas[dom[k]] += rowAreas[i] / 1e6;
      if (licenceAreas && mask![k]) licenceAreas[dom[k]] += rowAreas[i] / 1e6;
    }
  }
  const points = (cal: DomainStage['calTaper']) => (cal ? cal.points.map((q) => [q.strike, q.thickness] as [number, number]) : null);
  return {
    index,
    params: Object.fromEntries(SWEPT_PARAMS.map((k) => [k, rs.params[k]])) as Record<SweptParam, number | null>,
    limited: drawn.limited,
    taperPoints: points(rs.calTaper),
    oceanPoints: points(rs.calOcean),
    heldCells: held,
    joinedCells: rs.classified.joined,
    limitedOffsets,
    widths,
    areas,
    licenceAreas,
  };
}

function rngStream(seed: number, index: number, stream: string): () => number {
  const r = rng(seed, index, stream);
  return () => r.normal();
}

function onGrid(inp: GridInput, g: DomainStage['geometry'], values: Float32Array): GridInput {
  return { name: inp.name, bytes: inp.bytes, sha256: inp.sha256, grid: { geometry: g, values } as GridInput['grid'] };
}
