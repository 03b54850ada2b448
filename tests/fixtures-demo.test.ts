// The invented demo scenario: deterministic, in open ocean, shaped as the foundation issue asks.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { demoFiles } from '../fixtures/demo-files.js';
import { DEMO_GEOMETRY, generateDemoGrids, truthLines } from '../fixtures/demo-margin.js';
import { WGS84 } from '../src/crs/registry.js';
import { transformer } from '../src/crs/transform.js';
import { readGeoTiff } from '../src/io/geotiff-read.js';
import { readXyz } from '../src/io/xyz-read.js';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

describe('demo scenario', () => {
  const files = demoFiles();

  it('is deterministic: two runs give identical bytes', () => {
    const again = demoFiles();
    for (const [name, bytes] of Object.entries(files)) expect(sha(again[name]), name).toBe(sha(bytes));
  });

  it('is 600 × 400 cells at 500 m in WGS 84 / UTM 9S, in open South Pacific ocean', () => {
    const g = DEMO_GEOMETRY;
    expect([g.nx, g.ny, g.dx, g.crs.id]).toEqual([600, 400, 500, 'EPSG:32709']);
    const [lon, lat] = transformer(g.crs, WGS84).forward([g.x0 + 300 * g.dx, g.y0 + 200 * g.dy]);
    // about 35°S 129°W: > 2000 km from South America, New Zealand and Antarctica (from memory)
    expect(lat).toBeGreaterThan(-37);
    expect(lat).toBeLessThan(-33);
    expect(lon).toBeGreaterThan(-131);
    expect(lon).toBeLessThan(-127);
  });

  it('has the margin built in: ~32 km proximal crust, a zero-crust corridor, ~7 km oceanic crust, one hole, a Moho gap', () => {
    const d = generateDemoGrids();
    const row = 390; // a row clear of the hole and the Moho gap
    const tc = (i: number) => d.thickness[row * 600 + i];
    expect(tc(5)).toBeCloseTo(32000, -2);
    expect(tc(595)).toBeCloseTo(7000, -2);
    let zeros = 0;
    for (let i = 0; i < 600; i++) if (tc(i) === 0) zeros++;
    expect(zeros).toBeGreaterThan(30); // > 15 km of exhumed mantle
    const holes = d.seabed.filter(Number.isNaN).length;
    expect(holes).toBeGreaterThan(500);
    let mohoGap = 0;
    for (let k = 0; k < d.moho.length; k++) if (Number.isNaN(d.moho[k]) && !Number.isNaN(d.basement[k])) mohoGap++;
    expect(mohoGap).toBeGreaterThan(300);
  });

  it('the truth lines are not straight (embayment and offset)', () => {
    const t = truthLines()['crustal-taper-limit'];
    const xs = t.map((p) => p[0]);
    expect(Math.max(...xs) - Math.min(...xs)).toBeGreaterThan(15_000);
  });

  it('the files read back through the readers with the expected detections', async () => {
    const d = generateDemoGrids();
    const moho = await readGeoTiff(files['moho.tif'], 'moho.tif');
    expect(moho.report.role.value).toBe('moho');
    expect(moho.report.units).toMatchObject({ value: 'm', source: 'metadata' });
    expect(Array.from(moho.grid.values.subarray(0, 1000))).toEqual(Array.from(d.moho.subarray(0, 1000)));
    const xyz = readXyz(new TextDecoder().decode(files['seabed-elevation.xyz']), 'seabed-elevation.xyz', { crs: 'EPSG:32709' });
    expect(xyz.report.sign).toMatchObject({ value: 'elevation', source: 'metadata' });
    expect(xyz.report.noData.masked).toEqual({ '-99999': d.seabed.filter(Number.isNaN).length });
    // node-registered at the cell centres of the GeoTIFF: same sample positions
    expect([xyz.grid.geometry.x0, xyz.grid.geometry.y0]).toEqual([DEMO_GEOMETRY.x0, DEMO_GEOMETRY.y0]);
    for (let k = 0; k < 2000; k += 7) {
      if (Number.isNaN(d.seabed[k])) continue;
      expect(Math.abs(xyz.grid.values[k] - d.seabed[k])).toBeLessThanOrEqual(0.005 + 1e-3);
    }
  });
});
