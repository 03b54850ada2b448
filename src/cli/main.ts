#!/usr/bin/env node
/** The `taperline` command: a thin shell over the core pipeline (src/pipeline.ts). */

import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import { DEFAULT_READ_BUDGET_MB } from '../io/tiff/layout.js';
import { dirname, join, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { InputError } from '../io/errors.js';
import { gridJobs, outputFiles } from '../export/outputs.js';
import { writeGeoTiffs } from './tiff-pool.js';
import { geoPackage } from '../export/gpkg.js';
import { ParamError, PARAM_SPECS, DEFAULT_PARAMS, resolveParams } from '../params.js';
import { runPipeline, type PipelineInputs } from '../pipeline.js';
import type { GridReadOptions } from '../io/geotiff-read.js';
import type { LengthUnit, Sign } from '../io/detect.js';
import { loadGrid, loadVectors } from './load.js';
import { DEFAULT_PLAN, PLAN_SPECS, resolvePlan } from '../survey/params.js';
import { planFromResult } from '../survey/run.js';
import { surveyCsv, surveyGeoJson } from '../export/survey.js';
import { DEFAULT_WRITTEN, DERIVED, parseGridList, type DerivedName } from '../derive/grids.js';
import { DEFAULT_SPEC, resolveSpec, SPEC_DOCS, type UncertaintySpec } from '../uncertainty/spec.js';
import { summariseParts } from '../uncertainty/run.js';
import { uncertaintyFiles, uncertaintySummary } from '../export/uncertainty.js';
import { readSweepPart, writeSweepPart } from '../io/sweep-part.js';
import { runSweepThreads } from './sweep-pool.js';
import { mergeParts } from '../uncertainty/summary.js';

const here = dirname(fileURLToPath(import.meta.url));
const pkg = JSON.parse(readFileSync(join(here, '../../package.json'), 'utf8')) as { version: string };

const paramLines = PARAM_SPECS.map((s) => {
  const d = DEFAULT_PARAMS[s.key];
  const def = d === null ? 'none' : Array.isArray(s.choices) ? String(d) : `${d}${s.unit ? ' ' + s.unit : ''}`;
  return `    ${s.key.padEnd(22)} ${s.doc} (default ${def}${s.choices ? `; one of ${s.choices.join(', ')}` : ''})`;
}).join('\n');

const optInLines = DERIVED.filter((d) => 'optIn' in d)
  .map((d) => `    ${d.name.padEnd(24)} = ${(d as { optIn: string }).optIn}`)
  .join('\n');

const planLines = PLAN_SPECS.map((s) => {
  const d = DEFAULT_PLAN[s.key];
  return `    ${s.key.padEnd(22)} ${s.doc} (default ${d === null ? 'none' : `${d}${s.unit ? ' ' + s.unit : ''}`})`;
}).join('\n');

const specLines = SPEC_DOCS.map((d) => {
  const v = d.key.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown>)[k], DEFAULT_SPEC);
  return `    ${d.key.padEnd(24)} ${d.doc} (default ${v}${d.unit ? ' ' + d.unit : ''})`;
}).join('\n');

export const HELP = `taperline ${pkg.version} — map-view synthesis of rifted-margin depth grids

Usage:
  taperline synth --top-basement F --moho F [--seabed F] [options]
  taperline plan --top-basement F --moho F [--seabed F] [--existing F] [--spacing KM]
                 [--overhang-landward KM] [--overhang-oceanward KM] [synth options]
  taperline demo [--out DIR] [--size NX[xNY]] [--grids LIST]
  taperline --help | --version

synth: derive crustal thickness, β, γ, isostatic and subsidence grids, margin domains and the named
boundaries from depth grids (GeoTIFF or XYZ text; metres or km, depth or elevation are detected).
  --top-basement F     top-basement depth grid; it defines the analysis grid
  --moho F             Moho depth grid (resampled onto the analysis grid if needed)
  --seabed F           seabed (water bottom) grid; without it no water/sediment/subsidence grids
  --licence F          licence polygon (GeoJSON); lines are clipped to it and areas reported inside
  --lines F            existing seismic lines (GeoJSON LineStrings, property "name")
  --picks F            interpreter picks (GeoJSON Points with "kind": continental-limit | oceanic-limit
                       | onlap, and "line"): boundaries pass through them
  --isochrons F        magnetic isochrons (GeoJSON LineStrings with "age_ma")
  --crust F            crust-type polygons (GeoJSON, "crust": continental | oceanic | transition)
  --exclude-pick IDS   picks to leave out (comma-separated ids, as summary.json lists them: the
                       feature's "id", else "LINE/KIND", else "pick N"); still checked and reported
  --params F.json      parameters (keys below); unknown keys are an error
  --out DIR            output folder (default ./taperline-out)
  --ROLE-units m|km|ft       override detected units (ROLE = seabed, top-basement, moho)
  --ROLE-sign depth|elevation override the detected sign convention
  --ROLE-nodata V            an extra no-data value
  --ROLE-crs CRS             CRS for the file (EPSG code or proj4 string; XYZ text needs one,
                             otherwise the analysis grid's CRS is assumed with a warning)
  --ROLE-depth               accept a grid whose name or tags look like two-way time
  --read-budget-mb N   memory one grid file may take while read (default ${DEFAULT_READ_BUDGET_MB}); a
                       file declaring more is refused before anything is allocated
  --grids LIST         derived grids to write: default, all, or names (comma-separated, combinable:
                       default,gamma). The default leaves out six grids that are one raster-calculator
                       step from a written grid or an input, to save time and memory on large grids
                       (only the grids written are kept in memory); each is written on request:
${optInLines}
                       demo writes all of them unless told otherwise

Uncertainty (synth): the same run over N seeded realisations that vary the parameters and the
top-basement and Moho surfaces (errors small at seismic lines and picks, growing away from them):
  --realisations N     run N realisations (1–10000) and write DIR/uncertainty/ (below)
  --seed S             seed of the random numbers (default 1); same seed, same output bytes
  --uncertainty F.json what varies and by how much (keys below; every key optional)
  --threads N          worker threads for the realisations (default one per core, at most 4)
  --realisation-range K:M   run realisations K…M−1 only and write DIR/sweep-part-K-M.bin (nothing
                       else), so a large sweep can be spread over jobs of a batch scheduler
  --merge-parts F1,F2,…     build the uncertainty outputs from part files instead of running them
                       (they must cover 0…N−1 of the same inputs, parameters, spec and seed); the
                       result is byte for byte that of one whole run
Pq is what at least q % of the realisations reach: the P90 crustal taper limit is where continental
crust reaches at least this far oceanward in 90 % of realisations, the P90 oceanic limit where oceanic
crust reaches at least this far landward; P90 areas and widths are at least that in 90 %. Writes
DIR/uncertainty/lines.geojson (P90, P50, P10 of the taper, oceanic, onlap, necking and coupling
lines; property p), probability-<code>-<domain>.tif (per-cell probability of each domain),
positional-uncertainty.tif (P90–P10 envelope width of the two limits, km), zone-width.csv (zone
width along strike) and an "uncertainty" block in summary.json (licence areas P90/P50/P10).
Uncertainty keys (standard deviations; 0 holds a parameter fixed):
${specLines}

plan: propose 2D seismic lines across the continent–ocean transition (a planning aid: marine
surveys need permits, environmental mitigation and qualified operators). Same inputs as synth, plus
  --existing F         existing seismic lines (GeoJSON); proposals too close to them are dropped
  --spacing KM         dip-line spacing (default 20)
  --overhang-landward KM / --overhang-oceanward KM   extension beyond the taper limit / the
                       landward limit of oceanic crust (default 20 each)
  other planning values come from the params file (keys below, "plan" section).
Writes DIR/survey-lines.geojson (ranked lines with lengths, crossings, record lengths, the programme
totals, coverage gaps and dropped proposals) and DIR/survey-lines.csv (start and end points in WGS 84
and in the analysis CRS).

demo: run synth on the built-in invented demo scenario (fixtures/demo, generated if missing).
  --size NX[xNY]       the same invented margin on a finer grid over the same 300 km window
                       (default 600x400 at 500 m; e.g. 2400 → 2400 × 1600 cells of 125 m), for
                       benchmarks and regional-scale trials; written to fixtures/demo-NXxNY

Which threshold places which line (each calibrated only by picks of its own kind):
  crustal-taper-limit    taperThreshold, or the thickness at continental-limit picks
  oceanic-limit          oceanicThreshold (landward limit of oceanic crust), or the thickness at
                         oceanic-limit picks; crust between the two lines is the COT zone
  oldest-onlapped-crust  the oceanic limit moved oceanward by the offset seen at onlap picks; without
                         onlap picks it is the oceanic limit and says so (evidence proxy)
  necking-line           neckingFraction × tc0;   coupling-line   couplingThickness
summary.json (lines_placed_by) and every line's placed_by property say which applied. Picks that
disagree with their neighbours or lie far from the uncalibrated line are listed as suspect.

Writes DIR/boundaries.geojson (inside the licence when one is given; then also
boundaries-whole-grid.geojson), DIR/boundary-lines.geojson (one feature per continuous line; likewise),
DIR/domains.geojson, DIR/boundaries.gpkg (every vector layer in WGS 84 and in the analysis CRS),
DIR/grids/<name>.tif (one cloud-optimized Float32 GeoTIFF per derived grid written, see --grids;
metres unless stated, each no data outside the domains where its model applies; domains.tif and
unbounded-beta.tif as UInt8 with colour tables) and DIR/summary.json (parameters, inputs with
sha256, detections, the rule of every grid, flagged cells, areas, lengths, suspect picks, warnings);
a grid with no value anywhere is not written (listed in the summary). Every field: docs/outputs.md.
Files appear only when the run succeeds; a previous run's files that this run does not write are
removed (.taperline-outputs lists what was written); an output folder holding an input is refused.
Exit status: 0 success; 2 bad input (message names the file and the problem); 1 otherwise.

Params file keys (JSON object; every key optional):
${paramLines}

Planning keys (plan only; same params file):
${planLines}

Results are interpretations of the input grids and parameters; they do not replace the judgement of
qualified professionals, nor the local rules that govern licences, surveys and drilling.
`;

class UsageError extends Error {}

function parseArgs(argv: string[]): { command: string; flags: Map<string, string | true> } {
  const [command, ...rest] = argv;
  const flags = new Map<string, string | true>();
  for (let k = 0; k < rest.length; k++) {
    const a = rest[k];
    if (!a.startsWith('--')) throw new UsageError(`unexpected argument "${a}"`);
    const key = a.slice(2);
    const next = rest[k + 1];
    if (next === undefined || next.startsWith('--')) flags.set(key, true);
    else {
      flags.set(key, next);
      k++;
    }
  }
  return { command, flags };
}

const GRID_ROLES = ['seabed', 'top-basement', 'moho'] as const;
const SWEEP_FLAGS = ['realisations', 'seed', 'uncertainty', 'realisation-range', 'merge-parts', 'threads'];
const PLAN_FLAGS = ['existing', 'spacing', 'overhang-landward', 'overhang-oceanward'];
const KNOWN = new Set([
  'top-basement', 'moho', 'seabed', 'licence', 'lines', 'picks', 'isochrons', 'crust', 'params', 'out', 'exclude-pick', 'read-budget-mb', 'grids',
  ...SWEEP_FLAGS,
  ...GRID_ROLES.flatMap((r) => [`${r}-units`, `${r}-sign`, `${r}-nodata`, `${r}-crs`, `${r}-depth`]),
]);

function str(flags: Map<string, string | true>, key: string): string | undefined {
  const v = flags.get(key);
  if (v === true) throw new UsageError(`--${key} needs a value`);
  return v;
}

function gridOptions(flags: Map<string, string | true>, role: (typeof GRID_ROLES)[number]): GridReadOptions {
  const o: GridReadOptions = { role };
  const units = str(flags, `${role}-units`);
  if (units) {
    if (!['m', 'km', 'ft'].includes(units)) throw new UsageError(`--${role}-units must be m, km or ft`);
    o.units = units as LengthUnit;
  }
  const sign = str(flags, `${role}-sign`);
  if (sign) {
    if (!['depth', 'elevation'].includes(sign)) throw new UsageError(`--${role}-sign must be depth or elevation`);
    o.sign = sign as Sign;
  }
  const nd = str(flags, `${role}-nodata`);
  if (nd !== undefined) {
    if (!Number.isFinite(Number(nd))) throw new UsageError(`--${role}-nodata must be a number`);
    o.noData = Number(nd);
  }
  const crs = str(flags, `${role}-crs`);
  if (crs) o.crs = crs;
  if (flags.get(`${role}-depth`) === true) o.zDomain = 'depth';
  const budget = str(flags, 'read-budget-mb');
  if (budget !== undefined) {
    if (!/^\d+$/.test(budget) || Number(budget) < 1) throw new UsageError('--read-budget-mb must be a whole number of MB');
    o.readBudgetMB = Number(budget);
  }
  return o;
}

function gridList(flags: Map<string, string | true>, fallback: readonly DerivedName[]): readonly DerivedName[] {
  const v = str(flags, 'grids');
  if (v === undefined) return fallback;
  try {
    return parseGridList(v);
  } catch (err) {
    throw new UsageError(`--grids: ${(err as Error).message}`);
  }
}

async function synth(flags: Map<string, string | true>, out: string, mode: 'synth' | 'plan' = 'synth', defaultGrids: readonly DerivedName[] = DEFAULT_WRITTEN): Promise<void> {
  for (const k of flags.keys()) if (!KNOWN.has(k) && !(mode === 'plan' && PLAN_FLAGS.includes(k))) throw new UsageError(`unknown option --${k}`);
  if (mode === 'plan' && flags.has('grids')) throw new UsageError('--grids is for synth (plan writes no grids)');
  const grids = gridList(flags, defaultGrids);
  const basementPath = str(flags, 'top-basement');
  const mohoPath = str(flags, 'moho');
  if (!basementPath || !mohoPath) throw new UsageError('synth needs --top-basement F and --moho F');
  checkOutputFolder(out, ['top-basement', 'moho', 'seabed', 'licence', 'lines', 'existing', 'picks', 'isochrons', 'crust', 'params'].map((k) => (flags.get(k) === true ? undefined : (flags.get(k) as string | undefined))));
  let params: Record<string, unknown> = {};
  const paramsPath = str(flags, 'params');
  if (paramsPath) {
    let text: string;
    try {
      text = readFileSync(paramsPath, 'utf8');
    } catch (err) {
      throw new InputError(paramsPath, `cannot be read (${(err as NodeJS.ErrnoException).code})`);
    }
    try {
      params = JSON.parse(text);
    } catch (err) {
      throw new InputError(paramsPath, `is not valid JSON (${(err as Error).message})`);
    }
    if (!params || typeof params !== 'object' || Array.isArray(params)) throw new InputError(paramsPath, 'must hold a JSON object of parameters');
  }
  const basement = await loadGrid(basementPath, gridOptions(flags, 'top-basement'));
  const analysisCrs = basement.grid.geometry.crs;
  const assume = analysisCrs.id === 'PROJ4' ? analysisCrs.proj4 : analysisCrs.id;
  const moho = await loadGrid(mohoPath, { ...gridOptions(flags, 'moho'), assumeCrs: assume });
  const seabedPath = str(flags, 'seabed');
  const seabed = seabedPath ? await loadGrid(seabedPath, { ...gridOptions(flags, 'seabed'), assumeCrs: assume }) : null;
  const vec = (key: string) => {
    const p = str(flags, key);
    return p ? loadVectors(p) : null;
  };
  const inputs: PipelineInputs = {
    basement,
    moho,
    seabed,
    licence: vec('licence'),
    lines: vec('lines') ?? vec('existing'),
    picks: vec('picks'),
    isochrons: vec('isochrons'),
    crust: vec('crust'),
  };
  const planKeys = new Set(PLAN_SPECS.map((s) => s.key as string));
  const pipelineParams = Object.fromEntries(Object.entries(params).filter(([k]) => !planKeys.has(k)));
  const planParams: Record<string, unknown> = Object.fromEntries(Object.entries(params).filter(([k]) => planKeys.has(k)));
  for (const [flag, key] of [['spacing', 'spacingKm'], ['overhang-landward', 'overhangLandwardKm'], ['overhang-oceanward', 'overhangOceanwardKm']]) {
    const v = str(flags, flag);
    if (v !== undefined) {
      if (!Number.isFinite(Number(v))) throw new UsageError(`--${flag} must be a number of km`);
      planParams[key] = Number(v);
    }
  }
  const exclude = str(flags, 'exclude-pick');
  const excludePicks = exclude ? exclude.split(',').map((q) => q.trim()).filter(Boolean) : [];
  let result;
  try {
    resolvePlan(planParams); // planning keys are checked in synth too (they share the params file)
    resolveParams(pipelineParams, [...planKeys]); // unknown keys, with the nearest known one suggested
    // a batch synth keeps only the grids it writes, masked in place (plan reads every grid for its sections)
    result = runPipeline(inputs, { params: pipelineParams, excludePicks, keepGrids: mode === 'synth' ? new Set(grids) : undefined });
  } catch (err) {
    if (err instanceof ParamError || (err instanceof Error && /^plan parameter/.test(err.message))) throw new InputError(paramsPath ?? 'parameters', err.message);
    throw err;
  }
  const r = result;
  const sweep = await sweepOf(flags, inputs, { params: pipelineParams, excludePicks }, out);
  if (sweep === 'part-written') return;
  let planWarnings: string[] = [];
  let planNote = '';
  const count = await writeAtomically(out, async (put) => {
    if (mode === 'plan') {
      let sp;
      try {
        sp = planFromResult(r, planParams, sweep);
      } catch (err) {
        if (err instanceof Error && /^plan parameter/.test(err.message)) throw new InputError(paramsPath ?? 'parameters', err.message);
        throw err;
      }
      const enc = new TextEncoder();
      await put('survey-lines.geojson', enc.encode(JSON.stringify(surveyGeoJson(sp, r.geometry.crs), null, 1) + '\n'));
      await put('survey-lines.csv', enc.encode(surveyCsv(sp, r.geometry.crs)));
      planWarnings = sp.plan.warnings;
      planNote = `proposals ranked ${sp.plan.rankedBy}`;
      return;
    }
    const run = { version: pkg.version, time: runTime(), tool: 'cli' as const, grids };
    // GeoTIFFs on worker threads (with Node's zlib), each written to disk as it is done, while this
    // thread builds the vector outputs
    const { jobs, side } = gridJobs(r, run);
    const tiffs = writeGeoTiffs(r.geometry, jobs, undefined, put);
    tiffs.catch(() => {}); // awaited below; an early failure must not go unhandled meanwhile
    const extra = sweep ? uncertaintySummary(r, sweep) : undefined;
    for (const [rel, bytes] of Object.entries({ ...outputFiles(r, run, {}, extra), ...side, ...(sweep ? uncertaintyFiles(r, sweep, run) : {}) })) await put(rel, bytes);
    const { default: initSqlJs } = await import('sql.js');
    const gpkg = geoPackage(await initSqlJs(), r, run.time);
    await put('boundaries.gpkg', gpkg.bytes);
    if (gpkg.note) process.stderr.write(`note: ${gpkg.note}\n`);
    await tiffs;
  });
  for (const w of planWarnings) process.stderr.write(`warning: ${w}\n`);
  if (planNote) process.stderr.write(`note: ${planNote}\n`);
  for (const w of result.warnings) process.stderr.write(`warning: ${w}\n`);
  process.stdout.write(`wrote ${count} files to ${out}\n`);
}

/** The run's time: now, or SOURCE_DATE_EPOCH (seconds) when set, for reproducible outputs. */
function runTime(): string {
  const sde = process.env.SOURCE_DATE_EPOCH;
  if (sde !== undefined && /^\d+$/.test(sde)) return new Date(Number(sde) * 1000).toISOString();
  return new Date().toISOString();
}

/**
 * The sweep a synth run asks for: null without --realisations; the envelope from realisations run
 * here (on worker threads) or merged from part files; or, with --realisation-range, the part written
 * to the output folder and nothing else ('part-written').
 */
async function sweepOf(flags: Map<string, string | true>, inputs: PipelineInputs, options: { params: Record<string, unknown>; excludePicks: string[] }, out: string) {
  const has = SWEEP_FLAGS.filter((f) => flags.has(f));
  if (!flags.has('realisations')) {
    if (has.length) throw new UsageError(`--${has[0]} needs --realisations N`);
    return null;
  }
  const whole = (key: string, min: number, max: number) => {
    const v = str(flags, key);
    if (v === undefined) return undefined;
    if (!/^\d+$/.test(v) || Number(v) < min || Number(v) > max) throw new UsageError(`--${key} must be a whole number from ${min} to ${max}`);
    return Number(v);
  };
  let raw: unknown = {};
  const specPath = str(flags, 'uncertainty');
  if (specPath) {
    try {
      raw = JSON.parse(readFileSync(specPath, 'utf8'));
    } catch (err) {
      throw new InputError(specPath, (err as NodeJS.ErrnoException).code ? `cannot be read (${(err as NodeJS.ErrnoException).code})` : `is not valid JSON (${(err as Error).message})`);
    }
  }
  let spec: UncertaintySpec;
  try {
    spec = resolveSpec(raw, { realisations: whole('realisations', 1, 10_000), seed: whole('seed', 0, 2 ** 32 - 1) });
  } catch (err) {
    if (err instanceof ParamError) throw new InputError(specPath ?? '--realisations', err.message);
    throw err;
  }
  const threads = whole('threads', 1, 64);
  const rangeText = str(flags, 'realisation-range');
  const mergeText = str(flags, 'merge-parts');
  if (rangeText && mergeText) throw new UsageError('--realisation-range and --merge-parts do not go together: run the parts, then merge them');
  const started = Date.now();
  if (rangeText) {
    const m = /^(\d+):(\d+)$/.exec(rangeText);
    if (!m || Number(m[1]) >= Number(m[2]) || Number(m[2]) > spec.realisations) throw new UsageError(`--realisation-range must be K:M with 0 ≤ K < M ≤ ${spec.realisations} (realisations K…M−1)`);
    const parts = await runSweepThreads(inputs, options, spec, [Number(m[1]), Number(m[2])], threads);
    const file = `sweep-part-${m[1]}-${m[2]}.bin`;
    // the threads' parts of this range as one part
    const part = writeSweepPart(mergeParts(parts, spec, [Number(m[1]), Number(m[2])]));
    makeDir(out);
    writeFileSync(join(out, file), part);
    process.stdout.write(`wrote realisations ${m[1]}…${Number(m[2]) - 1} to ${join(out, file)} (${((Date.now() - started) / 1000).toFixed(1)} s)\n`);
    return 'part-written' as const;
  }
  const parts = mergeText
    ? mergeText.split(',').map((f) => {
        let bytes: Uint8Array;
        try {
          bytes = readFileSync(f.trim());
        } catch (err) {
          throw new InputError(f.trim(), `cannot be read (${(err as NodeJS.ErrnoException).code})`);
        }
        return readSweepPart(bytes, f.trim());
      })
    : await runSweepThreads(inputs, options, spec, [0, spec.realisations], threads);
  let result;
  try {
    result = summariseParts(inputs, options, spec, parts).result;
  } catch (err) {
    throw new InputError(mergeText ?? '--realisations', (err as Error).message);
  }
  process.stderr.write(`uncertainty: ${spec.realisations} realisations ${mergeText ? 'merged' : 'run'} in ${((Date.now() - started) / 1000).toFixed(1)} s\n`);
  return result;
}

const MANIFEST = '.taperline-outputs';

/**
 * Write every file under a temporary folder, then move them into place; nothing is left on failure.
 * Files a previous run wrote here (listed in the folder's manifest) that this run does not write are
 * removed, so no stale output sits beside new ones; temporary folders that earlier, killed runs left
 * are removed too; a signal mid-write removes this run's temporary folder before exiting. An output
 * folder that cannot be written gives one line naming it.
 */
async function writeAtomically(out: string, produce: (put: (rel: string, bytes: Uint8Array) => Promise<void>) => Promise<void>): Promise<number> {
  const tmp = join(out, `.taperline-tmp-${process.pid}`);
  const onSignal = (sig: NodeJS.Signals) => {
    rmSync(tmp, { recursive: true, force: true });
    process.stderr.write(`taperline: stopped by ${sig}; nothing was written to ${out}\n`);
    process.exit(130);
  };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    makeDir(out);
    for (const name of readdirSync(out)) if (name.startsWith('.taperline-tmp-')) rmSync(join(out, name), { recursive: true, force: true });
    // each file written as it is made (asynchronously, so a signal arriving meanwhile is handled and
    // the folder removed), so the run never holds all its encoded outputs at once
    const files = new Set<string>();
    await produce(async (rel, bytes) => {
      mkdirSync(dirname(join(tmp, rel)), { recursive: true });
      await writeFile(join(tmp, rel), bytes);
      files.add(rel);
    });
    // tests of interrupted writes hold the run here, between writing and moving into place
    const pause = Number(process.env.TAPERLINE_TEST_WRITE_PAUSE_MS ?? 0);
    if (pause > 0) await new Promise((resolve) => setTimeout(resolve, pause));
    const previous = existsSync(join(out, MANIFEST)) ? readFileSync(join(out, MANIFEST), 'utf8').split('\n').filter(Boolean) : [];
    for (const rel of files) {
      mkdirSync(dirname(join(out, rel)), { recursive: true });
      renameSync(join(tmp, rel), join(out, rel));
    }
    for (const rel of previous) {
      // only plain relative names this tool wrote; never anything outside the folder
      if (!files.has(rel) && !rel.includes('..') && !rel.startsWith('/')) rmSync(join(out, rel), { force: true });
    }
    writeFileSync(join(out, MANIFEST), [...files].sort().join('\n') + '\n');
    return files.size;
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    if (code) throw new InputError(out, `cannot be written (${code}): choose another --out folder`);
    throw err;
  } finally {
    rmSync(tmp, { recursive: true, force: true });
    process.removeListener('SIGINT', onSignal);
    process.removeListener('SIGTERM', onSignal);
  }
}

/**
 * mkdir -p one level at a time: Node's recursive mkdir can loop forever under /proc (where mkdir
 * fails with ENOENT on a parent that exists), so each missing level is made on its own and the first
 * failure is thrown.
 */
function makeDir(path: string): void {
  const missing: string[] = [];
  let p = resolve(path);
  while (!existsSync(p)) {
    missing.push(p);
    const up = dirname(p);
    if (up === p) break;
    p = up;
  }
  for (const m of missing.reverse()) mkdirSync(m);
}

/** Refuse an output folder that holds one of the inputs: a run must never overwrite what it reads. */
function checkOutputFolder(out: string, inputs: (string | undefined)[]): void {
  const root = resolve(out);
  for (const p of inputs) {
    if (!p) continue;
    const full = resolve(p);
    if (full.startsWith(root + sep)) throw new InputError(p, `lies inside the output folder ${out}: choose another --out so that no input can be overwritten`);
  }
}

async function demo(flags: Map<string, string | true>, out: string): Promise<void> {
  for (const k of flags.keys()) if (k !== 'out' && k !== 'size' && k !== 'grids') throw new UsageError(`unknown option --${k} for demo`);
  const grids = gridList(flags, DERIVED.map((d) => d.name));
  const size = str(flags, 'size');
  let dims: [number, number] = [600, 400];
  if (size !== undefined) {
    const m = /^(\d+)(?:x(\d+))?$/.exec(size);
    if (!m) throw new UsageError('--size must be NX or NXxNY cells, e.g. 2400 or 2400x1600');
    const nx = Number(m[1]);
    const ny = m[2] ? Number(m[2]) : Math.round((nx * 2) / 3);
    if (nx < 60 || ny < 40 || nx > 20_000 || ny > 20_000) throw new UsageError('--size: between 60 × 40 and 20000 × 20000 cells');
    dims = [nx, ny];
  }
  const dir = resolve(here, '../../fixtures', dims[0] === 600 && dims[1] === 400 ? 'demo' : `demo-${dims[0]}x${dims[1]}`);
  const { demoStamp } = await import('../../fixtures/stamp.js');
  const stamp = demoStamp(dims[0], dims[1]);
  if (!existsSync(join(dir, '.complete')) || readFileSync(join(dir, '.complete'), 'utf8') !== stamp) {
    // missing, or made by another version of the generator: build it (deterministic)
    const { demoFiles } = await import('../../fixtures/demo-files.js');
    const { demoGeometry } = await import('../../fixtures/demo-margin.js');
    mkdirSync(dir, { recursive: true });
    for (const [name, bytes] of Object.entries(demoFiles(demoGeometry(dims[0], dims[1])))) writeFileSync(join(dir, name), bytes);
    writeFileSync(join(dir, '.complete'), stamp);
  }
  const { DEMO_PARAMS } = await import('../../fixtures/demo-margin.js');
  const paramsPath = join(dir, 'demo-params.json');
  writeFileSync(paramsPath, JSON.stringify(DEMO_PARAMS, null, 1) + '\n');
  const f = new Map<string, string | true>([
    ['top-basement', join(dir, 'top-basement.tif')],
    ['moho', join(dir, 'moho.tif')],
    ['seabed', join(dir, 'seabed.tif')],
    ['licence', join(dir, 'licence.geojson')],
    ['lines', join(dir, 'seismic-lines.geojson')],
    ['picks', join(dir, 'picks.geojson')],
    ['isochrons', join(dir, 'isochrons.geojson')],
    ['params', paramsPath],
  ]);
  process.stdout.write('Running on the invented demo scenario (Veyra margin, VM-3 Tessel licence: not real data).\n');
  await synth(f, out, 'synth', grids);
}

export async function main(argv: string[]): Promise<number> {
  try {
    if (argv.includes('--version') || argv.includes('-V')) {
      process.stdout.write(`${pkg.version}\n`);
      return 0;
    }
    if (argv.length === 0 || argv.includes('--help') || argv.includes('-h')) {
      process.stdout.write(HELP);
      return 0;
    }
    const { command, flags } = parseArgs(argv);
    const out = resolve(str(flags, 'out') ?? 'taperline-out');
    if (command === 'synth') await synth(flags, out);
    else if (command === 'plan') await synth(flags, out, 'plan');
    else if (command === 'demo') await demo(flags, out);
    else throw new UsageError(`unknown command "${command}"`);
    return 0;
  } catch (err) {
    if (err instanceof UsageError) {
      process.stderr.write(`taperline: ${err.message} (see taperline --help)\n`);
      return 2;
    }
    if (err instanceof InputError || err instanceof ParamError) {
      process.stderr.write(`taperline: ${err.message}\n`);
      return 2;
    }
    process.stderr.write(`taperline: internal error: ${(err as Error).stack ?? err}\n`);
    return 1;
  }
}

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
