/** The "at cursor" rows: where the cursor is, which cell, its domain and every grid's value there. */

import { DERIVED } from '../../derive/grids.js';
import { lonLat, num, withUnit } from './format.js';
import { DOMAIN_LABELS, GRID_LABELS } from './labels.js';
import type { Row } from './popup.js';

export interface ReadoutInput {
  readonly lon: number;
  readonly lat: number;
  /** The analysis CRS's name for the map x, y row, and the position in it (none before a run). */
  readonly crs?: string;
  readonly xy?: [number, number];
  /** The cell under the cursor, or null outside the grid. */
  readonly cell?: { i: number; j: number; domain: number; values: Record<string, number> } | null;
}

export function readoutRows(r: ReadoutInput): Row[] {
  const rows: Row[] = [['Position', lonLat(r.lon, r.lat)]];
  if (r.xy && r.crs) rows.push([`Map position (${r.crs})`, `${num(r.xy[0], 0)} m E, ${num(r.xy[1], 0)} m N`]);
  if (r.cell === undefined) return rows;
  if (r.cell === null) {
    rows.push(['Grid cell', 'outside the analysis grid']);
    return rows;
  }
  const { i, j, domain, values } = r.cell;
  rows.push(['Grid cell', `column ${i}, row ${j}`]);
  rows.push(['Domain', DOMAIN_LABELS[domain] ?? String(domain)]);
  for (const info of DERIVED) {
    const v = values[info.name];
    const continental = domain >= 1 && domain <= 3;
    const applies = info.applies === 'all' || (info.applies === 'continental' ? continental : domain === 5);
    const text = Number.isFinite(v)
      ? info.unit ? withUnit(v, info.unit) : num(v, 2)
      : !applies ? `— (${info.applies === 'continental' ? 'continental domains only' : 'oceanic crust only'})` : '—';
    rows.push([GRID_LABELS[info.name], text]);
  }
  return rows;
}
