/**
 * Screenshots of the main states of the real app, for the README: `npm run screenshots`.
 * Builds the app, serves it on loopback, drives Debian's Chromium. Rerunnable; writes docs/screenshots/.
 */
import { mkdirSync } from 'node:fs';
import { loadFiles, startApp, openPage, waitReady } from '../tests/helpers/app.js';

const out = 'docs/screenshots';
mkdirSync(out, { recursive: true });
const app = await startApp();
try {
  // what a new user sees first, at a common laptop size and a larger one
  for (const [w, hgt] of [[1366, 768], [1600, 1000]]) {
    const c = await app.browser.newContext({ viewport: { width: w, height: hgt } });
    const first = await openPage(app, c);
    await first.page.mouse.move(Math.round(w / 2), Math.round(hgt / 2));
    await first.page.waitForTimeout(300);
    await first.page.screenshot({ path: `${out}/first-minute-${w}x${hgt}.png` });
    await c.close();
  }
  const ctx = await app.browser.newContext({ viewport: { width: 1600, height: 1000 }, acceptDownloads: true });
  const { page } = await openPage(app, ctx);
  await page.mouse.move(800, 500);
  await page.screenshot({ path: `${out}/overview.png` });

  let runs = await page.evaluate(() => window.__taperline.runs);
  await page.selectOption('#layer-select', 'domains');
  await page.waitForTimeout(400);
  const pt = await page.evaluate(() => {
    const fc = window.__taperline.state.result!.boundaries as { features: { properties: { kind: string; evidence: string }; geometry: { coordinates: number[][] } }[] };
    const f = fc.features.find((q) => q.properties.kind === 'crustal-taper-limit' && q.properties.evidence === 'proxy')!;
    const c = f.geometry.coordinates[Math.floor(f.geometry.coordinates.length / 2)];
    const s = window.__taperline.map.project([c[0], c[1]]);
    const r = window.__taperline.map.getContainer().getBoundingClientRect();
    return { x: r.left + s.x, y: r.top + s.y };
  });
  await page.mouse.click(pt.x, pt.y);
  await page.waitForTimeout(400);
  await page.screenshot({ path: `${out}/domains-and-boundary.png` });

  await page.keyboard.press('Escape');
  await page.evaluate(() => document.querySelectorAll('.maplibregl-popup').forEach((e) => e.remove()));
  await loadFiles(page, 'tests/fixtures/gdal/km_units.tif');
  await loadFiles(page, { name: 'damaged_moho.tif', mimeType: 'image/tiff', buffer: Buffer.concat([Buffer.from([0x49, 0x49, 42, 0, 8, 0, 0, 0]), Buffer.alloc(64, 0xee)]) });
  await page.locator('.file[data-name="damaged_moho.tif"] .file-error').waitFor();
  await page.evaluate(() => document.querySelector('.file[data-name="km_units.tif"]')?.scrollIntoView());
  await page.screenshot({ path: `${out}/loading-files.png`, clip: { x: 0, y: 0, width: 760, height: 1000 } });

  runs = await page.evaluate(() => window.__taperline.runs);
  await page.selectOption('#layer-select', 'beta-subsidence');
  await page.evaluate(() => document.querySelector('#p-tc0')?.scrollIntoView());
  await waitReady(page, runs);
  await page.screenshot({ path: `${out}/beta-from-subsidence.png` });

  // planning and a section at true scale, on a fresh page of the demo
  const fresh = await app.browser.newContext({ viewport: { width: 1600, height: 1000 }, acceptDownloads: true });
  const q = await openPage(app, fresh);
  await q.page.click('#btn-plan');
  await q.page.waitForFunction(() => (window.__taperline.planned ?? 0) >= 1, null, { timeout: 60_000 });
  await q.page.locator('#proposal-list tr', { hasText: '(dip)' }).first().locator('button').click();
  await q.page.locator('#section-panel:not([hidden]) svg').waitFor();
  await q.page.waitForTimeout(500);
  await q.page.screenshot({ path: `${out}/survey-plan-and-section.png` });
  // the exported map image
  const [dl] = await Promise.all([q.page.waitForEvent('download'), q.page.click('#export-png')]);
  await dl.saveAs(`${out}/map-image.png`);

  // how sure are we: 200 realisations, the envelope on the map and the panel's figures
  const third = await app.browser.newContext({ viewport: { width: 1600, height: 1000 } });
  const u = await openPage(app, third);
  await u.page.click('#btn-sweep');
  await u.page.waitForFunction(() => (window.__taperline.sweeps ?? 0) >= 1, null, { timeout: 180_000 });
  await u.page.selectOption('#layer-select', 'p-continental');
  await u.page.evaluate(() => document.querySelector('#sweep-areas')?.scrollIntoView({ block: 'center' }));
  await u.page.waitForTimeout(800);
  await u.page.screenshot({ path: `${out}/uncertainty.png` });
  console.log(`screenshots written to ${out}/`);
} finally {
  await app.close();
}
