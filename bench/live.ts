/**
 * The app's recompute loop in Node: `npx tsx bench/live.ts [runs]`. On the demo (licence, seismic
 * lines and isochrons; no picks, as the browser test's timing), one run computes everything, then
 * `runs` domain/line changes (the taper threshold) go through the pipeline cache as the worker's do,
 * each with the display data the worker builds and then the licence's lengths and COT area (which
 * the page asks for once the map is drawn). Prints each change's time, the median until the map's
 * data and the median by stage (from the pipeline's own progress marks). A benchmark, not a test.
 */

import { demoInputs } from '../tests/helpers/demo-run.js';
import { DEMO_PARAMS } from '../fixtures/demo-margin.js';
import { createPipelineCache, runPipeline } from '../src/pipeline.js';
import { licenceFigures, runDisplay } from '../src/app/worker-views.js';

const runs = Number(process.argv[2] ?? 20);
const inputs = await demoInputs({ picks: false, licence: true, isochrons: true, lines: true });
const cache = createPipelineCache();
const stages = new Map<string, number[]>();
const totals: number[] = [];
/** Until the display data is ready (what the map waits for), without the licence figures after it. */
const mapOnly: number[] = [];
function run(params: Record<string, unknown>): number {
  const marks: [string, number][] = [];
  const t0 = performance.now();
  const r = runPipeline(inputs, { params: { ...DEMO_PARAMS, ...params }, cache, onProgress: (s) => marks.push([s, performance.now()]) });
  const t1 = performance.now();
  runDisplay(r, false, () => 0);
  const t2 = performance.now();
  // what the page asks for once the map is drawn: the licence's lengths and COT area (the exact clip)
  licenceFigures(r);
  const t3 = performance.now();
  marks.push(['display', t1], ['licence figures', t2], ['end', t3]);
  mapOnly.push(t2 - t0);
  for (let q = 0; q < marks.length - 1; q++) {
    const [name, at] = marks[q];
    if (!stages.has(name)) stages.set(name, []);
    stages.get(name)!.push(marks[q + 1][1] - at);
  }
  return t3 - t0;
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
console.log(`first run (everything): ${run({}).toFixed(0)} ms`);
stages.clear();
mapOnly.length = 1; // (the first run's figure is left out below)
for (let k = 0; k < runs; k++) totals.push(run({ taperThreshold: 3000 + 50 * k }));
console.log(`domain/line changes: ${totals.map((t) => t.toFixed(0)).join(' ')} ms`);
console.log(`median ${median(totals).toFixed(0)} ms (min ${Math.min(...totals).toFixed(0)}, max ${Math.max(...totals).toFixed(0)}); until the map's data: median ${median(mapOnly.slice(1)).toFixed(0)} ms; by stage, median ms:`);
for (const [name, xs] of stages) if (median(xs) >= 1) console.log(`  ${name.padEnd(20)} ${median(xs).toFixed(0)}`);
