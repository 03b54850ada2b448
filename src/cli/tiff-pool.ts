/**
 * The CLI writes its GeoTIFFs on worker threads, one file per job, as many at a time as there are
 * threads (one per core, at most 4), while the main thread builds the GeoJSON and GeoPackage
 * outputs. Each job's samples are copied (and the copy transferred) to its thread (the run's grids
 * stay whole for the other outputs); only `threads` copies exist at once, so the extra memory is
 * `threads` grids.
 */

import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { GridJob } from '../export/outputs.js';
import type { GridGeometry } from '../grid/geometry.js';

/** One job as posted to a worker (a worker has one job at a time, so replies need no id). */
export interface TiffJobMessage extends Omit<GridJob, 'path'> {
  readonly geometry: GridGeometry;
}

type Reply = { bytes: Uint8Array } | { error: string };

export function poolThreads(): number {
  return Math.max(1, Math.min(4, availableParallelism()));
}

/**
 * Write every job, handing each file to `sink` as it is done (the CLI writes it to disk and lets the
 * bytes go, so no more than `threads` encoded files are held at once); without a sink, resolves to
 * the bytes keyed by the job's path. Rejects with the first failure.
 */
export async function writeGeoTiffs(
  geometry: GridGeometry,
  jobs: readonly GridJob[],
  threads = poolThreads(),
  sink?: (path: string, bytes: Uint8Array) => Promise<void>,
): Promise<Record<string, Uint8Array>> {
  const out: Record<string, Uint8Array> = {};
  if (!jobs.length) return out;
  const workers = Array.from({ length: Math.min(threads, jobs.length) }, () => new Worker(new URL('./tiff-worker-entry.mjs', import.meta.url)));
  let next = 0;
  try {
    await Promise.all(
      workers.map(async (w) => {
        while (next < jobs.length) {
          const { path, values, options } = jobs[next++];
          const reply = await new Promise<Reply>((resolve, reject) => {
            w.once('message', resolve);
            w.once('error', reject);
            // a copy made here and transferred: cheaper than the structured clone postMessage makes
            const copy = values.slice();
            w.postMessage({ geometry, values: copy, options } satisfies TiffJobMessage, [copy.buffer as ArrayBuffer]);
          });
          w.removeAllListeners('error');
          if ('error' in reply) throw new Error(`writing ${path}: ${reply.error}`);
          if (sink) await sink(path, reply.bytes);
          else out[path] = reply.bytes;
        }
      }),
    );
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return out;
}
