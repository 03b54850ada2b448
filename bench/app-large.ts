/**
 * The app on a large margin: `npx tsx bench/app-large.ts [N]` (default 2048). Builds the app, opens
 * it in headless Chromium (software WebGL, as the browser tests run), starts a new project with the
 * invented margin at N × N (bench/inputs.ts: seabed, top basement, Moho; no vector evidence), and
 * prints the times the page records: the first run, a full recompute (reference thickness) and a
 * domain/line change (taper threshold), each computed in the worker and until the first frame with
 * the new layers. A benchmark, not a test: nothing fails on timing.
 */

import { readFileSync } from 'node:fs';
import { openPage, startApp, loadFiles, waitReady } from '../tests/helpers/app.js';
import { benchInputs } from './inputs.js';

const n = Number(process.argv[2] ?? 2048);
const paths = benchInputs(n, console.log);
const app = await startApp();
try {
  const p = await openPage(app);
  const runs = () => p.page.evaluate(() => window.__taperline.runs);
  const timing = () => p.page.evaluate(() => `${window.__taperline.lastMillis.toFixed(0)} ms computed, ${window.__taperline.drawnMillis.toFixed(0)} ms until drawn`);
  let r = await runs();
  const t0 = performance.now();
  await loadFiles(
    p.page,
    (['seabed', 'top-basement', 'moho'] as const).map((g) => ({ name: `${g}.tif`, mimeType: 'image/tiff', buffer: readFileSync(paths[g]) })),
    'new',
  );
  await waitReady(p.page, r + 1);
  console.log(`${n}²: first run after loading the three grids: ${await timing()}; ${((performance.now() - t0) / 1000).toFixed(1)} s from choosing the files`);
  for (const [what, id, value] of [
    ['full recompute (reference thickness)', '#p-tc0', '34000'],
    ['domain/line change (taper threshold)', '#p-taperThreshold', '6000'],
    ['full recompute (reference thickness)', '#p-tc0', '35000'],
    ['domain/line change (taper threshold)', '#p-taperThreshold', '3000'],
  ] as const) {
    r = await runs();
    await p.page.evaluate((sel) => document.querySelector(sel)?.closest('details')?.setAttribute('open', ''), id);
    await p.page.fill(id, value);
    await p.page.dispatchEvent(id, 'change');
    await waitReady(p.page, r + 1);
    console.log(`${n}²: ${what}: ${await timing()}`);
  }
  if (p.errors.length) console.log(`page errors: ${p.errors.join(' | ')}`);
} finally {
  await app.close();
}
