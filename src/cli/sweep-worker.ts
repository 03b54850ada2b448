/**
 * Worker thread of the CLI's sweep pool (sweep-pool.ts): runs one range of realisations and sends
 * the part back, its arrays transferred.
 */

import { parentPort } from 'node:worker_threads';
import { runSweepPart, sweepBase, type SweepPart } from '../uncertainty/sweep.js';
import type { SweepJob } from './sweep-pool.js';

export function partBuffers(p: SweepPart): ArrayBuffer[] {
  const all = [...p.delta, ...p.cells, ...p.records.flatMap((r) => [r.widths, r.areas, ...(r.licenceAreas ? [r.licenceAreas] : [])]), ...Object.values(p.reach), ...Object.values(p.noData), ...p.domainCount];
  return [...new Set(all.map((a) => a.buffer as ArrayBuffer))];
}

parentPort?.on('message', (m: SweepJob) => {
  try {
    const base = sweepBase(m.inputs, m.options, m.spec);
    const part = runSweepPart(base, m.spec, m.start, m.end, (done) => {
      parentPort!.postMessage({ progress: done });
    });
    parentPort!.postMessage({ part }, partBuffers(part));
  } catch (err) {
    parentPort!.postMessage({ error: (err as Error).message });
  }
});
