import { launch } from '/work/main/scripts/browser.ts';
const b = await launch();
const page = await b.newPage({ viewport: { width: 1500, height: 900 } });
const logs: string[] = [];
page.on('console', (m) => logs.push(`${m.type()}: ${m.text()}`));
page.on('pageerror', (e) => logs.push(`pageerror: ${e.message}`));
await page.goto('http://127.0.0.1:5173/');
try { await page.waitForFunction(() => (window as any).__taperline?.ready === true, null, { timeout: 60000 }); } catch (e) { logs.push('TIMEOUT'); }
await page.screenshot({ path: '/tmp/app.png' });
console.log(logs.slice(0, 30).join('\n'));
console.log(await page.evaluate(() => JSON.stringify({ runs: (window as any).__taperline?.runs, ms: (window as any).__taperline?.lastMillis, err: (window as any).__taperline?.error })));
await b.close();
