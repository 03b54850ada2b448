/**
 * Benchmarks: `npm run bench [-- --size 4096]`. Prints our figures beside reference implementations.
 * Not a test: figures depend on the machine; the README records the ones measured.
 */

import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fromArrayBuffer, writeArrayBuffer } from 'geotiff';
import { readGeoTiff } from '../src/io/geotiff-read.js';
import { crsFromEpsg } from '../src/crs/registry.js';
import { derive } from '../src/derive/derive.js';
import { writeGeoTiff } from '../src/io/geotiff-write.js';
import { resolveParams } from '../src/params.js';
import { betaFromSubsidence, MCKENZIE_1978 } from '../src/science/mckenzie.js';
import { waterLoadedDepthCompacted } from '../src/science/unloading.js';
import { LITHOLOGIES } from '../src/science/compaction.js';
import { prng } from '../fixtures/demo-margin.js';

const args = process.argv.slice(2);
const size = Number(args[args.indexOf('--size') + 1] || 4096) || 4096;

function rssMB(): number {
  return process.memoryUsage().rss / 2 ** 20;
}

function time<T>(f: () => T): [T, number] {
  const t0 = performance.now();
  const r = f();
  return [r, performance.now() - t0];
}

function syntheticInputs(n: number) {
  const rnd = prng(5);
  const N = n * n;
  const seabed = new Float32Array(N);
  const basement = new Float32Array(N);
  const moho = new Float32Array(N);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      const k = j * n + i;
      const u = i / n;
      const tc = Math.max(0, 32_000 * (1 - 1.3 * u)) + (u > 0.85 ? 7000 : 0);
      seabed[k] = 200 + 4800 * u + 20 * rnd();
      basement[k] = seabed[k] + 1000 + 4000 * Math.sin(Math.PI * u);
      moho[k] = basement[k] + tc;
    }
  }
  return { seabed, basement, moho };
}

const rows: [string, string, string][] = [];
const rss0 = rssMB();
console.log(`Taperline benchmarks (node ${process.version}); grid ${size} × ${size} = ${(size * size / 1e6).toFixed(1)} M cells`);

// 1. Derived grids for a size² analysis grid (issue: no out-of-memory at 4096²).
{
  const inputs = syntheticInputs(size);
  const p = resolveParams({ riftAge: 100 });
  let peak = rssMB();
  const timer = setInterval(() => (peak = Math.max(peak, rssMB())), 50);
  const [d, ms] = time(() => derive(inputs, p));
  clearInterval(timer);
  peak = Math.max(peak, rssMB());
  rows.push(['derive: all 15 grids', `${(ms / 1000).toFixed(2)} s, ${((size * size) / (ms / 1000) / 1e6).toFixed(2)} M cells/s`, `peak RSS ${peak.toFixed(0)} MB (start ${rss0.toFixed(0)} MB)`]);
  void d;
  // Reference: the same unloading + β-from-subsidence done naively per cell with a fresh Brent solve
  // on a 1/64 sample (extrapolated), as a direct use of the published formulas would do it.
  const mk = { ...MCKENZIE_1978, tc: p.tc0, rhoMantle: p.rhoMantle };
  const [, msRef] = time(() => {
    for (let k = 0; k < inputs.seabed.length; k += 64) {
      const w = inputs.seabed[k];
      const s = inputs.basement[k] - w;
      const Y = waterLoadedDepthCompacted(w, s, LITHOLOGIES.shale, p.rhoMantle, p.rhoWater);
      betaFromSubsidence(Y, 100, mk);
    }
  });
  rows.push(['reference: per-cell Brent β-from-subsidence only', `${((msRef * 64) / 1000).toFixed(2)} s (extrapolated from 1/64)`, '']);
}

// 2. GeoTIFF writing, ours beside geotiff.js's writer (2000 × 2000 Float32).
{
  const n = 2000;
  const v = new Float32Array(n * n).map((_, k) => Math.sin(k * 1e-3));
  const geom = { nx: n, ny: n, x0: 0, y0: 0, dx: 1, dy: -1, registration: 'area' as const, crs: crsFromEpsg(32709) };
  const [ours, msOurs] = time(() => writeGeoTiff(geom, v, { noData: 'nan' }));
  const [, msRef] = time(() =>
    writeArrayBuffer(v, { width: n, height: n, ModelPixelScale: [1, 1, 0], ModelTiepoint: [0, 0, 0, 0, 0, 0], GeographicTypeGeoKey: 4326, GTModelTypeGeoKey: 2 } as never),
  );
  rows.push(['GeoTIFF write 2000² Float32 (ours)', `${msOurs.toFixed(0)} ms, ${(ours.length / 2 ** 20).toFixed(1)} MB`, `geotiff.js writeArrayBuffer: ${msRef.toFixed(0)} ms`]);
}

// 3. GeoTIFF reading, 2048 × 2048 Float32: ours beside geotiff.js and (when present) GDAL itself,
// on files GDAL wrote (uncompressed strips; DEFLATE + floating-point predictor, 256 tiles).
{
  const n = 2048;
  const dir = mkdtempSync(join(tmpdir(), 'taperline-bench-'));
  const v = new Float32Array(n * n).map((_, k) => 1000 + (k % n) * 3 + Math.sin(k * 1e-3));
  const geom = { nx: n, ny: n, x0: 500_000, y0: 7_000_000, dx: 100, dy: -100, registration: 'area' as const, crs: crsFromEpsg(32709) };
  writeFileSync(join(dir, 'src.tif'), writeGeoTiff(geom, v, { noData: 'nan', level: 0 }));
  const gdalHere = (() => {
    try {
      execFileSync('gdal_translate', ['--version'], { stdio: 'ignore' });
      return true;
    } catch {
      return false;
    }
  })();
  const layouts: [string, string[]][] = [['uncompressed strips', []], ['DEFLATE + predictor 3, tiled', ['-co', 'COMPRESS=DEFLATE', '-co', 'PREDICTOR=3', '-co', 'TILED=YES']]];
  for (const [label, co] of layouts) {
    const file = join(dir, `${label.replace(/\W+/g, '-')}.tif`);
    if (gdalHere) execFileSync('gdal_translate', ['-q', ...co, join(dir, 'src.tif'), file]);
    else writeFileSync(file, readFileSync(join(dir, 'src.tif')));
    const bytes = new Uint8Array(readFileSync(file));
    const med = async (f: () => Promise<unknown>) => {
      const t: number[] = [];
      for (let k = 0; k < 3; k++) {
        const t0 = performance.now();
        await f();
        t.push(performance.now() - t0);
      }
      return t.sort((a, b) => a - b)[1];
    };
    const ours = await med(() => readGeoTiff(bytes, 'bench.tif', { role: 'top-basement' }));
    const lib = await med(async () => (await (await fromArrayBuffer(bytes.slice().buffer)).getImage()).readRasters());
    let gdal = '';
    try {
      const ms = execFileSync('/usr/bin/python3', ['-c', `import time\nfrom osgeo import gdal\nts=[]\nfor k in range(3):\n  t=time.time(); gdal.Open(${JSON.stringify(file)}).ReadAsArray(); ts.append(time.time()-t)\nprint(sorted(ts)[1]*1000)`], { encoding: 'utf8' });
      gdal = `, GDAL ReadAsArray ${Number(ms).toFixed(0)} ms (×${(ours / Number(ms)).toFixed(1)})`;
    } catch {
      gdal = ', GDAL (python3-gdal) not found';
    }
    rows.push([`GeoTIFF read 2048² Float32, ${label}${gdalHere ? ' (GDAL-written)' : ''}`, `${ours.toFixed(0)} ms (incl. unit/sign detection)`, `geotiff.js readRasters ${lib.toFixed(0)} ms${gdal}`]);
  }
}

// 4. The whole pipeline on the invented demo (600 × 400), as the app and `taperline demo` run it.
{
  const { demoInputs } = await import('../tests/helpers/demo-run.js');
  const { runPipeline } = await import('../src/pipeline.js');
  const { outputFiles } = await import('../src/export/outputs.js');
  const inputs = await demoInputs({ picks: true, licence: true, isochrons: true, lines: true });
  runPipeline(inputs, { params: { riftAge: 110 } }); // warm-up
  const [r, ms] = time(() => runPipeline(inputs, { params: { riftAge: 110 } }));
  const [, msOut] = time(() => outputFiles(r, { version: 'bench', time: '', tool: 'cli' }));
  rows.push(['pipeline on the demo (600 × 400, picks, licence)', `${ms.toFixed(0)} ms`, `+ all outputs ${msOut.toFixed(0)} ms`]);
}

const w0 = Math.max(...rows.map((r) => r[0].length));
const w1 = Math.max(...rows.map((r) => r[1].length));
for (const r of rows) console.log(`${r[0].padEnd(w0)}  ${r[1].padEnd(w1)}  ${r[2]}`);
