/**
 * The vector outputs as one GeoPackage: every layer in WGS 84 (`…_wgs84`, as the GeoJSON files) and in
 * the analysis CRS (`…_epsg<code>`, metres; only for CRSs whose WKT we can state: WGS 84 / UTM), with the
 * fields of docs/outputs.md. Boundary pieces (lines) and the COT zone (polygons) are separate layers
 * so each has one geometry type; lengths and areas are the geodesic ones of the GeoJSON features.
 */

import type { SqlJsStatic } from 'sql.js';
import type { BoundaryPiece } from '../boundaries/extract.js';
import type { PipelineResult } from '../pipeline.js';
import { utmSrs, WGS84_SRS, writeGeoPackage, type GpkgGeometry, type GpkgLayer, type GpkgSrs, type Position } from '../io/gpkg-write.js';
import { domainFeatures, pieceToFeature, type Feature } from './geojson.js';

const closeRing = (r: Position[]): Position[] => (r[0][0] === r[r.length - 1][0] && r[0][1] === r[r.length - 1][1] ? r : [...r, r[0]]);
const signed = (r: Position[]) => r.reduce((a, p, k) => (k ? a + r[k - 1][0] * p[1] - p[0] * r[k - 1][1] : 0), 0);
/** Right-hand rule in map coordinates (north up): exterior counter-clockwise, holes clockwise. */
const orientRings = (rings: Position[][]): Position[][] =>
  rings.map((r, k) => {
    const c = closeRing(r);
    return (signed(c) > 0) === (k === 0) ? c : [...c].reverse();
  });

function mapGeometry(piece: BoundaryPiece): GpkgGeometry {
  return piece.kind === 'cot-zone'
    ? { type: 'Polygon', coordinates: orientRings(piece.coords as Position[][]) }
    : { type: 'LineString', coordinates: piece.coords[0] as Position[] };
}

export function geoPackage(SQL: SqlJsStatic, r: PipelineResult, time: string): { bytes: Uint8Array; note: string | null } {
  const analysis: GpkgSrs | null = r.geometry.crs.epsg ? utmSrs(r.geometry.crs.epsg) : null;
  const suffix = analysis ? `epsg${analysis.code}` : null;
  const layers: GpkgLayer[] = [];
  const add = (base: string, description: string, pieces: BoundaryPiece[], polygons: boolean) => {
    const chosen = pieces.filter((p) => (p.kind === 'cot-zone') === polygons);
    const lonlat = chosen.map((p) => pieceToFeature(p, r));
    const type = polygons ? 'MULTIPOLYGON' : 'MULTILINESTRING';
    layers.push({ name: `${base}_wgs84`, description: `${description} (WGS 84)`, srs: WGS84_SRS, geometryType: type, features: lonlat.map(asFeature) });
    if (analysis) {
      layers.push({
        name: `${base}_${suffix}`,
        description: `${description} (${analysis.name})`,
        srs: analysis,
        geometryType: type,
        features: chosen.map((p, k) => ({ geometry: multi(mapGeometry(p)), properties: lonlat[k].properties })),
      });
    }
  };
  const b = r.boundaries;
  const licence = Boolean(b.inLicence);
  add('boundary_pieces', licence ? `boundary pieces inside ${r.licenceName}` : 'boundary pieces', b.inLicence ?? b.pieces, false);
  add('cot_zone', licence ? `continent–ocean transition zone inside ${r.licenceName}` : 'continent–ocean transition zone', b.inLicence ?? b.pieces, true);
  add('boundary_lines', licence ? `boundary lines inside ${r.licenceName}` : 'boundary lines', b.linesInLicence ?? b.lines, false);
  if (licence) {
    add('boundary_pieces_whole_grid', 'boundary pieces, whole grid', b.pieces, false);
    add('cot_zone_whole_grid', 'continent–ocean transition zone, whole grid', b.pieces, true);
    add('boundary_lines_whole_grid', 'boundary lines, whole grid', b.lines, false);
  }
  const addDomains = (base: string, description: string, which: 'regional' | 'licence') => {
    const dom = domainFeatures(r, which);
    layers.push({ name: `${base}_wgs84`, description: `${description} (WGS 84)`, srs: WGS84_SRS, geometryType: 'MULTIPOLYGON', features: dom.collection.features.map(asFeature) });
    if (!analysis) return;
    layers.push({
      name: `${base}_${suffix}`,
      description: `${description} (${analysis.name})`,
      srs: analysis,
      geometryType: 'MULTIPOLYGON',
      features: dom.mapRings.map((rings, k) => ({ geometry: { type: 'MultiPolygon', coordinates: [orientRings(rings)] }, properties: dom.collection.features[k].properties })),
    });
  };
  if (licence) {
    addDomains('domains', `margin domains inside ${r.licenceName}`, 'licence');
    addDomains('domains_whole_grid', 'margin domains, whole grid', 'regional');
  } else addDomains('domains', 'margin domains', 'regional');
  const note = analysis ? null : `the analysis CRS (${r.geometry.crs.name}) has no WKT here: the GeoPackage holds WGS 84 layers only`;
  return { bytes: writeGeoPackage(SQL, layers, time), note };
}

function multi(g: GpkgGeometry): GpkgGeometry {
  if (g.type === 'LineString') return { type: 'MultiLineString', coordinates: [g.coordinates as Position[]] };
  if (g.type === 'Polygon') return { type: 'MultiPolygon', coordinates: [g.coordinates as Position[][]] };
  return g;
}

function asFeature(f: Feature): { geometry: GpkgGeometry; properties: Record<string, unknown> } {
  return { geometry: multi(f.geometry as unknown as GpkgGeometry), properties: f.properties };
}
