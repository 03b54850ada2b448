/**
 * The CLI's realisations on worker threads: the range 0…N − 1 split into one contiguous range per
 * thread (one per core, at most 4), each run by runSweepPart in its own thread, the parts merged in
 * order. The inputs are copied to each thread once (structured clone); the parts come back
 * transferred. Parts merge exactly, so the output does not depend on the number of threads.
 */

import { Worker } from 'node:worker_threads';
import type { PipelineInputs } from '../pipeline.js';
import { splitRange } from '../uncertainty/run.js';
import type { UncertaintySpec } from '../uncertainty/spec.js';
import type { SweepJob, SweepPart } from '../uncertainty/sweep.js';
import { poolThreads } from './tiff-pool.js';

export type { SweepJob };

type Reply = { part: SweepPart } | { progress: number } | { error: string };

export async function runSweepThreads(
  inputs: PipelineInputs,
  options: SweepJob['options'],
  spec: UncertaintySpec,
  range: [number, number],
  threads = poolThreads(),
  onProgress?: (done: number) => void,
): Promise<SweepPart[]> {
  const n = range[1] - range[0];
  const ranges = splitRange(n, threads).map(([a, b]) => [a + range[0], b + range[0]] as [number, number]);
  const done = new Array(ranges.length).fill(0);
  const workers = ranges.map(() => new Worker(new URL('./sweep-worker-entry.mjs', import.meta.url)));
  try {
    return await Promise.all(
      workers.map(
        (w, q) =>
          new Promise<SweepPart>((resolve, reject) => {
            w.on('message', (m: Reply) => {
              if ('progress' in m) {
                done[q] = m.progress;
                onProgress?.(done.reduce((s, v) => s + v, 0));
              } else if ('part' in m) resolve(m.part);
              else reject(new Error(`realisations ${ranges[q][0]}…${ranges[q][1] - 1}: ${m.error}`));
            });
            w.once('error', reject);
            w.postMessage({ inputs, options, spec, start: ranges[q][0], end: ranges[q][1] } satisfies SweepJob);
          }),
      ),
    );
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
}
