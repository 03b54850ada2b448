/** GeoJSON (RFC 7946) feature collections of the boundaries and the domain polygons. */

import { geodesicLength, geodesicRingArea } from '../crs/geodesy.js';
import { colToX, rowToY } from '../grid/geometry.js';
import { DOMAIN_NAMES, FLAG_BLOCK, FLAG_MOHO_NOT_IMAGED, FLAG_UNRESOLVED } from '../domains/classify.js';
import { polygonize } from '../domains/polygonize.js';
import type { BoundaryPiece } from '../boundaries/extract.js';
import type { PipelineResult } from '../pipeline.js';
import { rfcPolygons, splitLine, toLonLat, type Pos } from './rfc7946.js';
import { clipPolygons } from '../boundaries/planar.js';

export interface Feature {
  type: 'Feature';
  properties: Record<string, unknown>;
  geometry: { type: 'LineString' | 'MultiLineString' | 'Polygon' | 'MultiPolygon'; coordinates: unknown };
}

export interface FeatureCollection {
  type: 'FeatureCollection';
  features: Feature[];
  [key: string]: unknown;
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;

function polygonArea(polys: Pos[][][]): number {
  let a = 0;
  for (const rings of polys) {
    rings.forEach((ring, k) => {
      const s = geodesicRingArea(ring.flat());
      a += k === 0 ? s : -s;
    });
  }
  return a;
}

export function pieceToFeature(piece: BoundaryPiece, r: PipelineResult): Feature {
  const crs = r.geometry.crs;
  const step = Math.abs(r.geometry.dx);
  if (piece.kind === 'cot-zone') {
    const polys = rfcPolygons(piece.coords.map((ring) => toLonLat(ring, crs, step)));
    return {
      type: 'Feature',
      properties: { ...piece.properties, area_km2: r3(polygonArea(polys) / 1e6) },
      geometry: polys.length === 1 ? { type: 'Polygon', coordinates: polys[0] } : { type: 'MultiPolygon', coordinates: polys },
    };
  }
  const ll = toLonLat(piece.coords[0], crs, step);
  const parts = splitLine(ll);
  const length = parts.reduce((s, p) => s + geodesicLength(p.flat()), 0);
  return {
    type: 'Feature',
    properties: { ...piece.properties, length_km: r3(length / 1000) },
    geometry: parts.length === 1 ? { type: 'LineString', coordinates: parts[0] } : { type: 'MultiLineString', coordinates: parts },
  };
}

export function boundariesGeoJson(r: PipelineResult, which: 'regional' | 'licence' = r.boundaries.hasLicence ? 'licence' : 'regional'): FeatureCollection {
  const pieces = which === 'licence' && r.boundaries.inLicence ? r.boundaries.inLicence : r.boundaries.pieces;
  return {
    type: 'FeatureCollection',
    name: which === 'licence' ? `boundaries inside ${r.licenceName}` : 'boundaries (whole grid)',
    note: 'Interpretations from depth grids and parameters; see summary.json for the rules and parameters used.',
    features: pieces.map((p) => pieceToFeature(p, r)),
  };
}

/** One feature per continuous boundary line, with its evidence as shares of its length. */
export function boundaryLinesGeoJson(r: PipelineResult, which: 'regional' | 'licence' = r.boundaries.linesInLicence ? 'licence' : 'regional'): FeatureCollection {
  const lines = which === 'licence' && r.boundaries.linesInLicence ? r.boundaries.linesInLicence : r.boundaries.lines;
  return {
    type: 'FeatureCollection',
    name: which === 'licence' ? `boundary lines inside ${r.licenceName}` : 'boundary lines (whole grid)',
    note: 'One feature per continuous line; boundaries.geojson holds the same lines in pieces that each say what placed them.',
    features: lines.map((p) => pieceToFeature(p, r)),
  };
}

/** Domain polygons following cell edges (areas = cells × cell area), one feature per polygon. */
/** Domain polygons: inside the licence (clipped exactly) when one is given, else the whole grid. */
export function domainsGeoJson(r: PipelineResult, which: 'regional' | 'licence' = r.evidence.licence ? 'licence' : 'regional'): FeatureCollection {
  return domainFeatures(r, which).collection;
}

type DomainSet = { collection: FeatureCollection; mapRings: Pos[][][] };
/**
 * Made once per run and kind (keyed by the run's classification): the GeoJSON files, the summary's
 * licence areas and both GeoPackage layers share them. Treated as read-only by every caller.
 */
const domainSets = new WeakMap<object, Partial<Record<'regional' | 'licence', DomainSet>>>();

/** Domain polygons with their rings in the analysis CRS too (for projected layers). */
export function domainFeatures(r: PipelineResult, which: 'regional' | 'licence' = 'regional'): DomainSet {
  const kind = which === 'licence' && r.evidence.licence ? 'licence' : 'regional';
  let memo = domainSets.get(r.classified);
  if (!memo) domainSets.set(r.classified, (memo = {}));
  return (memo[kind] ??= kind === 'regional' ? wholeDomains(r) : clippedDomains(r, domainFeatures(r, 'regional')));
}

function clippedDomains(r: PipelineResult, whole: DomainSet): DomainSet {
  const licence = r.evidence.licence!;
  // exact intersection with the licence in the analysis CRS, then geodesic areas
  const g = r.geometry;
  const features: Feature[] = [];
  const mapRings: Pos[][][] = [];
  whole.mapRings.forEach((rings, k) => {
    for (const part of clipPolygons([rings as [number, number][][]], licence)) {
      const parts = rfcPolygons(part.map((ring) => toLonLat(ring, g.crs, Math.abs(g.dx))));
      if (!parts.length) continue;
      mapRings.push(part);
      features.push({
        type: 'Feature',
        properties: { ...whole.collection.features[k].properties, cells: null, area_km2: r3(polygonArea(parts) / 1e6), clipped_to_licence: true },
        geometry: parts.length === 1 ? { type: 'Polygon', coordinates: parts[0] } : { type: 'MultiPolygon', coordinates: parts },
      });
    }
  });
  return { collection: { ...whole.collection, name: `margin domains inside ${r.licenceName}`, features }, mapRings };
}

function wholeDomains(r: PipelineResult): { collection: FeatureCollection; mapRings: Pos[][][] } {
  const g = r.geometry;
  const { domains, flags } = r.classified;
  const keys = new Uint8Array(domains.length);
  for (let k = 0; k < keys.length; k++) {
    const f = flags[k];
    keys[k] = domains[k] | (f & FLAG_MOHO_NOT_IMAGED ? 8 : 0) | (f & FLAG_BLOCK ? 16 : 0) | (f & FLAG_UNRESOLVED ? 32 : 0);
  }
  const polys = polygonize(keys, g.nx, g.ny, (key) => (key & 7) === 0);
  const toMap = (ring: [number, number][]): Pos[] => ring.map(([i, j]) => [colToX(g, i), rowToY(g, j)]);
  const features: Feature[] = [];
  const mapRings: Pos[][][] = [];
  for (const p of polys) {
    mapRings.push([p.outer, ...p.holes].map(toMap));
    const rings = [p.outer, ...p.holes].map((ring) => toLonLat(toMap(ring), g.crs, Math.abs(g.dx)));
    const parts = rfcPolygons(rings);
    const code = p.key & 7;
    features.push({
      type: 'Feature',
      properties: {
        code,
        domain: DOMAIN_NAMES[code],
        cells: p.cells,
        area_km2: r3(polygonArea(parts) / 1e6),
        moho_imaged: !(p.key & 8),
        isolated_block: Boolean(p.key & 16),
        unresolved: Boolean(p.key & 32),
      },
      geometry: parts.length === 1 ? { type: 'Polygon', coordinates: parts[0] } : { type: 'MultiPolygon', coordinates: parts },
    });
  }
  return {
    collection: {
      type: 'FeatureCollection',
      name: 'margin domains',
      note: 'Interpretations: thickness proxy and evidence as stated in summary.json. Polygons follow grid cells.',
      features,
    },
    mapRings,
  };
}
