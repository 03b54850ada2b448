/** The one typed table of messages between the app and its pipeline worker. */

import type { GridReadOptions } from '../io/geotiff-read.js';
import type { GridReadReport } from '../io/report.js';
import type { GridGeometry } from '../grid/geometry.js';

export type GridRole = 'seabed' | 'top-basement' | 'moho';
export type VectorRole = 'licence' | 'lines' | 'picks' | 'isochrons' | 'crust';

export interface DisplayGeometry extends Omit<GridGeometry, 'crs'> {
  readonly crs: { id: string; name: string; proj4: string; epsg?: number; units: 'm' | 'degree' };
}

export interface RunSummary {
  readonly areas: { code: number; cells: number; km2: number }[];
  readonly areasInLicence: { code: number; cells: number; km2: number }[] | null;
  readonly licenceName: string | null;
  /** Line lengths (km) and the COT zone area (km²), inside the licence when there is one; null until
   * the page has asked for them (`figures`: the exact licence clip runs after the map is drawn). */
  readonly lengths: Record<string, number> | null;
  readonly cotAreaKm2: number | null;
  readonly warnings: string[];
  readonly missing: { kind: string; reason: string }[];
  readonly oceanwardAzimuth: number;
  readonly suggestedTc0: number | null;
  /** Picks used to calibrate each line's threshold. */
  readonly calibrated: { taper: number; ocean: number; onlap: number };
  /** Which parameter or which picks placed each line, in words. */
  readonly placedBy: Record<string, string>;
  readonly suspectPicks: number;
  readonly farFromControlKm: number;
}

export interface DisplayResult {
  readonly geometry: DisplayGeometry;
  /** Derived grids by name (Float32, analysis grid), plus 'domains' as codes. */
  readonly grids: Record<string, Float32Array>;
  readonly domains: Uint8Array;
  readonly boundaries: unknown; // RFC 7946 FeatureCollection (whole grid)
  readonly domainOutlines: unknown | null; // RFC 7946 FeatureCollection, when asked for
  /** Picks as used (lon/lat) with their checks: id, kind, line, excluded, suspect, reasons, numbers. */
  readonly picks: unknown; // RFC 7946 FeatureCollection
  readonly summary: RunSummary;
  readonly millis: number;
  /** What the run is made of (uncertainty/sweep.ts runKeyOf): a sweep with another key is out of date. */
  readonly runKey: string;
}

/** Lengths and the COT area inside the licence, for the run the key names. */
export interface LicenceFigures {
  readonly lengths: Record<string, number>;
  readonly cotAreaKm2: number;
}

/** An uncertainty sweep as the page shows and keeps it. */
export interface SweepDisplay {
  readonly runKey: string;
  readonly realisations: number;
  readonly seed: number;
  /** RFC 7946 FeatureCollection of the P90, P50 and P10 lines (properties kind, p). */
  readonly lines: unknown;
  /** Per-cell grids on the analysis grid: p-continental, p-transition, p-oceanic (0–1), positional-uncertainty (km). */
  readonly grids: Record<string, Float32Array>;
  /** The summary block (export/uncertainty.ts uncertaintySummary). */
  readonly summary: Record<string, unknown>;
  readonly millis: number;
}

/**
 * The worker protocol: one typed request → response table. Every request carries a unique id and
 * its reply carries the same id, so two requests of one kind (a file reloaded twice in quick
 * succession, say) can never take each other's replies. Progress messages name the run's id.
 */
export interface Requests {
  'load-grid': { req: { fileId: string; name: string; bytes: ArrayBuffer; options: GridReadOptions & { assumeCrs?: string } }; res: { report: GridReadReport } };
  'load-vector': { req: { fileId: string; name: string; text: string }; res: { features: number; warnings: string[]; display: unknown } };
  'make-demo': { req: Record<string, never>; res: { files: { name: string; bytes: ArrayBuffer }[] } };
  run: {
    req: {
      grids: Partial<Record<GridRole, string>>;
      vectors: Partial<Record<VectorRole, string>>;
      params: Record<string, unknown>;
      /** Domain polygons are built only when their layer is shown. */
      outlines: boolean;
      /** Ids of picks the user excluded. */
      excludePicks: string[];
    };
    res: DisplayResult;
  };
  /** The licence's lengths and COT area for the last run (refused when another run has replaced it). */
  figures: { req: { runKey: string }; res: LicenceFigures };
  export: { req: { time: string; version: string }; res: { files: Record<string, ArrayBuffer> } };
  section: { req: { lonlat: [number, number][]; title: string }; res: SectionData };
  plan: { req: { params: Record<string, unknown> }; res: PlanData };
  /** Realisations of the last run on sub-workers (both cores); progress as stage "realisations". */
  sweep: { req: { spec: Record<string, unknown> }; res: SweepDisplay };
}

export type Kind = keyof Requests;
export type Request<K extends Kind = Kind> = { [P in K]: { id: number; kind: P } & Requests[P]['req'] }[K];
export type Response<K extends Kind> = Requests[K]['res'];

export type ToWorker = Request | { id: number; kind: 'remove'; fileId: string } | { id: number; kind: 'sweep-cancel' };

export interface SectionData {
  readonly title: string;
  readonly chainageKm: Float64Array;
  readonly seabed: Float32Array;
  readonly basement: Float32Array;
  readonly moho: Float32Array;
  readonly domain: Uint8Array;
  readonly crossings: { kind: string; chainageKm: number }[];
  readonly picks: { kind: string; line: string | null; chainageKm: number; offsetKm: number }[];
  readonly csv: string;
  readonly lengthKm: number;
}

export interface PlanData {
  /** What ranked the dip lines, in words (survey/plan.ts). */
  readonly rankedBy: string;
  readonly lines: unknown; // RFC 7946 FeatureCollection of proposed lines (properties as in survey-lines.geojson)
  readonly midline: unknown; // FeatureCollection of the smoothed midline
  readonly gaps: unknown; // FeatureCollection of gap stretches (LineStrings along the midline)
  readonly programme: { lines: number; lineKm: number; productiveHours: number; totalDays: number; cost: number | null };
  readonly dropped: { id: string; kind: string; reason: string }[];
  readonly csv: string;
  readonly geojson: string;
  readonly warnings: string[];
}

export type FromWorker =
  | { id: number; ok: true; value: Response<Kind> }
  | { id: number; ok: false; error: string }
  | { id: number; progress: { stage: string; fraction: number } };
