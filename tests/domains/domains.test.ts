import { describe, expect, it } from 'vitest';
import { crsFromEpsg } from '../../src/crs/registry.js';
import type { GridGeometry } from '../../src/grid/geometry.js';
import { cellAreas, cellGeodesicArea, rasterizeRings } from '../../src/grid/cell-area.js';
import { classify, FLAG_ATYPICAL_OCEANIC, FLAG_BLOCK, FLAG_ENCLOSED_THIN, FLAG_MOHO_NOT_IMAGED, FLAG_UNRESOLVED, FORCE_OCEANIC } from '../../src/domains/classify.js';
import { oceanwardFromAzimuth, oceanwardFromDepth } from '../../src/domains/direction.js';
import { polygonize } from '../../src/domains/polygonize.js';

const shoelace = (r: [number, number][]) => r.slice(0, -1).reduce((s, p, k) => s + p[0] * r[k + 1][1] - r[k + 1][0] * p[1], 0) / 2;

describe('polygonize (raster → polygons along cell edges)', () => {
  const keys = Uint8Array.from([
    1, 1, 1, 1, 2,
    1, 3, 3, 1, 2,
    1, 3, 3, 1, 2,
    1, 1, 1, 1, 2,
    2, 2, 2, 2, 2,
  ]);
  const polys = polygonize(keys, 5, 5);
  it('areas equal cell counts, holes included', () => {
    const byKey = (k: number) => polys.filter((p) => p.key === k);
    expect(byKey(1)).toHaveLength(1);
    expect(byKey(1)[0].holes).toHaveLength(1);
    expect(byKey(1)[0].cells).toBe(12);
    expect(byKey(3)[0].cells).toBe(4);
    expect(byKey(2)[0].cells).toBe(9);
    expect(shoelace(byKey(1)[0].outer)).toBe(16);
  });
  it('neighbouring classes share their border vertex for vertex', () => {
    const hole = polys.find((p) => p.key === 1)!.holes[0].map((p) => p.join()).sort();
    const inner = polys.find((p) => p.key === 3)!.outer.map((p) => p.join()).sort();
    expect(hole).toEqual(inner);
  });
  it('cells touching only at a corner become separate polygons', () => {
    const p = polygonize(Uint8Array.from([1, 0, 0, 1]), 2, 2, (k) => k === 0);
    expect(p).toHaveLength(2);
    expect(p.every((q) => q.cells === 1 && q.outer.length === 5)).toBe(true);
  });
});

describe('classify', () => {
  const crs = crsFromEpsg(32631);
  const nx = 60;
  const ny = 20;
  const geom: GridGeometry = { nx, ny, x0: 500_000, y0: 5_000_000, dx: 1000, dy: -1000, registration: 'area', crs };
  /** A margin along x: 32 km → 0 at i = 30, zero crust to i = 38, 7 km oceanic beyond. */
  function thickness(f?: (i: number, j: number, t: number) => number): Float32Array {
    const t = new Float32Array(nx * ny);
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        let v = i < 10 ? 32000 : i < 30 ? 32000 - (i - 10) * 1600 : i < 38 ? 0 : 7000;
        if (f) v = f(i, j, v);
        t[j * nx + i] = v;
      }
    }
    return t;
  }
  const base = {
    geometry: geom, valid: new Uint8Array(nx * ny).fill(1), taperLevel: 2000, oceanLevel: 2000, oceanward: oceanwardFromAzimuth(90),
    tc0: 35000, neckingFraction: 0.8, couplingThickness: 10000, oceanicMin: 5000, oceanicMax: 9000, minBlockArea: 0, minBlockCells: 1, cellAreaKm2: 1,
  };
  const at = (a: ArrayLike<number>, i: number, j: number) => a[j * nx + i];

  it('assigns the domains of DESIGN.md by thickness and side', () => {
    const c = classify({ ...base, thickness: thickness() });
    // i = 12: 28 800 m ≥ 28 000 → proximal; i = 14: 25 600 → necking; i = 25: 8 000 → hyperextended
    expect([at(c.domains, 5, 3), at(c.domains, 12, 3), at(c.domains, 14, 3), at(c.domains, 25, 3), at(c.domains, 33, 3), at(c.domains, 50, 3)]).toEqual([1, 1, 2, 3, 4, 5]);
  });
  it('Moho not imaged is its own class (6) with its flag, never no data; missing basement is no data', () => {
    const t = thickness((i, j, v) => (i === 50 && j === 5 ? NaN : v));
    const valid = new Uint8Array(nx * ny).fill(1);
    valid[5 * nx + 51] = 0;
    const c = classify({ ...base, thickness: t, valid });
    expect(at(c.domains, 50, 5)).toBe(6);
    expect(at(c.flags, 50, 5) & FLAG_MOHO_NOT_IMAGED).toBeTruthy();
    expect(at(c.domains, 51, 5)).toBe(0);
  });
  it('atypical oceanic thickness is flagged, not unclassified; thin spots enclosed by oceanic crust stay oceanic', () => {
    const t = thickness((i, j, v) => (i === 55 && j === 10 ? 12000 : i === 45 && j === 10 ? 500 : v));
    const c = classify({ ...base, thickness: t });
    expect(at(c.domains, 55, 10)).toBe(5);
    expect(at(c.flags, 55, 10) & FLAG_ATYPICAL_OCEANIC).toBeTruthy();
    expect(at(c.domains, 45, 10)).toBe(5);
    expect(at(c.flags, 45, 10) & FLAG_ENCLOSED_THIN).toBeTruthy();
  });
  it('an isolated block in the transition is kept and labelled when large enough', () => {
    const t = thickness((i, j, v) => (i >= 33 && i <= 35 && j >= 8 && j <= 10 ? 6000 : v));
    const kept = classify({ ...base, thickness: t, minBlockArea: 5 });
    expect(at(kept.domains, 34, 9)).toBe(3);
    expect(at(kept.flags, 34, 9) & FLAG_BLOCK).toBeTruthy();
    expect(kept.blocks).toEqual([{ label: expect.any(Number), cells: 9, areaKm2: 9, x: expect.any(Number), y: expect.any(Number) }]);
    const dropped = classify({ ...base, thickness: t, minBlockArea: 10 });
    expect(at(dropped.domains, 34, 9)).toBe(4);
  });
  it('says so when thin continental crust runs into oceanic-range crust with no gap', () => {
    const t = thickness((i, j, v) => (j < 4 && i >= 29 && i < 38 ? 6000 : v));
    const c = classify({ ...base, thickness: t });
    expect(c.warnings.join()).toMatch(/thickness cannot resolve the transition/);
    expect(at(c.flags, 33, 1) & FLAG_UNRESOLVED).toBeTruthy();
    expect(at(c.domains, 33, 1)).toBe(4);
  });
  it('crust-type evidence forces its cells', () => {
    const force = new Uint8Array(nx * ny);
    for (let j = 0; j < ny; j++) for (let i = 26; i < 30; i++) force[j * nx + i] = FORCE_OCEANIC;
    const t = thickness();
    const c = classify({ ...base, thickness: t, force });
    expect(at(c.domains, 27, 3)).toBe(5);
  });
  it('the plane fit points down-dip', () => {
    const depth = new Float32Array(nx * ny);
    for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) depth[j * nx + i] = 1000 + 50 * i + 20 * j; // deepens east and south
    const o = oceanwardFromDepth(geom, depth)!;
    // gradient (50, 20 per km) in (east, −north): azimuth = atan2(50, −20) = 111.8° (own derivation)
    expect(o.azimuth).toBeCloseTo(111.8, 1);
  });
});

describe('cell areas (geodesic)', () => {
  const g: GridGeometry = { nx: 600, ny: 400, x0: 350_250, y0: 6_224_750, dx: 500, dy: -500, registration: 'area', crs: crsFromEpsg(32709) };
  it('interpolated cell areas match exact geodesic cell areas to 1e-6', () => {
    const a = cellAreas(g);
    for (const [i, j] of [[0, 0], [17, 333], [599, 399], [301, 150], [450, 7]]) {
      expect(Math.abs(a[j * 600 + i] / cellGeodesicArea(g, i, j) - 1)).toBeLessThan(1e-6);
    }
  });
  it('rasterizes a polygon by cell centres', () => {
    const m = rasterizeRings(g, [[[350_000, 6_225_000], [351_000, 6_225_000], [351_000, 6_224_000], [350_000, 6_224_000], [350_000, 6_225_000]]]);
    expect(m.reduce((s, v) => s + v, 0)).toBe(4);
  });
});
