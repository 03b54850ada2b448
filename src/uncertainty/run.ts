/**
 * A whole sweep in one thread: the deterministic domain stage, every realisation, the envelope. The
 * shells split it where it pays (CLI: worker threads; app: Web Workers), each part being
 * runSweepPart over a range, and merge the parts: the result is the same bytes however it is split.
 */

import type { PipelineInputs, PipelineOptions } from '../pipeline.js';
import type { UncertaintySpec } from './spec.js';
import { mergeParts, summarise, type UncertaintyResult } from './summary.js';
import { runSweepPart, sweepBase, type SweepBase, type SweepPart } from './sweep.js';

/** Contiguous ranges covering 0…N − 1 in `parts` pieces (the first ones one longer where N does not divide). */
export function splitRange(n: number, parts: number): [number, number][] {
  const k = Math.max(1, Math.min(parts, n));
  const out: [number, number][] = [];
  let at = 0;
  for (let q = 0; q < k; q++) {
    const len = Math.floor(n / k) + (q < n % k ? 1 : 0);
    out.push([at, at + len]);
    at += len;
  }
  return out;
}

export function runSweep(inputs: PipelineInputs, options: PipelineOptions, spec: UncertaintySpec, onRealisation?: (done: number) => void): { base: SweepBase; result: UncertaintyResult } {
  const base = sweepBase(inputs, options, spec);
  const part = runSweepPart(base, spec, 0, spec.realisations, onRealisation);
  return { base, result: summarise(base, spec, part) };
}

/** The envelope from parts made elsewhere (other threads, processes or machines). */
export function summariseParts(inputs: PipelineInputs, options: PipelineOptions, spec: UncertaintySpec, parts: readonly SweepPart[]): { base: SweepBase; result: UncertaintyResult } {
  const base = sweepBase(inputs, options, spec);
  for (const p of parts) if (p.key !== base.key) throw new Error(`realisations ${p.start}…${p.end - 1} were made from other inputs, parameters or uncertainty spec than this run`);
  return { base, result: summarise(base, spec, mergeParts(parts, spec)) };
}
