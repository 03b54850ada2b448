// The project file: saving and reopening reproduces identical outputs, timestamps aside.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { DEMO_PARAMS } from '../../fixtures/demo-margin.js';
import { outputFiles } from '../../src/export/outputs.js';
import { readGeoJson } from '../../src/io/geojson-read.js';
import { readGeoTiff } from '../../src/io/geotiff-read.js';
import { fromBase64, parseProject, PROJECT_FORMAT, toBase64 } from '../../src/io/project.js';
import { PARAM_SPECS } from '../../src/params.js';
import { PLAN_SPECS } from '../../src/survey/params.js';
import { resolveParams } from '../../src/params.js';
import { runPipeline, type PipelineInputs } from '../../src/pipeline.js';
import { demoBytes } from '../helpers/demo-run.js';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const ROLES: Record<string, string> = { 'top-basement.tif': 'basement', 'moho.tif': 'moho', 'seabed.tif': 'seabed', 'licence.geojson': 'licence', 'picks.geojson': 'picks', 'isochrons.geojson': 'isochrons', 'seismic-lines.geojson': 'lines' };

async function inputsFrom(files: Record<string, Uint8Array>): Promise<PipelineInputs> {
  const out: Record<string, unknown> = {};
  for (const [name, bytes] of Object.entries(files)) {
    const role = ROLES[name];
    if (name.endsWith('.tif')) out[role] = { name, bytes: bytes.length, sha256: sha(bytes), ...(await readGeoTiff(bytes, name)) };
    else out[role] = { name, bytes: bytes.length, sha256: sha(bytes), set: readGeoJson(new TextDecoder().decode(bytes), name) };
  }
  return out as unknown as PipelineInputs;
}

describe('project file', () => {
  it('base64 round trips any bytes (RFC 4648 alphabet)', () => {
    for (const n of [0, 1, 2, 3, 4, 5, 1000]) {
      const b = Uint8Array.from({ length: n }, (_, k) => (k * 37 + 11) & 255);
      expect(Array.from(fromBase64(toBase64(b)))).toEqual(Array.from(b));
    }
    expect(toBase64(new TextEncoder().encode('Man'))).toBe('TWFu'); // RFC 4648 §9 example
    expect(toBase64(new TextEncoder().encode('foob'))).toBe('Zm9vYg=='); // RFC 4648 §10 test vector
  });

  it('a saved project with bundled inputs reopens to byte-identical outputs (summary time aside)', async () => {
    const all = demoBytes();
    const files = Object.fromEntries(Object.keys(ROLES).map((n) => [n, all[n]]));
    const params = resolveParams({ ...DEMO_PARAMS, taperThreshold: 2500 });
    const first = outputFiles(runPipeline(await inputsFrom(files), { params: params as never }), { version: 't', time: 'T1', tool: 'app' });
    const text = JSON.stringify({
      format: PROJECT_FORMAT, version: 1, saved: 'x', tool: 't', params, view: null,
      inputs: Object.entries(files).map(([name, b]) => ({ name, kind: name.endsWith('.tif') ? 'grid' : 'vector', role: ROLES[name] === 'basement' ? 'top-basement' : ROLES[name], bytes: b.length, sha256: sha(b), options: {}, data: toBase64(b) })),
    });
    const p = parseProject(text, 'project.taperline.json');
    const reopened = Object.fromEntries(p.inputs.map((i) => [i.name, fromBase64(i.data!)]));
    for (const i of p.inputs) expect(sha(reopened[i.name])).toBe(i.sha256);
    const second = outputFiles(runPipeline(await inputsFrom(reopened), { params: p.params }), { version: 't', time: 'T2', tool: 'app' });
    expect(Object.keys(second).sort()).toEqual(Object.keys(first).sort());
    for (const name of Object.keys(first)) {
      if (name === 'summary.json') {
        const a = JSON.parse(new TextDecoder().decode(first[name]));
        const b = JSON.parse(new TextDecoder().decode(second[name]));
        expect({ ...b, time: a.time }).toEqual(a);
      } else if (name.endsWith('.geojson')) {
        const a = JSON.parse(new TextDecoder().decode(first[name]));
        const b = JSON.parse(new TextDecoder().decode(second[name]));
        expect(b.generated_by.time).toBe('T2');
        expect({ ...b, generated_by: { ...b.generated_by, time: 'T1' } }).toEqual(a);
      } else expect(sha(second[name]), name).toBe(sha(first[name]));
    }
  });

  it('keeps planning values and excluded picks, and refuses them wrongly typed', () => {
    const base = { format: PROJECT_FORMAT, version: 1, saved: 'x', tool: 't', params: {}, view: null, inputs: [] };
    const p = parseProject(JSON.stringify({ ...base, plan: { spacingKm: 30 }, excludePicks: ['VX-105/onlap'] }), 'p.json');
    expect(p.plan).toEqual({ spacingKm: 30 });
    expect(p.excludePicks).toEqual(['VX-105/onlap']);
    // an older project without them opens with none
    expect(parseProject(JSON.stringify(base), 'old.json')).toMatchObject({ plan: {}, excludePicks: [] });
    expect(() => parseProject(JSON.stringify({ ...base, plan: [1] }), 'bad.json')).toThrow(/bad\.json: field "plan" must be an object/);
    expect(() => parseProject(JSON.stringify({ ...base, excludePicks: [3] }), 'bad.json')).toThrow(/bad\.json: field "excludePicks" must be a list of pick ids/);
  });

  it('refuses what is not a project, naming the file', () => {
    expect(() => parseProject('{"hello": 1}', 'notes.json')).toThrow(/notes\.json: is not a Taperline project file/);
    expect(() => parseProject('nope', 'x.json')).toThrow(/x\.json: is not a project file/);
  });

  it('validates every field against its schema, naming the field (regression: view.layer "nope" broke every reload)', () => {
    const input = { name: 'moho.tif', kind: 'grid', role: 'moho', bytes: 3, sha256: 'a'.repeat(64), options: { units: 'km' }, data: 'AAAA' };
    const base = { format: PROJECT_FORMAT, version: 1, saved: 'x', tool: 't', params: { tc0: 32000 }, plan: {}, view: { center: [10, -35], zoom: 6, layer: 'domains', opacity: 0.8, visible: { picks: true } }, inputs: [input] };
    const schema = { paramKeys: PARAM_SPECS.map((s) => s.key), planKeys: PLAN_SPECS.map((s) => s.key), layers: ['domains', 'crustal-thickness'] };
    expect(parseProject(JSON.stringify(base), 'ok.json', schema).inputs[0].data).toBe('AAAA');
    const cases: [string, (p: typeof base) => unknown, RegExp][] = [
      ['an unknown map layer', (p) => ({ ...p, view: { ...p.view, layer: 'nope' } }), /field "view\.layer" must name a map layer/],
      ['a zoom that is text', (p) => ({ ...p, view: { ...p.view, zoom: '6' } }), /field "view\.zoom" must be a number/],
      ['a centre off the globe', (p) => ({ ...p, view: { ...p.view, center: [10, 95] } }), /field "view\.center"/],
      ['an opacity above 1', (p) => ({ ...p, view: { ...p.view, opacity: 3 } }), /field "view\.opacity"/],
      ['visibility that is not true/false', (p) => ({ ...p, view: { ...p.view, visible: { picks: 'yes' } } }), /field "view\.visible"/],
      ['a misspelt parameter', (p) => ({ ...p, params: { tc00: 32000 } }), /field "params\.tc00" is not a known key — did you mean "tc0"\?/],
      ['a parameter that is an object', (p) => ({ ...p, params: { tc0: { a: 1 } } }), /field "params\.tc0" must be a number/],
      ['a grid with a vector role', (p) => ({ ...p, inputs: [{ ...input, role: 'licence' }] }), /field "inputs\[0\]\.role" must be one of top-basement, moho, seabed, none/],
      ['a size that is text', (p) => ({ ...p, inputs: [{ ...input, bytes: '3' }] }), /field "inputs\[0\]\.bytes"/],
      ['a checksum that is not hex', (p) => ({ ...p, inputs: [{ ...input, sha256: 'zz' }] }), /field "inputs\[0\]\.sha256"/],
      ['an impossible unit', (p) => ({ ...p, inputs: [{ ...input, options: { units: 'furlong' } }] }), /field "inputs\[0\]\.options\.units" has an impossible value/],
      ['an unknown reader option', (p) => ({ ...p, inputs: [{ ...input, options: { colour: 'red' } }] }), /field "inputs\[0\]\.options\.colour" is not a reader option/],
      ['bundled bytes that are not base64', (p) => ({ ...p, inputs: [{ ...input, data: '<html>' }] }), /field "inputs\[0\]\.data" must be base64/],
      ['bundled bytes of the wrong length', (p) => ({ ...p, inputs: [{ ...input, data: 'AAAAAAAA' }] }), /field "inputs\[0\]\.data" holds 6 bytes where "bytes" says 3/],
      ['a version from the future', (p) => ({ ...p, version: 9 }), /has project version 9/],
      ['a version that is text', (p) => ({ ...p, version: '1' }), /has project version "1"/],
    ];
    for (const [what, mutate, message] of cases) {
      expect(() => parseProject(JSON.stringify(mutate(base)), 'p.json', schema), what).toThrow(message);
    }
  });
});
