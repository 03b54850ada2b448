/**
 * GeoJSON evidence and context inputs: licence polygon, existing seismic lines, interpreter picks,
 * magnetic isochrons, crust-type polygons. RFC 7946 says WGS84 lon/lat; an old-style `crs` member
 * naming an EPSG code is honoured (with a warning). Every problem names the file and the feature.
 */

import { resolveCrs, WGS84, type Crs } from '../crs/registry.js';
import { kinks, polygon as turfPolygon } from '@turf/turf';
import { InputError } from './errors.js';

export type Position = [number, number];

export interface VectorFeature {
  readonly kind: 'point' | 'line' | 'polygon';
  /** Points: one position; lines: one ring of positions; polygons: outer ring then holes. */
  readonly parts: Position[][];
  readonly properties: Record<string, unknown>;
  readonly index: number;
}

export interface VectorSet {
  readonly file: string;
  readonly crs: Crs;
  readonly features: VectorFeature[];
  readonly warnings: string[];
}

export function readGeoJson(text: string, file: string): VectorSet {
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (err) {
    throw new InputError(file, `is not valid JSON (${(err as Error).message})`);
  }
  const warnings: string[] = [];
  const root = doc as { type?: string; features?: unknown[]; crs?: { properties?: { name?: string } } };
  if (!root || typeof root !== 'object' || !root.type) throw new InputError(file, 'is not GeoJSON (no "type" member)');
  let crs: Crs = WGS84;
  const crsName = root.crs && typeof root.crs === 'object' ? root.crs.properties?.name : undefined;
  if (crsName !== undefined && typeof crsName !== 'string') throw new InputError(file, 'has a "crs" member whose name is not text');
  if (crsName) {
    const m = /EPSG:{1,2}(\d+)/i.exec(crsName);
    if (!m) throw new InputError(file, `names a CRS Taperline cannot read ("${crsName}")`);
    try {
      crs = resolveCrs(m[1]);
    } catch (err) {
      throw new InputError(file, (err as Error).message);
    }
    if (crs !== WGS84) warnings.push(`uses a "crs" member (${crsName}); RFC 7946 GeoJSON is WGS84 longitude/latitude`);
  }
  if (typeof root.type !== 'string') throw new InputError(file, 'is not GeoJSON ("type" is not text)');
  if (root.type === 'FeatureCollection' && !Array.isArray(root.features)) throw new InputError(file, 'is a FeatureCollection whose "features" is not a list');
  const raw: unknown[] =
    root.type === 'FeatureCollection' ? (root.features as unknown[]) : root.type === 'Feature' ? [root] : [{ type: 'Feature', geometry: root, properties: {} }];
  const features: VectorFeature[] = [];
  raw.forEach((item, index) => {
    if (!item || typeof item !== 'object' || Array.isArray(item)) throw new InputError(file, `feature ${index} is not a GeoJSON object`);
    const f = item as { geometry?: unknown; properties?: unknown };
    const g = f.geometry as { type?: unknown; coordinates?: unknown } | null | undefined;
    if (!g || typeof g !== 'object' || typeof g.type !== 'string') throw new InputError(file, `feature ${index} has no geometry`);
    if (!Array.isArray(g.coordinates)) throw new InputError(file, `feature ${index}: its ${g.type} has no list of coordinates`);
    if (f.properties !== undefined && f.properties !== null && (typeof f.properties !== 'object' || Array.isArray(f.properties))) {
      throw new InputError(file, `feature ${index}: "properties" is not an object`);
    }
    const props = (f.properties ?? {}) as Record<string, unknown>;
    const c = g.coordinates as unknown;
    const pos = (p: unknown, where: string): Position => {
      if (!Array.isArray(p) || p.length < 2 || !Number.isFinite(p[0]) || !Number.isFinite(p[1])) {
        throw new InputError(file, `feature ${index}: ${where} is not a coordinate pair`);
      }
      if (crs === WGS84 && (Math.abs(p[0]) > 360 || Math.abs(p[1]) > 90)) {
        throw new InputError(file, `feature ${index}: (${p[0]}, ${p[1]}) is not longitude/latitude; RFC 7946 GeoJSON is WGS84`);
      }
      return [p[0], p[1]];
    };
    const list = (v: unknown, what: string): unknown[] => {
      if (!Array.isArray(v)) throw new InputError(file, `feature ${index}: the coordinates of its ${what} are not a list`);
      return v;
    };
    const ring = (r: unknown, where: string) => {
      if (!Array.isArray(r)) throw new InputError(file, `feature ${index}: ${where} is not a list of positions`);
      return r.map((p, k) => pos(p, `${where} position ${k}`));
    };
    switch (g.type) {
      case 'Point':
        features.push({ kind: 'point', parts: [[pos(c, 'point')]], properties: props, index });
        break;
      case 'MultiPoint':
        for (const p of list(c, 'MultiPoint')) features.push({ kind: 'point', parts: [[pos(p, 'point')]], properties: props, index });
        break;
      case 'LineString':
        features.push({ kind: 'line', parts: [ring(c, 'line')], properties: props, index });
        break;
      case 'MultiLineString':
        for (const l of list(c, 'MultiLineString')) features.push({ kind: 'line', parts: [ring(l, 'line')], properties: props, index });
        break;
      case 'Polygon':
        features.push({ kind: 'polygon', parts: list(c, 'Polygon').map((r, k) => ring(r, `ring ${k}`)), properties: props, index });
        break;
      case 'MultiPolygon':
        for (const poly of list(c, 'MultiPolygon')) features.push({ kind: 'polygon', parts: list(poly, 'polygon of a MultiPolygon').map((r, k) => ring(r, `ring ${k}`)), properties: props, index });
        break;
      default:
        throw new InputError(file, `feature ${index} has geometry type ${g.type}, which Taperline does not read`);
    }
  });
  return { file, crs, features, warnings };
}

export type PickKind = 'continental-limit' | 'oceanic-limit' | 'onlap';
export const PICK_KINDS: readonly PickKind[] = ['continental-limit', 'oceanic-limit', 'onlap'];

/** Check the shape each evidence role needs, with messages naming the file and feature. */
export function expectKinds(set: VectorSet, role: 'licence' | 'lines' | 'picks' | 'isochrons' | 'crust'): void {
  const want = role === 'licence' || role === 'crust' ? 'polygon' : role === 'picks' ? 'point' : 'line';
  if (set.features.length === 0) throw new InputError(set.file, `holds no features (expected ${want}s for the ${role})`);
  for (const f of set.features) {
    if (f.kind !== want) throw new InputError(set.file, `feature ${f.index} is a ${f.kind}; the ${role} file needs ${want}s`);
    if (role === 'picks') {
      const k = f.properties.kind;
      if (typeof k !== 'string' || !PICK_KINDS.includes(k as PickKind)) {
        throw new InputError(set.file, `pick ${f.index} has ${k === undefined ? 'no "kind" property' : `kind ${JSON.stringify(k)?.slice(0, 40)}`}; expected one of ${PICK_KINDS.join(', ')}`);
      }
    }
    if (role === 'isochrons') {
      const a = f.properties.age_ma;
      // a JSON number: "0x10" is not 16 Ma
      if (typeof a !== 'number' || !Number.isFinite(a) || a < 0) throw new InputError(set.file, `isochron ${f.index} needs a numeric "age_ma" property (a JSON number of Ma), got ${a === undefined ? 'none' : JSON.stringify(a)?.slice(0, 30)}`);
    }
    if (want === 'polygon') polygonValid(set.file, f);
    if (want === 'line') {
      const l = f.parts[0];
      if (!l.some((p) => p[0] !== l[0][0] || p[1] !== l[0][1])) throw new InputError(set.file, `line ${f.index} needs at least two distinct positions`);
    }
    if (role === 'crust') {
      const t = f.properties.crust;
      if (t !== 'continental' && t !== 'oceanic' && t !== 'transition') {
        throw new InputError(set.file, `crust-type polygon ${f.index} needs "crust": "continental", "oceanic" or "transition"`);
      }
    }
  }
}

/**
 * A polygon Taperline can measure and clip: every ring closed with at least four positions, non-zero
 * area, and no edge crossing another (turf's kinks; a bow-tie would make areas meaningless — turf's
 * booleanValid accepts one, see STACK.md). The message names the file, the feature and the crossing.
 */
function polygonValid(file: string, f: VectorFeature): void {
  f.parts.forEach((r, k) => {
    const where = `polygon ${f.index}${f.parts.length > 1 ? `, ring ${k}` : ''}`;
    if (r.length < 4) throw new InputError(file, `${where} has ${r.length} positions; a ring needs at least 4 (closed)`);
    if (r[0][0] !== r[r.length - 1][0] || r[0][1] !== r[r.length - 1][1]) throw new InputError(file, `${where} is not closed (its first and last positions differ)`);
  });
  const crossings = kinks(turfPolygon(f.parts as number[][][])).features;
  if (crossings.length) {
    const [x, y] = crossings[0].geometry.coordinates;
    const fmt = (v: number) => (Math.abs(v) < 1000 ? v.toFixed(5) : v.toFixed(1));
    throw new InputError(file, `polygon ${f.index} crosses itself at (${fmt(x)}, ${fmt(y)})${crossings.length > 1 ? ` and ${crossings.length - 1} more places` : ''}: areas and clipping need a simple polygon`);
  }
  f.parts.forEach((r, k) => {
    let a = 0;
    for (let q = 0; q + 1 < r.length; q++) a += r[q][0] * r[q + 1][1] - r[q + 1][0] * r[q][1];
    if (a === 0) throw new InputError(file, `polygon ${f.index}${f.parts.length > 1 ? `, ring ${k}` : ''} has zero area`);
  });
}
