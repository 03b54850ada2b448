/**
 * Benchmark inputs: the invented demo margin generated at N × N (fixtures/demo-margin.ts), written
 * once as GeoTIFF (our cloud-optimized writer: tiled DEFLATE + predictor) under .tmp/bench/N/ and
 * reused, since generating the larger margins takes minutes.
 */

import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { demoGeometry, generateDemoGrids } from '../fixtures/demo-margin.js';
import { writeGeoTiff } from '../src/io/geotiff-write.js';

export const GRIDS = ['seabed', 'top-basement', 'moho'] as const;

export function benchInputs(n: number, log: (m: string) => void): Record<(typeof GRIDS)[number], string> {
  const dir = join('.tmp', 'bench', String(n));
  const paths = Object.fromEntries(GRIDS.map((g) => [g, join(dir, `${g}.tif`)])) as Record<(typeof GRIDS)[number], string>;
  if (GRIDS.every((g) => existsSync(paths[g]))) return paths;
  mkdirSync(dir, { recursive: true });
  log(`generating the demo margin at ${n} × ${n} (once; cached in ${dir})…`);
  const t0 = performance.now();
  const d = generateDemoGrids(demoGeometry(n, n));
  const values = { seabed: d.seabed, 'top-basement': d.basement, moho: d.moho };
  for (const g of GRIDS) writeFileSync(paths[g], writeGeoTiff(d.geometry, values[g], { noData: 'nan', unit: 'm', description: `${g} depth, m positive down (invented)` }));
  log(`  generated in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
  return paths;
}

export const bytesOf = (p: string) => new Uint8Array(readFileSync(p));
