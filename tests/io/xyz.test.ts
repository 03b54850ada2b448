import { describe, expect, it } from 'vitest';
import { readXyz } from '../../src/io/xyz-read.js';

function xyz(opts: { sep?: string; southFirst?: boolean; header?: string; drop?: number[]; mutate?: (lines: string[]) => void } = {}) {
  const sep = opts.sep ?? ' ';
  const lines: string[] = [];
  const rows = [0, 1, 2, 3];
  for (const r of opts.southFirst ? rows : [...rows].reverse()) {
    for (let c = 0; c < 5; c++) lines.push([1000 + c * 250, 5000 + r * 250, 100 + c + 10 * r].join(sep));
  }
  opts.mutate?.(lines);
  const kept = lines.filter((_, k) => !(opts.drop ?? []).includes(k));
  return (opts.header ? opts.header + '\n' : '') + kept.join('\n') + '\n';
}

describe('XYZ reader', () => {
  for (const [name, sep] of [['spaces', ' '], ['tabs', '\t'], ['commas', ',']] as const) {
    it(`reads ${name}, rows north-first, node-registered`, () => {
      const { grid, report } = readXyz(xyz({ sep }), 'basement.xyz', { crs: 'EPSG:32709' });
      const g = grid.geometry;
      expect([g.nx, g.ny, g.x0, g.y0, g.dx, g.dy, g.registration]).toEqual([5, 4, 1000, 5750, 250, -250, 'node']);
      // row 0 is the northern row (y = 5750, r = 3): z = 100 + c + 30
      expect(Array.from(grid.values.subarray(0, 5))).toEqual([130, 131, 132, 133, 134]);
      expect(report.format).toBe('xyz');
    });
  }
  it('reads rows in either order with a header line skipped', () => {
    const a = readXyz(xyz({ southFirst: true, header: 'Easting,Northing,Depth' }), 'basement.xyz', { crs: 'EPSG:32709' });
    const b = readXyz(xyz(), 'basement.xyz', { crs: 'EPSG:32709' });
    expect(Array.from(a.grid.values)).toEqual(Array.from(b.grid.values));
  });
  it('absent nodes become no data with a note', () => {
    const { grid, report } = readXyz(xyz({ drop: [7] }), 'basement.xyz', { crs: 'EPSG:32709' });
    expect(grid.values.filter(Number.isNaN).length).toBe(1);
    expect(report.warnings.join()).toMatch(/1 lattice nodes absent/);
  });
  it('refuses irregular spacing and names the first bad line', () => {
    const text = xyz({ mutate: (l) => (l[6] = '1260 5500 5') });
    // line 7 of the file (no header): the 7th data line
    expect(() => readXyz(text, 'bad.xyz', { crs: 'EPSG:32709' })).toThrow(/^bad\.xyz: irregular spacing: line 7 \(1260, 5500\)/);
  });
  it('refuses text that is not x y z, naming the line', () => {
    const text = xyz({ mutate: (l) => (l[3] = '1750 5750 abc') });
    expect(() => readXyz(text, 'bad.xyz', { crs: 'EPSG:32709' })).toThrow(/bad\.xyz: line 4 is not "x y z"/);
    expect(() => readXyz('hello\nworld\n', 'words.xyz', { crs: 'EPSG:32709' })).toThrow(/words\.xyz: holds 0 numeric points/);
  });
  it('needs a CRS: refuses without one, or assumes the analysis CRS with a warning', () => {
    expect(() => readXyz(xyz(), 'basement.xyz')).toThrow(/basement\.xyz: XYZ text carries no CRS/);
    const r = readXyz(xyz(), 'basement.xyz', { assumeCrs: 'EPSG:32709' });
    expect(r.report.crs.source).toBe('default');
    expect(r.report.warnings.join()).toMatch(/assumed EPSG:32709/);
  });
  it('refuses a repeated node with a different value', () => {
    const text = xyz() + '1000 5000 999\n';
    expect(() => readXyz(text, 'dup.xyz', { crs: 'EPSG:32709' })).toThrow(/dup\.xyz: line 21 repeats the node/);
  });
  it('reads only plain decimal numbers: hexadecimal, "Infinity" and empty fields are not numbers', () => {
    for (const bad of ['0x1F', 'Infinity', '1e400', '12abc']) {
      const text = xyz({ mutate: (l) => (l[3] = `1750 5750 ${bad}`) });
      expect(() => readXyz(text, 'bad.xyz', { crs: 'EPSG:32709' }), bad).toThrow(/bad\.xyz: line 4 is not "x y z"/);
    }
  });
  it('refuses a lattice its points barely fill, naming the spacing found, before allocating it (regression: 53 bytes read as 14 142 × 14 142)', () => {
    // four corners of a 100 km square and one point 1 m from a corner: a 1 m lattice of 10¹⁰ cells
    const text = '0 0 1\n100000 0 1\n0 100000 1\n100000 100000 1\n1 0 1\n';
    expect(() => readXyz(text, 'stray.xyz', { crs: 'EPSG:32709' })).toThrow(/^stray\.xyz: its 5 points fill .* of the 100001 × 2 lattice their spacing \(1 × 100000\)/);
  });
  it('checks the CRS before reading any point', () => {
    expect(() => readXyz('garbage that is not xyz', 'g.xyz')).toThrow(/g\.xyz: XYZ text carries no CRS/);
    expect(() => readXyz(xyz(), 'g.xyz', { crs: 'EPSG:99999999' })).toThrow(/^g\.xyz: /);
  });
  it('refuses more points than the read budget allows', () => {
    expect(() => readXyz(xyz(), 'big.xyz', { crs: 'EPSG:32709', readBudgetMB: 1 })).toThrow(/big\.xyz: holds more points than the read budget of 1 MB/);
  });
});
