// The taperline command where users meet it: help, exit codes, one-line messages, no half-written output.
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoBytes } from '../helpers/demo-run.js';
import { DEMO_PARAMS } from '../../fixtures/demo-margin.js';
import { PARAM_SPECS } from '../../src/params.js';
import { taperline } from '../helpers/cli.js';

const dir = mkdtempSync(join(tmpdir(), 'taperline-cli-'));
const f = (name: string) => join(dir, name);
beforeAll(() => {
  const files = demoBytes();
  for (const name of ['top-basement.tif', 'moho.tif', 'seabed.tif', 'licence.geojson']) writeFileSync(f(name), files[name]);
  writeFileSync(f('cut.tif'), files['moho.tif'].subarray(0, 5000));
  writeFileSync(f('notes.tif'), 'these are my notes, not a grid\n');
  // a TIFF that declares 100000 × 100000 cells: patch ImageWidth/ImageLength of a small valid file
  const big = Buffer.from(files['moho.tif']);
  const entries = big.readUInt16LE(8);
  for (let e = 0; e < entries; e++) {
    const p = 10 + 12 * e;
    const tag = big.readUInt16LE(p);
    if (tag === 256 || tag === 257) big.writeUInt32LE(100_000, p + 8);
  }
  writeFileSync(f('huge.tif'), big);
  writeFileSync(f('bad-params.json'), JSON.stringify({ rhoMantle: 2500 }));
  writeFileSync(f('other-params.json'), JSON.stringify({ taperThreshold: 3000 }));
  writeFileSync(f('bad-plan.json'), JSON.stringify({ spacingKm: 'wide' }));
  // a bow-tie licence: its edges cross at (-128.5, -35.0)
  const bow = [[-129, -35.5], [-128, -34.5], [-128, -35.5], [-129, -34.5], [-129, -35.5]];
  writeFileSync(f('bowtie.geojson'), JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [bow] } }] }));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const synth = (extra: string[], out = f('out')) => taperline(['synth', '--top-basement', f('top-basement.tif'), '--moho', f('moho.tif'), '--out', out, ...extra]);

describe('taperline CLI', () => {
  it('--help documents every flag and every params-file key; --version prints the version', () => {
    const h = taperline(['--help']);
    expect(h.status).toBe(0);
    for (const flag of ['--top-basement', '--moho', '--seabed', '--licence', '--picks', '--isochrons', '--exclude-pick', '--params', '--out', 'demo']) expect(h.stdout).toContain(flag);
    // which threshold places which line
    expect(h.stdout).toMatch(/oceanic-limit +oceanicThreshold/);
    expect(h.stdout).toMatch(/crustal-taper-limit +taperThreshold/);
    for (const s of PARAM_SPECS) expect(h.stdout).toContain(s.key);
    expect(h.stdout).toMatch(/qualified professionals/);
    const v = taperline(['--version']);
    expect(v.stdout.trim()).toBe(JSON.parse(readFileSync('package.json', 'utf8')).version);
  });

  const bad: [string, string[], RegExp][] = [
    ['a missing file', ['--seabed', f('nope.tif')], /nope\.tif: cannot be read \(ENOENT\)/],
    ['a truncated file', ['--seabed', f('cut.tif')], /cut\.tif: .*(truncated|damaged|cannot be read)/],
    ['a file that is not a grid', ['--seabed', f('notes.tif')], /notes\.tif: is not a TIFF file/],
    ['a declared size beyond memory', ['--seabed', f('huge.tif')], /huge\.tif: declares 100000 × 100000 cells/],
    ['impossible parameters', ['--params', f('bad-params.json')], /bad-params\.json: mantle density \(2500\) must exceed crust density/],
    ['a planning value that is not a number, in synth', ['--params', f('bad-plan.json')], /bad-plan\.json: plan parameter spacingKm = "wide" must be a number/],
    ['a licence that is not a polygon file', ['--licence', f('moho.tif')], /moho\.tif: is not valid JSON/],
    ['a self-intersecting licence', ['--licence', f('bowtie.geojson')], /bowtie\.geojson: polygon 0 crosses itself at \(-128\.50000, -35\.00000\)/],
  ];
  for (const [what, args, message] of bad) {
    it(`exits 2 on ${what}, with one line naming the file, and leaves no output behind`, () => {
      const out = f(`out-${what.replace(/\W+/g, '-')}`);
      const r = synth(args, out);
      expect(r.status).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(message);
      expect(existsSync(out) ? readdirSync(out) : []).toEqual([]);
    });
  }

  it('exits 2 when the Moho and basement are swapped', () => {
    const r = taperline(['synth', '--top-basement', f('moho.tif'), '--moho', f('top-basement.tif'), '--out', f('swapped')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/top-basement\.tif: lies above the top basement \(moho\.tif\) in \d+% of cells: are the Moho and top-basement files swapped\?/);
  });

  it('exits 2 when the grids do not overlap', () => {
    const r = synth(['--seabed', f('top-basement.tif'), '--seabed-crs', 'EPSG:32601'], f('disjoint'));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/top-basement\.tif: does not overlap the top-basement grid/);
  });

  it('exits 2 on an unknown option', () => {
    const r = synth(['--colour', 'red']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/unknown option --colour/);
  });

  it('a minimal synth (basement + Moho only) succeeds and says what it could not compute', () => {
    const r = synth([], f('minimal'));
    expect(r.status).toBe(0);
    const s = JSON.parse(readFileSync(join(f('minimal'), 'summary.json'), 'utf8'));
    expect(s.warnings.join()).toMatch(/no seabed grid/);
    // no temporary folder left; only the list of what this run wrote
    expect(readdirSync(f('minimal')).filter((n) => n.startsWith('.'))).toEqual(['.taperline-outputs']);
  });
});

describe('nothing overwritten, nothing stale', () => {
  it('refuses an output folder that holds an input', () => {
    mkdirSync(f('inside'), { recursive: true });
    writeFileSync(f('inside/boundaries.geojson'), demoBytes()['licence.geojson']);
    const r = synth(['--licence', f('inside/boundaries.geojson')], f('inside'));
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/boundaries\.geojson: lies inside the output folder/);
    expect(readFileSync(f('inside/boundaries.geojson'))).toEqual(Buffer.from(demoBytes()['licence.geojson'])); // untouched
  });

  it("removes what a previous run wrote and this one does not, keeps the user's own files, and clears stale temporary folders", () => {
    const out = f('rerun');
    expect(synth(['--licence', f('licence.geojson')], out).status).toBe(0);
    expect(existsSync(join(out, 'boundaries-whole-grid.geojson'))).toBe(true);
    writeFileSync(join(out, 'my-notes.txt'), 'mine');
    mkdirSync(join(out, '.taperline-tmp-999999'), { recursive: true });
    writeFileSync(join(out, '.taperline-tmp-999999', 'half.tif'), 'half-written');
    expect(synth([], out).status).toBe(0); // no licence this time
    expect(existsSync(join(out, 'boundaries-whole-grid.geojson'))).toBe(false);
    expect(existsSync(join(out, 'boundaries.geojson'))).toBe(true);
    expect(readFileSync(join(out, 'my-notes.txt'), 'utf8')).toBe('mine');
    expect(existsSync(join(out, '.taperline-tmp-999999'))).toBe(false);
  });

  for (const signal of ['SIGTERM', 'SIGINT', 'SIGKILL'] as const) {
    it(`a run stopped by ${signal} while writing leaves the previous outputs whole${signal === 'SIGKILL' ? '; the next run clears what it left' : ' and no temporary folder'}`, async () => {
      const out = f(`killed-${signal}`);
      expect(synth(['--licence', f('licence.geojson')], out).status).toBe(0);
      const before = Object.fromEntries(readdirSync(out).filter((n) => n.endsWith('.geojson') || n.endsWith('.json')).map((n) => [n, readFileSync(join(out, n))]));
      const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', 'synth', '--top-basement', f('top-basement.tif'), '--moho', f('moho.tif'), '--out', out, '--params', f('other-params.json')], {
        env: { ...process.env, TAPERLINE_TEST_WRITE_PAUSE_MS: '20000' },
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      const tmpDir = () => readdirSync(out).find((n) => n.startsWith('.taperline-tmp-'));
      for (let k = 0; k < 600 && !tmpDir(); k++) await new Promise((r) => setTimeout(r, 100));
      expect(tmpDir()).toBeDefined();
      const code = new Promise<number | null>((resolve) => child.on('exit', (c) => resolve(c)));
      child.kill(signal);
      const exit = await code;
      for (const [n, bytes] of Object.entries(before)) expect(readFileSync(join(out, n)).equals(bytes), n).toBe(true);
      if (signal === 'SIGKILL') {
        expect(tmpDir()).toBeDefined();
        expect(synth([], out).status).toBe(0);
      } else expect(exit).toBe(130);
      expect(tmpDir()).toBeUndefined();
    }, 120_000);
  }

  it('an output folder that cannot be written gives one line naming it', () => {
    const r = synth([], '/proc/taperline-out');
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/\/proc\/taperline-out: cannot be written \(E[A-Z]+\)/);
  });
});

describe('which grids synth writes (--grids)', () => {
  it('by default every grid but the six opt-in ones, each byte-equal to the same grid of --grids all; unknown names refused', () => {
    writeFileSync(f('demo-params.json'), JSON.stringify(DEMO_PARAMS)); // a rift age: every grid has values
    const lean = synth(['--seabed', f('seabed.tif'), '--params', f('demo-params.json')], f('lean'));
    const all = synth(['--seabed', f('seabed.tif'), '--params', f('demo-params.json'), '--grids', 'all'], f('all'));
    expect(lean.status).toBe(0);
    expect(all.status).toBe(0);
    const tifs = (out: string) => readdirSync(join(out, 'grids')).filter((q) => q.endsWith('.tif')).sort();
    const optIn = ['airy-thickness', 'beta-ratio', 'gamma', 'predicted-water-loaded', 'sediment-thickness', 'water-depth'];
    expect(tifs(f('all')).filter((q) => !tifs(f('lean')).includes(q))).toEqual(optIn.map((q) => `${q}.tif`));
    const summary = JSON.parse(readFileSync(join(f('lean'), 'summary.json'), 'utf8'));
    expect([...summary.grids_not_requested].sort()).toEqual(optIn);
    // the lean run masks its grids in place rather than copying them: same samples, same files
    // (the TIFF DateTime tag differs between runs: compare the samples after the header)
    for (const t of tifs(f('lean'))) {
      const a = readFileSync(join(f('lean'), 'grids', t));
      const b = readFileSync(join(f('all'), 'grids', t));
      expect(a.length, t).toBe(b.length);
      let diff = 0;
      for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) diff++;
      expect(diff, t).toBeLessThanOrEqual(19); // "YYYY:MM:DD HH:MM:SS" at most
    }
    // the vector outputs do not depend on which grids are written
    for (const v of ['boundaries.geojson', 'domains.geojson']) {
      const strip = (t: string) => t.replace(/"time": "[^"]*"/g, '');
      expect(strip(readFileSync(join(f('lean'), v), 'utf8')), v).toBe(strip(readFileSync(join(f('all'), v), 'utf8')));
    }
    const some = synth(['--grids', 'crustal-thickness,gamma'], f('some'));
    expect(some.status).toBe(0);
    expect(tifs(f('some'))).toEqual(['crustal-thickness.tif', 'domains.tif', 'gamma.tif', 'unbounded-beta.tif']);
    const bad = synth(['--grids', 'default,thickness'], f('bad'));
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--grids: unknown grid "thickness"/);
  });
});

describe('excluding a pick', () => {
  it('--exclude-pick leaves the pick out, and the summary says so', () => {
    writeFileSync(f('picks.geojson'), demoBytes()['picks.geojson']);
    const r = synth(['--seabed', f('seabed.tif'), '--picks', f('picks.geojson'), '--exclude-pick', 'VX-105/continental-limit'], f('excl'));
    expect(r.status).toBe(0);
    const s = JSON.parse(readFileSync(join(f('excl'), 'summary.json'), 'utf8'));
    expect(s.evidence.excluded_picks).toEqual(['VX-105/continental-limit']);
    expect(s.evidence.calibrated['crustal-taper-limit']).toBe(2);
    expect(s.lines_placed_by['crustal-taper-limit']).toMatch(/calibrated to 2 continental-limit picks/);
    const none = synth(['--picks', f('picks.geojson'), '--exclude-pick', 'no-such-pick'], f('excl2'));
    expect(none.stderr).toMatch(/excluded pick "no-such-pick" is not in the picks file/);
  });
});

describe('taperline plan', () => {
  it('writes ranked proposals as GeoJSON and CSV with both CRSs stated', async () => {
    const files = demoBytes();
    for (const name of ['seismic-lines.geojson', 'picks.geojson']) writeFileSync(f(name), files[name]);
    const out = f('plan');
    const r = taperline(['plan', '--top-basement', f('top-basement.tif'), '--moho', f('moho.tif'), '--seabed', f('seabed.tif'), '--existing', f('seismic-lines.geojson'), '--picks', f('picks.geojson'), '--spacing', '25', '--overhang-landward', '15', '--overhang-oceanward', '10', '--out', out]);
    expect(r.status).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['.taperline-outputs', 'survey-lines.csv', 'survey-lines.geojson']);
    const csv = readFileSync(join(out, 'survey-lines.csv'), 'utf8').split('\n');
    expect(csv[0]).toBe('id,kind,rank,start_lon,start_lat,end_lon,end_lat,start_x,start_y,end_x,end_y,length_km,cumulative_km,record_length_s,crossings,analysis_crs');
    expect(csv[1]).toMatch(/"EPSG:32709 WGS 84 \/ UTM zone 9S"$/);
    const fc = JSON.parse(readFileSync(join(out, 'survey-lines.geojson'), 'utf8'));
    const { rfc7946Violations } = await import('../helpers/rfc7946.js');
    expect(rfc7946Violations(fc)).toEqual([]);
    expect(fc.programme.parameters.spacingKm).toBe(25);
    expect(fc.features[0].properties.rank).toBe(1);
    expect(fc.features[0].properties.record_length_s).toBeGreaterThan(8);
  });
});
