// docs/outputs.md is the schema: every field of every real output must be listed there, with its type.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { outputFiles } from '../../src/export/outputs.js';
import { surveyCsv, surveyGeoJson } from '../../src/export/survey.js';
import { planFromResult, sectionAlong } from '../../src/survey/run.js';
import { sectionCsv } from '../../src/survey/section.js';
import { DERIVED } from '../../src/derive/grids.js';
import { runDemo } from '../helpers/demo-run.js';
import { resolveSpec } from '../../src/uncertainty/spec.js';
import { runSweep } from '../../src/uncertainty/run.js';
import { uncertaintyFiles, uncertaintySummary } from '../../src/export/uncertainty.js';

/** Tables of the doc: file name (from the heading) → field → type. CSV columns from "Columns:" lines. */
function parseDoc(): { fields: Map<string, Map<string, string>>; columns: Map<string, string[]>; grids: string[] } {
  const text = readFileSync('docs/outputs.md', 'utf8');
  const fields = new Map<string, Map<string, string>>();
  const columns = new Map<string, string[]>();
  const grids: string[] = [];
  let files: string[] = [];
  for (const line of text.split('\n')) {
    const h = /^## (.+)$/.exec(line);
    if (h) {
      files = h[1].split(/,\s*|\s+\(/).map((s) => s.trim()).filter((s) => /\.(geojson|csv|tif|json)$|\*\.tif$/.test(s));
      continue;
    }
    const row = /^\| ([a-z0-9_.*-]+) \|([^|]*)\|/.exec(line);
    if (row && !['field', 'file'].includes(row[1])) {
      if (files[0] === 'grids/*.tif') grids.push(row[1]);
      for (const f of files) {
        if (!fields.has(f)) fields.set(f, new Map());
        fields.get(f)!.set(row[1], row[2].trim());
      }
    }
    const cols = /^Columns: `([^`]+)`/.exec(line);
    if (cols) for (const f of files) columns.set(f, cols[1].split(','));
  }
  return { fields, columns, grids };
}

function typeOf(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) {
    if (v.length === 2 && v.every((q) => typeof q === 'number')) return 'number pair';
    if (v.every((q) => typeof q === 'string')) return v.length ? 'string list' : 'list';
    return 'object list';
  }
  if (typeof v === 'number') return Number.isInteger(v) ? 'integer' : 'number';
  return typeof v;
}

function fits(value: unknown, declared: string): boolean {
  const nullable = declared.endsWith('?');
  const base = declared.replace(/\?$/, '');
  const t = typeOf(value);
  if (t === 'null') return nullable;
  if (t === base) return true;
  if (base === 'number' && t === 'integer') return true; // 2 is a number too
  if (t === 'list') return base.endsWith('list');
  return false;
}

describe('the output schema (docs/outputs.md) against real outputs', async () => {
  const doc = parseDoc();
  const r = await runDemo({ picks: true, licence: true, lines: true, isochrons: true });
  const files = outputFiles(r, { version: 'test', time: '2026-01-01T00:00:00Z', tool: 'cli' });
  const sp = planFromResult(r, {});
  // a small sweep: its files and summary block are documented too
  const spec = resolveSpec({}, { realisations: 4 });
  const { result: u } = runSweep(r.inputs, { params: r.params as unknown as Record<string, unknown> }, spec);
  const run = { version: 'test', time: '2026-01-01T00:00:00Z', tool: 'cli' as const };
  const swept = { ...outputFiles(r, run, undefined, uncertaintySummary(r, u)), ...uncertaintyFiles(r, u, run) };
  const geo: Record<string, unknown> = Object.fromEntries(Object.entries(swept).filter(([n]) => n.endsWith('.geojson')).map(([n, b]) => [n, JSON.parse(new TextDecoder().decode(b))]));
  geo['survey-lines.geojson'] = JSON.parse(JSON.stringify(surveyGeoJson(sp, r.geometry.crs)));
  geo['survey-lines-with-envelope.geojson'] = JSON.parse(JSON.stringify(surveyGeoJson(planFromResult(r, {}, u), r.geometry.crs)));

  it('documents every GeoJSON file the run writes', () => {
    for (const name of Object.keys(geo)) if (name !== 'survey-lines-with-envelope.geojson') expect(doc.fields.has(name), name).toBe(true);
  });

  it('every field of every feature is documented with its type', () => {
    const problems: string[] = [];
    for (const [name, fc] of Object.entries(geo)) {
      const schema = doc.fields.get(name === 'survey-lines-with-envelope.geojson' ? 'survey-lines.geojson' : name)!;
      for (const f of (fc as { features: { properties: Record<string, unknown> }[] }).features) {
        for (const [k, v] of Object.entries(f.properties)) {
          const declared = schema.get(k);
          if (!declared) problems.push(`${name}: field "${k}" is not in docs/outputs.md`);
          else if (!fits(v, declared)) problems.push(`${name}: field "${k}" is ${typeOf(v)}, documented as ${declared}`);
        }
      }
    }
    expect([...new Set(problems)]).toEqual([]);
  });

  it('one type per field across features', () => {
    for (const [name, fc] of Object.entries(geo)) {
      const types = new Map<string, Set<string>>();
      for (const f of (fc as { features: { properties: Record<string, unknown> }[] }).features) {
        for (const [k, v] of Object.entries(f.properties)) {
          const t = typeOf(v).replace('integer', 'number');
          if (t === 'null' || t === 'list') continue;
          if (!types.has(k)) types.set(k, new Set());
          types.get(k)!.add(t);
        }
      }
      for (const [k, ts] of types) expect([...ts], `${name}: ${k}`).toHaveLength(1);
    }
  });

  it('CSV files start with the documented header', () => {
    expect(surveyCsv(sp, r.geometry.crs).split('\n')[0].split(',')).toEqual(doc.columns.get('survey-lines.csv'));
    const s = sectionAlong(r, sp.plan.lines.find((l) => l.kind === 'dip')!.coords);
    expect(sectionCsv(s, 'EPSG:32709').split('\n')[0].split(',')).toEqual(doc.columns.get('section.csv'));
    expect(new TextDecoder().decode(swept['uncertainty/zone-width.csv']).split('\n')[0].split(',')).toEqual(doc.columns.get('uncertainty/zone-width.csv'));
  });

  it('lists every grid the tool can write, and every grid written is listed', () => {
    const documented = new Set(doc.grids);
    for (const g of DERIVED) expect(documented.has(`${g.name}.tif`), g.name).toBe(true);
    for (const name of Object.keys(files).filter((n) => n.endsWith('.tif'))) expect(documented.has(name.replace('grids/', '')), name).toBe(true);
    const text = readFileSync('docs/outputs.md', 'utf8');
    for (const name of Object.keys(swept).filter((n) => n.startsWith('uncertainty/') && n.endsWith('.tif'))) expect(text, name).toContain(`| ${name.replace('uncertainty/', '')} |`);
  });

  it('lists every top-level key of summary.json', () => {
    const text = readFileSync('docs/outputs.md', 'utf8');
    const summary = JSON.parse(new TextDecoder().decode(files['summary.json']));
    const section = text.slice(text.indexOf('## summary.json'));
    for (const k of Object.keys(summary)) expect(section, k).toContain(`\`${k}\``);
    const block = JSON.parse(new TextDecoder().decode(swept['summary.json'])).uncertainty;
    expect(section).toContain('`uncertainty`');
    for (const k of Object.keys(block)) expect(section, `uncertainty.${k}`).toContain(`\`${k}\``);
  });
});
