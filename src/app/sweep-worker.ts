/// <reference lib="webworker" />
/**
 * A sweep sub-worker, started by the pipeline worker (one per core): runs one range of realisations
 * (uncertainty/sweep.ts) and sends the part back with its arrays transferred, telling each
 * realisation done as it goes.
 */

import { partArrays, runSweepPart, sweepBase, type SweepJob } from '../uncertainty/sweep.js';

self.onmessage = (ev: MessageEvent<SweepJob>) => {
  const m = ev.data;
  try {
    const base = sweepBase(m.inputs, m.options, m.spec);
    const part = runSweepPart(base, m.spec, m.start, m.end, (done) => (self as unknown as Worker).postMessage({ progress: done }));
    (self as unknown as Worker).postMessage({ part }, [...new Set(partArrays(part).map((a) => a.buffer as ArrayBuffer))]);
  } catch (err) {
    (self as unknown as Worker).postMessage({ error: err instanceof Error ? err.message : String(err) });
  }
};
