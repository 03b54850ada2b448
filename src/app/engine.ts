/**
 * Main-thread side of the worker: loads, runs, exports; cancel = terminate and restart the worker,
 * then send the loaded files again (the app keeps their bytes), so nothing the user loaded is lost.
 */

import type { GridReadOptions } from '../io/geotiff-read.js';
import type { GridReadReport } from '../io/report.js';
import type { DisplayResult, FromWorker, GridRole, PlanData, SectionData, ToWorker, VectorRole } from './messages.js';

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
  error: string | null;
}

type Pending = { resolve: (v: never) => void; reject: (e: Error) => void };

export class Engine {
  private worker!: Worker;
  private pending = new Map<string, Pending>();
  private runId = 0;
  private requestId = 0;
  onProgress: (stage: string, fraction: number) => void = () => {};

  constructor(private readonly files: () => LoadedFile[]) {
    this.start();
  }

  private start(): void {
    this.worker = new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' });
    this.worker.onmessage = (ev: MessageEvent<FromWorker>) => this.receive(ev.data);
  }

  private receive(m: FromWorker): void {
    const settle = (key: string, ok: boolean, value: unknown) => {
      const p = this.pending.get(key);
      if (!p) return;
      this.pending.delete(key);
      if (ok) p.resolve(value as never);
      else p.reject(new Error(String(value)));
    };
    switch (m.type) {
      case 'loaded':
        settle(`load:${m.id}`, true, m);
        break;
      case 'load-error':
        settle(`load:${m.id}`, false, m.message);
        break;
      case 'demo':
        settle('demo', true, m.files);
        break;
      case 'progress':
        if (m.runId === this.runId) this.onProgress(m.stage, m.fraction);
        break;
      case 'result':
        settle(`run:${m.runId}`, true, m.result);
        break;
      case 'run-error':
        settle(`run:${m.runId}`, false, m.message);
        break;
      case 'exported':
        settle(`export:${m.requestId}`, true, m.files);
        break;
      case 'section-result':
        settle(`section:${m.requestId}`, m.section !== null, m.section ?? m.error);
        break;
      case 'plan-result':
        settle(`plan:${m.requestId}`, m.plan !== null, m.plan ?? m.error);
        break;
    }
  }

  private call<T>(key: string, msg: ToWorker, transfer: Transferable[] = []): Promise<T> {
    return new Promise<T>((resolve, reject) => {
      this.pending.set(key, { resolve: resolve as (v: never) => void, reject });
      this.worker.postMessage(msg, transfer);
    });
  }

  makeDemo(): Promise<{ name: string; bytes: ArrayBuffer }[]> {
    return this.call('demo', { type: 'make-demo' });
  }

  load(f: LoadedFile): Promise<{ report: GridReadReport | null; features?: number; warnings?: string[] }> {
    const copy = f.bytes.slice(0);
    if (f.kind === 'grid') {
      return this.call(`load:${f.id}`, { type: 'load-grid', id: f.id, name: f.name, bytes: copy, options: f.options }, [copy]);
    }
    return this.call(`load:${f.id}`, { type: 'load-vector', id: f.id, name: f.name, text: new TextDecoder().decode(f.bytes) });
  }

  remove(id: string): void {
    this.worker.postMessage({ type: 'remove', id } satisfies ToWorker);
  }

  run(params: Record<string, unknown>, outlines = false, excludePicks: string[] = []): Promise<DisplayResult> {
    const runId = ++this.runId;
    const grids: Partial<Record<GridRole, string>> = {};
    const vectors: Partial<Record<VectorRole, string>> = {};
    for (const f of this.files()) {
      if (f.error || f.role === 'none') continue;
      if (f.kind === 'grid') grids[f.role as GridRole] = f.id;
      else vectors[f.role as VectorRole] = f.id;
    }
    return this.call(`run:${runId}`, { type: 'run', runId, grids, vectors, params, outlines, excludePicks });
  }

  exportAll(version: string): Promise<Record<string, ArrayBuffer>> {
    const requestId = ++this.requestId;
    return this.call(`export:${requestId}`, { type: 'export', requestId, time: new Date().toISOString(), version });
  }

  section(lonlat: [number, number][], title: string): Promise<SectionData> {
    const requestId = ++this.requestId;
    return this.call(`section:${requestId}`, { type: 'section', requestId, lonlat, title });
  }

  plan(params: Record<string, unknown>): Promise<PlanData> {
    const requestId = ++this.requestId;
    return this.call(`plan:${requestId}`, { type: 'plan', requestId, params });
  }

  /** Stop whatever runs: terminate the worker, start a new one and reload every file into it. */
  async cancel(): Promise<void> {
    this.worker.terminate();
    for (const [key, p] of this.pending) p.reject(new Error(key.startsWith('run:') ? 'cancelled' : 'worker restarted'));
    this.pending.clear();
    this.start();
    for (const f of this.files()) if (!f.error) await this.load(f).catch(() => undefined);
  }
}
