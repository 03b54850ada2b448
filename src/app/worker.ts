/// <reference lib="webworker" />
/**
 * The pipeline worker: reads files (the same readers as the CLI), runs the one pipeline function and
 * hands back display data with buffers transferred. It never touches the DOM.
 */

import { demoFiles } from '../../fixtures/demo-files.js';
import { outputFiles } from '../export/outputs.js';
import { geoPackage } from '../export/gpkg.js';
import { readGeoJson } from '../io/geojson-read.js';
import { readGeoTiff } from '../io/geotiff-read.js';
import { readXyz } from '../io/xyz-read.js';
import { createPipelineCache, runPipeline, type GridInput, type PipelineResult, type VectorInput } from '../pipeline.js';
import type { DisplayResult, FromWorker, Kind, Request, Response, SweepDisplay, ToWorker } from './messages.js';
import { displayGeoJson, licenceFigures, planDisplay, runDisplay, sectionDisplay, sweepDisplay } from './worker-views.js';
import { resolveSpec } from '../uncertainty/spec.js';
import { splitRange, summariseParts } from '../uncertainty/run.js';
import { runKeyOf, type SweepJob, type SweepPart } from '../uncertainty/sweep.js';
import type { UncertaintyResult } from '../uncertainty/summary.js';
import { uncertaintyFiles, uncertaintySummary } from '../export/uncertainty.js';

const grids = new Map<string, GridInput>();
const vectors = new Map<string, VectorInput>();
let last: PipelineResult | null = null;
/** The options of the last run (a sweep varies that run) and the last sweep, while its run stands. */
let lastOptions: { params: Record<string, unknown>; excludePicks: string[] } = { params: {}, excludePicks: [] };
let lastSweep: { runKey: string; result: UncertaintyResult } | null = null;
let lastRunKey = '';
/** The last sweep if it varies the last run (a run since may have changed the inputs or parameters). */
const currentSweep = () => (lastSweep && lastSweep.runKey === lastRunKey ? lastSweep.result : null);
/** The running sweep's sub-workers and its way out (cancel). */
let sweeping: { workers: Worker[]; fail: (e: Error) => void } | null = null;
const cache = createPipelineCache();

const post = (m: FromWorker, transfer: Transferable[] = []) => (self as unknown as Worker).postMessage(m, transfer);

async function sha256(bytes: ArrayBuffer): Promise<string> {
  const d = await crypto.subtle.digest('SHA-256', bytes);
  return [...new Uint8Array(d)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

/** Each kind of request, answered with its response (thrown errors become error replies). */
type Handlers = { [K in Kind]: (m: Request<K>) => Promise<Response<K>> | Response<K> };

const handlers: Handlers = {
  'make-demo': () => {
    const files = demoFiles();
    const keep = ['seabed.tif', 'top-basement.tif', 'moho.tif', 'licence.geojson', 'seismic-lines.geojson', 'picks.geojson', 'isochrons.geojson'];
    return { files: keep.map((name) => ({ name, bytes: files[name].slice().buffer as ArrayBuffer })) };
  },
  'load-grid': async (m) => {
    const isTiff = /\.(tif|tiff|gtiff)$/.test(m.name.toLowerCase());
    const r = isTiff ? await readGeoTiff(m.bytes, m.name, m.options) : readXyz(new TextDecoder().decode(m.bytes), m.name, m.options);
    grids.set(m.fileId, { name: m.name, bytes: m.bytes.byteLength, sha256: await sha256(m.bytes), grid: r.grid, report: r.report });
    return { report: r.report };
  },
  'load-vector': async (m) => {
    const set = readGeoJson(m.text, m.name);
    const bytes = new TextEncoder().encode(m.text);
    vectors.set(m.fileId, { name: m.name, bytes: bytes.length, sha256: await sha256(bytes.buffer as ArrayBuffer), set });
    return { features: set.features.length, warnings: set.warnings, display: displayGeoJson(set) };
  },
  run: (m) => {
    const t0 = performance.now();
    const g = (role: keyof typeof m.grids) => (m.grids[role] ? grids.get(m.grids[role]!) ?? null : null);
    const v = (role: keyof typeof m.vectors) => (m.vectors[role] ? vectors.get(m.vectors[role]!) ?? null : null);
    const basement = g('top-basement');
    const moho = g('moho');
    if (!basement || !moho) throw new Error('a top-basement grid and a Moho grid are needed (assign the roles in Data)');
    last = runPipeline(
      { basement, moho, seabed: g('seabed'), licence: v('licence'), lines: v('lines'), picks: v('picks'), isochrons: v('isochrons'), crust: v('crust') },
      { params: m.params, cache, excludePicks: m.excludePicks, onProgress: (stage, fraction) => post({ id: m.id, progress: { stage, fraction } }) },
    );
    lastOptions = { params: m.params, excludePicks: m.excludePicks };
    lastRunKey = runKeyOf(last.inputs, last.params, m.excludePicks);
    return { ...runDisplay(last, m.outlines, () => performance.now() - t0), runKey: lastRunKey };
  },
  sweep: async (m) => {
    if (!last) throw new Error('compute the grids first');
    if (sweeping) throw new Error('a sweep is already running');
    const t0 = performance.now();
    const spec = resolveSpec(m.spec);
    // the run this sweep varies: runs may go on meanwhile (the sweep does not hold the queue)
    const run = last;
    const runKey = lastRunKey;
    const inputs = run.inputs;
    const options = { params: lastOptions.params, excludePicks: lastOptions.excludePicks };
    const ranges = splitRange(spec.realisations, Math.max(1, Math.min(4, navigator.hardwareConcurrency || 2)));
    const done = ranges.map(() => 0);
    const workers = ranges.map(() => new Worker(new URL('./sweep-worker.ts', import.meta.url), { type: 'module' }));
    let parts: SweepPart[];
    try {
      parts = await new Promise<SweepPart[]>((resolve, reject) => {
        const got: (SweepPart | undefined)[] = ranges.map(() => undefined);
        sweeping = { workers, fail: reject };
        workers.forEach((w, q) => {
          w.onmessage = (ev: MessageEvent<{ part?: SweepPart; progress?: number; error?: string }>) => {
            const d = ev.data;
            if (d.progress !== undefined) {
              done[q] = d.progress;
              post({ id: m.id, progress: { stage: 'realisations', fraction: done.reduce((a, b) => a + b, 0) / spec.realisations } });
            } else if (d.part) {
              got[q] = d.part;
              if (got.every(Boolean)) resolve(got as SweepPart[]);
            } else reject(new Error(`realisations ${ranges[q][0]}…${ranges[q][1] - 1}: ${d.error}`));
          };
          w.onerror = (e) => reject(new Error(`realisations ${ranges[q][0]}…${ranges[q][1] - 1}: ${e.message}`));
          w.postMessage({ inputs, options, spec, start: ranges[q][0], end: ranges[q][1] } satisfies SweepJob);
        });
      });
    } finally {
      for (const w of workers) w.terminate();
      sweeping = null;
    }
    post({ id: m.id, progress: { stage: 'envelope', fraction: 1 } });
    const { result } = summariseParts(inputs, options, spec, parts);
    lastSweep = { runKey, result };
    return sweepDisplay(run, result, runKey, uncertaintySummary(run, result), performance.now() - t0);
  },
  figures: (m) => {
    if (!last || lastRunKey !== m.runKey) throw new Error('another run has replaced this one');
    if (!last.boundaries.hasLicence) throw new Error('this run has no licence');
    return licenceFigures(last);
  },
  section: (m) => {
    if (!last) throw new Error('compute the grids first');
    return sectionDisplay(last, m.lonlat, m.title);
  },
  plan: (m) => {
    if (!last) throw new Error('compute the grids first');
    return planDisplay(last, m.params, currentSweep());
  },
  export: async (m) => {
    if (!last) throw new Error('nothing computed yet');
    const run = { version: m.version, time: m.time, tool: 'app' as const };
    const sw = currentSweep();
    const files = sw ? { ...outputFiles(last, run, undefined, uncertaintySummary(last, sw)), ...uncertaintyFiles(last, sw, run) } : outputFiles(last, run);
    // the GeoPackage: SQLite in WebAssembly, loaded only when exporting (bundled, never fetched elsewhere)
    const [{ default: initSqlJs }, { default: wasmUrl }] = await Promise.all([import('sql.js/dist/sql-wasm-browser.js'), import('sql.js/dist/sql-wasm-browser.wasm?url')]);
    files['boundaries.gpkg'] = geoPackage(await initSqlJs({ locateFile: () => wasmUrl }), last, m.time).bytes;
    const out: Record<string, ArrayBuffer> = {};
    for (const [k, v] of Object.entries(files)) out[k] = v.slice().buffer as ArrayBuffer;
    return { files: out };
  },
};

/** Buffers to transfer with a response, never copy. */
function transfers(value: unknown): Transferable[] {
  const v = value as Partial<DisplayResult & { files: Record<string, ArrayBuffer> | { bytes: ArrayBuffer }[] }> & Partial<SweepDisplay>;
  if (v.grids && v.domains) return [...Object.values(v.grids).map((a) => a.buffer), v.domains.buffer];
  if (v.grids) return Object.values(v.grids).map((a) => a.buffer);
  if (Array.isArray(v.files)) return v.files.map((f) => f.bytes);
  if (v.files) return Object.values(v.files);
  return [];
}

// Requests are handled one at a time, in order: a file loaded twice in a row ends with the second.
let queue: Promise<void> = Promise.resolve();
self.onmessage = (ev: MessageEvent<ToWorker>) => {
  const m = ev.data;
  // a cancel must not wait behind the sweep it cancels
  if (m.kind === 'sweep-cancel') {
    if (sweeping) {
      for (const w of sweeping.workers) w.terminate();
      sweeping.fail(new Error('cancelled'));
    }
    return;
  }
  // a sweep waits on its sub-workers, not on this thread: it does not hold the queue, so runs go on
  if (m.kind === 'sweep') {
    void (async () => {
      try {
        const value = await handlers.sweep(m);
        post({ id: m.id, ok: true, value }, transfers(value));
      } catch (err) {
        post({ id: m.id, ok: false, error: err instanceof Error ? err.message : String(err) });
      }
    })();
    return;
  }
  queue = queue.then(async () => {
    if (m.kind === 'remove') {
      grids.delete(m.fileId);
      vectors.delete(m.fileId);
      return;
    }
    try {
      const value = await (handlers[m.kind] as (r: Request) => unknown)(m);
      post({ id: m.id, ok: true, value: value as never }, transfers(value));
    } catch (err) {
      post({ id: m.id, ok: false, error: err instanceof Error ? err.message : String(err) });
    }
  });
};
