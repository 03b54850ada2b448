// A small synthetic magma-poor margin built inside the tests (not the demo): strike north–south,
// oceanward east, 1 km cells, every thickness profile piecewise linear in the dip coordinate u (km)
// with its kinks on cell centres, so each thickness isoline lies exactly where the profile says.
//
//   u < −100: 35 km │ −100..−60: 35 → 10 km │ −60..0: 10 → 2 km │ 0..4: 2 → 0 km │ 4..24: exhumed
//   mantle (0 km) │ 24..25: 0 → 3 km │ 25..45: thin first oceanic crust 3 → 5 km │ 45..55: 5 → 6.5 km │ 6.5 km
//
// With the default thresholds: taper limit (2 km) at u = 0, landward limit of oceanic crust (4 km)
// at u = 35. Optional Moho gaps (no Moho, basement kept) and picks on dip "lines" (rows).
import { crsFromEpsg, WGS84 } from '../../src/crs/registry.js';
import { transformer } from '../../src/crs/transform.js';
import type { GridGeometry } from '../../src/grid/geometry.js';
import { readGeoJson } from '../../src/io/geojson-read.js';
import type { PipelineInputs } from '../../src/pipeline.js';

export const SYN_NX = 260;
export const SYN_NY = 160;
export const SYN_GEOMETRY: GridGeometry = { nx: SYN_NX, ny: SYN_NY, x0: 370_500, y0: 5_159_500, dx: 1000, dy: -1000, registration: 'area', crs: crsFromEpsg(32631) };
/** u (km) of column i: cell centres at integer u from −130. */
export const uOf = (i: number) => i - 130;
export const xOfU = (u: number) => SYN_GEOMETRY.x0 + (u + 130) * 1000;
export const yOfRow = (j: number) => SYN_GEOMETRY.y0 - j * 1000;
export const TAPER_U = 0;
export const OCEANIC_U = 35; // 4 km on the 3 → 5 km ramp

export function thicknessKm(u: number): number {
  if (u <= -100) return 35;
  if (u <= -60) return 35 - (25 * (u + 100)) / 40;
  if (u <= 0) return 10 - (8 * (u + 60)) / 60;
  if (u <= 4) return 2 - u / 2;
  if (u <= 24) return 0;
  if (u <= 25) return 3 * (u - 24);
  if (u <= 45) return 3 + (2 * (u - 25)) / 20;
  if (u <= 55) return 5 + (1.5 * (u - 45)) / 10;
  return 6.5;
}

/** Water depth (m): 200 m landward, deepening to 4 500 m at the first oceanic crust, shoaling oceanward. */
export function waterDepth(u: number): number {
  if (u <= -100) return 200;
  if (u <= 24) return 200 + (4300 * (u + 100)) / 124;
  return 4500 - (1000 * (u - 24)) / 106;
}

export interface Gap {
  readonly u0: number;
  readonly u1: number;
  readonly j0: number;
  readonly j1: number;
}

export interface SynPick {
  readonly kind: 'continental-limit' | 'oceanic-limit' | 'onlap';
  readonly row: number;
  readonly u: number;
  readonly id?: string;
}

export interface SynOptions {
  readonly gaps?: readonly Gap[];
  readonly picks?: readonly SynPick[];
  /** Extra thick cells (tc set to `km`) as [u, row] pairs. */
  readonly spots?: readonly { u: number; row: number; km: number }[];
  /** Another thickness profile (km) for some rows, e.g. a segment with no gap. */
  readonly profile?: (u: number, row: number) => number;
}

/** A segment where thin continental crust meets thin first oceanic crust with no thinner gap:
 * 10 → 3 km over −60..0, then oceanic 3 → 5 km over 0..20, 5 → 6.5 km over 20..30, 6.5 km. */
export function gaplessKm(u: number): number {
  if (u <= -60) return thicknessKm(u);
  if (u <= 0) return 10 - (7 * (u + 60)) / 60;
  if (u <= 20) return 3 + u / 10;
  if (u <= 30) return 5 + (1.5 * (u - 20)) / 10;
  return 6.5;
}

export const inGap = (gaps: readonly Gap[], u: number, j: number) => gaps.some((g) => u >= g.u0 && u <= g.u1 && j >= g.j0 && j <= g.j1);

export function syntheticInputs(opt: SynOptions = {}): PipelineInputs {
  const n = SYN_NX * SYN_NY;
  const seabed = new Float32Array(n);
  const basement = new Float32Array(n);
  const moho = new Float32Array(n);
  const spots = new Map((opt.spots ?? []).map((s) => [`${s.u},${s.row}`, s.km]));
  for (let j = 0; j < SYN_NY; j++) {
    for (let i = 0; i < SYN_NX; i++) {
      const u = uOf(i);
      const k = j * SYN_NX + i;
      const w = waterDepth(u);
      seabed[k] = w;
      basement[k] = w + 1000;
      const tc = (spots.get(`${u},${j}`) ?? (opt.profile ? opt.profile(u, j) : thicknessKm(u))) * 1000;
      moho[k] = inGap(opt.gaps ?? [], u, j) ? NaN : basement[k] + tc;
    }
  }
  const grid = (name: string, values: Float32Array) => ({ name, grid: { geometry: SYN_GEOMETRY, values } });
  const inputs: PipelineInputs = { basement: grid('tb.tif', basement), moho: grid('moho.tif', moho), seabed: grid('seabed.tif', seabed) };
  if (!opt.picks?.length) return inputs;
  const t = transformer(SYN_GEOMETRY.crs, WGS84);
  const features = opt.picks.map((p) => ({
    type: 'Feature',
    properties: { kind: p.kind, line: `L${p.row}`, ...(p.id ? { id: p.id } : {}) },
    geometry: { type: 'Point', coordinates: t.forward([xOfU(p.u), yOfRow(p.row)]) },
  }));
  const text = JSON.stringify({ type: 'FeatureCollection', features });
  return { ...inputs, picks: { name: 'picks.geojson', set: readGeoJson(text, 'picks.geojson') } };
}

/** Picks of every kind on the given rows, at the true positions (onlap `onlapU`). */
export function picksOnRows(rows: readonly number[], onlapU: number | null): SynPick[] {
  return rows.flatMap((row) => [
    { kind: 'continental-limit' as const, row, u: TAPER_U },
    { kind: 'oceanic-limit' as const, row, u: OCEANIC_U },
    ...(onlapU === null ? [] : [{ kind: 'onlap' as const, row, u: onlapU }]),
  ]);
}
