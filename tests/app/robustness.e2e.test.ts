// Nothing lost, nothing injected, where users meet it: the built app in headless Chromium.
import { createHash } from 'node:crypto';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PROJECT_FORMAT, toBase64 } from '../../src/io/project.js';
import { loadFiles, openPage, startApp, waitReady, type App, type OpenedPage } from '../helpers/app.js';
import { toolOrSkip } from '../helpers/tools.js';

const haveChromium = toolOrSkip('chromium');
const dir = mkdtempSync(join(tmpdir(), 'taperline-robust-'));

const files = (page: OpenedPage['page']) => page.evaluate(() => window.__taperline.state.files.map((f) => `${f.name}:${f.role}`).sort());

describe.skipIf(!haveChromium)('app keeps the user\'s work and runs only its own code', () => {
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

  it('keeps a parameter changed just before a reload (regression: changes under ~300 ms were lost)', async () => {
    const runs = await p.page.evaluate(() => window.__taperline.runs);
    await p.page.fill('#p-taperThreshold', '5500');
    await p.page.press('#p-taperThreshold', 'Tab');
    await p.page.reload(); // no wait
    await waitReady(p.page);
    expect(await p.page.evaluate(() => window.__taperline.state.params.taperThreshold)).toBe(5500);
    expect(runs).toBeGreaterThan(0);
  });

  it('a project whose bundled grid is damaged is refused and leaves the current files, settings and autosave as they were', async () => {
    const before = await files(p.page);
    const garbage = new TextEncoder().encode('II*\0 this is not a grid at all');
    const sha = createHash('sha256').update(garbage).digest('hex');
    const project = {
      format: PROJECT_FORMAT, version: 1, saved: 'x', tool: 't', params: { taperThreshold: 3000 }, view: null, plan: {}, excludePicks: [],
      inputs: [{ name: 'broken.tif', kind: 'grid', role: 'top-basement', bytes: garbage.length, sha256: sha, options: {}, data: toBase64(garbage) }],
    };
    const path = join(dir, 'broken.taperline.json');
    writeFileSync(path, JSON.stringify(project));
    await p.page.setInputFiles('#project-input', path);
    await p.page.waitForFunction(() => /was not opened/.test(document.querySelector('#status')?.textContent ?? ''), null, { timeout: 30_000 });
    const status = await p.page.locator('#status').textContent();
    expect(status).toMatch(/broken\.tif: /);
    expect(status).toMatch(/your current files and settings are unchanged/);
    expect(status).not.toMatch(/undefined/);
    expect(await files(p.page)).toEqual(before);
    expect(await p.page.evaluate(() => window.__taperline.state.params.taperThreshold)).toBe(5500);
    await p.page.waitForTimeout(600);
    await p.page.reload();
    await waitReady(p.page);
    expect(await files(p.page)).toEqual(before);
    expect(await p.page.evaluate(() => window.__taperline.state.params.taperThreshold)).toBe(5500);
  });

  it('a project naming a map layer that does not exist is refused, naming the field', async () => {
    const path = join(dir, 'layer.taperline.json');
    writeFileSync(path, JSON.stringify({ format: PROJECT_FORMAT, version: 1, params: {}, inputs: [], view: { center: [0, 0], zoom: 3, layer: 'nope', opacity: 1, visible: {} } }));
    await p.page.setInputFiles('#project-input', path);
    await p.page.waitForFunction(() => /view\.layer/.test(document.querySelector('#status')?.textContent ?? ''), null, { timeout: 30_000 });
  });

  it('an autosave naming a layer this version lacks still opens (regression: it failed on every reload)', async () => {
    await p.page.evaluate(
      () =>
        new Promise<void>((resolve, reject) => {
          const req = indexedDB.open('taperline', 1);
          req.onsuccess = () => {
            const db = req.result;
            const store = db.transaction('project', 'readwrite').objectStore('project');
            const get = store.get('state');
            get.onsuccess = () => {
              const s = get.result;
              s.view = { ...s.view, layer: 'nope' };
              const tx = store.put(s, 'state');
              const mirror = JSON.parse(localStorage.getItem('taperline-state')!);
              localStorage.setItem('taperline-state', JSON.stringify({ ...mirror, view: { ...mirror.view, layer: 'nope' } }));
              tx.onsuccess = () => (db.close(), resolve());
              tx.onerror = () => reject(tx.error);
            };
          };
          req.onerror = () => reject(req.error);
        }),
    );
    await p.page.reload();
    await waitReady(p.page);
    expect(await p.page.evaluate(() => window.__taperline.state.layer)).toBe('crustal-thickness');
    expect(await p.page.evaluate(() => window.__taperline.error)).toBeNull();
  });

  it('has a Content-Security-Policy that blocks remote connections and injected inline script', async () => {
    const meta = await p.page.evaluate(() => document.querySelector('meta[http-equiv="Content-Security-Policy"]')?.getAttribute('content') ?? '');
    expect(meta).toMatch(/default-src 'self'/);
    expect(meta).not.toMatch(/'unsafe-eval'|script-src[^;]*unsafe-inline/);
    const outcome = await p.page.evaluate(async () => {
      const violations: string[] = [];
      document.addEventListener('securitypolicyviolation', (e) => violations.push(e.violatedDirective));
      let fetched = 'sent';
      try {
        await fetch('http://192.0.2.1/x'); // TEST-NET-1 (RFC 5737): never a real host
      } catch {
        fetched = 'blocked';
      }
      const s = document.createElement('script');
      s.textContent = 'window.__injected = true';
      document.body.append(s);
      await new Promise((r) => setTimeout(r, 100));
      return { fetched, injected: (window as unknown as { __injected?: boolean }).__injected === true, violations };
    });
    expect(outcome.fetched).toBe('blocked');
    expect(outcome.injected).toBe(false);
    expect(outcome.violations).toEqual(expect.arrayContaining(['connect-src', 'script-src-elem']));
    expect(p.requests.some((u) => u.includes('192.0.2.1'))).toBe(false);
  });

  it('reads a ZSTD-compressed GeoTIFF under the policy (the decoder is WebAssembly inside the bundle)', async () => {
    const path = new URL('../fixtures/gdal/f32_zstd_striped.tif', import.meta.url).pathname;
    await loadFiles(p.page, path);
    const card = p.page.locator('.file[data-name="f32_zstd_striped.tif"]');
    await card.waitFor();
    await p.page.waitForFunction(() => window.__taperline.state.files.some((f) => f.name === 'f32_zstd_striped.tif' && (f.report || f.error)), null, { timeout: 30_000 });
    const f = await p.page.evaluate(() => window.__taperline.state.files.find((x) => x.name === 'f32_zstd_striped.tif')!);
    expect(f.error).toBeNull();
    expect(f.report!.nx).toBe(37);
  });

  it('the preview server sends the policy as a header too', async () => {
    const res = await fetch(app.url);
    expect(res.headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/);
  });

  it('the dev server sends the policy as a header (with its reload socket allowed)', async () => {
    const { createServer } = await import('vite');
    const server = await createServer({ configFile: 'vite.config.ts', logLevel: 'error', server: { port: 0, host: '127.0.0.1', hmr: false } });
    await server.listen();
    try {
      const res = await fetch(server.resolvedUrls!.local[0]);
      const csp = res.headers.get('content-security-policy') ?? '';
      expect(csp).toMatch(/default-src 'self'/);
      expect(csp).toMatch(/script-src 'self' 'wasm-unsafe-eval'/);
      expect(csp).toMatch(/connect-src 'self' data: blob: ws:\/\/127\.0\.0\.1:\*/);
    } finally {
      await server.close();
    }
  });

  it('runs the demo with no error under the policy', () => {
    expect(p.errors.filter((e) => !/192\.0\.2\.1|Content Security Policy/.test(e))).toEqual([]);
  });
});
