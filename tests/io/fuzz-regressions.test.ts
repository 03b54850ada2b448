// Damaged files the fuzzer (npm run fuzz) found, or that broke the earlier reader, each refused
// cleanly: an InputError that names the file and says what is wrong, before any large allocation.
// Plus a seeded sample of the fuzzer itself, every reader, in the ordinary test run.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { formatReports, runFuzz } from '../../fuzz/harness.js';
import { InputError } from '../../src/io/errors.js';
import { readGeoTiff } from '../../src/io/geotiff-read.js';
import { readXyz } from '../../src/io/xyz-read.js';

const dir = new URL('../fixtures/fuzz/', import.meta.url);
const bytes = (f: string) => new Uint8Array(readFileSync(new URL(f, dir)));

const refused: [file: string, origin: string, message: RegExp][] = [
  ['empty-bits-per-sample.tif', 'npm run fuzz --seed 1, case 1937 ("undefined-bit samples")', /has an empty BitsPerSample tag: damaged/],
  ['declared-1x200000000.tif', 'passed the old size guard, then out of memory after 75 s', /declares 1 × 200000000 cells \(\d+ MB to read\), beyond the 1024 MB read budget/],
  ['pixel-scale-zero.tif', 'escaped the grid model as "cell width must be positive"', /declares a cell width of 0: it must be a positive number/],
  ['origin-nan.tif', 'escaped the grid model as "grid origin must be finite"', /grid origin that is not a finite number/],
  ['geokey-outside-params.tif', 'escaped the library as "Could not get value of geoKey"', /GeoKey \d+ points outside the GeoAsciiParams tag: damaged/],
  ['lzw-damaged.tif', 'aborted Node with a fatal "invalid size" error', /strip \d+ cannot be decoded \(.+\): the file is damaged or truncated/],
  ['zstd-huge-content-size.tif', 'grew a 4.6 GB heap until the process died', /strip \d+ cannot be decoded|decodes to \d+ bytes/],
  ['scale-not-a-number.tif', 'a scale of NaN would have made every value no data', /declares a scale of "abc", not a number/],
];

describe('fuzz regression fixtures', () => {
  for (const [file, origin, message] of refused) {
    it(`${file}: refused clearly (${origin})`, async () => {
      const err = await readGeoTiff(bytes(file), file, { role: 'top-basement' }).catch((e) => e);
      expect(err).toBeInstanceOf(InputError);
      expect(err.message.startsWith(`${file}: `)).toBe(true);
      expect(err.message).toMatch(message);
      expect(err.message).not.toMatch(/undefined/);
    });
  }
  it('km-values-beyond-float32.tif: values a Float32 grid cannot hold become counted no data, never ±∞ (npm run fuzz --seed 7, case 8622)', async () => {
    const { grid, report } = await readGeoTiff(bytes('km-values-beyond-float32.tif'), 'km.tif', { role: 'top-basement' });
    expect(grid.values.some((v) => v === Infinity || v === -Infinity)).toBe(false);
    expect(report.noData.masked['beyond Float32 range']).toBeGreaterThan(0);
    expect(report.warnings.join()).toMatch(/beyond the Float32 range/);
  });
  it('stray-point-huge-lattice.xyz: a few bytes no longer read as a huge lattice (as 53 bytes were once read as 14 142 × 14 142)', () => {
    const text = new TextDecoder().decode(bytes('stray-point-huge-lattice.xyz'));
    expect(text.length).toBeLessThan(60);
    expect(() => readXyz(text, 'stray.xyz', { crs: 'EPSG:32709' })).toThrow(/^stray\.xyz: its 5 points fill/);
  });
  it('hex-value.xyz: "0x1F" is not read as 31', () => {
    expect(() => readXyz(new TextDecoder().decode(bytes('hex-value.xyz')), 'hex.xyz', { crs: 'EPSG:32709' })).toThrow(/hex\.xyz: line 4 is not "x y z" numbers/);
  });
});

describe('fuzzer, seeded sample', () => {
  it('200 mutated files per reader: no uncaught error, unclear message, unsound read, hang, abort or runaway memory', async () => {
    const reports = await runFuzz({ readers: ['geotiff', 'xyz', 'geojson', 'project'], cases: 200, seed: 20261202 });
    const text = formatReports(reports);
    for (const r of reports) {
      expect(r.counts.refused + r.counts.read, `${r.reader}\n${text}`).toBe(r.cases);
      expect(r.counts.refused).toBeGreaterThan(r.cases / 2); // the mutations really damage
    }
  }, 240_000);
});
