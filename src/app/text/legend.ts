/**
 * The legend as data: which entries to show for what is on the map, in words, with the symbol of
 * each. Only what exists is listed (no proposed-line symbols before a plan, no pick kinds the file
 * lacks). Ramp labels are three ticks (low, middle, high), which cannot collide at legend width.
 */

import { APPLIES_TEXT, DERIVED } from '../../derive/grids.js';
import { DOMAIN_STYLES } from '../../domains/styles.js';
import { BOUNDARY_STYLES, COLOURS, COT_FILL, ENVELOPE_DASH, EXCLUDED_PICK, PICK_STYLES, SUSPECT_PICK } from '../map/styles.js';
import { num, withUnit } from './format.js';
import { DOMAIN_LABELS, layerLabel, PICK_KIND_LABELS, SWEEP_LAYERS } from './labels.js';

export type LegendEntry =
  | { readonly type: 'title'; readonly text: string }
  | { readonly type: 'hint'; readonly text: string; readonly id?: string }
  | { readonly type: 'ramp'; readonly ticks: readonly string[] }
  | { readonly type: 'fill'; readonly colour: string; readonly label: string; readonly outline?: string }
  | { readonly type: 'line'; readonly colour: string; readonly dash: readonly number[] | null; readonly width: number; readonly label: string; readonly casing?: boolean }
  | { readonly type: 'dot'; readonly fill: string; readonly stroke: string; readonly strokeWidth: number; readonly label: string };

export interface LegendInput {
  readonly layer: string;
  /** The raster ramp's ends (values in the grid's unit), when a grid is shown. */
  readonly ramp: { min: number; max: number } | null;
  readonly placedBy: Record<string, string> | null;
  readonly farFromControlKm: number;
  /** What is on the map now. */
  readonly present: {
    readonly boundaries: readonly string[];
    readonly farPieces: boolean;
    readonly cot: boolean;
    readonly licence: boolean;
    readonly seismic: boolean;
    readonly isochrons: boolean;
    readonly pickKinds: readonly string[];
    readonly suspectPicks: boolean;
    readonly excludedPicks: boolean;
    readonly plan: boolean;
    /** The sweep's P90 / P10 lines are drawn. */
    readonly envelope?: boolean;
  };
}

export function legendEntries(inp: LegendInput): LegendEntry[] {
  const out: LegendEntry[] = [{ type: 'title', text: layerLabel(inp.layer) }];
  if (inp.layer === 'domains') {
    for (const d of DOMAIN_STYLES) out.push({ type: 'fill', colour: `rgb(${d.colour.join(',')})`, label: DOMAIN_LABELS[d.code] });
  } else if (SWEEP_LAYERS[inp.layer]) {
    if (inp.ramp) {
      const km = inp.layer === 'positional-uncertainty';
      const tick = (v: number) => (km ? withUnit(v, 'km') : num(v, 2));
      out.push({ type: 'ramp', ticks: [tick(inp.ramp.min), tick((inp.ramp.min + inp.ramp.max) / 2), tick(inp.ramp.max)] });
    }
    out.push({ type: 'hint', id: 'sweep-layer', text: inp.layer === 'positional-uncertainty' ? 'Width of the P90–P10 envelope of the taper limit and of the oceanic limit along the oceanward direction, over the envelope.' : 'Share of the realisations in which the cell has this crust type (the thickness rules applied to each realisation).' });
  } else {
    const info = DERIVED.find((d) => d.name === inp.layer);
    if (info && inp.ramp) {
      const mid = (inp.ramp.min + inp.ramp.max) / 2;
      const tick = (v: number) => (info.unit ? withUnit(v, info.unit) : num(v, 2));
      out.push({ type: 'ramp', ticks: [tick(inp.ramp.min), tick(mid), tick(inp.ramp.max)] });
    }
    if (info && info.applies !== 'all') out.push({ type: 'hint', id: 'grid-rule', text: `Shown over ${APPLIES_TEXT[info.applies]}.` });
    if (/^beta/.test(inp.layer)) out.push({ type: 'hint', text: 'Unbounded β (zero crust, or subsidence beyond β = ∞) is no data here; the unbounded-beta grid in the exports marks those cells.' });
  }
  const p = inp.present;
  if (p.boundaries.length || p.cot) out.push({ type: 'title', text: 'Boundaries' });
  if (inp.placedBy && p.boundaries.length) {
    const words: [string, string][] = [['crustal-taper-limit', 'Taper limit'], ['oceanic-limit', 'Oceanic limit'], ['oldest-onlapped-crust', 'Oldest onlapped crust']];
    out.push({ type: 'hint', id: 'placed-by', text: words.filter(([k]) => inp.placedBy![k]).map(([k, label]) => `${label}: ${inp.placedBy![k]}`).join(' · ') });
  }
  for (const s of BOUNDARY_STYLES) if (p.boundaries.includes(s.kind)) out.push({ type: 'line', colour: s.colour, dash: s.dash, width: s.width, label: s.label, casing: true });
  if (p.cot) out.push({ type: 'fill', colour: COT_FILL, outline: COT_FILL, label: 'Continent–ocean transition zone' });
  if (p.envelope) {
    out.push({ type: 'line', colour: '#555555', dash: ENVELOPE_DASH, width: 1.5, label: 'P90 and P10 of each line (the envelope): P90 is reached in 90 % of the realisations, P10 in 10 %' });
  }
  if (p.boundaries.length) {
    out.push({ type: 'line', colour: '#555555', dash: null, width: 4.5, label: 'Placed by picks (bold)' });
    out.push({ type: 'line', colour: '#555555', dash: null, width: 2, label: 'Placed by the thickness proxy (thin)' });
    if (p.farPieces) out.push({ type: 'line', colour: 'rgba(85,85,85,0.45)', dash: null, width: 1.5, label: `Proxy more than ${num(inp.farFromControlKm, 0)} km from any pick or seismic line (faded)` });
  }
  if (p.licence || p.seismic || p.isochrons || p.pickKinds.length) out.push({ type: 'title', text: 'Evidence' });
  if (p.licence) out.push({ type: 'line', colour: COLOURS.licence, dash: [2.5, 1], width: 2, label: 'Licence' });
  if (p.seismic) out.push({ type: 'line', colour: COLOURS.seismic, dash: null, width: 1.6, label: 'Existing seismic line (click for its section)' });
  for (const k of Object.keys(PICK_STYLES)) {
    if (!p.pickKinds.includes(k)) continue;
    const s = PICK_STYLES[k];
    out.push({ type: 'dot', fill: s.fill, stroke: s.stroke, strokeWidth: s.strokeWidth, label: `${PICK_KIND_LABELS[k]} (click for its checks)` });
  }
  if (p.suspectPicks) out.push({ type: 'dot', fill: SUSPECT_PICK, stroke: '#000000', strokeWidth: 1.5, label: 'Suspect pick: disagrees with its neighbours or lies far from the line' });
  if (p.excludedPicks) out.push({ type: 'dot', fill: EXCLUDED_PICK, stroke: '#000000', strokeWidth: 1.5, label: 'Pick excluded by you' });
  if (p.isochrons) out.push({ type: 'line', colour: COLOURS.isochron, dash: [1, 1.5], width: 2, label: 'Magnetic isochron', casing: true });
  if (p.plan) {
    out.push({ type: 'title', text: 'Survey proposal' });
    out.push({ type: 'line', colour: COLOURS.dip, dash: null, width: 3, label: 'Proposed dip line' });
    out.push({ type: 'line', colour: COLOURS.strike, dash: null, width: 2.5, label: 'Proposed strike (tie) line' });
    out.push({ type: 'fill', colour: COLOURS.gap, label: 'Coverage gap on the zone midline' });
  }
  return out;
}
