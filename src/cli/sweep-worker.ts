/**
 * Worker thread of the CLI's sweep pool (sweep-pool.ts): runs one range of realisations and sends
 * the part back, its arrays transferred.
 */

import { parentPort } from 'node:worker_threads';
import { partArrays, runSweepPart, sweepBase } from '../uncertainty/sweep.js';
import type { SweepJob } from './sweep-pool.js';

parentPort?.on('message', (m: SweepJob) => {
  try {
    const base = sweepBase(m.inputs, m.options, m.spec);
    const part = runSweepPart(base, m.spec, m.start, m.end, (done) => {
      parentPort!.postMessage({ progress: done });
    });
    parentPort!.postMessage({ part }, [...new Set(partArrays(part).map((a) => a.buffer as ArrayBuffer))]);
  } catch (err) {
    parentPort!.postMessage({ error: (err as Error).message });
  }
});
