/**
 * The fuzz corpus: valid files of every kind and layout each reader supports (GDAL-made GeoTIFFs
 * from the test fixtures, GeoTIFFs of our own writer, XYZ text, GeoJSON of every role, project
 * files with bundled inputs), and the k-th mutated case of a reader, rebuilt from (reader, seed, k).
 */

import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { demoFiles } from '../fixtures/demo-files.js';
import { demoGeometry } from '../fixtures/demo-margin.js';
import { writeGeoTiff } from '../src/io/geotiff-write.js';
import { PROJECT_FORMAT, toBase64 } from '../src/io/project.js';
import { mutateBytes, mutateJson, mutateText, prng } from './mutate.js';

export const READERS = ['geotiff', 'xyz', 'geojson', 'project'] as const;
export type Reader = (typeof READERS)[number];

export interface Seed {
  readonly name: string;
  readonly bytes: Uint8Array;
  /** For GeoJSON: the role the file is read for. */
  readonly role?: 'licence' | 'lines' | 'picks' | 'isochrons' | 'crust';
}

export interface Case extends Seed {
  readonly how: string;
  readonly seedName: string;
}

const enc = new TextEncoder();
const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

export function corpus(): Record<Reader, Seed[]> {
  const demo = demoFiles(demoGeometry(40, 30));
  const gdalDir = new URL('../tests/fixtures/gdal/', import.meta.url);
  const gdal = readdirSync(gdalDir)
    .filter((f) => f.endsWith('.tif'))
    .sort()
    .map((f) => ({ name: f, bytes: new Uint8Array(readFileSync(new URL(f, gdalDir))) }));
  const g = demoGeometry(300, 20); // wide enough for two 256-pixel tiles and an overview
  const ramp = Float32Array.from({ length: g.nx * g.ny }, (_, k) => 1000 + (k % g.nx) * 3);
  const classes = Uint8Array.from({ length: g.nx * g.ny }, (_, k) => (k % g.nx) % 7);
  const own = [
    { name: 'own-seabed.tif', bytes: demo['seabed.tif'] },
    { name: 'own-moho.tif', bytes: demo['moho.tif'] },
    { name: 'own-tiled-basement.tif', bytes: writeGeoTiff(g, ramp, { noData: 'nan', unit: 'm' }) },
    { name: 'own-raw-basement.tif', bytes: writeGeoTiff(g, ramp, { noData: -9999, level: 0 }) },
    { name: 'own-classes.tif', bytes: writeGeoTiff(g, classes, { noData: 255, colours: new Map([[1, [200, 0, 0] as const]]) }) },
  ];
  const xyzRows: string[] = ['Easting,Northing,Depth'];
  for (let j = 0; j < 12; j++) for (let i = 0; i < 15; i++) xyzRows.push(`${500000 + i * 250},${6000000 + j * 250},${(1500 + i * 7 + j).toFixed(1)}`);
  const crust = { type: 'FeatureCollection', features: [{ type: 'Feature', properties: { crust: 'oceanic' }, geometry: { type: 'Polygon', coordinates: [[[-129, -35.5], [-128, -35.5], [-128, -34.5], [-129, -34.5], [-129, -35.5]]] } }] };
  const project = {
    format: PROJECT_FORMAT,
    version: 1,
    saved: '2026-01-01T00:00:00Z',
    tool: 'taperline fuzz',
    params: { riftAge: 110, taperThreshold: 2000 },
    plan: { spacingKm: 30 },
    excludePicks: ['VX-101/continental-limit'],
    view: { center: [-128.5, -35], zoom: 6, layer: 'crustal-thickness', opacity: 0.8, visible: { picks: true } },
    inputs: [
      ['top-basement.tif', 'grid', 'top-basement'],
      ['moho.tif', 'grid', 'moho'],
      ['licence.geojson', 'vector', 'licence'],
    ].map(([name, kind, role]) => ({ name, kind, role, bytes: demo[name].length, sha256: sha(demo[name]), options: {}, data: toBase64(demo[name]) })),
  };
  const unbundled = { ...project, inputs: project.inputs.map(({ data: _d, ...i }) => i) };
  return {
    geotiff: [...gdal, ...own],
    xyz: [
      { name: 'seabed-elevation.xyz', bytes: demo['seabed-elevation.xyz'] },
      { name: 'basement.csv', bytes: enc.encode(xyzRows.join('\n') + '\n') },
    ],
    geojson: [
      { name: 'licence.geojson', bytes: demo['licence.geojson'], role: 'licence' },
      { name: 'seismic-lines.geojson', bytes: demo['seismic-lines.geojson'], role: 'lines' },
      { name: 'picks.geojson', bytes: demo['picks.geojson'], role: 'picks' },
      { name: 'isochrons.geojson', bytes: demo['isochrons.geojson'], role: 'isochrons' },
      { name: 'crust.geojson', bytes: enc.encode(JSON.stringify(crust)), role: 'crust' },
    ],
    project: [
      { name: 'bundled.taperline.json', bytes: enc.encode(JSON.stringify(project)) },
      { name: 'plain.taperline.json', bytes: enc.encode(JSON.stringify(unbundled)) },
    ],
  };
}

/** The k-th case of a reader for a run seed: a seed file picked and mutated, reproducibly. */
export function makeCase(seeds: Seed[], reader: Reader, seed: number, k: number): Case {
  const r = prng((seed * 0x9e3779b1) ^ (k * 0x85ebca77) ^ READERS.indexOf(reader));
  const s = seeds[Math.floor(r() * seeds.length)];
  const base = { name: s.name, seedName: s.name, role: s.role };
  if (reader === 'geotiff') {
    const m = mutateBytes(s.bytes, r, Math.min(s.bytes.length, 600));
    return { ...base, bytes: m.bytes, how: m.how };
  }
  if (reader === 'xyz') {
    const m = mutateText(new TextDecoder().decode(s.bytes), r);
    return { ...base, bytes: enc.encode(m.text), how: m.how };
  }
  // JSON files: structure damaged half the time, bytes the other half
  if (r() < 0.5) {
    const m = mutateJson(JSON.parse(new TextDecoder().decode(s.bytes)), r);
    return { ...base, bytes: enc.encode(JSON.stringify(m.value) ?? 'undefined'), how: m.how };
  }
  const m = mutateBytes(s.bytes, r, s.bytes.length);
  return { ...base, bytes: m.bytes, how: m.how };
}
