/**
 * "How sure are we?": the uncertainty settings (every one with its default and source), Run and
 * Cancel, progress, and the sweep's figures: licence areas and zone width as P90 / P50 / P10, the
 * envelope width, and how often thickness could not part the sides. One convention, said once.
 */

import { CONVENTION, DEFAULT_SPEC, SPEC_DOCS } from '../../uncertainty/spec.js';
import { clear, h, reentrySafe } from '../dom.js';
import { sweepCurrent, type Actions, type Store } from '../state.js';
import { num, withUnit } from '../text/format.js';
import { DOMAIN_LABELS } from '../text/labels.js';

/** The settings shown first; the rest are under "More". */
const MAIN = ['realisations', 'seed', 'params.tc0', 'params.taperThreshold', 'params.oceanicThreshold', 'moho.sigmaFar', 'basement.sigmaFar'];
const LABELS: Record<string, string> = {
  realisations: 'Realisations N',
  seed: 'Seed',
  'params.tc0': 'σ of tc0',
  'params.rhoMantle': 'σ of mantle density',
  'params.rhoCrust': 'σ of crust density',
  'params.taperThreshold': 'σ of the taper threshold',
  'params.oceanicThreshold': 'σ of the oceanic-crust threshold',
  'params.riftAge': 'σ of the rift age',
  'basement.sigmaControl': 'Basement σ on control',
  'basement.sigmaFar': 'Basement σ far from control',
  'moho.sigmaControl': 'Moho σ on control',
  'moho.sigmaFar': 'Moho σ far from control',
  rampLength: 'σ rises over (L)',
  correlationLength: 'Correlation length ℓ',
  surfaceCorrelation: 'Basement–Moho error correlation ρ',
};

const defaultOf = (key: string) => key.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown>)[k], DEFAULT_SPEC);

type Fig = { p90: number | null; p50: number | null; p10: number | null };

export function mountUncertainty(el: HTMLElement, store: Store, actions: Actions): void {
  const errors: Record<string, string> = {};
  const field = (d: (typeof SPEC_DOCS)[number]) => {
    const v = store.state.uncertainty[d.key];
    const id = `unc-${d.key.replace('.', '-')}`;
    const input = h('input', { type: 'number', step: 'any', id, value: v === null || v === undefined ? '' : String(v), placeholder: String(defaultOf(d.key)),
      onchange: (e: Event) => {
        const problem = actions.setUncertainty(d.key, (e.target as HTMLInputElement).value);
        if (problem) errors[d.key] = problem;
        else delete errors[d.key];
        render();
      } });
    return h('div', { class: 'param' }, h('label', { for: id, text: LABELS[d.key] ?? d.key }), h('div', { class: 'param-input' }, input, h('span', { class: 'unit', text: d.unit })),
      errors[d.key] ? h('div', { class: 'error', text: errors[d.key] }) : h('div', { class: 'doc', text: `${d.doc} Default ${defaultOf(d.key)}. Source: ${d.source}.` }));
  };
  const figRow = (label: string, f: Fig, unit: string) =>
    h('tr', {}, h('th', { text: label }), ...[f.p90, f.p50, f.p10].map((v) => h('td', { text: v === null ? '—' : withUnit(v, unit) })));
  const renderNow = () => {
    const s = store.state;
    clear(el);
    const running = s.sweepProgress !== null;
    el.append(
      h('p', { class: 'hint', text: 'The same run over many realisations: parameters and the basement and Moho surfaces vary within the ranges below (errors small at seismic lines and picks, growing away from them).' }),
      ...SPEC_DOCS.filter((d) => MAIN.includes(d.key)).map(field),
      h('details', {}, h('summary', { text: 'More uncertainty settings' }), ...SPEC_DOCS.filter((d) => !MAIN.includes(d.key)).map(field)),
      h('div', { class: 'row-buttons' },
        h('button', { class: 'small', id: 'btn-sweep', disabled: running || !s.result, onclick: () => void actions.runSweep() }, 'Run realisations'),
        h('button', { class: 'small', id: 'btn-sweep-cancel', hidden: !running, onclick: () => actions.cancelSweep() }, 'Cancel'),
      ),
      ...(running ? [h('progress', { id: 'sweep-progress', max: 1, value: s.sweepProgress ?? 0 })] : []),
    );
    const sw = s.sweep;
    if (!sw) return;
    const u = sw.summary as {
      licence_areas_km2: { code: number; km2: Fig }[] | null;
      areas_km2: { code: number; km2: Fig }[];
      zone_width_km: { median_of_p50: number | null; stations_crossing: number; stations: number };
      positional_uncertainty_km: { median: number; max: number } | null;
      realisations_sides_joined: number;
    };
    const areas = u.licence_areas_km2 ?? u.areas_km2;
    el.append(
      ...(sweepCurrent(s) ? [] : [h('p', { class: 'warning', id: 'sweep-stale', text: 'The inputs, parameters or excluded picks changed since these realisations: the envelope below is of the earlier run. Run the realisations again.' })]),
      h('div', { class: 'legend-title', text: `${sw.realisations} realisations, seed ${sw.seed}${sw.millis ? ` (${num(sw.millis / 1000, 1)} s)` : ''}` }),
      ...(Object.keys(sw.grids).length ? [] : [h('p', { class: 'hint', id: 'sweep-saved', text: 'Kept with the project: the lines and figures. Run the realisations again for the probability layers.' })]),
      h('p', { class: 'hint', id: 'sweep-convention', text: CONVENTION }),
      h('table', { id: 'sweep-areas', class: 'props' },
        h('tr', {}, h('th', { text: u.licence_areas_km2 ? 'Inside the licence' : 'Whole grid' }), h('th', { text: 'P90' }), h('th', { text: 'P50' }), h('th', { text: 'P10' })),
        ...areas.filter((a) => a.code > 0 && (a.km2.p10 ?? 0) > 0).map((a) => figRow(DOMAIN_LABELS[a.code], a.km2, 'km²')),
      ),
      h('p', { class: 'hint', text: `Zone width along strike: median of the P50 ${u.zone_width_km.median_of_p50 === null ? '—' : withUnit(u.zone_width_km.median_of_p50, 'km')} (${u.zone_width_km.stations_crossing} of ${u.zone_width_km.stations} stations cross both limits; zone-width.csv in the export).` +
        (u.positional_uncertainty_km ? ` Envelope width of the limits: median ${withUnit(u.positional_uncertainty_km.median, 'km')}, largest ${withUnit(u.positional_uncertainty_km.max, 'km')}.` : '') }),
      ...(u.realisations_sides_joined
        ? [h('p', { class: 'warning', id: 'sweep-joined', text: `In ${u.realisations_sides_joined} of ${sw.realisations} realisations crust as thick as the oceanic-limit threshold ran unbroken from the ocean to the landward edge: thickness alone could not part continental from oceanic crust there. Picks or crust-type polygons can.` })]
        : []),
      h('p', { class: 'hint', text: 'Realisations show how the lines move under the uncertainties stated here, not every uncertainty there is (the domain rules themselves, the velocity model, structure the grids do not resolve). Decisions rest with qualified professionals and the local rules.' }),
    );
  };
  const render = reentrySafe(renderNow);
  store.subscribe(['sweep', 'sweepProgress', 'result', 'uncertainty'], render);
  render();
}
