/** Areas and lengths of the run (inside the licence when there is one), and its warnings. */

import { clear, h } from '../dom.js';
import type { Store } from '../state.js';
import { num, withUnit } from '../text/format.js';
import { DOMAIN_LABELS } from '../text/labels.js';

const LINE_WORDS: Record<string, string> = {
  'crustal-taper-limit': 'Crustal taper limit',
  'oceanic-limit': 'Landward limit of oceanic crust',
  'oldest-onlapped-crust': 'Oldest onlapped crust',
  'necking-line': 'Necking line',
  'coupling-line': 'Coupling line',
};

export function mountAreas(el: HTMLElement, store: Store): void {
  const render = () => {
    clear(el);
    const r = store.state.result;
    if (!r) return;
    const s = r.summary;
    const list = s.areasInLicence ?? s.areas;
    // inside a licence the lengths and the COT area come from the exact clip, asked for once the map is drawn
    const f = s.cotAreaKm2 !== null && s.lengths ? { lengths: s.lengths, cotAreaKm2: s.cotAreaKm2 } : store.state.figures?.runKey === r.runKey ? store.state.figures : null;
    const measuring = 'measuring inside the licence…';
    el.append(h('div', { class: 'legend-title', text: s.areasInLicence ? `Inside ${s.licenceName}` : 'Whole grid' }));
    const rows = list.filter((a) => a.code > 0).map((a) => h('tr', {}, h('th', { text: DOMAIN_LABELS[a.code] }), h('td', { text: withUnit(a.km2, 'km²') })));
    const lengths = f
      ? Object.entries(f.lengths).map(([k, v]) => h('tr', {}, h('th', { text: LINE_WORDS[k] ?? k }), h('td', { text: withUnit(v, 'km') })))
      : [h('tr', {}, h('th', { text: 'Line lengths' }), h('td', { class: 'hint', text: measuring }))];
    el.append(
      h('table', { id: 'areas-table' }, ...rows, h('tr', {}, h('th', { text: 'Continent–ocean transition zone' }), h('td', { text: f ? withUnit(f.cotAreaKm2, 'km²') : measuring })), ...lengths),
      h('p', { class: 'hint', text: `Geodesic (WGS 84). Oceanward azimuth ${num(s.oceanwardAzimuth, 0)}°. Computed in ${num(r.millis)} ms.` }),
    );
  };
  store.subscribe(['result', 'figures'], render);
  render();
}

export function mountWarnings(el: HTMLElement, store: Store): void {
  const render = () => {
    clear(el);
    const w = store.state.result?.summary.warnings ?? [];
    if (!w.length) el.append(h('p', { class: 'hint', text: 'None.' }));
    for (const text of w) el.append(h('p', { class: 'warning', text }));
  };
  store.subscribe(['result'], render);
  render();
}
