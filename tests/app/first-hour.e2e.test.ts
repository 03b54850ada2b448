// The first hour with your own data, where users meet it (built app, headless Chromium): grids far
// from the demo, a new project, a file reloaded twice, opacity without recolouring, and the view
// and planning values kept across a reload.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { crsFromEpsg, WGS84 } from '../../src/crs/registry.js';
import { transformer } from '../../src/crs/transform.js';
import { writeGeoTiff } from '../../src/io/geotiff-write.js';
import { loadFiles, openPage, startApp, waitReady, type App, type OpenedPage } from '../helpers/app.js';
import { toolOrSkip } from '../helpers/tools.js';

const haveChromium = toolOrSkip('chromium');

/** A basement and a Moho in WGS 84 / UTM zone 33N (the Adriatic), far from the demo's South Pacific. */
function utm33Grids(): { basement: Buffer; moho: Buffer; bounds: [number, number, number, number] } {
  const nx = 80;
  const ny = 60;
  const g = { nx, ny, x0: 400_000, y0: 4_700_000, dx: 1000, dy: -1000, registration: 'area' as const, crs: crsFromEpsg(32633) };
  const basement = new Float32Array(nx * ny);
  const moho = new Float32Array(nx * ny);
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    basement[j * nx + i] = 3000 + 40 * i;
    moho[j * nx + i] = basement[j * nx + i] + Math.max(500, 30_000 - 400 * i);
  }
  const t = transformer(crsFromEpsg(32633), WGS84);
  const corners = [[399_500, 4_700_500], [479_500, 4_700_500], [399_500, 4_640_500], [479_500, 4_640_500]].map((p) => t.forward(p as [number, number]));
  const lons = corners.map((c) => c[0]);
  const lats = corners.map((c) => c[1]);
  return {
    basement: Buffer.from(writeGeoTiff(g, basement, { noData: 'nan', unit: 'm' })),
    moho: Buffer.from(writeGeoTiff(g, moho, { noData: 'nan', unit: 'm' })),
    bounds: [Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)],
  };
}

describe.skipIf(!haveChromium)('the first hour with your own data', () => {
  let app: App;
  let p: OpenedPage;

  beforeAll(async () => {
    app = await startApp();
    p = await openPage(app);
  }, 180_000);
  afterAll(async () => {
    await app?.close();
  });

  it('opacity changes and runs that leave the shown grid as it was recolour nothing (the colouring is cached per layer and content)', async () => {
    const before = await p.page.evaluate(() => window.__taperline.colourings());
    for (const v of ['0.2', '0.4', '0.6', '0.9', '0.5']) {
      await p.page.locator('#opacity').fill(v);
      await p.page.waitForTimeout(30);
    }
    expect(await p.page.evaluate(() => window.__taperline.state.opacity)).toBe(0.5);
    expect(await p.page.evaluate(() => window.__taperline.colourings())).toBe(before);
    // a line parameter changes no crustal-thickness value: the run recolours nothing
    expect(await p.page.evaluate(() => window.__taperline.state.layer)).toBe('crustal-thickness');
    const runs = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.evaluate(() => document.querySelector('#p-taperThreshold')?.closest('details')?.setAttribute('open', ''));
    await p.page.fill('#p-taperThreshold', '2500');
    await p.page.dispatchEvent('#p-taperThreshold', 'change');
    await waitReady(p.page, runs + 1);
    expect(await p.page.evaluate(() => window.__taperline.colourings())).toBe(before);
    // the domains, shown, change with the necking fraction (necking ↔ proximal): recoloured
    await p.page.selectOption('#layer-select', 'domains');
    const withDomains = await p.page.evaluate(() => window.__taperline.colourings());
    expect(withDomains).toBeGreaterThan(before);
    const runs2 = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.evaluate(() => document.querySelector('#p-neckingFraction')?.closest('details')?.setAttribute('open', ''));
    await p.page.fill('#p-neckingFraction', '0.6');
    await p.page.dispatchEvent('#p-neckingFraction', 'change');
    await waitReady(p.page, runs2 + 1);
    const afterRun = await p.page.evaluate(() => window.__taperline.colourings());
    expect(afterRun).toBeGreaterThan(withDomains);
    await p.page.selectOption('#layer-select', 'sediment-thickness');
    expect(await p.page.evaluate(() => window.__taperline.colourings())).toBeGreaterThan(afterRun);
  });

  it('a file reloaded twice in quick succession ends with the second request\'s result', async () => {
    const card = p.page.locator('.file[data-name="moho.tif"]');
    const units = card.locator('.overrides select').first();
    await units.selectOption('km');
    await units.selectOption('m'); // no wait: both requests in flight
    await p.page.waitForFunction(() => {
      const f = window.__taperline.state.files.find((x) => x.name === 'moho.tif')!;
      return f.options.units === 'm' && f.report?.units.value === 'm';
    }, null, { timeout: 30_000 });
    await p.page.waitForTimeout(1500);
    const f = await p.page.evaluate(() => window.__taperline.state.files.find((x) => x.name === 'moho.tif')!);
    expect(f.error).toBeNull();
    expect(f.report!.units.value).toBe('m');
    expect(f.role).toBe('moho');
  });

  it('a file that takes a role from another says so (the other is set to "not used")', async () => {
    await loadFiles(p.page, { name: 'moho-reprocessed.tif', mimeType: 'image/tiff', buffer: readFileSync('fixtures/demo/moho.tif') }, 'add');
    // said under Data, where it stays until the next file action (the status line moves on to the run)
    await p.page.waitForFunction(() => /moho-reprocessed\.tif is now the moho/.test(document.querySelector('#files-note')?.textContent ?? ''), null, { timeout: 30_000 });
    expect(await p.page.locator('#files-note').textContent()).toMatch(/moho\.tif no longer used/);
    const roles = await p.page.evaluate(() => window.__taperline.state.files.filter((f) => /moho/.test(f.name)).map((f) => `${f.name}:${f.role}`).sort());
    expect(roles).toEqual(['moho-reprocessed.tif:moho', 'moho.tif:none']);
  });

  it('evidence GeoJSON that carries a projected CRS is drawn reprojected to longitude/latitude', async () => {
    // a licence square in WGS 84 / UTM 9S metres (an old-style "crs" member), inside the demo area
    const ring = [[560_000, 6_120_000], [600_000, 6_120_000], [600_000, 6_160_000], [560_000, 6_160_000], [560_000, 6_120_000]];
    const fc = { type: 'FeatureCollection', crs: { type: 'name', properties: { name: 'urn:ogc:def:crs:EPSG::32709' } }, features: [{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } }] };
    await loadFiles(p.page, { name: 'licence-utm.geojson', mimeType: 'application/geo+json', buffer: Buffer.from(JSON.stringify(fc)) }, 'add');
    await p.page.waitForFunction(() => window.__taperline.state.files.some((f) => f.name === 'licence-utm.geojson' && f.display), null, { timeout: 30_000 });
    // what the map's licence source is given (main.ts sets it from the file's display copy)
    const shown = await p.page.evaluate(() => {
      const f = window.__taperline.state.files.find((x) => x.name === 'licence-utm.geojson')!;
      return { role: f.role, first: (f.display as { features: { geometry: { coordinates: number[][][] } }[] }).features[0].geometry.coordinates[0][0] };
    });
    expect(shown.role).toBe('licence');
    const [lon, lat] = transformer(crsFromEpsg(32709), WGS84).forward([560_000, 6_120_000]);
    expect(shown.first[0]).toBeCloseTo(lon, 6);
    expect(shown.first[1]).toBeCloseTo(lat, 6);
  });

  it('grids in another UTM zone far from the demo: the map zooms to them, and the demo marking goes', async () => {
    const g = utm33Grids();
    const runs = await p.page.evaluate(() => window.__taperline.runs);
    await loadFiles(p.page, [
      { name: 'top-basement-utm33.tif', mimeType: 'image/tiff', buffer: g.basement },
      { name: 'moho-utm33.tif', mimeType: 'image/tiff', buffer: g.moho },
    ], 'new');
    await p.page.waitForFunction(() => window.__taperline.state.result?.geometry.crs.id === 'EPSG:32633' && !window.__taperline.state.running, null, { timeout: 60_000 });
    await waitReady(p.page, runs + 1);
    const files = await p.page.evaluate(() => window.__taperline.state.files.map((f) => `${f.name}:${f.role}`).sort());
    expect(files).toEqual(['moho-utm33.tif:moho', 'top-basement-utm33.tif:top-basement']);
    const b = await p.page.evaluate(() => window.__taperline.map.getBounds().toArray().flat());
    const [w, s, e, n] = g.bounds;
    expect(b[0]).toBeLessThanOrEqual(w);
    expect(b[1]).toBeLessThanOrEqual(s);
    expect(b[2]).toBeGreaterThanOrEqual(e);
    expect(b[3]).toBeGreaterThanOrEqual(n);
    expect(await p.page.locator('#scenario').textContent()).toBe('Your data (kept in this browser only)');
    // panning away and "Fit to data" comes back
    await p.page.evaluate(() => window.__taperline.map.jumpTo({ center: [-100, 20], zoom: 3 }));
    await p.page.click('#btn-fit');
    const c = await p.page.evaluate(() => window.__taperline.map.getCenter().toArray());
    expect(Math.abs(c[0] - (w + e) / 2)).toBeLessThan(0.5);
  });

  it('the view and the planning values survive a reload', async () => {
    await p.page.evaluate(() => window.__taperline.map.jumpTo({ center: [14.2, 42.1], zoom: 8.5 }));
    await p.page.fill('#plan-spacingKm', '35');
    await p.page.press('#plan-spacingKm', 'Tab');
    await p.page.waitForTimeout(300);
    await p.page.reload();
    await waitReady(p.page);
    await p.page.waitForTimeout(500);
    const c = await p.page.evaluate(() => ({ center: window.__taperline.map.getCenter().toArray(), zoom: window.__taperline.map.getZoom() }));
    expect(c.center[0]).toBeCloseTo(14.2, 3);
    expect(c.center[1]).toBeCloseTo(42.1, 3);
    expect(c.zoom).toBeCloseTo(8.5, 3);
    expect(await p.page.locator('#plan-spacingKm').inputValue()).toBe('35');
  });

  it('"New project" from the demo clears the demo\'s files in one action, asking first', async () => {
    const q = await openPage(app); // a fresh context: the demo
    expect(await q.page.evaluate(() => window.__taperline.state.files.some((f) => f.demo))).toBe(true);
    q.page.once('dialog', (d) => void d.accept());
    await q.page.click('#btn-new');
    await q.page.waitForFunction(() => window.__taperline.state.files.length === 0);
    expect(await q.page.locator('#scenario').textContent()).toBe('No data loaded');
    expect(await q.page.evaluate(() => window.__taperline.state.result)).toBeNull();
    await q.page.close();
  });

  it('the status line counts the warnings in words and links to them', async () => {
    const q = await openPage(app);
    const text = (await q.page.locator('#status-warnings').textContent())!;
    expect(text).toMatch(/^(\d+ warnings?|no warnings)$/);
    await q.page.click('#status-warnings');
    await q.page.close();
  });
});
