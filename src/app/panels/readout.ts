/** The "At cursor" panel: rows from text/readout.ts for the cell under the cursor. */

import { clear, h } from '../dom.js';
import type { AppState, Store } from '../state.js';
import type { ReadoutInput } from '../text/readout.js';
import { readoutRows } from '../text/readout.js';

export function mountReadout(el: HTMLElement, store: Store, probe: (s: AppState) => ReadoutInput | null): void {
  const render = () => {
    clear(el);
    const input = probe(store.state);
    if (!input) {
      el.append(h('p', { class: 'hint', text: 'Move the cursor over the map.' }));
      return;
    }
    el.append(h('table', {}, ...readoutRows(input).map(([a, b]) => h('tr', {}, h('th', { text: a }), h('td', { text: b })))));
  };
  store.subscribe(['cursor', 'result'], render);
  render();
}
