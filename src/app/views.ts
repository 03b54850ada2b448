/**
 * Views derived from the state for the panels that need more than a slice: the header's scenario
 * line (the demo marking follows what is really loaded), the legend's input (what is on the map),
 * and the readout's probe (the cell under the cursor).
 */

import { WGS84 } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import { rampFor } from './map/raster.js';
import { DEMO_NAME } from './panels/about.js';
import { sweepCurrent, type AppState } from './state.js';
import type { DisplayResult } from './messages.js';
import type { LegendInput } from './text/legend.js';
import type { ReadoutInput } from './text/readout.js';

export function scenarioText(s: AppState): string {
  const demo = s.files.filter((f) => f.demo);
  const own = s.files.filter((f) => !f.demo && !f.error);
  if (demo.length && !own.length) return `${DEMO_NAME} — invented demo data, not a real place`;
  if (demo.length) return `Invented demo data (${DEMO_NAME}) with your files: ${own.map((f) => f.name).join(', ')}`;
  return own.length ? 'Your data (kept in this browser only)' : 'No data loaded';
}

/** The run as the map shows it: with the sweep's grids (probabilities, envelope width) while the sweep varies this run. */
export function shownResult(s: AppState): DisplayResult | null {
  const r = s.result;
  if (!r || !s.sweep || !sweepCurrent(s) || !Object.keys(s.sweep.grids).length) return r;
  return { ...r, grids: { ...r.grids, ...s.sweep.grids } };
}

export function legendInput(s: AppState): LegendInput {
  const r = shownResult(s);
  const feats = ((r?.boundaries as { features?: { properties: Record<string, unknown> }[] })?.features ?? []).map((f) => f.properties);
  const picks = ((r?.picks as { features?: { properties: Record<string, unknown> }[] })?.features ?? []).map((f) => f.properties);
  const has = (role: string) => s.files.some((f) => f.role === role && !f.error && (f.features ?? 0) > 0);
  return {
    layer: s.layer,
    ramp: r && s.layer !== 'domains' && r.grids[s.layer] ? rampFor(s.layer, r.grids[s.layer]) : null,
    placedBy: r?.summary.placedBy ?? null,
    farFromControlKm: r?.summary.farFromControlKm ?? 25,
    present: {
      boundaries: [...new Set(feats.map((p) => String(p.kind)).filter((k) => k !== 'cot-zone'))],
      farPieces: feats.some((p) => p.far_from_control === true),
      cot: feats.some((p) => p.kind === 'cot-zone'),
      licence: has('licence'),
      seismic: has('lines'),
      isochrons: has('isochrons'),
      pickKinds: [...new Set(picks.filter((p) => !p.excluded && !p.suspect).map((p) => String(p.kind)))],
      suspectPicks: picks.some((p) => p.suspect === true && !p.excluded),
      excludedPicks: picks.some((p) => p.excluded === true),
      plan: s.planResult !== null,
      envelope: Boolean(s.sweep && sweepCurrent(s) && s.visible.envelope),
    },
  };
}

export function probe(s: AppState): ReadoutInput | null {
  if (!s.cursor) return null;
  const [lon, lat] = s.cursor;
  const r = s.result;
  if (!r) return { lon, lat };
  const g = r.geometry;
  const [x, y] = transformer(WGS84, { ...g.crs }).forward([lon, lat]);
  const i = Math.round((x - g.x0) / g.dx);
  const j = Math.round((y - g.y0) / g.dy);
  const crs = g.crs.id === 'PROJ4' ? 'analysis CRS' : g.crs.id;
  if (!(i >= 0 && j >= 0 && i < g.nx && j < g.ny)) return { lon, lat, crs, xy: [x, y], cell: null };
  const k = j * g.nx + i;
  const values: Record<string, number> = {};
  for (const [name, v] of Object.entries(shownResult(s)!.grids)) values[name] = v[k];
  return { lon, lat, crs, xy: [x, y], cell: { i, j, domain: r.domains[k], values } };
}
