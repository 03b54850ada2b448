/**
 * Benchmarks: `npm run bench [-- --sizes 1024,2048,4096 --reps 3]`. On the invented demo margin at
 * each size (bench/inputs.ts), ours and the references timed side by side, interleaved, `reps`
 * repetitions, median (min–max), the ratio beside each figure:
 *  - reading the three GeoTIFFs: ours (as the CLI reads, with Node's zlib) vs GDAL's reader;
 *  - the derived grids vs the plain-loop floor (one loop writing two Float32 grids), per grid written;
 *  - contouring crustal thickness at 5 levels: ours (traceLevels, one pass) vs d3-contour vs GDAL's
 *    in-memory generator;
 *  - each pipeline stage (from the pipeline's own progress marks);
 *  - the whole `taperline synth` process vs the GDAL subset (gdal_calc.py + gdal_contour to GPKG),
 *    with its peak RSS.
 * A benchmark, not a test: nothing fails on timing. The README records the figures measured.
 */

import { spawn } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { contours } from 'd3-contour';
import { traceLevels } from '../src/contour/marching-squares.js';
import { derive } from '../src/derive/derive.js';
import { readGeoTiff } from '../src/io/geotiff-read.js';
import { nodeInflate } from '../src/cli/load.js';
import { resolveParams } from '../src/params.js';
import { runPipeline } from '../src/pipeline.js';
import { DEMO_PARAMS } from '../fixtures/demo-margin.js';
import { benchInputs, bytesOf } from './inputs.js';
import { gdalContour, gdalRead, gdalSubset, haveGdal } from './gdal.js';

const args = process.argv.slice(2);
const flag = (k: string, d: string) => (args.includes(`--${k}`) ? args[args.indexOf(`--${k}`) + 1] : d);
const sizes = flag('sizes', '1024,2048,4096').split(',').map(Number);
const reps = Number(flag('reps', '3'));
const LEVELS = [2000, 4000, 10_000, 20_000, 28_000];

interface Stat { median: number; min: number; max: number }
const stat = (xs: number[]): Stat => {
  const s = [...xs].sort((a, b) => a - b);
  return { median: s[Math.floor(s.length / 2)], min: s[0], max: s[s.length - 1] };
};
const ms = (s: Stat) => `${s.median.toFixed(0)} ms (${s.min.toFixed(0)}–${s.max.toFixed(0)})`;
const ratio = (a: number, b: number | null) => (b ? `×${(a / b).toFixed(2)}` : '—');
const rows: string[][] = [];
const row = (...r: string[]) => (rows.push(r), console.log(`  ${r.join('  |  ')}`));

async function timeAsync(f: () => Promise<unknown>): Promise<number> {
  const t0 = performance.now();
  await f();
  return performance.now() - t0;
}
function time(f: () => unknown): number {
  const t0 = performance.now();
  f();
  return performance.now() - t0;
}

/** Wall time and peak resident memory (VmHWM, Linux) of a child process. */
function runProcess(cmd: string, argv: string[]): Promise<{ ms: number; peakMB: number; code: number | null }> {
  return new Promise((resolve) => {
    const t0 = performance.now();
    const child = spawn(cmd, argv, { stdio: 'ignore' });
    let peak = 0;
    const poll = setInterval(() => {
      try {
        const kb = Number(/VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'))?.[1] ?? 0);
        peak = Math.max(peak, kb / 1024);
      } catch {
        // the process has gone
      }
    }, 25);
    child.on('exit', (code) => {
      clearInterval(poll);
      resolve({ ms: performance.now() - t0, peakMB: peak, code });
    });
  });
}

console.log(`Taperline benchmarks: node ${process.version}, ${availableParallelism()} cores, sizes ${sizes.join(', ')}, ${reps} repetitions${haveGdal() ? '' : ' (GDAL not found: references skipped)'}`);
const params = resolveParams(DEMO_PARAMS);
const paramsFile = join('.tmp', 'bench', 'params.json');
mkdirSync(join('.tmp', 'bench'), { recursive: true });
writeFileSync(paramsFile, JSON.stringify(DEMO_PARAMS));

for (const n of sizes) {
  console.log(`\n${n} × ${n} (${((n * n) / 1e6).toFixed(1)} M cells)`);
  const paths = benchInputs(n, (m) => console.log(`  ${m}`));
  const files = [paths['top-basement'], paths.moho, paths.seabed];
  const bytes = files.map(bytesOf);

  // 1. reading
  const readT: number[] = [];
  let grids = null as null | Awaited<ReturnType<typeof readGeoTiff>>[];
  for (let k = 0; k < reps; k++) {
    readT.push(await timeAsync(async () => (grids = await Promise.all(bytes.map((b, q) => readGeoTiff(b, files[q], { role: (['top-basement', 'moho', 'seabed'] as const)[q], inflate: nodeInflate }))))));
  }
  const gRead = gdalRead(files, reps);
  const gReadSum = gRead ? gRead.reduce((a, b) => a + b, 0) : null;
  row(`${n}²`, 'read 3 GeoTIFFs (DEFLATE, tiled)', ms(stat(readT)), gReadSum ? `GDAL ${gReadSum.toFixed(0)} ms` : 'GDAL —', ratio(stat(readT).median, gReadSum));
  const [basement, moho, seabed] = grids!.map((g) => g.grid.values);

  // 2. derived grids against the floor: one plain loop writing two Float32 outputs
  const floorT: number[] = [];
  const deriveT: number[] = [];
  let outputs = 0;
  for (let k = 0; k < reps; k++) {
    floorT.push(time(() => {
      const a = new Float32Array(basement.length);
      const b = new Float32Array(basement.length);
      for (let q = 0; q < basement.length; q++) {
        a[q] = moho[q] - basement[q];
        b[q] = basement[q] - seabed[q];
      }
    }));
    deriveT.push(time(() => (outputs = Object.keys(derive({ seabed, basement, moho }, params).grids).length)));
  }
  const perGridFloor = stat(floorT).median / 2;
  row(`${n}²`, `derive: ${outputs} grids`, ms(stat(deriveT)), `floor ${perGridFloor.toFixed(1)} ms per grid written`, ratio(stat(deriveT).median / outputs, perGridFloor));

  // 3. contouring 5 levels of crustal thickness
  const thick = Float32Array.from(moho, (v, q) => v - basement[q]);
  const oursC: number[] = [];
  const d3C: number[] = [];
  for (let k = 0; k < reps; k++) {
    oursC.push(time(() => traceLevels({ values: thick, nx: n, ny: n }, LEVELS)));
    d3C.push(time(() => contours().size([n, n]).thresholds(LEVELS)(Array.from(thick, (v) => (Number.isNaN(v) ? -Infinity : v)))));
  }
  const gC = gdalContour(paths['top-basement'], paths.moho, LEVELS, reps);
  row(`${n}²`, 'contour 5 levels (in memory)', ms(stat(oursC)), `d3-contour ${ms(stat(d3C))}; GDAL generator ${gC ? `${gC.toFixed(0)} ms` : '—'}`, ratio(stat(oursC).median, gC));

  // 4. pipeline stages (one run; the stage marks are the pipeline's own progress calls)
  const marks: [string, number][] = [];
  const t0 = performance.now();
  runPipeline(
    { basement: { name: 'b', ...grids![0] }, moho: { name: 'm', ...grids![1] }, seabed: { name: 's', ...grids![2] } },
    { params: DEMO_PARAMS, onProgress: (stage) => marks.push([stage, performance.now() - t0]) },
  );
  const stages = marks.slice(1).map(([, t], k) => `${marks[k][0]} ${(t - marks[k][1]).toFixed(0)}`);
  row(`${n}²`, 'pipeline stages (ms)', stages.join(', '), '', '');

  // 5. the whole synth process against the GDAL subset
  const out = join('.tmp', 'bench', String(n), 'out');
  mkdirSync(out, { recursive: true });
  const synth = [] as { ms: number; peakMB: number }[];
  const subset: number[] = [];
  for (let k = 0; k < Math.min(reps, n >= 4096 ? 1 : reps); k++) {
    synth.push(await runProcess(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', 'synth', '--top-basement', paths['top-basement'], '--moho', paths.moho, '--seabed', paths.seabed, '--params', paramsFile, '--out', out]));
    const g = gdalSubset(paths['top-basement'], paths.moho, LEVELS, join('.tmp', 'bench', String(n)));
    if (g !== null) subset.push(g);
  }
  const sub = subset.length ? stat(subset).median : null;
  row(`${n}²`, 'whole synth (process)', `${ms(stat(synth.map((s) => s.ms)))}, peak RSS ${Math.max(...synth.map((s) => s.peakMB)).toFixed(0)} MB`, sub ? `GDAL subset ${sub.toFixed(0)} ms` : 'GDAL subset —', ratio(stat(synth.map((s) => s.ms)).median, sub));
}

console.log('\n| size | what | ours | reference | ratio |\n| --- | --- | --- | --- | --- |');
for (const r of rows) console.log(`| ${r.join(' | ')} |`);
