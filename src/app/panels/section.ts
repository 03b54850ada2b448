/** The section panel under the map: the depth section along a line, its CSV and image. */

import { clear, download, h } from '../dom.js';
import { renderSection, svgToPng } from '../section-view.js';
import type { Actions, Store } from '../state.js';
import { withUnit } from '../text/format.js';

export function mountSection(el: HTMLElement, store: Store, actions: Actions): void {
  const body = h('div', { class: 'section-body', id: 'section-body' });
  const title = h('strong', { id: 'section-title', text: 'Section' });
  const draw = () => {
    clear(body);
    const s = store.state.section;
    el.hidden = !s;
    if (!s) return;
    title.textContent = `${s.title} — ${withUnit(s.lengthKm, 'km')}`;
    const width = Math.max(400, body.clientWidth - 8 || 900);
    body.append(renderSection(s, width, Number(ve.value)));
  };
  const ve = h('select', { id: 'section-ve', 'aria-label': 'Vertical exaggeration', onchange: draw }, ...[1, 2, 5, 10].map((v) => h('option', { value: v, text: v === 1 ? 'VE 1 (true scale)' : `VE ${v}` }))) as HTMLSelectElement;
  const image = async () => {
    const svg = body.querySelector('svg');
    if (!svg) return;
    download('section.png', await (await svgToPng(svg as SVGSVGElement)).arrayBuffer(), 'image/png');
  };
  el.append(
    h('div', { class: 'section-bar' },
      title,
      h('span', { class: 'spacer' }),
      ve,
      h('button', { class: 'small', id: 'section-csv', onclick: () => store.state.section && download('section.csv', store.state.section.csv, 'text/csv') }, 'CSV'),
      h('button', { class: 'small', id: 'section-png', onclick: () => void image() }, 'Image'),
      h('button', { class: 'small', id: 'section-close', onclick: () => actions.closeSection() }, 'Close'),
    ),
    body,
  );
  store.subscribe(['section'], draw);
  draw();
}
