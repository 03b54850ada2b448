import { demoInputs } from '../tests/helpers/demo-run.js';
import { runPipeline } from '../src/pipeline.js';
const inputs = await demoInputs({ picks: true, licence: true, isochrons: true, lines: true });
for (let rep = 0; rep < 2; rep++) {
let t = performance.now();
runPipeline(inputs, { params: { riftAge: 110 }, onProgress: (s) => { const n = performance.now(); console.log('  before', s, (n - t).toFixed(0)); t = n; } });
}
