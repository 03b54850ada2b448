/**
 * What the worker hands the page, built from a pipeline result: display data for a run (grids
 * masked as exported, domains, boundaries, picks with their checks, the summary in brief), a
 * section along a path, a survey proposal, and evidence files in WGS 84 for the map.
 */

import { WGS84 } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import { boundariesGeoJson, domainsGeoJson } from '../export/geojson.js';
import { exportValues, lineFigures, linesPlacedBy } from '../export/outputs.js';
import { splitLine, toLonLat } from '../export/rfc7946.js';
import { surveyCsv, surveyGeoJson } from '../export/survey.js';
import type { VectorSet } from '../io/geojson-read.js';
import type { PipelineResult } from '../pipeline.js';
import { sectionCsv } from '../survey/section.js';
import { planFromResult, sectionAlong } from '../survey/run.js';
import type { DisplayResult, LicenceFigures, PlanData, SectionData, SweepDisplay } from './messages.js';
import type { UncertaintyResult } from '../uncertainty/summary.js';
import { uncertaintyLinesGeoJson } from '../export/uncertainty.js';

/** The picks as the run used them, with their consistency checks, in WGS 84 for the map. */
export function picksGeoJson(r: PipelineResult): unknown {
  const t = transformer(r.geometry.crs, WGS84);
  const checks = new Map(r.pickChecks.map((c) => [c.id, c]));
  return {
    type: 'FeatureCollection',
    features: r.evidence.picks.map((q) => {
      const c = checks.get(q.id);
      return {
        type: 'Feature',
        properties: {
          id: q.id, kind: q.kind, line: q.line ?? null, excluded: Boolean(q.excluded), suspect: Boolean(c?.suspect),
          reasons: c?.reasons ?? [], thickness_m: c?.thickness_m ?? null, trend_m: c?.trend_m ?? null, departure_m: c?.departure_m ?? null, proxy_distance_m: c?.proxy_distance_m ?? null,
        },
        geometry: { type: 'Point', coordinates: t.forward([q.x, q.y]) },
      };
    }),
  };
}

/** An evidence file as the map shows it: WGS 84 longitude/latitude, whatever CRS the file carried. */
export function displayGeoJson(set: VectorSet): unknown {
  const t = set.crs === WGS84 ? null : transformer(set.crs, WGS84);
  const ll = (p: [number, number]) => (t ? (t.forward(p) as [number, number]) : p);
  return {
    type: 'FeatureCollection',
    features: set.features.map((f) => ({
      type: 'Feature',
      properties: f.properties,
      geometry:
        f.kind === 'point'
          ? { type: 'Point', coordinates: ll(f.parts[0][0]) }
          : f.kind === 'line'
            ? { type: 'LineString', coordinates: f.parts[0].map(ll) }
            : { type: 'Polygon', coordinates: f.parts.map((r) => r.map(ll)) },
    })),
  };
}

export function runDisplay(r: PipelineResult, outlines: boolean, millis: () => number): Omit<DisplayResult, 'runKey'> {
  const regional = boundariesGeoJson(r, 'regional');
  // lengths and the COT area as the summary gives them: for the whole grid now; inside a licence they
  // wait for the exact clip, which the page asks for once the map is drawn (licenceFigures); the rest
  // of the summary (exact licence clipping of every domain) waits for an export
  const figures = r.boundaries.hasLicence ? null : lineFigures(regional);
  const gridsOut: Record<string, Float32Array> = {};
  // shown as exported: each grid masked to the domains where its model applies
  for (const name of Object.keys(r.grids)) gridsOut[name] = exportValues(r, name).slice();
  return {
    geometry: { ...r.geometry, crs: { ...r.geometry.crs } },
    grids: gridsOut,
    domains: r.classified.domains.slice(),
    boundaries: regional,
    domainOutlines: outlines ? domainsGeoJson(r, 'regional') : null,
    picks: picksGeoJson(r),
    summary: {
      areas: r.areas.total,
      areasInLicence: r.areas.inLicence,
      licenceName: r.licenceName,
      lengths: figures?.lengths ?? null,
      cotAreaKm2: figures ? Math.round(figures.cot * 1000) / 1000 : null,
      warnings: r.warnings,
      missing: r.boundaries.missing,
      oceanwardAzimuth: r.oceanward.azimuth,
      suggestedTc0: Number.isFinite(r.derived.suggestedTc0) ? r.derived.suggestedTc0 : null,
      calibrated: { taper: r.calibration.taper?.points.length ?? 0, ocean: r.calibration.ocean?.points.length ?? 0, onlap: r.boundaries.onlap.points.length },
      placedBy: linesPlacedBy(r),
      suspectPicks: r.pickChecks.filter((c) => c.suspect && !c.excluded).length,
      farFromControlKm: r.params.farFromControl / 1000,
    },
    millis: millis(),
  };
}

/** Lengths and the COT area inside the licence, from the exact clip (a run with a licence only). */
export function licenceFigures(r: PipelineResult): LicenceFigures {
  const f = lineFigures(boundariesGeoJson(r, 'licence'));
  return { lengths: f.lengths, cotAreaKm2: Math.round(f.cot * 1000) / 1000 };
}

export function sectionDisplay(last: PipelineResult, lonlat: [number, number][], title: string): SectionData {
  const t = transformer(WGS84, last.geometry.crs);
  const path = lonlat.map((q) => t.forward(q) as [number, number]);
  const s = sectionAlong(last, path);
  const picks = last.evidence.picks
    .map((pk) => {
      let best = Infinity;
      let at = 0;
      for (let k = 0; k < s.x.length; k++) {
        const d = Math.hypot(s.x[k] - pk.x, s.y[k] - pk.y);
        if (d < best) (best = d), (at = k);
      }
      return { kind: pk.kind, line: pk.line ?? null, chainageKm: s.chainageKm[at], offsetKm: best / 1000 };
    })
    .filter((pk) => pk.offsetKm <= 2);
  const crsName = last.geometry.crs.id === 'PROJ4' ? last.geometry.crs.proj4 : `${last.geometry.crs.id} ${last.geometry.crs.name}`;
  return {
    title, chainageKm: s.chainageKm, seabed: s.seabed, basement: s.basement, moho: s.moho, domain: s.domain,
    crossings: s.crossings.map((c) => ({ kind: c.kind, chainageKm: c.chainageKm })), picks, csv: sectionCsv(s, crsName),
    lengthKm: s.chainageKm[s.chainageKm.length - 1],
  };
}

export function planDisplay(last: PipelineResult, params: Record<string, unknown>, sweep: UncertaintyResult | null = null): PlanData {
  const sp = planFromResult(last, params, sweep);
  const crs = last.geometry.crs;
  const ll = (r: [number, number][]) => splitLine(toLonLat(r, crs, 500));
  const fc = (geoms: [number, number][][][], props: (k: number) => Record<string, unknown>) => ({
    type: 'FeatureCollection',
    features: geoms.flatMap((parts, k) => parts.map((c) => ({ type: 'Feature', properties: props(k), geometry: { type: 'LineString', coordinates: c } }))),
  });
  const gaps = sp.plan.gaps.map((g) => {
    const cov = sp.plan.coverage[g.piece];
    const pts = cov.midline.filter((_, k) => cov.chainageKm[k] >= g.startKm && cov.chainageKm[k] <= g.endKm);
    return { g, pts };
  });
  const survey = surveyGeoJson(sp, crs);
  return {
    lines: survey,
    midline: fc(sp.plan.midline.map(ll), () => ({ kind: 'midline' })),
    gaps: fc(gaps.map((x) => (x.pts.length > 1 ? ll(x.pts) : [])), (k) => ({ rank: gaps[k].g.rank, length_km: Math.round(gaps[k].g.lengthKm * 10) / 10, max_distance_km: Math.round(gaps[k].g.maxDistanceKm * 10) / 10 })),
    programme: sp.programme,
    dropped: sp.plan.dropped,
    csv: surveyCsv(sp, crs),
    geojson: JSON.stringify(survey, null, 1) + '\n',
    warnings: sp.plan.warnings,
    rankedBy: sp.plan.rankedBy,
  };
}

/**
 * A sweep for the page: the percentile lines (WGS 84), P(continental) = P(codes 1–3), P(transition),
 * P(oceanic) and the positional-uncertainty grid, with the summary block.
 */
export function sweepDisplay(last: PipelineResult, u: UncertaintyResult, runKey: string, summary: Record<string, unknown>, millis: number): SweepDisplay {
  const n = last.geometry.nx * last.geometry.ny;
  const continental = new Float32Array(n);
  for (let k = 0; k < n; k++) continental[k] = u.probability[1][k] + u.probability[2][k] + u.probability[3][k];
  return {
    runKey,
    realisations: u.realisations,
    seed: u.spec.seed,
    lines: uncertaintyLinesGeoJson(last, u),
    grids: { 'p-continental': continental, 'p-transition': u.probability[4].slice(), 'p-oceanic': u.probability[5].slice(), 'positional-uncertainty': u.positional.slice() },
    summary,
    millis,
  };
}
