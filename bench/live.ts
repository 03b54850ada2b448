/**
 * The app's recompute loop in Node: `npx tsx bench/live.ts [runs]`. On the demo (licence, seismic
 * lines and isochrons; no picks, as the browser test's timing), one run computes everything, then
 * `runs` domain/line changes (the taper threshold) go through the pipeline cache as the worker's do,
 * each with the display data the worker builds. Prints each change's time and the median by stage
 * (from the pipeline's own progress marks). A benchmark, not a test.
 */

import { demoInputs } from '../tests/helpers/demo-run.js';
import { DEMO_PARAMS } from '../fixtures/demo-margin.js';
import { createPipelineCache, runPipeline } from '../src/pipeline.js';
import { runDisplay } from '../src/app/worker-views.js';

const runs = Number(process.argv[2] ?? 20);
const inputs = await demoInputs({ picks: false, licence: true, isochrons: true, lines: true });
const cache = createPipelineCache();
const stages = new Map<string, number[]>();
const totals: number[] = [];
function run(params: Record<string, unknown>): number {
  const marks: [string, number][] = [];
  const t0 = performance.now();
  const r = runPipeline(inputs, { params: { ...DEMO_PARAMS, ...params }, cache, onProgress: (s) => marks.push([s, performance.now()]) });
  const t1 = performance.now();
  runDisplay(r, false, () => 0);
  const t2 = performance.now();
  marks.push(['display', t1], ['end', t2]);
  for (let q = 0; q < marks.length - 1; q++) {
    const [name, at] = marks[q];
    if (!stages.has(name)) stages.set(name, []);
    stages.get(name)!.push(marks[q + 1][1] - at);
  }
  return t2 - t0;
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
console.log(`first run (everything): ${run({}).toFixed(0)} ms`);
stages.clear();
for (let k = 0; k < runs; k++) totals.push(run({ taperThreshold: 3000 + 50 * k }));
console.log(`domain/line changes: ${totals.map((t) => t.toFixed(0)).join(' ')} ms`);
console.log(`median ${median(totals).toFixed(0)} ms (min ${Math.min(...totals).toFixed(0)}, max ${Math.max(...totals).toFixed(0)}); by stage, median ms:`);
for (const [name, xs] of stages) if (median(xs) >= 1) console.log(`  ${name.padEnd(20)} ${median(xs).toFixed(0)}`);
