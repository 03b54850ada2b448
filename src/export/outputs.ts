/**
 * The output set of a run: boundaries.geojson, domains.geojson, grids/<name>.tif and summary.json,
 * as bytes keyed by relative path. Shells write them (CLI) or offer them for download (app).
 */

import { APPLIES_TEXT, DERIVED, type DerivedName } from '../derive/grids.js';
import { DOMAIN_STYLES } from '../domains/styles.js';
import { DOMAIN_NAMES, FLAG_ATYPICAL_OCEANIC, FLAG_BLOCK, FLAG_ENCLOSED_THIN, FLAG_FORCED, FLAG_UNRESOLVED } from '../domains/classify.js';
import { WGS84 } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import { writeGeoTiff, type TiffWriteOptions } from '../io/geotiff-write.js';
import { DEFAULT_PARAMS, PARAM_SPECS } from '../params.js';
import type { PipelineResult } from '../pipeline.js';
import { boundariesGeoJson, boundaryLinesGeoJson, domainsGeoJson, type FeatureCollection } from './geojson.js';

export interface RunInfo {
  readonly version: string;
  /** ISO time of the run, from the shell (the core reads no clock). */
  readonly time: string;
  readonly tool: 'cli' | 'app';
  /** The derived grids asked for (the CLI's --grids); absent: every one. */
  readonly grids?: readonly DerivedName[];
}

const enc = new TextEncoder();
const json = (v: unknown) => enc.encode(JSON.stringify(v, null, 1) + '\n');

/** Derived grid values as exported and shown: masked to the domains where each model applies, no ±∞. */
export function exportValues(r: PipelineResult, name: string): Float32Array {
  const v = r.grids[name as keyof typeof r.grids];
  if (!v) throw new Error(`no derived grid named ${name}`);
  return v;
}

/** One GeoTIFF to write: its path in the output set, its samples and its tags. */
export interface GridJob {
  readonly path: string;
  readonly values: Float32Array | Uint8Array;
  readonly options: Omit<TiffWriteOptions, 'deflate'>;
}

/**
 * The GeoTIFFs of a run as jobs (so a shell can write them on several threads: the CLI does) and
 * their small side files (.aux.xml category names). Only the derived grids the run asked for
 * (run.grids), never an empty one; domains and the unbounded-β mask always.
 */
export function gridJobs(r: PipelineResult, run?: RunInfo): { jobs: GridJob[]; side: Record<string, Uint8Array> } {
  const jobs: GridJob[] = [];
  const only = run?.grids ? new Set(run.grids) : null;
  // provenance in every GeoTIFF: program, version and time (the parameters are in summary.json)
  const prov = run ? { software: `taperline ${run.version}`, dateTime: tiffTime(run.time) } : {};
  const empty = new Set(emptyGrids(r).map((e) => e.name));
  for (const g of DERIVED) {
    if (empty.has(g.name) || !r.grids[g.name] || (only && !only.has(g.name))) continue;
    jobs.push({
      path: `grids/${g.name}.tif`,
      values: exportValues(r, g.name),
      options: {
        noData: 'nan',
        unit: g.unit || undefined,
        description: g.desc,
        metadata: { APPLIES_OVER: APPLIES_TEXT[g.applies], ...(g.name.startsWith('beta') ? { UNBOUNDED: 'no data where beta is unbounded; unbounded-beta.tif marks those cells' } : {}) },
        ...prov,
      },
    });
  }
  const domainColours = new Map(DOMAIN_STYLES.map((d) => [d.code, d.colour] as const));
  jobs.push({
    path: 'grids/domains.tif',
    values: r.classified.domains,
    options: { ...prov, noData: 0, description: `margin domains: ${DOMAIN_NAMES.map((n, k) => `${k} ${n}`).join('; ')}`, colours: domainColours },
  });
  const unbounded = ['neither', 'zero crust (beta-crust unbounded)', 'subsidence beyond McKenzie beta infinity (continental cells)', 'both'];
  jobs.push({
    path: 'grids/unbounded-beta.tif',
    values: r.applied.unboundedBeta,
    options: {
      ...prov,
      description: `unbounded beta: ${unbounded.map((n, k) => `${k} ${n}`).join('; ')}`,
      colours: new Map([[0, [255, 255, 255]], [1, [230, 57, 70]], [2, [69, 123, 157]], [3, [29, 53, 87]]]),
    },
  });
  const side = { 'grids/domains.tif.aux.xml': categories(DOMAIN_NAMES), 'grids/unbounded-beta.tif.aux.xml': categories(unbounded) };
  return { jobs, side };
}

/** The GeoTIFFs of a run written here, one after another (the app's worker; tests). */
export function gridFiles(r: PipelineResult, run?: RunInfo): Record<string, Uint8Array> {
  const { jobs, side } = gridJobs(r, run);
  const files: Record<string, Uint8Array> = {};
  for (const j of jobs) files[j.path] = writeGeoTiff(r.geometry, j.values, j.options);
  return { ...files, ...side };
}

/**
 * Derived grids with no value anywhere (a model that applies to no cell, or inputs it needs missing):
 * not written, so a GIS never gets an empty raster; the summary lists them with the reason.
 */
export function emptyGrids(r: PipelineResult): { name: string; reason: string }[] {
  const out: { name: string; reason: string }[] = [];
  for (const g of DERIVED) {
    const v = r.grids[g.name];
    if (!v) continue; // not kept in this run (listed as not requested)
    let any = false;
    for (let k = 0; k < v.length; k++) if (v[k] === v[k]) { any = true; break; }
    if (any) continue;
    const reason =
      g.name === 'oceanic-depth-anomaly'
        ? 'no oceanic cell is deeper than the age–depth curve allows for crust younger than the rift'
        : `no cell where it applies has the inputs it needs (${APPLIES_TEXT[g.applies]}; see the warnings)`;
    out.push({ name: g.name, reason });
  }
  return out;
}

/** GDAL's PAM side-car with the category names of a class grid (gdalinfo lists them). */
function categories(names: readonly string[]): Uint8Array {
  const esc = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
  return enc.encode(
    `<PAMDataset>\n  <PAMRasterBand band="1">\n    <CategoryNames>\n${names.map((n) => `      <Category>${esc(n)}</Category>`).join('\n')}\n    </CategoryNames>\n  </PAMRasterBand>\n</PAMDataset>\n`,
  );
}

export function tiffTime(iso: string): string | undefined {
  const m = /^(\d{4})-(\d\d)-(\d\d)T(\d\d):(\d\d):(\d\d)/.exec(iso);
  return m ? `${m[1]}:${m[2]}:${m[3]} ${m[4]}:${m[5]}:${m[6]}` : undefined;
}

/** A foreign member (RFC 7946 §6.1) saying what made a GeoJSON file. */
export function provenance(r: PipelineResult, run: RunInfo): Record<string, unknown> {
  return {
    tool: `taperline ${run.version}`,
    time: run.time,
    inputs: Object.values(r.inputs)
      .filter(Boolean)
      .map((v) => ({ name: (v as { name: string }).name, sha256: (v as { sha256?: string }).sha256 ?? null })),
    parameters: 'summary.json',
  };
}

/** Length of each kind of line (km, geodesic, summed over its pieces) and the COT zone's area (km²). */
export function lineFigures(bfc: FeatureCollection): { lengths: Record<string, number>; cot: number } {
  const lengths: Record<string, number> = {};
  for (const f of bfc.features) {
    const k = String(f.properties.kind);
    if (typeof f.properties.length_km === 'number') lengths[k] = Math.round(((lengths[k] ?? 0) + f.properties.length_km) * 1000) / 1000;
  }
  const cot = bfc.features.filter((f) => f.properties.kind === 'cot-zone').reduce((s, f) => s + Number(f.properties.area_km2), 0);
  return { lengths, cot };
}

/** Which parameter or which picks placed each named line, in words. */
export function linesPlacedBy(r: PipelineResult): Record<string, string> {
  return {
    'crustal-taper-limit': r.placedBy.taper,
    'oceanic-limit': r.placedBy.oceanic,
    'oldest-onlapped-crust': String(r.boundaries.pieces.find((q) => q.kind === 'oldest-onlapped-crust')?.properties.placed_by ?? 'not drawn'),
    'necking-line': `parameters neckingFraction × tc0 = ${r.params.neckingFraction * r.params.tc0} m`,
    'coupling-line': `parameter couplingThickness = ${r.params.couplingThickness} m`,
  };
}

export function summary(r: PipelineResult, run: RunInfo, boundaries?: FeatureCollection, domainsInLicence?: FeatureCollection): Record<string, unknown> {
  const inputs = Object.entries(r.inputs)
    .filter(([, v]) => v)
    .map(([role, v]) => {
      const meta = v as { name: string; bytes?: number; sha256?: string; report?: unknown };
      return { role, name: meta.name, bytes: meta.bytes ?? null, sha256: meta.sha256 ?? null, detected: meta.report ?? null };
    });
  const { lengths, cot } = lineFigures(boundaries ?? boundariesGeoJson(r));
  const area = (list: { code: number; cells: number; km2: number }[] | null, exact?: Map<number, number>) =>
    list ? Object.fromEntries(list.map((a) => [DOMAIN_NAMES[a.code], { code: a.code, cells: a.cells, km2: Math.round((exact && a.code > 0 ? exact.get(a.code) ?? 0 : a.km2) * 1000) / 1000 }])) : null;
  // inside the licence: the geodesic areas of the domain polygons clipped exactly to it (cells: by centre)
  let exactInLicence: Map<number, number> | undefined;
  if (r.evidence.licence) {
    exactInLicence = new Map();
    for (const f of (domainsInLicence ?? domainsGeoJson(r, 'licence')).features) {
      const c = Number(f.properties.code);
      exactInLicence.set(c, (exactInLicence.get(c) ?? 0) + Number(f.properties.area_km2));
    }
  }
  return {
    tool: `taperline ${run.version} (${run.tool})`,
    time: run.time,
    caution:
      'Interpretations from depth grids and the parameters below; they depend on the picks, densities and thresholds. Decisions on licences, surveys and drilling belong to qualified professionals and local rules.',
    analysis_grid: {
      crs: r.geometry.crs.id === 'PROJ4' ? r.geometry.crs.proj4 : r.geometry.crs.id,
      crs_name: r.geometry.crs.name,
      nx: r.geometry.nx,
      ny: r.geometry.ny,
      dx: r.geometry.dx,
      dy: r.geometry.dy,
      x0: r.geometry.x0,
      y0: r.geometry.y0,
      registration: r.geometry.registration,
    },
    inputs,
    parameters: r.params,
    parameter_defaults: DEFAULT_PARAMS,
    parameter_units: Object.fromEntries(PARAM_SPECS.map((s) => [s.key, s.unit])),
    oceanward: { azimuth_deg: Math.round(r.oceanward.azimuth * 10) / 10, source: r.oceanward.source },
    evidence: {
      picks: r.evidence.picks.length,
      seismic_lines: r.evidence.lines.length,
      isochrons: r.evidence.isochrons.length,
      calibrated: {
        'crustal-taper-limit': r.calibration.taper ? r.calibration.taper.points.length : 0,
        'oceanic-limit': r.calibration.ocean ? r.calibration.ocean.points.length : 0,
        'oldest-onlapped-crust': r.boundaries.onlap.points.length,
      },
      excluded_picks: r.evidence.picks.filter((q) => q.excluded).map((q) => q.id),
      suspect_picks: r.pickChecks.filter((c) => c.suspect).map((c) => ({ ...c, ...lonLat(r, c.x, c.y) })),
    },
    lines_placed_by: linesPlacedBy(r),
    lines_interrupted_by_moho_gap: r.boundaries.interruptions.filter((q) => q.cause === 'moho-gap').map((q) => ({ kind: q.kind, ...lonLat(r, q.x, q.y) })),
    lines_interrupted_by_unresolved_transition: r.boundaries.interruptions.filter((q) => q.cause === 'unresolved').map((q) => ({ kind: q.kind, ...lonLat(r, q.x, q.y) })),
    grid_rules: Object.fromEntries(DERIVED.map((d) => [d.name, APPLIES_TEXT[d.applies]])),
    grids_not_written: emptyGrids(r),
    grids_not_requested: run.grids ? DERIVED.filter((d) => !run.grids!.includes(d.name)).map((d) => d.name) : [],
    depth_anomaly_reference: r.applied.anomalyReference,
    flagged_cells: snakeKeys({ ...r.derived.flags, ...r.applied.counts, ...classFlagCounts(r.classified.flags) }),
    domain_cells: r.classified.counts,
    continental_blocks: {
      min_block_km2: Math.round(r.classified.minBlockKm2 * 1000) / 1000,
      rule: `isolated continental components at least max(minBlockArea = ${r.params.minBlockArea} km², minBlockCells = ${r.params.minBlockCells} cells)`,
      blocks: r.classified.blocks.map((b) => ({ cells: b.cells, area_km2: Math.round(b.areaKm2 * 1000) / 1000, ...lonLat(r, b.x, b.y) })),
    },
    areas_km2: { whole_grid: area(r.areas.total), inside_licence: area(r.areas.inLicence, exactInLicence), licence: r.licenceName, inside_licence_rule: r.evidence.licence ? 'km2: geodesic area of the domain polygons clipped exactly to the licence (no data: cells whose centre lies inside); cells: cells whose centre lies inside' : null },
    cot_zone_area_km2: Math.round(cot * 1000) / 1000,
    boundary_lengths_km: lengths,
    boundaries_missing: r.boundaries.missing,
    suggested_tc0_m: Number.isFinite(r.derived.suggestedTc0) ? r.derived.suggestedTc0 : null,
    notes: r.boundaries.notes,
    warnings: r.warnings,
  };
}

/** camelCase keys → snake_case (one naming convention in every output). */
function snakeKeys(o: Record<string, number>): Record<string, number> {
  return Object.fromEntries(Object.entries(o).map(([k, v]) => [k.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`), v]));
}

function lonLat(r: PipelineResult, x: number, y: number): { lon: number; lat: number } {
  const [lon, lat] = transformer(r.geometry.crs, WGS84).forward([x, y]);
  return { lon: Math.round(lon * 1e5) / 1e5, lat: Math.round(lat * 1e5) / 1e5 };
}

function classFlagCounts(flags: Uint8Array): Record<string, number> {
  const c = { atypicalOceanic: 0, unresolvedTransition: 0, enclosedThin: 0, inContinentalBlocks: 0, forcedByEvidence: 0 };
  for (let k = 0; k < flags.length; k++) {
    const f = flags[k];
    if (f & FLAG_ATYPICAL_OCEANIC) c.atypicalOceanic++;
    if (f & FLAG_UNRESOLVED) c.unresolvedTransition++;
    if (f & FLAG_ENCLOSED_THIN) c.enclosedThin++;
    if (f & FLAG_BLOCK) c.inContinentalBlocks++;
    if (f & FLAG_FORCED) c.forcedByEvidence++;
  }
  return c;
}

/**
 * Every output file. `grids`: the GeoTIFFs and their side files when the shell writes them itself
 * (the CLI, on worker threads, from gridJobs); written here otherwise.
 */
/** The run's files; `uncertainty` (a sweep's summary block) is added to summary.json when given. */
export function outputFiles(r: PipelineResult, run: RunInfo, grids?: Record<string, Uint8Array>, uncertainty?: Record<string, unknown>): Record<string, Uint8Array> {
  const bfc = boundariesGeoJson(r);
  const domains = domainsGeoJson(r); // inside the licence when one is given (clipped once, used twice)
  const made = provenance(r, run);
  const files: Record<string, Uint8Array> = {
    'boundaries.geojson': json({ ...bfc, generated_by: made }),
    'boundary-lines.geojson': json({ ...boundaryLinesGeoJson(r), generated_by: made }),
    'domains.geojson': json({ ...domains, generated_by: made }),
    ...(r.evidence.licence ? { 'domains-whole-grid.geojson': json({ ...domainsGeoJson(r, 'regional'), generated_by: made }) } : {}),
    ...(grids ?? gridFiles(r, run)),
  };
  if (r.boundaries.inLicence) {
    files['boundaries-whole-grid.geojson'] = json({ ...boundariesGeoJson(r, 'regional'), generated_by: made });
    files['boundary-lines-whole-grid.geojson'] = json({ ...boundaryLinesGeoJson(r, 'regional'), generated_by: made });
  }
  files['summary.json'] = json({ ...summary(r, run, bfc, r.evidence.licence ? domains : undefined), ...(uncertainty ? { uncertainty } : {}) });
  return files;
}
