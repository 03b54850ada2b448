/** Shared headless-Chromium launch (Debian's chromium through playwright-core; no browser download). */
import { chromium, type Browser } from 'playwright-core';

export const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-dev-shm-usage', '--disable-background-networking', '--disable-component-update',
  '--disable-sync', '--no-first-run', '--disable-quic', '--use-angle=swiftshader', '--enable-unsafe-swiftshader',
];

export function launch(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: CHROMIUM_ARGS });
}
