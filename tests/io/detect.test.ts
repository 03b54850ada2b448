import { describe, expect, it } from 'vitest';
import { guessRole, SENTINELS, toDepthMetres, words } from '../../src/io/detect.js';

const ramp = (n: number, a: number, b: number) => Float64Array.from({ length: n }, (_, k) => a + ((b - a) * k) / (n - 1));

describe('units', () => {
  it('a Moho of 10–50 is kilometres (a Moho 10–50 m deep is impossible)', () => {
    const r = toDepthMetres(ramp(100, 10, 50), { fileName: 'moho_final.tif' });
    expect(r.report.role.value).toBe('moho');
    expect(r.report.units).toMatchObject({ value: 'km', source: 'values' });
    expect(r.values[0]).toBe(10000);
    expect(r.report.warnings).toEqual([]);
  });
  it('a Moho of 10 000–50 000 is metres', () => {
    const r = toDepthMetres(ramp(100, 10000, 50000), { fileName: 'moho.tif' });
    expect(r.report.units).toMatchObject({ value: 'm', source: 'values' });
  });
  it('a basement of 1–12 is read as kilometres with a warning to confirm', () => {
    const r = toDepthMetres(ramp(100, 1, 12), { fileName: 'top_basement.tif' });
    expect(r.report.units.value).toBe('km');
    expect(r.report.warnings.join()).toMatch(/please confirm/);
  });
  it('an ambiguous range (largest |value| 40, unknown role) is metres with a warning', () => {
    const r = toDepthMetres(ramp(100, 20, 40), { fileName: 'surface.tif' });
    expect(r.report.units).toMatchObject({ value: 'm', source: 'default' });
    expect(r.report.warnings.join()).toMatch(/cannot be told/);
  });
  it('metadata beats values: a unit tag "km" on a seabed of 0.1–5', () => {
    const r = toDepthMetres(ramp(10, 0.1, 5), { fileName: 'seabed.tif', unitTag: 'km' });
    expect(r.report.units).toMatchObject({ value: 'km', source: 'metadata' });
  });
  it('feet are converted at 0.3048 m (international foot, exact by definition)', () => {
    const r = toDepthMetres(ramp(10, 1000, 10000), { fileName: 'seabed_ft.tif' });
    expect(r.report.units.value).toBe('ft');
    expect(r.values[0]).toBeCloseTo(304.8, 3);
  });
  it('an explicit option overrides everything', () => {
    const r = toDepthMetres(ramp(10, 10, 50), { fileName: 'moho.tif', unitTag: 'km' }, { units: 'm' });
    expect(r.report.units).toMatchObject({ value: 'm', source: 'option' });
    expect(r.values[0]).toBe(10);
  });
});

describe('sign convention', () => {
  it('a seabed mostly negative is elevation and is flipped to depth', () => {
    const r = toDepthMetres(ramp(100, -4000, -50), { fileName: 'seabed.tif' });
    expect(r.report.sign).toMatchObject({ value: 'elevation', source: 'values' });
    expect(r.values[0]).toBe(4000);
  });
  it('all positive is depth', () => {
    const r = toDepthMetres(ramp(100, 50, 4000), { fileName: 'seabed.tif' });
    expect(r.report.sign.value).toBe('depth');
    expect(r.values[0]).toBe(50);
  });
  it('a mixed seabed (40% negative) is a guess with a warning', () => {
    const r = toDepthMetres(ramp(100, -400, 600), { fileName: 'seabed.tif' });
    expect(r.report.sign.value).toBe('depth');
    expect(r.report.warnings.join()).toMatch(/sign convention guessed/);
  });
  it('"elevation" in the name decides even for positive values (land heights)', () => {
    const r = toDepthMetres(ramp(10, 100, 200), { fileName: 'basement_elevation.tif' });
    expect(r.report.sign).toMatchObject({ value: 'elevation', source: 'metadata' });
    expect(r.values[0]).toBe(-100);
  });
  it('the sign option overrides', () => {
    const r = toDepthMetres(ramp(10, -100, -10), { fileName: 'seabed.tif' }, { sign: 'depth' });
    expect(r.values[0]).toBe(-100);
  });
});

describe('no-data sentinels', () => {
  // The common sentinels (issue 2): -9999, -99999, 1e30, 1.70141e38, ±3.4028e38, NaN.
  for (const s of [...SENTINELS, NaN]) {
    it(`masks ${s}, in float64 and after float32 rounding`, () => {
      for (const arr of [Float64Array.from([1000, s, 2000, 3000]), Float32Array.from([1000, s, 2000, 3000])]) {
        const r = toDepthMetres(arr, { fileName: 'top_basement.tif' });
        expect(r.values[1]).toBeNaN();
        expect(r.report.noData.total).toBe(1);
        expect(Object.values(r.report.noData.masked)).toEqual([1]);
      }
    });
  }
  it('masks the file tag and the user values, and reports counts per value', () => {
    const r = toDepthMetres(Float64Array.from([1000, 0, 0, 77, 2000]), { fileName: 'x_basement.tif' }, { noData: 77 }, 0);
    expect(r.report.noData.masked).toEqual({ '0': 2, '77': 1 });
  });
  it('refuses a file that is all no data', () => {
    expect(() => toDepthMetres(Float64Array.from([-9999, NaN]), { fileName: 'empty.tif' })).toThrow(/^empty\.tif: holds no data/);
  });
});

describe('time grids and roles', () => {
  it('refuses two-way time named in the file name, unit tag or description', () => {
    const z = ramp(10, 100, 4000);
    expect(() => toDepthMetres(z, { fileName: 'seabed_twt.tif' })).toThrow(/seabed_twt\.tif: .*two-way-time/);
    expect(() => toDepthMetres(z, { fileName: 'horizon.tif', unitTag: 's' })).toThrow(/two-way-time/);
    expect(() => toDepthMetres(z, { fileName: 'horizon.tif', descriptions: ['Two-way time to basement'] })).toThrow(/two-way-time/);
    expect(() => toDepthMetres(z, { fileName: 'moho_time_ms.grd' })).toThrow(/two-way-time/);
  });
  it('splits words the way file names are written', () => {
    expect(words('Moho_Depth-km.v2')).toEqual(['moho', 'depth', 'km', 'v', '2']);
  });
  it('guesses roles from file names', () => {
    expect(guessRole('Seabed_2019.tif')).toBe('seabed');
    expect(guessRole('bathymetry.xyz')).toBe('seabed');
    expect(guessRole('TopBasement.tif'.replace(/([a-z])([A-Z])/g, '$1_$2'))).toBe('top-basement');
    expect(guessRole('moho_gravity.tif')).toBe('moho');
    expect(guessRole('grid1.tif')).toBe('other');
  });
});
