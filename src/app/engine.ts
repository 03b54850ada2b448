/**
 * Main-thread side of the worker: one `request` per kind of the typed protocol (messages.ts), each
 * paired with its reply by a unique id. Cancel = terminate and restart the worker, then send the
 * loaded files again (the app keeps their bytes), so nothing the user loaded is lost.
 */

import type { GridReadOptions } from '../io/geotiff-read.js';
import type { GridReadReport } from '../io/report.js';
import type { DisplayResult, FromWorker, GridRole, Kind, LicenceFigures, PlanData, Requests, Response, SectionData, SweepDisplay, ToWorker, VectorRole } from './messages.js';

export interface LoadedFile {
  readonly id: string;
  readonly name: string;
  readonly kind: 'grid' | 'vector';
  role: GridRole | VectorRole | 'none';
  readonly bytes: ArrayBuffer;
  options: GridReadOptions;
  report: GridReadReport | null;
  features?: number;
  warnings?: string[];
  /** Part of the built-in invented demo. */
  demo?: boolean;
  /** Vector files as the map shows them (WGS 84), from the reader. */
  display?: unknown;
  error: string | null;
}

type Pending = { resolve: (v: unknown) => void; reject: (e: Error) => void; kind: Kind; onProgress?: (stage: string, fraction: number) => void };

export class Engine {
  private worker!: Worker;
  private pending = new Map<number, Pending>();
  private nextId = 0;
  private lastRun = 0;

  constructor(private readonly files: () => LoadedFile[]) {
    this.start();
  }

  private start(): void {
    this.worker = new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' });
    this.worker.onmessage = (ev: MessageEvent<FromWorker>) => this.receive(ev.data);
  }

  private receive(m: FromWorker): void {
    const p = this.pending.get(m.id);
    if (!p) return;
    if ('progress' in m) {
      p.onProgress?.(m.progress.stage, m.progress.fraction);
      return;
    }
    this.pending.delete(m.id);
    if (m.ok) p.resolve(m.value);
    else p.reject(new Error(m.error));
  }

  /** Send one request; the reply with the same id settles it. */
  request<K extends Kind>(kind: K, body: Requests[K]['req'], transfer: Transferable[] = [], onProgress?: Pending['onProgress']): Promise<Response<K>> {
    const id = ++this.nextId;
    return new Promise<Response<K>>((resolve, reject) => {
      this.pending.set(id, { resolve: resolve as (v: unknown) => void, reject, kind, onProgress });
      this.worker.postMessage({ id, kind, ...body } as ToWorker, transfer);
    });
  }

  async makeDemo(): Promise<{ name: string; bytes: ArrayBuffer }[]> {
    return (await this.request('make-demo', {})).files;
  }

  async load(f: LoadedFile): Promise<{ report: GridReadReport | null; features?: number; warnings?: string[]; display?: unknown }> {
    if (f.kind === 'grid') {
      const copy = f.bytes.slice(0);
      return this.request('load-grid', { fileId: f.id, name: f.name, bytes: copy, options: f.options }, [copy]);
    }
    return { report: null, ...(await this.request('load-vector', { fileId: f.id, name: f.name, text: new TextDecoder().decode(f.bytes) })) };
  }

  remove(fileId: string): void {
    this.worker.postMessage({ id: ++this.nextId, kind: 'remove', fileId } satisfies ToWorker);
  }

  /** Run the pipeline on the files in their roles; progress reports only for the newest run. */
  run(params: Record<string, unknown>, outlines: boolean, excludePicks: string[], onProgress: (stage: string, fraction: number) => void): Promise<DisplayResult> {
    const grids: Partial<Record<GridRole, string>> = {};
    const vectors: Partial<Record<VectorRole, string>> = {};
    for (const f of this.files()) {
      if (f.error || f.role === 'none') continue;
      if (f.kind === 'grid') grids[f.role as GridRole] = f.id;
      else vectors[f.role as VectorRole] = f.id;
    }
    const mine = ++this.lastRun;
    return this.request('run', { grids, vectors, params, outlines, excludePicks }, [], (stage, fraction) => mine === this.lastRun && onProgress(stage, fraction));
  }

  /** The licence's lengths and COT area for the run with this key (the last one). */
  figures(runKey: string): Promise<LicenceFigures> {
    return this.request('figures', { runKey });
  }

  async exportAll(version: string): Promise<Record<string, ArrayBuffer>> {
    return (await this.request('export', { time: new Date().toISOString(), version })).files;
  }

  section(lonlat: [number, number][], title: string): Promise<SectionData> {
    return this.request('section', { lonlat, title });
  }

  plan(params: Record<string, unknown>): Promise<PlanData> {
    return this.request('plan', { params });
  }

  /** Realisations of the last run, on the worker's sub-workers (both cores); progress as the share done. */
  sweep(spec: Record<string, unknown>, onProgress: (fraction: number) => void): Promise<SweepDisplay> {
    return this.request('sweep', { spec }, [], (stage, fraction) => stage === 'realisations' && onProgress(fraction));
  }

  /** Stop a running sweep (its sub-workers); the worker and the run it varies stay. */
  cancelSweep(): void {
    this.worker.postMessage({ id: ++this.nextId, kind: 'sweep-cancel' } satisfies ToWorker);
  }

  /** Stop whatever runs: terminate the worker, start a new one and reload every file into it. */
  async cancel(): Promise<void> {
    this.worker.terminate();
    for (const p of this.pending.values()) p.reject(new Error(p.kind === 'run' ? 'cancelled' : 'worker restarted'));
    this.pending.clear();
    this.start();
    for (const f of this.files()) if (!f.error) await this.load(f).catch(() => undefined);
  }
}
