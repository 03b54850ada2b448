/// <reference lib="webworker" />
/**
 * The pipeline worker: reads files (the same readers as the CLI), runs the one pipeline function and
 * hands back display data with buffers transferred. It never touches the DOM.
 */

import { demoFiles } from '../../fixtures/demo-files.js';
import { boundariesGeoJson, domainsGeoJson } from '../export/geojson.js';
import { exportValues, outputFiles, summary as runSummary } from '../export/outputs.js';
import { geoPackage } from '../export/gpkg.js';
import { readGeoJson } from '../io/geojson-read.js';
import { readGeoTiff } from '../io/geotiff-read.js';
import { readXyz } from '../io/xyz-read.js';
import { createPipelineCache, runPipeline, type GridInput, type PipelineResult, type VectorInput } from '../pipeline.js';
import type { FromWorker, ToWorker } from './messages.js';
import { WGS84 } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import { sectionCsv } from '../survey/section.js';
import { planFromResult, sectionAlong } from '../survey/run.js';
import { surveyCsv, surveyGeoJson } from '../export/survey.js';
import { splitLine, toLonLat } from '../export/rfc7946.js';

/** The picks as the run used them, with their consistency checks, in WGS 84 for the map. */
function picksGeoJson(r: PipelineResult): unknown {
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

const grids = new Map<string, GridInput>();
const vectors = new Map<string, VectorInput>();
let last: PipelineResult | null = null;
const cache = createPipelineCache();

const post = (m: FromWorker, transfer: Transferable[] = []) => (self as unknown as Worker).postMessage(m, transfer);

async function sha256(bytes: ArrayBuffer): Promise<string> {
  const d = await crypto.subtle.digest('SHA-256', bytes);
  return [...new Uint8Array(d)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

self.onmessage = async (ev: MessageEvent<ToWorker>) => {
  const m = ev.data;
  try {
    switch (m.type) {
      case 'make-demo': {
        const files = demoFiles();
        const keep = ['seabed.tif', 'top-basement.tif', 'moho.tif', 'licence.geojson', 'seismic-lines.geojson', 'picks.geojson', 'isochrons.geojson'];
        const out = keep.map((name) => ({ name, bytes: files[name].slice().buffer as ArrayBuffer }));
        post({ type: 'demo', files: out }, out.map((f) => f.bytes));
        break;
      }
      case 'load-grid': {
        try {
          const lower = m.name.toLowerCase();
          const isTiff = /\.(tif|tiff|gtiff)$/.test(lower);
          const r = isTiff ? await readGeoTiff(m.bytes, m.name, m.options) : readXyz(new TextDecoder().decode(m.bytes), m.name, m.options);
          grids.set(m.id, { name: m.name, bytes: m.bytes.byteLength, sha256: await sha256(m.bytes), grid: r.grid, report: r.report });
          post({ type: 'loaded', id: m.id, report: r.report });
        } catch (err) {
          post({ type: 'load-error', id: m.id, message: (err as Error).message });
        }
        break;
      }
      case 'load-vector': {
        try {
          const set = readGeoJson(m.text, m.name);
          const bytes = new TextEncoder().encode(m.text);
          vectors.set(m.id, { name: m.name, bytes: bytes.length, sha256: await sha256(bytes.buffer as ArrayBuffer), set });
          post({ type: 'loaded', id: m.id, report: null, features: set.features.length, warnings: set.warnings });
        } catch (err) {
          post({ type: 'load-error', id: m.id, message: (err as Error).message });
        }
        break;
      }
      case 'remove':
        grids.delete(m.id);
        vectors.delete(m.id);
        break;
      case 'run': {
        const t0 = performance.now();
        try {
          const g = (role: keyof typeof m.grids) => (m.grids[role] ? grids.get(m.grids[role]!) ?? null : null);
          const v = (role: keyof typeof m.vectors) => (m.vectors[role] ? vectors.get(m.vectors[role]!) ?? null : null);
          const basement = g('top-basement');
          const moho = g('moho');
          if (!basement || !moho) throw new Error('a top-basement grid and a Moho grid are needed (assign the roles in Data)');
          const r = runPipeline(
            { basement, moho, seabed: g('seabed'), licence: v('licence'), lines: v('lines'), picks: v('picks'), isochrons: v('isochrons'), crust: v('crust') },
            { params: m.params, cache, excludePicks: m.excludePicks, onProgress: (stage, fraction) => post({ type: 'progress', runId: m.runId, stage, fraction }) },
          );
          last = r;
          const regional = boundariesGeoJson(r, 'regional');
          const s = runSummary(r, { version: '', time: '', tool: 'app' }, r.boundaries.inLicence ? undefined : regional) as Record<string, unknown>;
          const gridsOut: Record<string, Float32Array> = {};
          // shown as exported: each grid masked to the domains where its model applies
          for (const name of Object.keys(r.grids)) gridsOut[name] = exportValues(r, name).slice();
          const domains = r.classified.domains.slice();
          const result = {
            geometry: { ...r.geometry, crs: { ...r.geometry.crs } },
            grids: gridsOut,
            domains,
            boundaries: regional,
            domainOutlines: m.outlines ? domainsGeoJson(r, 'regional') : null,
            picks: picksGeoJson(r),
            summary: {
              areas: r.areas.total,
              areasInLicence: r.areas.inLicence,
              licenceName: r.licenceName,
              lengths: s.boundary_lengths_km as Record<string, number>,
              cotAreaKm2: s.cot_zone_area_km2 as number,
              warnings: r.warnings,
              missing: r.boundaries.missing,
              oceanwardAzimuth: r.oceanward.azimuth,
              suggestedTc0: Number.isFinite(r.derived.suggestedTc0) ? r.derived.suggestedTc0 : null,
              calibrated: { taper: r.calibration.taper?.points.length ?? 0, ocean: r.calibration.ocean?.points.length ?? 0, onlap: r.boundaries.onlap.points.length },
              placedBy: s.lines_placed_by as Record<string, string>,
              suspectPicks: r.pickChecks.filter((c) => c.suspect && !c.excluded).length,
              farFromControlKm: r.params.farFromControl / 1000,
            },
            millis: performance.now() - t0,
          };
          post({ type: 'result', runId: m.runId, result }, [...Object.values(gridsOut).map((a) => a.buffer), domains.buffer]);
        } catch (err) {
          post({ type: 'run-error', runId: m.runId, message: (err as Error).message });
        }
        break;
      }
      case 'section': {
        try {
          if (!last) throw new Error('compute the grids first');
          const t = transformer(WGS84, last.geometry.crs);
          const path = m.lonlat.map((q) => t.forward(q) as [number, number]);
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
          post({
            type: 'section-result',
            requestId: m.requestId,
            section: {
              title: m.title, chainageKm: s.chainageKm, seabed: s.seabed, basement: s.basement, moho: s.moho, domain: s.domain,
              crossings: s.crossings.map((c) => ({ kind: c.kind, chainageKm: c.chainageKm })), picks, csv: sectionCsv(s, crsName),
              lengthKm: s.chainageKm[s.chainageKm.length - 1],
            },
          });
        } catch (err) {
          post({ type: 'section-result', requestId: m.requestId, section: null, error: (err as Error).message });
        }
        break;
      }
      case 'plan': {
        try {
          if (!last) throw new Error('compute the grids first');
          const sp = planFromResult(last, m.params);
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
          post({
            type: 'plan-result',
            requestId: m.requestId,
            plan: {
              lines: survey,
              midline: fc(sp.plan.midline.map(ll), () => ({ kind: 'midline' })),
              gaps: fc(gaps.map((x) => (x.pts.length > 1 ? ll(x.pts) : [])), (k) => ({ rank: gaps[k].g.rank, length_km: Math.round(gaps[k].g.lengthKm * 10) / 10, max_distance_km: Math.round(gaps[k].g.maxDistanceKm * 10) / 10 })),
              programme: sp.programme,
              dropped: sp.plan.dropped,
              csv: surveyCsv(sp, crs),
              geojson: JSON.stringify(survey, null, 1) + '\n',
              warnings: sp.plan.warnings,
            },
          });
        } catch (err) {
          post({ type: 'plan-result', requestId: m.requestId, plan: null, error: (err as Error).message });
        }
        break;
      }
      case 'export': {
        if (!last) throw new Error('nothing computed yet');
        const files = outputFiles(last, { version: m.version, time: m.time, tool: 'app' });
        // the GeoPackage: SQLite in WebAssembly, loaded only when exporting (bundled, never fetched elsewhere)
        const [{ default: initSqlJs }, { default: wasmUrl }] = await Promise.all([import('sql.js/dist/sql-wasm-browser.js'), import('sql.js/dist/sql-wasm-browser.wasm?url')]);
        files['boundaries.gpkg'] = geoPackage(await initSqlJs({ locateFile: () => wasmUrl }), last, m.time).bytes;
        const out: Record<string, ArrayBuffer> = {};
        for (const [k, v] of Object.entries(files)) out[k] = v.slice().buffer as ArrayBuffer;
        post({ type: 'exported', requestId: m.requestId, files: out }, Object.values(out));
        break;
      }
    }
  } catch (err) {
    console.error(err);
  }
};
