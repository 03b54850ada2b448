/**
 * Cross-sections along any polyline in the analysis CRS: seabed, top basement, Moho, crustal
 * thickness (bilinear, NaN-aware) and domain (nearest cell) every `step` metres — at most half a cell —
 * with chainage in km measured geodesically on WGS84, and where the section crosses each named line.
 */

import { geodesicDistance } from '../crs/geodesy.js';
import { WGS84, type Crs } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import { xToCol, yToRow, type GridGeometry } from '../grid/geometry.js';
import { sampleBilinear } from '../grid/resample.js';
import { segmentHit, type Ring } from '../boundaries/planar.js';

export interface SectionGrids {
  readonly geometry: GridGeometry;
  readonly seabed: Float32Array | null;
  readonly basement: Float32Array;
  readonly moho: Float32Array;
  readonly thickness: Float32Array;
  readonly domains: Uint8Array;
}

export interface Crossing {
  readonly kind: string;
  readonly chainageKm: number;
  readonly x: number;
  readonly y: number;
}

export interface Section {
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly lon: Float64Array;
  readonly lat: Float64Array;
  readonly chainageKm: Float64Array;
  readonly seabed: Float32Array;
  readonly basement: Float32Array;
  readonly moho: Float32Array;
  readonly thickness: Float32Array;
  readonly domain: Uint8Array;
  readonly crossings: Crossing[];
  readonly stepM: number;
}

/** Points along a polyline every ≤ step (vertices kept), in map units. */
export function resamplePath(path: Ring, step: number): Ring {
  const out: Ring = [];
  for (let k = 0; k < path.length - 1; k++) {
    const [ax, ay] = path[k];
    const [bx, by] = path[k + 1];
    const n = Math.max(1, Math.ceil(Math.hypot(bx - ax, by - ay) / step));
    for (let q = 0; q < n; q++) out.push([ax + ((bx - ax) * q) / n, ay + ((by - ay) * q) / n]);
  }
  out.push([path[path.length - 1][0], path[path.length - 1][1]]);
  return out;
}

export function sampleSection(g: SectionGrids, path: Ring, lines: Record<string, Ring[]> = {}, stepIn?: number): Section {
  const geo = g.geometry;
  const half = Math.min(Math.abs(geo.dx), Math.abs(geo.dy)) / 2;
  const step = Math.min(stepIn ?? half, half);
  const pts = resamplePath(path, step);
  const n = pts.length;
  const toLL = transformer(geo.crs as Crs, WGS84);
  const s: Section = {
    x: new Float64Array(n), y: new Float64Array(n), lon: new Float64Array(n), lat: new Float64Array(n), chainageKm: new Float64Array(n),
    seabed: new Float32Array(n), basement: new Float32Array(n), moho: new Float32Array(n), thickness: new Float32Array(n), domain: new Uint8Array(n),
    crossings: [], stepM: step,
  };
  const at = (v: Float32Array, fi: number, fj: number) => sampleBilinear({ geometry: geo, values: v }, fi, fj);
  for (let k = 0; k < n; k++) {
    const [x, y] = pts[k];
    const [lon, lat] = toLL.forward([x, y]);
    s.x[k] = x;
    s.y[k] = y;
    s.lon[k] = lon;
    s.lat[k] = lat;
    s.chainageKm[k] = k === 0 ? 0 : s.chainageKm[k - 1] + geodesicDistance(s.lon[k - 1], s.lat[k - 1], lon, lat) / 1000;
    const fi = xToCol(geo, x);
    const fj = yToRow(geo, y);
    s.seabed[k] = g.seabed ? at(g.seabed, fi, fj) : NaN;
    s.basement[k] = at(g.basement, fi, fj);
    s.moho[k] = at(g.moho, fi, fj);
    s.thickness[k] = at(g.thickness, fi, fj);
    const i = Math.round(fi);
    const j = Math.round(fj);
    s.domain[k] = i >= 0 && j >= 0 && i < geo.nx && j < geo.ny ? g.domains[j * geo.nx + i] : 0;
  }
  // Crossings with the named lines, located by segment intersection and chainage interpolation.
  for (const [kind, rings] of Object.entries(lines)) {
    for (let k = 0; k < n - 1; k++) {
      for (const r of rings) {
        for (let q = 0; q < r.length - 1; q++) {
          const t = segmentHit(pts[k], pts[k + 1], r[q], r[q + 1]);
          if (t === null) continue;
          s.crossings.push({
            kind,
            chainageKm: s.chainageKm[k] + t * (s.chainageKm[k + 1] - s.chainageKm[k]),
            x: pts[k][0] + t * (pts[k + 1][0] - pts[k][0]),
            y: pts[k][1] + t * (pts[k + 1][1] - pts[k][1]),
          });
        }
      }
    }
  }
  s.crossings.sort((a, b) => a.chainageKm - b.chainageKm);
  return s;
}

/** Section as CSV: one row per sample, named columns with units, header first. */
export function sectionCsv(s: Section, crsName: string): string {
  const f = (v: number, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : '');
  // header first (docs/outputs.md): x, y in the analysis CRS (named on every row), lon, lat WGS 84,
  // depths m positive down, chainage geodesic; `crossing` names the lines crossed since the last sample
  const rows = ['chainage_km,x_m,y_m,lon_deg,lat_deg,seabed_m,top_basement_m,moho_m,crustal_thickness_m,domain,crossing,analysis_crs'];
  const crs = `"${crsName.replace(/"/g, "'")}"`;
  for (let k = 0; k < s.x.length; k++) {
    const crossed = s.crossings.filter((c) => c.chainageKm <= s.chainageKm[k] && (k === 0 || c.chainageKm > s.chainageKm[k - 1])).map((c) => c.kind);
    rows.push([s.chainageKm[k].toFixed(4), s.x[k].toFixed(2), s.y[k].toFixed(2), s.lon[k].toFixed(7), s.lat[k].toFixed(7), f(s.seabed[k]), f(s.basement[k]), f(s.moho[k]), f(s.thickness[k]), s.domain[k], crossed.join(' '), crs].join(','));
  }
  return rows.join('\n') + '\n';
}
