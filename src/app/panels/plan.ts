/** Survey planning: its values, "Propose lines", the programme and the ranked proposals. */

import { DEFAULT_PLAN, PLAN_SPECS } from '../../survey/params.js';
import { clear, download, h, reentrySafe } from '../dom.js';
import type { Actions, Store } from '../state.js';
import { num, withUnit } from '../text/format.js';

const MAIN = ['spacingKm', 'overhangLandwardKm', 'overhangOceanwardKm', 'clipToLicence', 'costPerKm'];

export function mountPlan(el: HTMLElement, store: Store, actions: Actions): void {
  const field = (spec: (typeof PLAN_SPECS)[number]) => {
    const v = store.state.plan[spec.key] ?? DEFAULT_PLAN[spec.key];
    const input = spec.boolean
      ? h('input', { type: 'checkbox', id: `plan-${spec.key}`, checked: v === true, onchange: (e: Event) => actions.setPlan(spec.key, (e.target as HTMLInputElement).checked) })
      : h('input', { type: 'number', step: 'any', id: `plan-${spec.key}`, value: v === null ? '' : String(v), placeholder: spec.nullable ? 'not set' : '',
          onchange: (e: Event) => actions.setPlan(spec.key, (e.target as HTMLInputElement).value === '' ? null : Number((e.target as HTMLInputElement).value)) });
    return h('div', { class: 'param' }, h('label', { for: `plan-${spec.key}`, text: spec.label }), h('div', { class: 'param-input' }, input, h('span', { class: 'unit', text: spec.unit })),
      h('div', { class: 'doc', text: `${spec.doc} Default ${DEFAULT_PLAN[spec.key] ?? 'none'}. Source: ${spec.source}.` }));
  };
  const renderNow = () => {
    clear(el);
    el.append(
      h('p', { class: 'warning', text: 'Planning aid only: marine surveys need permits, environmental mitigation and qualified operators, under local rules.' }),
      h('button', { class: 'small', id: 'btn-draw', onclick: () => actions.startDrawing() }, 'Draw a section line'),
      h('p', { class: 'hint', text: 'Or click an existing or proposed line to see its section.' }),
      ...PLAN_SPECS.filter((sp) => MAIN.includes(sp.key)).map(field),
      h('details', {}, h('summary', { text: 'More planning parameters' }), ...PLAN_SPECS.filter((sp) => !MAIN.includes(sp.key)).map(field)),
      h('button', { class: 'small', id: 'btn-plan', onclick: () => void actions.propose() }, 'Propose lines'),
    );
    const result = store.state.planResult;
    if (!result) return;
    const pr = result.programme;
    const fc = result.lines as { features: { properties: Record<string, unknown>; geometry: { coordinates: [number, number][] } }[] };
    el.append(
      h('table', { id: 'programme', class: 'props' },
        h('tr', {}, h('th', { text: 'Lines' }), h('td', { text: String(pr.lines) })),
        h('tr', {}, h('th', { text: 'Line length (geodesic)' }), h('td', { text: withUnit(pr.lineKm, 'km') })),
        h('tr', {}, h('th', { text: 'Acquisition' }), h('td', { text: `${num(pr.totalDays, 1)} days incl. downtime (${num(pr.productiveHours, 0)} h productive)` })),
        h('tr', {}, h('th', { text: 'Cost' }), h('td', { text: pr.cost === null ? 'set a cost per line-km' : num(pr.cost, 0) })),
      ),
      h('div', { class: 'legend-title', text: 'Ranked proposals (cut the list at your budget)' }),
      h('p', { class: 'hint', id: 'plan-ranked-by', text: `Ranked ${result.rankedBy}.${/envelope/.test(result.rankedBy) ? '' : ' Run the realisations (How sure are we?) to rank by the uncertainty each line would remove.'}` }),
      h('table', { id: 'proposal-list', class: 'props' },
        h('tr', {}, h('th', { text: '#' }), h('th', { text: 'Line' }), h('th', { text: 'km' }), h('th', { text: 'Total km' }), h('th', { text: 'Record s' }), h('th', { text: '' })),
        ...fc.features.map((f) => h('tr', {},
          h('td', { text: String(f.properties.rank) }),
          h('td', {
            text: `${f.properties.id} (${f.properties.kind === 'strike' ? 'tie' : 'dip'})`,
            title: f.properties.kind === 'strike' ? `ties ${(f.properties.ties as string[] | null)?.join(', ') ?? '—'}; ${f.properties.note ?? ''}` : String(f.properties.note ?? ''),
          }),
          h('td', { text: num(Number(f.properties.length_km), 1) }),
          h('td', { text: num(Number(f.properties.cumulative_km), 0) }),
          h('td', { text: String(f.properties.record_length_s) }),
          h('td', {}, h('button', { class: 'small', title: 'Show its section', onclick: () => void actions.openSection(f.geometry.coordinates, `Proposed line ${f.properties.id}`) }, 'View')),
        )),
      ),
      h('p', { class: 'hint', text: result.dropped.length ? `Dropped: ${result.dropped.map((d) => `${d.id} (${d.reason})`).join('; ')}` : 'No proposal dropped.' }),
      h('p', { class: 'hint', text: 'Yellow stretches on the midline: farther than half the spacing from any existing line or pick.' }),
      h('button', { class: 'small', id: 'export-plan-geojson', onclick: () => download('survey-lines.geojson', result.geojson, 'application/geo+json') }, 'survey-lines.geojson'),
      h('button', { class: 'small', id: 'export-plan-csv', onclick: () => download('survey-lines.csv', result.csv, 'text/csv') }, 'survey-lines.csv'),
    );
  };
  const render = reentrySafe(renderNow);
  store.subscribe(['planResult', 'plan'], render);
  render();
}
