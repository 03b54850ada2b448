/** The Legend panel: entries built by text/legend.ts from what is on the map, drawn as swatches. */

import { clear, h } from '../dom.js';
import type { AppState, Store } from '../state.js';
import { legendEntries, type LegendEntry, type LegendInput } from '../text/legend.js';
import { viridis } from '../colour.js';

function swatchLine(colour: string, dash: readonly number[] | null, width: number, casing = false): SVGSVGElement {
  const ns = 'http://www.w3.org/2000/svg';
  const svg = document.createElementNS(ns, 'svg');
  svg.setAttribute('width', '44');
  svg.setAttribute('height', '12');
  const line = (stroke: string, w: number, d: readonly number[] | null) => {
    const l = document.createElementNS(ns, 'line');
    for (const [k, v] of [['x1', '2'], ['x2', '42'], ['y1', '6'], ['y2', '6'], ['stroke', stroke], ['stroke-width', String(w)]]) l.setAttribute(k, v);
    if (d) l.setAttribute('stroke-dasharray', d.map((x) => x * width).join(' '));
    svg.append(l);
  };
  if (casing) line('#ffffff', width + 2, null);
  line(colour, width, dash);
  return svg;
}

export function entryElement(e: LegendEntry): HTMLElement {
  switch (e.type) {
    case 'title':
      return h('div', { class: 'legend-title', text: e.text });
    case 'hint':
      return h('div', { class: 'hint', id: e.id, text: e.text });
    case 'ramp': {
      const stops = Array.from({ length: 11 }, (_, k) => `rgb(${viridis(k / 10).join(',')}) ${k * 10}%`).join(', ');
      return h('div', {}, h('div', { class: 'ramp', style: `background: linear-gradient(to right, ${stops})` }), h('div', { class: 'ramp-labels' }, ...e.ticks.map((t) => h('span', { text: t }))));
    }
    case 'fill':
      return h('div', { class: 'swatch-row' }, h('span', { class: 'swatch', style: `background: ${e.colour}; ${e.outline ? `border: 2px solid ${e.outline}; opacity: 0.8` : ''}` }), e.label);
    case 'line':
      return h('div', { class: 'swatch-row' }, swatchLine(e.colour, e.dash, e.width, e.casing), e.label);
    case 'dot':
      return h('div', { class: 'swatch-row' }, h('span', { class: 'swatch dot', style: `background: ${e.fill}; border: ${e.strokeWidth}px solid ${e.stroke}` }), e.label);
  }
}

/** What the legend needs from the state: the ramp ends come from the raster layer. */
export type LegendSource = (s: AppState) => LegendInput;

export function mountLegend(el: HTMLElement, store: Store, source: LegendSource): void {
  const render = () => {
    clear(el);
    for (const e of legendEntries(source(store.state))) el.append(entryElement(e));
  };
  store.subscribe(['result', 'layer', 'files', 'planResult', 'visible', 'excludePicks'], render);
  render();
}
