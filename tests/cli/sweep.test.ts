// `synth --realisations` where users meet it: the same seed gives the same bytes (whatever the
// number of threads), parts run apart and merged give the bytes of one run, another seed other bytes,
// and misuse is refused with one line. SOURCE_DATE_EPOCH fixes the run time (reproducible-builds.org).
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoBytes } from '../helpers/demo-run.js';
import { DEMO_PARAMS } from '../../fixtures/demo-margin.js';
import { execFileSync } from 'node:child_process';
import { taperline } from '../helpers/cli.js';
import { rfc7946Violations } from '../helpers/rfc7946.js';
import { GDAL_PYTHON, GDAL_SAMPLES, toolOrSkip } from '../helpers/tools.js';

const gdalPython = toolOrSkip('gdal-python');

const dir = mkdtempSync(join(tmpdir(), 'taperline-sweep-'));
const f = (name: string) => join(dir, name);
beforeAll(() => {
  const files = demoBytes();
  for (const name of ['top-basement.tif', 'moho.tif', 'seabed.tif', 'licence.geojson', 'picks.geojson', 'seismic-lines.geojson']) writeFileSync(f(name), files[name]);
  writeFileSync(f('params.json'), JSON.stringify(DEMO_PARAMS));
  writeFileSync(f('spec.json'), JSON.stringify({ correlationLength: 8000 }));
  process.env.SOURCE_DATE_EPOCH = '1767225600';
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const synth = (extra: string[], out: string) =>
  taperline([
    'synth', '--top-basement', f('top-basement.tif'), '--moho', f('moho.tif'), '--seabed', f('seabed.tif'), '--licence', f('licence.geojson'),
    '--picks', f('picks.geojson'), '--lines', f('seismic-lines.geojson'), '--params', f('params.json'), '--uncertainty', f('spec.json'), '--out', out, ...extra,
  ]);
const files = (out: string) => Object.fromEntries(readdirSync(join(out, 'uncertainty')).map((q) => [q, readFileSync(join(out, 'uncertainty', q))]));

describe('synth --realisations', () => {
  it('same seed: the same bytes on 2 threads and on 1; parts run apart and merged: the same bytes again; another seed: other bytes', () => {
    const a = synth(['--realisations', '6', '--seed', '2'], f('a'));
    expect(a.status, a.stderr).toBe(0);
    expect(a.stderr).toMatch(/uncertainty: 6 realisations run in/);
    const b = synth(['--realisations', '6', '--seed', '2', '--threads', '1'], f('b'));
    expect(b.status, b.stderr).toBe(0);
    const fa = files(f('a'));
    expect(Object.keys(fa).sort()).toEqual([
      'lines.geojson', 'positional-uncertainty.tif', 'probability-1-proximal-continental.tif', 'probability-2-necking.tif',
      'probability-3-hyperextended-continental.tif', 'probability-4-transition-exhumed-mantle-or-unresolved.tif', 'probability-5-oceanic.tif', 'zone-width.csv',
    ]);
    expect(files(f('b'))).toEqual(fa);
    expect(readFileSync(join(f('b'), 'summary.json'))).toEqual(readFileSync(join(f('a'), 'summary.json')));
    const p1 = synth(['--realisations', '6', '--seed', '2', '--realisation-range', '0:4'], f('p1'));
    const p2 = synth(['--realisations', '6', '--seed', '2', '--realisation-range', '4:6'], f('p2'));
    expect(p1.status, p1.stderr).toBe(0);
    expect(p2.status, p2.stderr).toBe(0);
    expect(readdirSync(f('p1'))).toEqual(['sweep-part-0-4.bin']);
    const m = synth(['--realisations', '6', '--seed', '2', '--merge-parts', `${join(f('p2'), 'sweep-part-4-6.bin')},${join(f('p1'), 'sweep-part-0-4.bin')}`], f('m'));
    expect(m.status, m.stderr).toBe(0);
    expect(files(f('m'))).toEqual(fa);
    expect(readFileSync(join(f('m'), 'summary.json'))).toEqual(readFileSync(join(f('a'), 'summary.json')));
    const c = synth(['--realisations', '6', '--seed', '3'], f('c'));
    expect(c.status, c.stderr).toBe(0);
    expect(files(f('c'))['lines.geojson']).not.toEqual(fa['lines.geojson']);
    const s = JSON.parse(readFileSync(join(f('a'), 'summary.json'), 'utf8')).uncertainty;
    expect(s.realisations).toBe(6);
    expect(s.convention).toMatch(/P90 crustal taper limit is where continental crust reaches at least this far oceanward in 90 %/);
    expect(s.licence_areas_km2.map((q: { code: number }) => q.code)).toEqual([1, 2, 3, 4, 5, 6]);
    const lines = JSON.parse(readFileSync(join(f('a'), 'uncertainty', 'lines.geojson'), 'utf8'));
    expect(new Set(lines.features.map((q: { properties: { p: number } }) => q.properties.p))).toEqual(new Set([90, 50, 10]));
  }, 300_000); // six CLI runs of the demo sweep: 70 s on a slow CI machine

  it.skipIf(!gdalPython)("the uncertainty grids pass GDAL's COG validator with finite statistics; the lines are RFC 7946 and valid per GDAL", () => {
    for (const q of readdirSync(join(f('a'), 'uncertainty')).filter((n) => n.endsWith('.tif'))) {
      const path = join(f('a'), 'uncertainty', q);
      const text = execFileSync(GDAL_PYTHON, [`${GDAL_SAMPLES}/validate_cloud_optimized_geotiff.py`, '--full-check=yes', path], { encoding: 'utf8' });
      expect(text, q).toMatch(/is a valid cloud optimized GeoTIFF/);
      expect(text, q).not.toMatch(/warning/i);
      const b = JSON.parse(execFileSync('gdalinfo', ['-json', '-stats', path], { encoding: 'utf8' })).bands[0];
      for (const k of ['minimum', 'maximum', 'mean']) expect(Number.isFinite(b[k]), `${q} ${k}`).toBe(true);
      if (q.startsWith('probability')) expect(b.minimum >= 0 && b.maximum <= 1, q).toBe(true);
    }
    const lines = join(f('a'), 'uncertainty', 'lines.geojson');
    expect(rfc7946Violations(JSON.parse(readFileSync(lines, 'utf8')))).toEqual([]);
    const bad = execFileSync('ogrinfo', ['-dialect', 'SQLite', '-sql', 'SELECT COUNT(*) AS n FROM lines WHERE NOT ST_IsValid(geometry)', lines], { encoding: 'utf8' });
    expect(bad).toMatch(/n \(Integer\) = 0/);
  });

  it('refuses misuse with one line: a sweep flag without --realisations, a bad range, a missing part', () => {
    const r1 = synth(['--seed', '2'], f('e1'));
    expect(r1.status).toBe(2);
    expect(r1.stderr).toMatch(/--seed needs --realisations N/);
    const r2 = synth(['--realisations', '6', '--realisation-range', '5:3'], f('e2'));
    expect(r2.status).toBe(2);
    expect(r2.stderr).toMatch(/--realisation-range must be K:M/);
    const p = synth(['--realisations', '6', '--seed', '2', '--realisation-range', '0:3'], f('e3'));
    expect(p.status, p.stderr).toBe(0);
    const r3 = synth(['--realisations', '6', '--seed', '2', '--merge-parts', join(f('e3'), 'sweep-part-0-3.bin')], f('e4'));
    expect(r3.status).toBe(2);
    expect(r3.stderr.trim().split('\n')).toHaveLength(1);
    expect(r3.stderr).toMatch(/realisations 3…5 are missing/);
  });
});
