// Reader checks against GeoTIFFs written by GDAL 3.6 (an independent tool); recipe in
// tests/fixtures/gdal/make.sh. Every file holds raw = 1000 + 10·col + 3·row, no data at (4,2), (30,20).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readGeoTiff } from '../../src/io/geotiff-read.js';
import { InputError } from '../../src/io/errors.js';
import { nodeInflate } from '../../src/cli/load.js';

const dir = new URL('../fixtures/gdal/', import.meta.url);
const bytes = (f: string) => readFileSync(new URL(f, dir));
const expectedRaw = (i: number, j: number) => 1000 + 10 * i + 3 * j;
const isHole = (i: number, j: number) => (i === 4 && j === 2) || (i === 30 && j === 20);

async function check(file: string, physical: (raw: number) => number, epsg: string, registration: 'area' | 'node') {
  const { grid, report } = await readGeoTiff(bytes(file), file, { role: 'top-basement' });
  const g = grid.geometry;
  expect([g.nx, g.ny, g.dx, g.dy]).toEqual([37, 23, 500, -500]);
  // GDAL wrote the upper-left corner at (300000, 6011500); the first cell centre is half a cell in.
  expect([g.x0, g.y0]).toEqual([300250, 6011250]);
  expect(g.registration).toBe(registration);
  expect(g.crs.id).toBe(epsg);
  expect(report.noData.total).toBe(2);
  for (let j = 0; j < 23; j++) {
    for (let i = 0; i < 37; i++) {
      const v = grid.values[j * 37 + i];
      if (isHole(i, j)) expect(v).toBeNaN();
      else expect(v).toBe(Math.fround(physical(expectedRaw(i, j))));
    }
  }
  return report;
}

describe('GeoTIFF reader on GDAL-made files', () => {
  it('Float32, DEFLATE + floating-point predictor, 16×16 tiles', async () => {
    const r = await check('f32_deflate_tiled.tif', (v) => v, 'EPSG:32709', 'area');
    expect(r.sampleType).toBe('Float32');
    expect(r.noData.masked).toEqual({ '-9999': 2 });
  });
  it('Float32, ZSTD, 5-row strips', async () => {
    await check('f32_zstd_striped.tif', (v) => v, 'EPSG:32709', 'area');
  });
  it('Float64, LZW', async () => {
    const r = await check('f64_lzw.tif', (v) => v, 'EPSG:32709', 'area');
    expect(r.sampleType).toBe('Float64');
  });
  it('Int16 with scale 0.5 and offset −100 applied after no data is masked', async () => {
    const r = await check('i16_scale_offset.tif', (v) => v * 0.5 - 100, 'EPSG:32709', 'area');
    expect(r.sampleType).toBe('Int16');
    expect(r.warnings.join()).toMatch(/scale 0.5 and offset -100/);
  });
  it('UInt16, PixelIsPoint, ETRS89 / UTM 32N, no data 65535', async () => {
    // GDAL writes the tie point of a PixelIsPoint file at the first pixel's centre: the node itself.
    const r = await check('u16_point.tif', (v) => v, 'EPSG:25832', 'node');
    expect(r.registration.detail).toBe('RasterPixelIsPoint');
    expect(r.noData.masked).toEqual({ '65535': 2 });
  });
  it('Int16, big-endian, LZW with the integer predictor, 7-row strips', async () => {
    const r = await check('i16_lzw_pred2_be.tif', (v) => v, 'EPSG:32709', 'area');
    expect(r.sampleType).toBe('Int16');
  });
  it('Float32, PackBits', async () => {
    await check('f32_packbits.tif', (v) => v, 'EPSG:32709', 'area');
  });
  it('BigTIFF: Float32 big-endian DEFLATE tiled, and Float64 DEFLATE + floating-point predictor, 16×32 tiles', async () => {
    await check('f32_bigtiff_be.tif', (v) => v, 'EPSG:32709', 'area');
    await check('f64_bigtiff_pred3.tif', (v) => v, 'EPSG:32709', 'area');
  });
  it('three bands pixel-interleaved (Int32, DEFLATE + predictor 2) and band-interleaved (UInt16, ZSTD, tiled): band 1 read, a warning', async () => {
    const a = await check('i32_3band_pixel.tif', (v) => v, 'EPSG:32709', 'area');
    expect(a.warnings.join()).toMatch(/3 bands: only band 1/);
    const b = await check('u16_3band_planar.tif', (v) => v, 'EPSG:32709', 'area');
    expect(b.noData.masked).toEqual({ '65535': 2 });
  });
  it('tiles GDAL left out of a sparse file read as no data', async () => {
    const { grid, report } = await readGeoTiff(bytes('f32_sparse.tif'), 'f32_sparse.tif', { role: 'top-basement' });
    expect([grid.geometry.nx, grid.geometry.ny]).toEqual([53, 23]);
    expect(report.noData.total).toBe(16 * 23 + 2);
    for (let j = 0; j < 23; j++) {
      for (let i = 0; i < 53; i++) {
        const v = grid.values[j * 53 + i];
        if (i < 16 || isHole(i - 16, j)) expect(v).toBeNaN();
        else expect(v).toBe(expectedRaw(i - 16, j));
      }
    }
  });
  it('kilometres declared by the unit tag are converted to metres', async () => {
    const r = await check('km_units.tif', (v) => Math.fround(v / 1000) * 1000, 'EPSG:32709', 'area');
    expect(r.units).toMatchObject({ value: 'km', source: 'metadata' });
  });
  it('refuses a two-way-time grid, naming the file and asking for depth', async () => {
    await expect(readGeoTiff(bytes('twt_ms.tif'), 'twt_ms.tif')).rejects.toThrow(/^twt_ms\.tif: .*two-way-time.*depth-converted/);
  });
  it('accepts the time-looking grid when the user says it holds depths', async () => {
    const { report } = await readGeoTiff(bytes('twt_ms.tif'), 'twt_ms.tif', { zDomain: 'depth', units: 'm' });
    expect(report.units.source).toBe('option');
  });
  it('names an EPSG code outside the list and a user-defined CRS, and takes a proj4 override', async () => {
    await expect(readGeoTiff(bytes('epsg2193.tif'), 'epsg2193.tif')).rejects.toThrow(/epsg2193\.tif: CRS EPSG:2193 .*proj4/);
    await expect(readGeoTiff(bytes('user_defined.tif'), 'user_defined.tif')).rejects.toThrow(/user-defined/);
    const { grid } = await readGeoTiff(bytes('user_defined.tif'), 'user_defined.tif', {
      crs: '+proj=tmerc +lat_0=0 +lon_0=7 +k=1 +x_0=0 +y_0=0 +ellps=WGS84 +units=m',
    });
    expect(grid.geometry.crs.id).toBe('PROJ4');
  });
  it('refuses a truncated file and a non-TIFF with a message naming the file', async () => {
    const whole = bytes('f32_zstd_striped.tif');
    const err = await readGeoTiff(whole.subarray(0, 1500), 'cut.tif').catch((e) => e);
    expect(err).toBeInstanceOf(InputError);
    expect(err.message).toMatch(/^cut\.tif: /);
    await expect(readGeoTiff(new TextEncoder().encode('x y z\n1 2 3\n'), 'notes.tif')).rejects.toThrow(/notes\.tif: is not a TIFF/);
  });
  it("Node's zlib (the CLI's DEFLATE decoder) reads every DEFLATE file exactly as the portable decoder, and refuses the same damage", async () => {
    for (const f of ['f32_deflate_tiled.tif', 'f64_bigtiff_pred3.tif', 'f32_bigtiff_be.tif', 'i32_3band_pixel.tif', 'f32_sparse.tif']) {
      const a = await readGeoTiff(bytes(f), f, { role: 'top-basement' });
      const b = await readGeoTiff(bytes(f), f, { role: 'top-basement', inflate: nodeInflate });
      expect(Array.from(b.grid.values), f).toEqual(Array.from(a.grid.values));
    }
    const damaged = new Uint8Array(bytes('f32_deflate_tiled.tif'));
    for (let k = 600; k < 700; k += 3) damaged[k] ^= 0x5a;
    const e1 = await readGeoTiff(damaged, 'd.tif').catch((e) => e);
    const e2 = await readGeoTiff(damaged, 'd.tif', { inflate: nodeInflate }).catch((e) => e);
    expect(e1).toBeInstanceOf(InputError);
    expect(e2).toBeInstanceOf(InputError);
  });
});
