// Runs the pipeline on the invented demo scenario through the real readers (shared by tests).
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { demoFiles } from '../../fixtures/demo-files.js';
import { demoStamp } from '../../fixtures/stamp.js';
import { DEMO_PARAMS } from '../../fixtures/demo-margin.js';
import { readGeoJson } from '../../src/io/geojson-read.js';
import { readGeoTiff } from '../../src/io/geotiff-read.js';
import { runPipeline, type PipelineInputs, type PipelineResult } from '../../src/pipeline.js';

let files: Record<string, Uint8Array> | null = null;
/**
 * The demo files: read from fixtures/demo/ when its stamp says this generator made it (the suite's
 * global setup writes it once), else generated here. Generating takes 10–30 s per test file, so
 * reading saves minutes over the suite; tests/fixtures-demo.test.ts checks the folder equals a
 * fresh generation byte for byte.
 */
export function demoBytes(): Record<string, Uint8Array> {
  files ??= readDemoFolder() ?? demoFiles();
  return files;
}

export const DEMO_FOLDER = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'fixtures', 'demo');

/** The files of fixtures/demo/ when its `.complete` stamp matches the generator's sources, else null. */
export function readDemoFolder(): Record<string, Uint8Array> | null {
  const stamp = join(DEMO_FOLDER, '.complete');
  if (!existsSync(stamp) || readFileSync(stamp, 'utf8') !== demoStamp()) return null;
  const names = readdirSync(DEMO_FOLDER).filter((n) => !n.startsWith('.')).sort();
  return Object.fromEntries(names.map((n) => [n, new Uint8Array(readFileSync(join(DEMO_FOLDER, n)))]));
}

export async function demoInputs(opts: { picks?: boolean; licence?: boolean; isochrons?: boolean; lines?: boolean } = {}): Promise<PipelineInputs> {
  const f = demoBytes();
  const grid = async (name: string) => ({ name, ...(await readGeoTiff(f[name], name)) });
  const vec = (name: string) => ({ name, set: readGeoJson(new TextDecoder().decode(f[name]), name) });
  return {
    basement: await grid('top-basement.tif'),
    moho: await grid('moho.tif'),
    seabed: await grid('seabed.tif'),
    licence: opts.licence ? vec('licence.geojson') : null,
    picks: opts.picks ? vec('picks.geojson') : null,
    isochrons: opts.isochrons ? vec('isochrons.geojson') : null,
    lines: opts.lines ? vec('seismic-lines.geojson') : null,
  };
}

export async function runDemo(opts: Parameters<typeof demoInputs>[0] = {}, params: Record<string, unknown> = {}, excludePicks: string[] = []): Promise<PipelineResult> {
  return runPipeline(await demoInputs(opts), { params: { ...DEMO_PARAMS, ...params }, excludePicks });
}
