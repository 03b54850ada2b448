import { deflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { crsFromEpsg } from '../../src/crs/registry.js';
import type { GridGeometry } from '../../src/grid/geometry.js';
import { writeGeoTiff } from '../../src/io/geotiff-write.js';
import { writeGeoTiffs } from '../../src/cli/tiff-pool.js';

// Odd sizes so edge tiles are padded and overviews have odd rows and columns.
const g: GridGeometry = { nx: 613, ny: 301, x0: 350_250, y0: 6_224_750, dx: 500, dy: -500, registration: 'area', crs: crsFromEpsg(32709) };
const deflate = (d: Uint8Array, level: number) => deflateSync(d, { level });

function grid(seed: number): Float32Array {
  const v = new Float32Array(g.nx * g.ny);
  for (let k = 0; k < v.length; k++) v[k] = Math.fround(Math.sin(k * 0.37 + seed) * 12345.678);
  v[seed] = NaN;
  v[seed + 1] = Infinity;
  return v;
}

describe('GeoTIFFs written on worker threads (the CLI)', () => {
  it('gives the same bytes as writing each file on the main thread, for more files than threads', async () => {
    const classes = new Uint8Array(g.nx * g.ny).map((_, k) => k % 7);
    const jobs = [
      ...[1, 2, 3].map((s) => ({ path: `grids/g${s}.tif`, values: grid(s), options: { noData: 'nan' as const, unit: 'm', description: `grid ${s}`, software: 'taperline test', dateTime: '2026:12:02 12:00:00' } })),
      { path: 'grids/classes.tif', values: classes, options: { noData: 0, colours: new Map([[1, [10, 20, 30] as const]]) } },
    ];
    const out = await writeGeoTiffs(g, jobs, 2);
    expect(Object.keys(out).sort()).toEqual(jobs.map((j) => j.path).sort());
    for (const j of jobs) {
      expect(Buffer.from(out[j.path]).equals(Buffer.from(writeGeoTiff(g, j.values, { ...j.options, deflate })))).toBe(true);
    }
    // (the main-thread writer's bytes are checked against GDAL in tests/io/geotiff-write.test.ts)
  });

  it('names the file when a job fails', async () => {
    const bad = [{ path: 'grids/short.tif', values: new Float32Array(10), options: {} }];
    await expect(writeGeoTiffs(g, bad, 1)).rejects.toThrow(/grids\/short\.tif: data length 10/);
  });
});
