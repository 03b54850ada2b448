/** Planned lines as RFC 7946 GeoJSON and as CSV of end points (WGS 84 and the analysis CRS). */

import { WGS84, type Crs } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import type { SurveyPlan } from '../survey/run.js';
import { splitLine, toLonLat } from './rfc7946.js';

const r3 = (v: number) => Math.round(v * 1000) / 1000;

export function surveyGeoJson(sp: SurveyPlan, crs: Crs): Record<string, unknown> {
  const features = sp.plan.lines.map((l) => {
    const parts = splitLine(toLonLat(l.coords, crs, 500));
    const f = sp.figures.get(l.id);
    return {
      type: 'Feature',
      properties: {
        id: l.id,
        kind: l.kind,
        segment: l.segment + 1,
        rank: l.rank,
        length_km: r3(l.lengthKm),
        cumulative_km: r3(l.cumulativeKm),
        zone_width_km: l.zoneWidthKm === null ? null : r3(l.zoneWidthKm),
        envelope_width_km: l.envelopeWidthKm === null ? null : r3(l.envelopeWidthKm),
        control_distance_km: l.controlDistanceKm === null ? null : r3(l.controlDistanceKm),
        score: l.score === null ? null : r3(l.score),
        note: l.note ?? null,
        ties: l.ties ?? null,
        max_twt_to_moho_s: f ? r3(f.maxTwtS) : null,
        record_length_s: f ? f.recordLengthS : null,
        crossings: f ? f.crossings : [],
        status: 'proposed (planning aid; permits, environmental mitigation and qualified operators required)',
      },
      geometry: parts.length === 1 ? { type: 'LineString', coordinates: parts[0] } : { type: 'MultiLineString', coordinates: parts },
    };
  });
  return {
    type: 'FeatureCollection',
    name: 'proposed seismic lines',
    programme: {
      lines: sp.programme.lines,
      line_km: r3(sp.programme.lineKm),
      productive_hours: r3(sp.programme.productiveHours),
      total_days: r3(sp.programme.totalDays),
      cost: sp.programme.cost,
      parameters: sp.params,
      ranked_by: sp.plan.rankedBy,
      dropped: sp.plan.dropped,
      gaps: sp.plan.gaps.map((g) => {
        const [lon, lat] = transformer(crs, WGS84).forward(g.at);
        return { rank: g.rank, start_km: r3(g.startKm), end_km: r3(g.endKm), length_km: r3(g.lengthKm), max_distance_km: r3(g.maxDistanceKm), midline_piece: g.piece, lon: Math.round(lon * 1e7) / 1e7, lat: Math.round(lat * 1e7) / 1e7 };
      }),
    },
    features,
  };
}

export function surveyCsv(sp: SurveyPlan, crs: Crs): string {
  const t = transformer(crs, WGS84);
  const crsName = crs.id === 'PROJ4' ? crs.proj4 : `${crs.id} ${crs.name}`;
  // header first (docs/outputs.md); start/end in WGS 84 degrees and in the analysis CRS (metres), named
  // on every row; lengths geodesic; a planning aid
  const rows = ['id,kind,rank,start_lon,start_lat,end_lon,end_lat,start_x,start_y,end_x,end_y,length_km,cumulative_km,record_length_s,crossings,analysis_crs'];
  for (const l of sp.plan.lines) {
    const a = l.coords[0];
    const b = l.coords[l.coords.length - 1];
    const [alon, alat] = t.forward(a);
    const [blon, blat] = t.forward(b);
    const f = sp.figures.get(l.id);
    const cross = f ? f.crossings.map((c) => `${c.kind}@${c.chainageKm.toFixed(2)}km`).join(' ') : '';
    rows.push([l.id, l.kind, l.rank, alon.toFixed(7), alat.toFixed(7), blon.toFixed(7), blat.toFixed(7), a[0].toFixed(2), a[1].toFixed(2), b[0].toFixed(2), b[1].toFixed(2), l.lengthKm.toFixed(3), l.cumulativeKm.toFixed(3), f ? f.recordLengthS : '', `"${cross}"`, `"${crsName.replace(/"/g, "'")}"`].join(','));
  }
  return rows.join('\n') + '\n';
}
