import { describe, expect, it } from 'vitest';
import { crsFromEpsg, WGS84 } from '../../src/crs/registry.js';
import { transformer } from '../../src/crs/transform.js';
import { colToX, extentOf, rowToY, xToCol, yToRow, type GridGeometry } from '../../src/grid/geometry.js';
import { makeGrid } from '../../src/grid/grid.js';
import { resample } from '../../src/grid/resample.js';
import { quantile, stats } from '../../src/grid/stats.js';

const UTM = crsFromEpsg(32709);
const geo = (over: Partial<GridGeometry> = {}): GridGeometry => ({
  nx: 40, ny: 30, x0: 400_250, y0: 6_100_250, dx: 500, dy: -500, registration: 'area', crs: UTM, ...over,
});
const plane = (x: number, y: number) => 1000 + 0.01 * (x - 400_000) - 0.02 * (y - 6_100_000);

function planeGrid(g: GridGeometry) {
  const grid = makeGrid(g);
  for (let j = 0; j < g.ny; j++) for (let i = 0; i < g.nx; i++) grid.values[j * g.nx + i] = plane(colToX(g, i), rowToY(g, j));
  return grid;
}

describe('grid geometry', () => {
  it('index ↔ world round trips and the footprint depends on registration', () => {
    const g = geo();
    expect(xToCol(g, colToX(g, 7.25))).toBeCloseTo(7.25, 12);
    expect(yToRow(g, rowToY(g, 3.5))).toBeCloseTo(3.5, 12);
    expect(extentOf(g)).toEqual({ xmin: 400_000, xmax: 420_000, ymin: 6_085_500, ymax: 6_100_500 });
    expect(extentOf({ ...g, registration: 'node' })).toEqual({ xmin: 400_250, xmax: 419_750, ymin: 6_085_750, ymax: 6_100_250 });
  });

  it('rejects impossible geometry', () => {
    expect(() => makeGrid(geo({ nx: 0 }))).toThrow(/positive integers/);
    expect(() => makeGrid(geo({ dx: -1 }))).toThrow(/cell width/);
    expect(() => makeGrid(geo(), new Float32Array(5))).toThrow(/does not match/);
  });
});

describe('NaN-aware statistics', () => {
  it('ignores NaN, counts ±Infinity apart, and matches a hand computation', () => {
    const s = stats(new Float32Array([1, 2, NaN, 3, Infinity, 4, -Infinity]));
    expect(s).toMatchObject({ count: 4, nan: 1, infinite: 2, min: 1, max: 4, mean: 2.5 });
    // sample std of 1..4 = sqrt(5/3)
    expect(s.std).toBeCloseTo(Math.sqrt(5 / 3), 12);
    expect(stats(new Float32Array([NaN])).mean).toBeNaN();
  });
  it('quantiles follow the type-7 definition (numpy default): median of 1..4 is 2.5, p90 of 0..10 is 9', () => {
    expect(quantile([4, NaN, 1, 3, 2], 0.5)).toBe(2.5);
    expect(quantile([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 0.9)).toBeCloseTo(9, 12);
  });
});

describe('resampling', () => {
  it('onto itself is an exact copy, NaN included', () => {
    const g = geo();
    const src = planeGrid(g);
    src.values[5] = NaN;
    src.values[333] = NaN;
    const out = resample(src, g);
    expect(Array.from(out.values)).toEqual(Array.from(src.values));
  });

  it('onto a shifted, finer grid reproduces an analytic plane to rounding', () => {
    const src = planeGrid(geo());
    const target = geo({ nx: 70, ny: 50, x0: 400_600, y0: 6_099_900, dx: 250, dy: -250 });
    const out = resample(src, target);
    let checked = 0;
    for (let j = 0; j < target.ny; j++) {
      for (let i = 0; i < target.nx; i++) {
        const v = out.values[j * target.nx + i];
        if (Number.isNaN(v)) continue;
        checked++;
        // float32 storage of ~1000-m values: relative 6e-8 → < 1e-3 m
        expect(Math.abs(v - plane(colToX(target, i), rowToY(target, j)))).toBeLessThan(1e-3);
      }
    }
    expect(checked).toBe(target.nx * target.ny); // target lies inside the source footprint
  });

  it('NaN never spreads more than one cell', () => {
    const g = geo();
    const src = planeGrid(g);
    const hole = 15 * g.nx + 20;
    src.values[hole] = NaN;
    const target = geo({ nx: 160, ny: 116, x0: 400_062.5, y0: 6_100_187.5, dx: 125, dy: -125 });
    const out = resample(src, target);
    for (let j = 0; j < target.ny; j++) {
      for (let i = 0; i < target.nx; i++) {
        if (!Number.isNaN(out.values[j * target.nx + i])) continue;
        const fi = xToCol(g, colToX(target, i));
        const fj = yToRow(g, rowToY(target, j));
        expect(Math.abs(fi - 20)).toBeLessThan(1);
        expect(Math.abs(fj - 15)).toBeLessThan(1);
      }
    }
  });

  it('across CRSs: a UTM plane resampled onto a lon/lat grid matches the plane at the transformed points', () => {
    const src = planeGrid(geo());
    const t = transformer(UTM, WGS84);
    const [lon0, lat0] = t.forward([402_000, 6_098_000]);
    const target: GridGeometry = { nx: 20, ny: 20, x0: lon0, y0: lat0, dx: 0.004, dy: -0.004, registration: 'area', crs: WGS84 };
    const out = resample(src, target);
    let checked = 0;
    for (let j = 0; j < 20; j++) {
      for (let i = 0; i < 20; i++) {
        const [x, y] = t.inverse([colToX(target, i), rowToY(target, j)]);
        const v = out.values[j * 20 + i];
        if (Number.isNaN(v)) continue;
        checked++;
        expect(Math.abs(v - plane(x, y))).toBeLessThan(1e-3);
      }
    }
    expect(checked).toBeGreaterThan(300);
  });
});
