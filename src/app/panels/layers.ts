/** The Layers panel: which grid the raster shows, its opacity, and the overlays on or off. */

import { DERIVED } from '../../derive/grids.js';
import { clear, h } from '../dom.js';
import { sweepCurrent, type Store } from '../state.js';
import { layerLabel, OVERLAY_LABELS, SWEEP_LAYERS } from '../text/labels.js';

export function mountLayers(el: HTMLElement, store: Store): void {
  const render = () => {
    const s = store.state;
    clear(el);
    const select = h('select', { id: 'layer-select', onchange: (e: Event) => store.update({ layer: (e.target as HTMLSelectElement).value }) },
      h('option', { value: 'domains', text: layerLabel('domains') }),
      ...DERIVED.map((d) => h('option', { value: d.name, text: layerLabel(d.name) })),
      ...(s.sweep && sweepCurrent(s) ? Object.keys(SWEEP_LAYERS).map((k) => h('option', { value: k, text: layerLabel(k) })) : []),
    ) as HTMLSelectElement;
    select.value = s.layer;
    // opacity changes only the layer's props: the colouring is cached (map/raster.ts)
    const opacity = h('input', { type: 'range', min: 0, max: 1, step: 0.05, value: s.opacity, id: 'opacity', 'aria-label': 'Raster opacity',
      oninput: (e: Event) => store.update({ opacity: Number((e.target as HTMLInputElement).value) }) });
    const check = (key: string) =>
      h('label', { class: 'check' }, h('input', { type: 'checkbox', id: `vis-${key}`, checked: s.visible[key],
        onchange: (e: Event) => store.update({ visible: { ...store.state.visible, [key]: (e.target as HTMLInputElement).checked } }) }), ` ${OVERLAY_LABELS[key]}`);
    el.append(
      h('label', { class: 'row' }, h('span', { text: 'Raster' }), select),
      h('label', { class: 'row' }, h('span', { text: 'Opacity' }), opacity),
      ...Object.keys(OVERLAY_LABELS).map(check),
    );
  };
  // re-rendered when the layer or overlays change (from a project, say), not on every opacity step
  store.subscribe(['layer', 'visible', 'sweep', 'result'], render);
  render();
}
