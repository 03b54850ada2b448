/**
 * Browser-test harness: builds the app once (vite build), serves it with vite preview on a free
 * loopback port, and opens pages in Debian's Chromium through playwright-core, recording every
 * request so tests can assert that nothing leaves the page's origin.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import type { Browser, Page } from 'playwright-core';
import { build, preview, type PreviewServer } from 'vite';
import { launch } from '../../scripts/browser.js';

export interface App {
  url: string;
  browser: Browser;
  close(): Promise<void>;
}

export async function startApp(): Promise<App> {
  const outDir = join(process.cwd(), '.tmp', 'e2e-dist');
  mkdirSync(outDir, { recursive: true });
  await build({ configFile: 'vite.config.ts', logLevel: 'error', build: { outDir, emptyOutDir: true } });
  const server: PreviewServer = await preview({ configFile: 'vite.config.ts', logLevel: 'error', preview: { port: 0, host: '127.0.0.1', strictPort: false }, build: { outDir } });
  const url = server.resolvedUrls!.local[0];
  const browser = await launch();
  return {
    url,
    browser,
    async close() {
      await browser.close();
      await new Promise<void>((resolve) => server.httpServer.close(() => resolve()));
    },
  };
}

export interface OpenedPage {
  page: Page;
  requests: string[];
  errors: string[];
}

export async function openPage(app: App, context?: Awaited<ReturnType<Browser['newContext']>>): Promise<OpenedPage> {
  const ctx = context ?? (await app.browser.newContext({ viewport: { width: 1400, height: 900 }, acceptDownloads: true }));
  const page = await ctx.newPage();
  const requests: string[] = [];
  const errors: string[] = [];
  page.on('request', (r) => requests.push(r.url()));
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
  await page.goto(app.url);
  await waitReady(page);
  return { page, requests, errors };
}

export async function waitReady(page: Page, runsAtLeast = 1): Promise<void> {
  await page.waitForFunction((n) => window.__taperline?.ready === true && window.__taperline.runs >= n && !document.querySelector('footer progress:not([hidden])'), runsAtLeast, { timeout: 90_000 });
}

/** Screenshot as decoded RGBA pixels. */
export async function pixels(page: Page, clip?: { x: number; y: number; width: number; height: number }): Promise<PNG> {
  const buf = await page.screenshot({ type: 'png', clip });
  return PNG.sync.read(buf);
}

export function countColour(png: PNG, rgb: [number, number, number], tol = 12): number {
  let n = 0;
  for (let k = 0; k < png.data.length; k += 4) {
    if (Math.abs(png.data[k] - rgb[0]) <= tol && Math.abs(png.data[k + 1] - rgb[1]) <= tol && Math.abs(png.data[k + 2] - rgb[2]) <= tol) n++;
  }
  return n;
}

export function pixelAt(png: PNG, x: number, y: number): [number, number, number] {
  const k = (y * png.width + x) * 4;
  return [png.data[k], png.data[k + 1], png.data[k + 2]];
}

/** Load files through the file input; while the demo is shown, answer the add-or-new question. */
export async function loadFiles(page: Page, files: Parameters<Page['setInputFiles']>[1], answer: 'add' | 'new' = 'add'): Promise<void> {
  const demo = await page.evaluate(() => window.__taperline.state.files.some((f) => f.demo));
  await page.setInputFiles('#file-input', files);
  if (demo) await page.click(`#ask-${answer}`);
}

/**
 * One built app, one browser context (1400 × 900, downloads on) and its first page for a describe
 * block: started before its tests, closed after them. Read the fields inside the tests.
 */
export function appSession(beforeAll: (fn: () => Promise<void>, timeout?: number) => void, afterAll: (fn: () => Promise<void>) => void) {
  const s = {} as { app: App; ctx: Awaited<ReturnType<Browser['newContext']>>; p: OpenedPage };
  beforeAll(async () => {
    s.app = await startApp();
    s.ctx = await s.app.browser.newContext({ viewport: { width: 1400, height: 900 }, acceptDownloads: true });
    s.p = await openPage(s.app, s.ctx);
  }, 180_000);
  afterAll(async () => {
    await s.app?.close();
  });
  return s;
}
