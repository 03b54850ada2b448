/**
 * Popup rows for what the user clicks: a boundary piece or the COT zone (the exported fields, in
 * words, with units), and a pick with its checks. Keys follow docs/outputs.md.
 */

import { num, withUnit } from './format.js';
import { PICK_KIND_LABELS } from './labels.js';

export type Row = readonly [label: string, value: string];

const KIND_WORDS: Record<string, string> = {
  'crustal-taper-limit': 'Crustal taper limit',
  'oceanic-limit': 'Landward limit of oceanic crust',
  'oldest-onlapped-crust': 'Oldest onlapped crust',
  'necking-line': 'Necking line',
  'coupling-line': 'Coupling line',
  'cot-zone': 'Continent–ocean transition zone',
};

/** Field → label and how to show its value; fields not listed here are not shown. */
const FIELDS: [key: string, label: string, show: (v: unknown) => string][] = [
  ['kind', 'What', (v) => KIND_WORDS[String(v)] ?? String(v)],
  ['placed_by', 'Placed by', String],
  ['rule', 'Rule', String],
  ['evidence', 'Evidence', (v) => ({ picks: 'interpreter picks', proxy: 'thickness proxy', mixed: 'picks and proxy' })[String(v)] ?? String(v)],
  ['evidence_picks_fraction', 'Border placed by picks', (v) => withUnit(Number(v), 'fraction')],
  ['threshold_m', 'Thickness threshold', (v) => withUnit(Number(v), 'm')],
  ['threshold_range_m', 'Threshold along the piece (calibrated by picks)', (v) => range(v, 'm')],
  ['proxy', 'Stands in where no pick is near', (v) => (v === 'oceanic-limit' ? 'the landward limit of oceanic crust' : String(v))],
  ['onlap_offset_km', 'Offset from the oceanic limit', (v) => range(v, 'km')],
  ['far_from_control', 'Far from any pick or seismic line', yesNo],
  ['control_distance_km', 'Farthest from a pick or seismic line', (v) => withUnit(Number(v), 'km')],
  ['ends_at_moho_gap', 'Stops where the Moho is not imaged', yesNo],
  ['ends_at_unresolved', 'Stops where thickness cannot resolve the transition', yesNo],
  ['length_km', 'Length (geodesic)', (v) => withUnit(Number(v), 'km')],
  ['area_km2', 'Area (geodesic)', (v) => withUnit(Number(v), 'km²')],
  ['age_evidence', 'Age from', String],
  ['age_min_ma', 'At least as old as', (v) => withUnit(Number(v), 'Ma')],
  ['age_note', 'Age note', String],
  ['depth_age_min_ma', 'Age from depth', (v) => withUnit(Number(v), 'Ma')],
  ['depth_age_max_ma', 'Age from depth, old end', (v) => withUnit(Number(v), 'Ma')],
  ['depth_age_note', 'Depth-age note', String],
  ['clipped_to_licence', 'Cut to the licence', yesNo],
];

function yesNo(v: unknown): string {
  return v === true || v === 'true' ? 'yes' : 'no';
}

function parsed(v: unknown): unknown {
  if (typeof v !== 'string' || !/^[[{]/.test(v)) return v;
  try {
    return JSON.parse(v);
  } catch {
    return v;
  }
}

function range(v: unknown, unit: string): string {
  const p = parsed(v);
  if (!Array.isArray(p)) return withUnit(Number(p), unit);
  const [a, b] = p.map(Number);
  return a === b || !Number.isFinite(b) ? withUnit(a, unit) : `${withUnit(a, unit)} to ${withUnit(b, unit)}`;
}

/** Rows for a boundary piece or the COT zone; absent and null fields are left out. */
export function boundaryRows(props: Record<string, unknown>): Row[] {
  const rows: Row[] = [];
  for (const [key, label, show] of FIELDS) {
    const v = parsed(props[key]);
    if (v === undefined || v === null || v === 'null') continue;
    if (typeof v === 'boolean' && !v && key !== 'far_from_control') continue; // "no" is the usual case
    rows.push([label, show(v)]);
  }
  return rows;
}

/** Rows for a pick's popup: what it is and what the checks found, with the numbers. */
export function pickRows(p: Record<string, unknown>, excluded: boolean): Row[] {
  const km = (v: unknown) => (v === null || v === undefined || v === 'null' ? '—' : `${num(Number(v) / 1000, 2)} km`);
  const reasons = (parsed(p.reasons) ?? []) as string[];
  const suspect = p.suspect === true || p.suspect === 'true';
  return [
    ['Pick', String(p.id)],
    ['Kind', PICK_KIND_LABELS[String(p.kind)] ?? String(p.kind)],
    ['Seismic line', p.line && p.line !== 'null' ? String(p.line) : '—'],
    ['Crustal thickness at the pick', km(p.thickness_m)],
    [p.kind === 'onlap' ? 'Neighbours’ offset (median)' : 'Neighbours’ thickness (median)', km(p.trend_m)],
    ['Departure from the neighbours', km(p.departure_m)],
    ['Distance from the uncalibrated line', km(p.proxy_distance_m)],
    ['Status', excluded ? 'excluded by you: not used to place any line' : suspect ? `suspect: ${reasons.join('; ')}` : 'consistent with its neighbours'],
  ];
}
