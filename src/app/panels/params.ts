/**
 * The Parameters panel: every interpretive rule as a field with its unit, default, reason and
 * source, grouped; the groups a first run rarely needs start collapsed.
 */

import { DEFAULT_PARAMS, PARAM_SPECS, type ParamSpec } from '../../params.js';
import { clear, h } from '../dom.js';
import type { Actions, AppState, Store } from '../state.js';

const GROUPS: [key: string, title: string, open: boolean][] = [
  ['crust', 'Crust', true],
  ['domains', 'Domains', true],
  ['lines', 'Lines', false],
  ['subsidence', 'Subsidence (McKenzie 1978)', false],
  ['densities', 'Densities', false],
  ['sediment', 'Sediment', false],
  ['age', 'Oceanic age', false],
  ['picks', 'Pick tolerances', false],
];

/** The note under the taper threshold when picks, not the value, place the lines. */
export function calibratedNote(s: AppState): string | null {
  const c = s.result?.summary.calibrated;
  if (!c || (!c.taper && !c.ocean && !c.onlap)) return null;
  return (
    `Picks in use (${c.taper} continental-limit, ${c.ocean} oceanic-limit, ${c.onlap} onlap): the taper limit and the oceanic limit each follow ` +
    'their own picks (the crustal thickness at the picks, interpolated along strike); a line with picks is not placed by its threshold value. ' +
    'Onlap picks move the oldest onlapped crust away from the oceanic limit. Set the picks file to "not used" to apply the values.'
  );
}

function field(spec: ParamSpec, s: AppState, actions: Actions): HTMLElement {
  const current = s.params[spec.key] ?? DEFAULT_PARAMS[spec.key];
  const onchange = (e: Event) => actions.setParam(spec.key, (e.target as HTMLInputElement | HTMLSelectElement).value);
  const input = spec.choices
    ? h('select', { id: `p-${spec.key}`, onchange }, ...spec.choices.map((c) => h('option', { value: c, text: c, selected: c === current })))
    : h('input', { id: `p-${spec.key}`, type: 'number', step: 'any', value: current === null ? '' : String(current), placeholder: spec.nullable ? 'not set' : '', onchange });
  const def = DEFAULT_PARAMS[spec.key];
  const note = calibratedNote(s);
  const placed = s.result?.summary.placedBy;
  return h(
    'div',
    { class: 'param' },
    h('label', { for: `p-${spec.key}`, text: spec.label }),
    h('div', { class: 'param-input' }, input, h('span', { class: 'unit', text: spec.unit })),
    h('div', { class: 'doc', text: `${spec.doc} Default ${def === null ? 'none' : def}${spec.unit && def !== null && !spec.choices ? ' ' + spec.unit : ''}. Source: ${spec.source}.` }),
    s.paramErrors[spec.key] ? h('div', { class: 'error', text: s.paramErrors[spec.key] }) : null,
    spec.key === 'taperThreshold' && note ? h('div', { class: 'warning', id: 'calibration-note', text: note }) : null,
    (spec.key === 'taperThreshold' || spec.key === 'oceanicThreshold') && placed
      ? h('div', { class: 'hint', id: `placed-${spec.key}`, text: `In this run: ${placed[spec.key === 'taperThreshold' ? 'crustal-taper-limit' : 'oceanic-limit']}.` })
      : null,
  );
}

export function mountParams(el: HTMLElement, store: Store, actions: Actions): void {
  let rendering = false;
  let shown = '';
  const render = () => {
    // removing a focused field fires its change and blur handlers, which render again: once is enough
    if (rendering) return;
    rendering = true;
    try {
      const open = new Set([...el.querySelectorAll('details[open]')].map((d) => d.getAttribute('data-group')));
      const first = !el.firstChild;
      clear(el);
      for (const [g, title, openByDefault] of GROUPS) {
        const specs = PARAM_SPECS.filter((s) => s.group === g);
        if (!specs.length) continue;
        el.append(h('details', { 'data-group': g, open: first ? openByDefault : open.has(g) }, h('summary', { text: `${title} (${specs.length})` }), ...specs.map((sp) => field(sp, store.state, actions))));
      }
      el.append(h('button', { class: 'small', onclick: () => actions.resetParams() }, 'Reset to defaults'));
    } finally {
      rendering = false;
    }
  };
  store.subscribe(['params', 'paramErrors'], render);
  // a run changes the notes under the thresholds only when the picks or the placing changed
  store.subscribe(['result'], (s) => {
    const key = `${calibratedNote(s)}|${JSON.stringify(s.result?.summary.placedBy ?? null)}`;
    if (key !== shown) (shown = key), render();
  });
  render();
}
