/**
 * The sweep's output set: the P90/P50/P10 lines (GeoJSON, RFC 7946), per-cell domain probabilities
 * and the positional-uncertainty grid (GeoTIFF), the zone width along strike (CSV) and a summary
 * block. Every figure uses one convention (uncertainty/summary.ts): Pq is what at least q % of the
 * realisations reach.
 */

import { geodesicLength } from '../crs/geodesy.js';
import { transformer } from '../crs/transform.js';
import { WGS84 } from '../crs/registry.js';
import { DOMAIN_NAMES } from '../domains/classify.js';
import type { NamedLine } from '../boundaries/fields.js';
import { writeGeoTiff, type TiffWriteOptions } from '../io/geotiff-write.js';
import type { PipelineResult } from '../pipeline.js';
import { stationPoint } from '../uncertainty/stations.js';
import { CONVENTION, SPEC_DOCS } from '../uncertainty/spec.js';

export { CONVENTION };
import type { PercentileFigure, UncertaintyResult } from '../uncertainty/summary.js';
import type { Feature, FeatureCollection } from './geojson.js';
import { splitLine, toLonLat } from './rfc7946.js';
import { provenance, tiffTime, type RunInfo } from './outputs.js';


export const LINE_KINDS: Record<NamedLine | 'onlap', string> = {
  taper: 'crustal-taper-limit',
  oceanic: 'oceanic-limit',
  onlap: 'oldest-onlapped-crust',
  necking: 'necking-line',
  coupling: 'coupling-line',
};

const r3 = (v: number) => Math.round(v * 1000) / 1000;

/** The envelope lines as RFC 7946 features: kind, p (90, 50, 10), length, realisations, seed. */
export function uncertaintyLinesGeoJson(r: PipelineResult, u: UncertaintyResult): FeatureCollection {
  const crs = r.geometry.crs;
  const step = Math.abs(r.geometry.dx);
  const features: Feature[] = [];
  for (const l of u.lines) {
    let part = 0;
    for (const ring of l.rings) {
      // a zero line that only touches 0 at one sample leaves a sliver of sub-millimetre length: no line
      let planar = 0;
      for (let q = 1; q < ring.length; q++) planar += Math.hypot(ring[q][0] - ring[q - 1][0], ring[q][1] - ring[q - 1][1]);
      if (planar < step * 1e-3) continue;
      const parts = splitLine(toLonLat(ring, crs, step));
      if (!parts.length) continue;
      const length = parts.reduce((s, p) => s + geodesicLength(p.flat()), 0);
      features.push({
        type: 'Feature',
        properties: { kind: LINE_KINDS[l.line], p: l.p, part: ++part, length_km: r3(length / 1000), realisations: u.realisations, seed: u.spec.seed },
        geometry: parts.length === 1 ? { type: 'LineString', coordinates: parts[0] } : { type: 'MultiLineString', coordinates: parts },
      });
    }
  }
  return { type: 'FeatureCollection', convention: CONVENTION, features };
}

/** Zone width along strike, one row per station: strike position, the station's P50 mid-zone point, P90/P50/P10 widths (km). */
export function zoneWidthCsv(r: PipelineResult, u: UncertaintyResult): string {
  const t = transformer(r.geometry.crs, WGS84);
  const w = u.widths;
  const rows = ['station,strike_km,lon,lat,width_p90_km,width_p50_km,width_p10_km,realisations_crossing'];
  for (let a = 0; a < w.strike.length; a++) {
    if (!w.count[a]) continue;
    // the point on the station ray where the P50 zone midpoint lies is not stored; the ray's centre of the grid is
    const [x, y] = stationPoint(u.stations, a, u.stations.t0 + ((u.stations.samples - 1) * u.stations.step) / 2);
    const [lon, lat] = t.forward([x, y]);
    const km = (v: number) => (v === v ? (v / 1000).toFixed(3) : '');
    rows.push(`${a + 1},${(w.strike[a] / 1000).toFixed(3)},${lon.toFixed(6)},${lat.toFixed(6)},${km(w.p90[a])},${km(w.p50[a])},${km(w.p10[a])},${w.count[a]}`);
  }
  return rows.join('\n') + '\n';
}

function fig(f: PercentileFigure, scale = 1): Record<string, number | null> {
  const v = (x: number) => (x === x ? r3(x * scale) : null);
  return { p90: v(f.p90), p50: v(f.p50), p10: v(f.p10), realisations: f.count };
}

/** The summary's uncertainty block. */
export function uncertaintySummary(r: PipelineResult, u: UncertaintyResult): Record<string, unknown> {
  const named = (list: UncertaintyResult['areas']) => list.filter((a) => a.code > 0).map((a) => ({ code: a.code, domain: DOMAIN_NAMES[a.code], km2: fig(a.km2) }));
  const widths = Array.from(u.widths.p50).filter((v) => v === v);
  const lengths: Record<string, Record<string, number>> = {};
  for (const l of u.lines) {
    const kind = LINE_KINDS[l.line];
    const ll = l.rings.map((ring) => toLonLat(ring, r.geometry.crs, Math.abs(r.geometry.dx)));
    (lengths[kind] ??= {})[`p${l.p}`] = r3(ll.reduce((s, p) => s + geodesicLength(p.flat()), 0) / 1000);
  }
  const pos = Array.from(u.positional).filter((v) => v === v).sort((a, b) => a - b);
  return {
    convention: CONVENTION,
    realisations: u.realisations,
    seed: u.spec.seed,
    spec: u.spec,
    spec_meaning: Object.fromEntries(SPEC_DOCS.map((d) => [d.key, `${d.doc}${d.unit ? ` (${d.unit})` : ''} — ${d.source}`])),
    held_fixed: 'the analysis grid, the seabed, the oceanward direction of the deterministic run, the picks, lines, licence, isochrons and crust polygons',
    not_moving_lines: 'rhoMantle, rhoCrust and riftAge enter only the isostatic and subsidence diagnostics; no domain rule and no line uses them, so they do not widen these envelopes',
    line_lengths_km: lengths,
    areas_km2: named(u.areas),
    licence_areas_km2: u.licenceAreas ? named(u.licenceAreas) : null,
    zone_width_km: {
      stations: u.widths.strike.length,
      stations_crossing: widths.length,
      median_of_p50: widths.length ? r3(widths.sort((a, b) => a - b)[widths.length >> 1] / 1000) : null,
      note: 'width along the oceanward direction between the first crossings from land of the taper limit and the oceanic limit, per station (zone-width.csv)',
    },
    positional_uncertainty_km: pos.length ? { cells: pos.length, median: r3(pos[pos.length >> 1]), max: r3(pos[pos.length - 1]) } : null,
    parameters_drawn: u.params.map((p) => ({ key: p.key, min: r3(p.min), p50: r3(p.p50), max: r3(p.max), limited_to_range: p.limited })),
    cells_held_at_zero_crust_or_outcrop: u.heldCells,
    realisations_sides_joined: u.joinedRealisations,
    realisations_sides_joined_meaning:
      'realisations in which crust at least as thick as the oceanic-limit threshold ran unbroken from the oceanward to the landward edge: thickness could not part continental from oceanic crust there, and the oceanic crust of that component became transition (unresolved). A large share says the thickness proxy cannot place the limits under this uncertainty: picks or crust-type polygons can',
    thickness_offsets_limited: u.limitedOffsets,
  };
}

/** The sweep's files under uncertainty/. */
export function uncertaintyFiles(r: PipelineResult, u: UncertaintyResult, run: RunInfo): Record<string, Uint8Array> {
  const enc = new TextEncoder();
  const prov: Partial<TiffWriteOptions> = { software: `taperline ${run.version}`, dateTime: tiffTime(run.time) };
  const files: Record<string, Uint8Array> = {};
  for (let code = 1; code <= 5; code++) {
    const name = DOMAIN_NAMES[code].replace(/[^a-z0-9]+/gi, '-').replace(/-+$/, '').toLowerCase();
    files[`uncertainty/probability-${code}-${name}.tif`] = writeGeoTiff(r.geometry, u.probability[code], {
      ...prov,
      noData: 'nan',
      description: `probability that the cell is ${DOMAIN_NAMES[code]} (code ${code}), over ${u.realisations} realisations (seed ${u.spec.seed})`,
    });
  }
  files['uncertainty/positional-uncertainty.tif'] = writeGeoTiff(r.geometry, u.positional, {
    ...prov,
    noData: 'nan',
    unit: 'km',
    description: 'width of the P90–P10 envelope of the crustal taper limit and of the landward limit of oceanic crust, along the oceanward direction, painted over the envelope (km)',
  });
  files['uncertainty/lines.geojson'] = enc.encode(JSON.stringify({ ...uncertaintyLinesGeoJson(r, u), generated_by: provenance(r, run) }) + '\n');
  files['uncertainty/zone-width.csv'] = enc.encode(zoneWidthCsv(r, u));
  return files;
}
