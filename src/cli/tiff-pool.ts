/**
 * The CLI writes its GeoTIFFs on worker threads, one file per job, as many at a time as there are
 * threads (one per core, at most 4), while the main thread builds the GeoJSON and GeoPackage
 * outputs. Each job's samples are copied to its thread (the run's grids stay whole for the other
 * outputs); only `threads` copies exist at once, so the extra memory is `threads` grids.
 */

import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { GridJob } from '../export/outputs.js';
import type { GridGeometry } from '../grid/geometry.js';

export interface TiffJobMessage extends Omit<GridJob, 'path'> {
  readonly id: number;
  readonly geometry: GridGeometry;
}

type Reply = { id: number; bytes: Uint8Array } | { id: number; error: string };

export function poolThreads(): number {
  return Math.max(1, Math.min(4, availableParallelism()));
}

/** Write every job; resolves to bytes keyed by the job's path (rejects with the first failure). */
export async function writeGeoTiffs(geometry: GridGeometry, jobs: readonly GridJob[], threads = poolThreads()): Promise<Record<string, Uint8Array>> {
  const out: Record<string, Uint8Array> = {};
  if (!jobs.length) return out;
  const workers = Array.from({ length: Math.min(threads, jobs.length) }, () => new Worker(new URL('./tiff-worker-entry.mjs', import.meta.url)));
  let next = 0;
  try {
    await Promise.all(
      workers.map(async (w) => {
        while (next < jobs.length) {
          const id = next++;
          const { path, values, options } = jobs[id];
          const reply = await new Promise<Reply>((resolve, reject) => {
            w.once('message', resolve);
            w.once('error', reject);
            w.postMessage({ id, geometry, values, options } satisfies TiffJobMessage);
          });
          w.removeAllListeners('error');
          if ('error' in reply) throw new Error(`writing ${path}: ${reply.error}`);
          out[path] = reply.bytes;
        }
      }),
    );
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return out;
}
