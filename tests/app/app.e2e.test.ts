// The app where users meet it: headless Chromium (Debian's) on the built app, served on loopback.
import { execFileSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WGS84 } from '../../src/crs/registry.js';
import { crsFromEpsg } from '../../src/crs/registry.js';
import { transformer } from '../../src/crs/transform.js';
import { DOMAIN_STYLES } from '../../src/app/colour.js';
import { countColour, loadFiles, openPage, pixelAt, pixels, startApp, waitReady, type App, type OpenedPage } from '../helpers/app.js';
import { rfc7946Violations } from '../helpers/rfc7946.js';
import { GDAL_PYTHON, GDAL_SAMPLES, toolOrSkip } from '../helpers/tools.js';

const haveChromium = toolOrSkip('chromium');
const TAPER: [number, number, number] = [0xd5, 0x5e, 0x00]; // Okabe–Ito vermillion
const VIRIDIS_TOP: [number, number, number] = [253, 231, 37];
const MAP = { x: 320, y: 60, width: 760, height: 800 }; // the map area at 1400 × 900

describe.skipIf(!haveChromium)('app in headless Chromium', () => {
  let app: App;
  let ctx: Awaited<ReturnType<App['browser']['newContext']>>;
  let p: OpenedPage;

  beforeAll(async () => {
    app = await startApp();
    ctx = await app.browser.newContext({ viewport: { width: 1400, height: 900 }, acceptDownloads: true });
    p = await openPage(app, ctx);
  }, 180_000);
  afterAll(async () => {
    await app?.close();
  });

  it('opens on the invented demo with the thickness raster, the boundaries, the licence and a legend', async () => {
    const shot = await pixels(p.page, MAP);
    expect(countColour(shot, TAPER, 18)).toBeGreaterThan(150); // the taper limit line
    expect(countColour(shot, VIRIDIS_TOP, 20)).toBeGreaterThan(5000); // thick proximal crust in the raster
    await expect(p.page.locator('#scenario').textContent()).resolves.toMatch(/invented/);
    await expect(p.page.locator('#legend').textContent()).resolves.toMatch(/Crustal taper limit/);
    await expect(p.page.locator('#caution').textContent()).resolves.toMatch(/qualified professionals/);
    expect(p.errors).toEqual([]);
  });

  it('shows every grid value and the domain under the cursor', async () => {
    await p.page.mouse.move(MAP.x + 300, MAP.y + 400);
    const text = await p.page.locator('#inspect').textContent();
    expect(text).toMatch(/Position\d+\.\d{5}° S, \d+\.\d{5}° W/);
    expect(text).toMatch(/Map position \(EPSG:32709\)/);
    expect(text).toMatch(/Crustal thickness(\d|—)/);
    expect(text).toMatch(/Domain/);
    // plain words with units, no internal keys
    expect(text).not.toMatch(/beta crust|crustal-thickness|NaN|undefined/);
  });

  it('a pick shows its checks on click and can be excluded and used again', async () => {
    const pickAt = () =>
      p.page.evaluate(() => {
        const fc = window.__taperline.state.result!.picks as { features: { properties: { id: string; kind: string }; geometry: { coordinates: number[] } }[] };
        const f = fc.features.find((q) => q.properties.kind === 'continental-limit')!;
        const s = window.__taperline.map.project([f.geometry.coordinates[0], f.geometry.coordinates[1]]);
        const r = window.__taperline.map.getContainer().getBoundingClientRect();
        return { x: r.left + s.x, y: r.top + s.y, id: f.properties.id };
      });
    const at = await pickAt();
    await p.page.mouse.click(at.x, at.y);
    const popup = p.page.locator('#pick-popup');
    await popup.waitFor({ timeout: 5000 });
    const text = (await popup.textContent())!;
    expect(text).toContain(at.id);
    expect(text).toMatch(/Crustal thickness at the pick\d+(\.\d+)? km/);
    expect(text).toMatch(/KindContinental-limit pick/);
    expect(text).toMatch(/neighbours|departure/);
    let runs = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.click('#pick-exclude');
    await waitReady(p.page, runs + 1);
    const excluded = await p.page.evaluate((id) => {
      const fc = window.__taperline.state.result!.picks as { features: { properties: { id: string; excluded: boolean } }[] };
      return { state: window.__taperline.state.excludePicks, flag: fc.features.find((q) => q.properties.id === id)!.properties.excluded, calibrated: window.__taperline.state.result!.summary.calibrated.taper };
    }, at.id);
    expect(excluded).toEqual({ state: [at.id], flag: true, calibrated: 2 });
    const again = await pickAt();
    await p.page.mouse.click(again.x, again.y);
    await p.page.locator('#pick-popup').waitFor({ timeout: 5000 });
    await expect(p.page.locator('#pick-popup').textContent()).resolves.toMatch(/excluded by you/);
    runs = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.click('#pick-exclude');
    await waitReady(p.page, runs + 1);
    expect(await p.page.evaluate(() => window.__taperline.state.excludePicks)).toEqual([]);
  });

  it('moves the taper limit landward when the taper threshold rises', async () => {
    const meanLon = () =>
      p.page.evaluate(() => {
        const fc = window.__taperline.state.result!.boundaries as { features: { properties: { kind: string }; geometry: { coordinates: number[][] } }[] };
        const xs = fc.features.filter((f) => f.properties.kind === 'crustal-taper-limit').flatMap((f) => f.geometry.coordinates.map((c) => c[0]));
        return xs.reduce((a, b) => a + b, 0) / xs.length;
      });
    // With picks loaded the line goes through the picks whatever the threshold, and the panel says so.
    await expect(p.page.locator('#calibration-note').textContent()).resolves.toMatch(/3 continental-limit/);
    let runs = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.selectOption('.file[data-name="picks.geojson"] select.role', 'none');
    await waitReady(p.page, runs + 1);
    const before = await meanLon();
    runs = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.fill('#p-taperThreshold', '6000');
    await p.page.dispatchEvent('#p-taperThreshold', 'change');
    await waitReady(p.page, runs + 1);
    const after = await meanLon();
    // the demo thins westward at ~8 km per 50 km: 6 km crust lies ~25 km (≈0.27°) landward of the 2 km line
    expect(before - after).toBeGreaterThan(0.15);
    const timing = () =>
      p.page.evaluate(
        () =>
          `${window.__taperline.lastMillis.toFixed(0)} ms computed, ${window.__taperline.drawnMillis.toFixed(0)} ms until the first frame with the new layers, ` +
          `${window.__taperline.figuresMillis.toFixed(0)} ms until the lengths and COT area inside the licence are in`,
      );
    console.log(`recompute after a domain/line parameter change on the demo: ${await timing()}`);
    // the licence's figures arrive after the map: the table shows them, clipped (smaller than the whole-grid zone, not empty)
    const areas = await p.page.evaluate(() => {
      const s = window.__taperline.state;
      const whole = (s.result!.boundaries as { features: { properties: { kind: string; area_km2?: number } }[] }).features
        .filter((f) => f.properties.kind === 'cot-zone')
        .reduce((a, f) => a + (f.properties.area_km2 ?? 0), 0);
      return { table: document.querySelector('#areas-table')?.textContent ?? '', figures: s.figures, runKey: s.result!.runKey, whole };
    });
    expect(areas.figures?.runKey).toBe(areas.runKey);
    expect(areas.table).not.toMatch(/measuring/);
    expect(areas.figures!.cotAreaKm2).toBeGreaterThan(0);
    expect(areas.figures!.cotAreaKm2).toBeLessThan(areas.whole);
    expect(areas.table).toMatch(/Continent–ocean transition zone[\d,.]+\s?km²/);
    // a parameter of the derived grids: the full recompute
    runs = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.evaluate(() => document.querySelector('#p-tc0')?.closest('details')?.setAttribute('open', ''));
    await p.page.fill('#p-tc0', '34000');
    await p.page.dispatchEvent('#p-tc0', 'change');
    await waitReady(p.page, runs + 1);
    console.log(`full recompute after a reference-thickness change on the demo: ${await timing()}`);
  });

  it('loads a GeoTIFF through the file input and shows what the reader detected', async () => {
    await loadFiles(p.page, 'tests/fixtures/gdal/km_units.tif');
    const card = p.page.locator('.file[data-name="km_units.tif"]');
    await card.waitFor();
    await expect(card.textContent()).resolves.toMatch(/37 × 23 cells of 500\.0 m, EPSG:32709/);
    await expect(card.textContent()).resolves.toMatch(/Units km \(unit tag "km"\)/);
  });

  it('loads XYZ text, assumes the analysis CRS with a warning, and takes a CRS typed by the user', async () => {
    const lines = ['x y z'];
    for (let j = 0; j < 4; j++) for (let i = 0; i < 5; i++) lines.push(`${480000 + i * 1000} ${6100000 + j * 1000} ${-(2500 + 10 * i + j)}`);
    await loadFiles(p.page, { name: 'extra_horizon.xyz', mimeType: 'text/plain', buffer: Buffer.from(lines.join('\n')) });
    const card = p.page.locator('.file[data-name="extra_horizon.xyz"]');
    await card.locator('.report').first().waitFor();
    await expect(card.textContent()).resolves.toMatch(/5 × 4 cells of 1,000\.0 m/);
    await expect(card.textContent()).resolves.toMatch(/assumed EPSG:32709, please confirm/);
    await expect(card.textContent()).resolves.toMatch(/elevation/);
    await card.locator('.crs-input').fill('EPSG:32709');
    await card.locator('.crs-input').dispatchEvent('change');
    await expect.poll(async () => (await card.textContent()) ?? '').not.toMatch(/assumed EPSG/);
    await card.locator('button.x').click(); // remove it again
  });

  it('shows a clear error for a corrupt file and keeps everything already loaded', async () => {
    const runs = await p.page.evaluate(() => window.__taperline.runs);
    const corrupt = Buffer.concat([Buffer.from([0x49, 0x49, 42, 0, 8, 0, 0, 0]), Buffer.alloc(64, 0xee)]);
    await loadFiles(p.page, { name: 'corrupt_basement.tif', mimeType: 'image/tiff', buffer: corrupt });
    const card = p.page.locator('.file[data-name="corrupt_basement.tif"]');
    await card.locator('.file-error').waitFor();
    await expect(card.locator('.file-error').textContent()).resolves.toMatch(/damaged|truncated|not a/);
    await p.page.waitForTimeout(800);
    // the demo grids keep their roles, and the map keeps its layers
    const roles = await p.page.evaluate(() => window.__taperline.state.files.filter((f) => !f.error).map((f) => `${f.name}:${f.role}`));
    expect(roles).toContain('top-basement.tif:top-basement');
    expect(await p.page.evaluate(() => window.__taperline.state.result !== null)).toBe(true);
    expect(await p.page.evaluate(() => window.__taperline.runs)).toBeGreaterThanOrEqual(runs);
    expect(countColour(await pixels(p.page, MAP), TAPER, 18)).toBeGreaterThan(150);
  });

  it('exports boundaries.geojson that follows RFC 7946', async () => {
    const [download] = await Promise.all([p.page.waitForEvent('download'), p.page.click('#export-boundaries')]);
    expect(download.suggestedFilename()).toBe('boundaries.geojson');
    const fc = JSON.parse(readFileSync((await download.path())!, 'utf8'));
    expect(fc.features.length).toBeGreaterThan(5);
    expect(rfc7946Violations(fc)).toEqual([]);
    expect(fc.features.some((f: { properties: { kind: string } }) => f.properties.kind === 'crustal-taper-limit')).toBe(true);
  });

  it('exports a GeoPackage that GDAL validates, with every layer in WGS 84 and the analysis CRS', async () => {
    const [download] = await Promise.all([p.page.waitForEvent('download'), p.page.click('#export-gpkg')]);
    expect(download.suggestedFilename()).toBe('boundaries.gpkg');
    const path = join(mkdtempSync(join(tmpdir(), 'taperline-gpkg-')), 'boundaries.gpkg'); // the validator wants the extension
    copyFileSync((await download.path())!, path);
    expect(readFileSync(path).subarray(0, 15).toString('latin1')).toBe('SQLite format 3');
    if (toolOrSkip('gdal-python')) {
      expect(execFileSync(GDAL_PYTHON, [`${GDAL_SAMPLES}/validate_gpkg.py`, path], { encoding: 'utf8' }).trim()).toBe('');
      const layers = execFileSync('ogrinfo', ['-q', path], { encoding: 'utf8' });
      expect(layers).toMatch(/domains_wgs84/);
      expect(layers).toMatch(/boundary_lines_epsg32709/);
    }
  });

  it('exports a map image with legend and scale', async () => {
    const [download] = await Promise.all([p.page.waitForEvent('download'), p.page.click('#export-png')]);
    const buf = readFileSync((await download.path())!);
    expect(buf.subarray(1, 4).toString()).toBe('PNG');
    expect(buf.length).toBeGreaterThan(50_000);
  });

  it('clicking a boundary shows its properties', async () => {
    // click on a taper-limit vertex projected to the screen
    const pt = await p.page.evaluate(() => {
      const fc = window.__taperline.state.result!.boundaries as { features: { properties: { kind: string }; geometry: { coordinates: number[][] } }[] };
      const f = fc.features.find((q) => q.properties.kind === 'crustal-taper-limit')!;
      const c = f.geometry.coordinates[Math.floor(f.geometry.coordinates.length / 2)];
      const s = window.__taperline.map.project([c[0], c[1]]);
      const r = window.__taperline.map.getContainer().getBoundingClientRect();
      return { x: r.left + s.x, y: r.top + s.y };
    });
    await p.page.mouse.click(pt.x, pt.y);
    const popup = p.page.locator('#boundary-popup');
    await popup.waitFor({ timeout: 5000 });
    const text = await popup.textContent();
    expect(text).toMatch(/WhatCrustal taper limit/);
    expect(text).toMatch(/Length \(geodesic\)\d+(\.\d)? km/);
    expect(text).not.toMatch(/closed|threshold m|_/);
  });

  it('restores the project after a reload', async () => {
    await p.page.waitForTimeout(800); // autosave debounce
    await p.page.reload();
    await waitReady(p.page);
    const st = await p.page.evaluate(() => ({
      files: window.__taperline.state.files.map((f) => f.name).sort(),
      taper: window.__taperline.state.params.taperThreshold,
      picksRole: window.__taperline.state.files.find((f) => f.name === 'picks.geojson')?.role,
    }));
    expect(st.files).toEqual(expect.arrayContaining(['km_units.tif', 'moho.tif', 'seabed.tif', 'top-basement.tif', 'picks.geojson']));
    expect(st.taper).toBe(6000);
    expect(st.picksRole).toBe('none');
    await expect(p.page.locator('#p-taperThreshold').inputValue()).resolves.toBe('6000');
  });

  it('a project saved with its data opens in a fresh browser and reproduces the results', async () => {
    const [download] = await Promise.all([p.page.waitForEvent('download'), p.page.click('#btn-save-bundle')]);
    const path = (await download.path())!;
    const before = await p.page.evaluate(() => JSON.stringify(window.__taperline.state.result!.summary.areas));
    const fresh = await app.browser.newContext({ viewport: { width: 1400, height: 900 } });
    const q = await openPage(app, fresh);
    const runs = await q.page.evaluate(() => window.__taperline.runs);
    await q.page.setInputFiles('#project-input', path);
    await waitReady(q.page, runs + 1);
    const after = await q.page.evaluate(() => JSON.stringify(window.__taperline.state.result!.summary.areas));
    expect(after).toBe(before);
    expect(await q.page.evaluate(() => window.__taperline.state.params.taperThreshold)).toBe(6000);
    await fresh.close();
  });

  it('a boundary drawn from cell edges lies on the raster colour edge within a pixel, zoomed to single cells', async () => {
    // Domain raster and domain outline polygons (cell edges) at ~40 px per cell.
    const cell = await p.page.evaluate(() => {
      const r = window.__taperline.state.result!;
      const g = r.geometry;
      const j = Math.floor(g.ny * 0.8);
      for (let i = 1; i < g.nx - 1; i++) {
        const k = j * g.nx + i;
        if (r.domains[k] === 3 && r.domains[k + 1] === 4 && r.domains[k - g.nx] === 3 && r.domains[k + g.nx] === 3) return { i, j, x0: g.x0, y0: g.y0, dx: g.dx, dy: g.dy };
      }
      return null;
    });
    expect(cell).not.toBeNull();
    const c = cell!;
    const [lon, lat] = transformer(crsFromEpsg(32709), WGS84).forward([c.x0 + (c.i + 0.5) * c.dx, c.y0 + c.j * c.dy]);
    await p.page.selectOption('#layer-select', 'domains');
    await p.page.fill('#opacity', '1');
    await p.page.dispatchEvent('#opacity', 'input');
    for (const id of ['boundaries', 'cot', 'licence', 'seismic', 'picks', 'graticule']) await p.page.setChecked(`#vis-${id}`, false);
    await p.page.evaluate(([lo, la]) => window.__taperline.map.jumpTo({ center: [lo, la], zoom: 12.3 }), [lon, lat]);
    await p.page.waitForFunction(() => window.__taperline.map.loaded() && !window.__taperline.map.isMoving());
    await p.page.waitForTimeout(500);
    const box = await p.page.evaluate(() => {
      const r = window.__taperline.map.getContainer().getBoundingClientRect();
      return { x: Math.round(r.left), y: Math.round(r.top), width: Math.round(r.width), height: Math.round(r.height) };
    });
    const cy = Math.round(box.height / 2);
    const cx = Math.round(box.width / 2);
    const hyper = DOMAIN_STYLES.find((d) => d.code === 3)!.colour;
    const trans = DOMAIN_STYLES.find((d) => d.code === 4)!.colour;
    const near = (a: number[], b: number[]) => Math.abs(a[0] - b[0]) + Math.abs(a[1] - b[1]) + Math.abs(a[2] - b[2]) < 30;
    // raster only: where does hyperextended turn into transition along the centre row?
    const raster = await pixels(p.page, box);
    let edgeRaster = -1;
    for (let x = cx - 60; x < cx + 60; x++) if (near(pixelAt(raster, x, cy), hyper) && near(pixelAt(raster, x + 1, cy), trans)) edgeRaster = x + 0.5;
    expect(edgeRaster).toBeGreaterThan(0);
    // outline only (raster hidden): where is the dark line?
    const before = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.setChecked('#vis-outlines', true); // domain polygons are built on demand: one more run
    await waitReady(p.page, before + 1);
    await p.page.fill('#opacity', '0');
    await p.page.dispatchEvent('#opacity', 'input');
    await p.page.waitForTimeout(500);
    const outline = await pixels(p.page, box);
    const dark: number[] = [];
    for (let x = cx - 60; x < cx + 60; x++) if (pixelAt(outline, x, cy).every((v) => v < 90)) dark.push(x);
    expect(dark.length).toBeGreaterThan(0);
    const lineX = dark.reduce((a, b) => a + b, 0) / dark.length;
    expect(Math.abs(lineX - edgeRaster)).toBeLessThanOrEqual(1);
    // and both sit where the cell edge is on the map (the centre of the view)
    expect(Math.abs(edgeRaster - cx)).toBeLessThanOrEqual(1.5);
  });

  it('draws a section line and shows its section with water, sediment, crust and mantle, domains and crossings', async () => {
    // back to a normal view of the whole grid
    await p.page.evaluate(() => window.__taperline.map.jumpTo({ center: [-129.0, -35.0], zoom: 7.2 }));
    await p.page.waitForTimeout(300);
    const box = await p.page.evaluate(() => {
      const r = window.__taperline.map.getContainer().getBoundingClientRect();
      const a = window.__taperline.map.project([-129.9, -35.05]);
      const b = window.__taperline.map.project([-128.2, -35.1]);
      return { ax: r.left + a.x, ay: r.top + a.y, bx: r.left + b.x, by: r.top + b.y };
    });
    await p.page.click('#btn-draw');
    await p.page.mouse.click(box.ax, box.ay);
    await p.page.mouse.click((box.ax + box.bx) / 2, (box.ay + box.by) / 2);
    await p.page.mouse.click(box.bx, box.by);
    await p.page.keyboard.press('Enter');
    const svg = p.page.locator('#section-panel svg');
    await svg.waitFor({ timeout: 20_000 });
    for (const layer of ['water', 'sediment', 'crust', 'mantle', 'domain']) expect(await svg.locator(`[data-layer="${layer}"]`).count(), layer).toBeGreaterThan(0);
    expect(await svg.locator('[data-crossing="crustal-taper-limit"]').count()).toBeGreaterThan(0);
    expect(await svg.locator('[data-ve="1"]').textContent()).toMatch(/true scale/);
    const [csv] = await Promise.all([p.page.waitForEvent('download'), p.page.click('#section-csv')]);
    const text = readFileSync((await csv.path())!, 'utf8');
    expect(text.split('\n')[0]).toBe('chainage_km,x_m,y_m,lon_deg,lat_deg,seabed_m,top_basement_m,moho_m,crustal_thickness_m,domain,crossing,analysis_crs');
    await p.page.selectOption('#section-ve', '5');
    expect(await svg.locator('[data-ve="5"]').count()).toBe(1);
  });

  it('proposes lines, shows them on the map and exports them', async () => {
    await p.page.click('#section-close');
    await p.page.fill('#plan-spacingKm', '30');
    await p.page.dispatchEvent('#plan-spacingKm', 'change');
    await p.page.click('#btn-plan');
    await p.page.waitForFunction(() => (window.__taperline.planned ?? 0) >= 1, null, { timeout: 60_000 });
    await p.page.waitForTimeout(500);
    const shot = await pixels(p.page, MAP);
    expect(countColour(shot, [0x00, 0x9e, 0x73], 20)).toBeGreaterThan(100); // dip lines (Okabe–Ito bluish green)
    expect(await p.page.locator('#proposal-list tr').count()).toBeGreaterThan(5);
    const [dl] = await Promise.all([p.page.waitForEvent('download'), p.page.click('#export-plan-geojson')]);
    const fc = JSON.parse(readFileSync((await dl.path())!, 'utf8'));
    expect(rfc7946Violations(fc)).toEqual([]);
    expect(fc.features[0].properties.rank).toBe(1);
    expect(fc.programme.parameters.spacingKm).toBe(30);
    const [dl2] = await Promise.all([p.page.waitForEvent('download'), p.page.click('#export-plan-csv')]);
    expect(readFileSync((await dl2.path())!, 'utf8')).toMatch(/start_lon,start_lat/);
  });

  it('planning parameters survive a reload', async () => {
    await p.page.waitForTimeout(800); // autosave debounce
    await p.page.reload();
    await waitReady(p.page);
    expect(await p.page.evaluate(() => window.__taperline.state.plan.spacingKm)).toBe(30);
    await expect(p.page.locator('#plan-spacingKm').inputValue()).resolves.toBe('30');
  });

  it('"Clear local data" removes everything stored and starts again on the demo', async () => {
    const page = (await openPage(app, ctx)).page; // same browser context: shares the stored project
    expect(await page.evaluate(() => window.__taperline.state.files.some((f) => f.name === 'km_units.tif'))).toBe(true);
    page.once('dialog', (d) => void d.accept());
    await Promise.all([page.waitForEvent('load'), page.click('#btn-clear')]);
    await waitReady(page);
    const files = await page.evaluate(() => window.__taperline.state.files.map((f) => f.name).sort());
    expect(files).not.toContain('km_units.tif');
    expect(files).toContain('top-basement.tif');
    await expect(page.locator('#scenario').textContent()).resolves.toMatch(/invented/);
    await page.close();
  });

  it('never sends a request outside the page origin', () => {
    const origin = new URL(app.url).origin;
    const outside = p.requests.filter((u) => !u.startsWith(origin) && !u.startsWith('data:') && !u.startsWith('blob:'));
    expect(p.requests.length).toBeGreaterThan(3);
    expect(outside).toEqual([]);
  });
});
