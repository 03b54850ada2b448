// Runs the pipeline on the invented demo scenario through the real readers (shared by tests).
import { demoFiles } from '../../fixtures/demo-files.js';
import { DEMO_PARAMS } from '../../fixtures/demo-margin.js';
import { readGeoJson } from '../../src/io/geojson-read.js';
import { readGeoTiff } from '../../src/io/geotiff-read.js';
import { runPipeline, type PipelineInputs, type PipelineResult } from '../../src/pipeline.js';

let files: Record<string, Uint8Array> | null = null;
export function demoBytes(): Record<string, Uint8Array> {
  files ??= demoFiles();
  return files;
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
