import { deflateSync } from 'node:zlib';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { crsFromEpsg, WGS84 } from '../../src/crs/registry.js';
import type { GridGeometry } from '../../src/grid/geometry.js';
import { readGeoTiff } from '../../src/io/geotiff-read.js';
import { writeGeoTiff } from '../../src/io/geotiff-write.js';
import { toolOrSkip } from '../helpers/tools.js';

const g: GridGeometry = { nx: 301, ny: 217, x0: 350_250, y0: 6_224_750, dx: 500, dy: -500, registration: 'area', crs: crsFromEpsg(32709) };
function values(): Float32Array {
  const v = new Float32Array(g.nx * g.ny);
  for (let k = 0; k < v.length; k++) v[k] = Math.fround(Math.sin(k * 0.37) * 12345.678 + k * 1e-3);
  v[7] = NaN;
  v[100] = Infinity; // unbounded β is stored as +Infinity
  v[101] = -0;
  v[102] = 1e-40; // subnormal
  return v;
}

describe('GeoTIFF writer', () => {
  it("tiles compressed by Node's zlib (as the CLI writes them) read back bit for bit, like fflate's", async () => {
    const v = values();
    const a = writeGeoTiff(g, v, { noData: 'nan' });
    const b = writeGeoTiff(g, v, { noData: 'nan', deflate: (d, level) => deflateSync(d, { level }) });
    const ra = await readGeoTiff(a, 'a.tif', { role: 'other', units: 'm', sign: 'depth' });
    const rb = await readGeoTiff(b, 'b.tif', { role: 'other', units: 'm', sign: 'depth' });
    expect(Array.from(rb.grid.values)).toEqual(Array.from(ra.grid.values));
  });
  it('round trips through our reader bit for bit, with geometry and CRS', async () => {
    const v = values();
    const bytes = writeGeoTiff(g, v, { noData: 'nan', unit: 'm', description: 'test grid' });
    const { grid } = await readGeoTiff(bytes, 'roundtrip.tif', { role: 'other', units: 'm', sign: 'depth' });
    expect(grid.geometry).toMatchObject({ nx: g.nx, ny: g.ny, x0: g.x0, y0: g.y0, dx: 500, dy: -500, registration: 'area' });
    expect(grid.geometry.crs.id).toBe('EPSG:32709');
    // NaN and ±Inf are masked by the reader (no data / not finite); every other sample is identical.
    for (let k = 0; k < v.length; k++) {
      if (!Number.isFinite(v[k])) expect(grid.values[k]).toBeNaN();
      else expect(Object.is(grid.values[k], v[k]) || grid.values[k] === v[k]).toBe(true);
    }
  });

  it('writes node-registered and south-up grids with the right tie point', async () => {
    const south: GridGeometry = { ...g, nx: 3, ny: 2, x0: 0, y0: 0, dx: 1, dy: 1, registration: 'node', crs: WGS84 };
    const bytes = writeGeoTiff(south, Float32Array.from([1, 2, 3, 4, 5, 6]));
    const { grid } = await readGeoTiff(bytes, 'south.tif', { units: 'm', sign: 'depth' });
    expect(grid.geometry).toMatchObject({ x0: 0, y0: 1, dy: -1, registration: 'node' });
    expect(Array.from(grid.values)).toEqual([4, 5, 6, 1, 2, 3]);
  });

  it('writes UInt8 class grids', async () => {
    const bytes = writeGeoTiff({ ...g, nx: 4, ny: 1 }, Uint8Array.from([0, 1, 5, 255]), { noData: 0 });
    const { grid, report } = await readGeoTiff(bytes, 'classes.tif', { units: 'm', sign: 'depth', noData: 255 });
    expect(report.sampleType).toBe('UInt8');
    expect(Array.from(grid.values)).toEqual([NaN, 1, 5, NaN]);
  });
});

describe('GeoTIFF writer read back by GDAL', () => {
  const have = toolOrSkip('gdal');
  const dir = mkdtempSync(join(tmpdir(), 'taperline-gdal-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it.skipIf(!have)('gdal_translate reads our Float32 samples bit-identically; gdalinfo sees CRS, extent and NoData', () => {
    const v = values();
    const tif = join(dir, 'ours.tif');
    writeFileSync(tif, writeGeoTiff(g, v, { noData: 'nan', unit: 'm' }));
    const info = JSON.parse(execFileSync('gdalinfo', ['-json', tif], { encoding: 'utf8' }));
    expect(info.size).toEqual([g.nx, g.ny]);
    expect(info.geoTransform).toEqual([350_000, 500, 0, 6_225_000, 0, -500]);
    expect(info.coordinateSystem.wkt).toMatch(/UTM zone 9S/);
    expect(info.coordinateSystem.wkt).toMatch(/ID\["EPSG",32709\]\]$/);
    expect(info.bands[0].type).toBe('Float32');
    expect(String(info.bands[0].noDataValue)).toBe('NaN');
    expect(info.bands[0].unit).toBe('m');
    // raw dump of GDAL's decoded samples, compared byte for byte
    const raw = join(dir, 'ours.bin');
    execFileSync('gdal_translate', ['-q', '-of', 'ENVI', tif, raw]);
    const back = readFileSync(raw);
    const mine = Buffer.from(v.buffer);
    expect(back.length).toBe(mine.length);
    expect(back.equals(mine)).toBe(true);
  });
});
