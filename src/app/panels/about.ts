/** "About & cautions": what the results are, the assumptions, who decides, and where the data stays. */

import { h } from '../dom.js';

export const DEMO_NAME = 'Veyra margin, VM-3 Tessel licence';

export function aboutDialog(): HTMLDialogElement {
  return h(
    'dialog',
    { id: 'about' },
    h('h2', { text: 'About Taperline and its results' }),
    h('p', {
      text:
        'Taperline turns depth grids of the seabed, the top of the basement and the Moho into crustal thickness, stretching (β) and thinning (γ) maps, ' +
        'isostatic and subsidence checks, margin domains and boundary lines for rifted continental margins.',
    }),
    h('h3', { text: 'What the results are' }),
    h('p', {
      text:
        'Interpretations. Every domain and line follows from the Moho and basement picks, the densities, the reference crustal thickness and the thresholds ' +
        'shown under Parameters. Crust type cannot be read from thickness alone: thinned continental crust, oceanic crust and serpentinised mantle can look alike. ' +
        'Each line says whether interpreter picks or the thickness proxy placed it, and how far it is from the nearest pick or seismic line.',
    }),
    h('h3', { text: 'Assumptions' }),
    h('ul', {},
      h('li', { text: 'Local (Airy) isostasy; no flexure, no dynamic topography.' }),
      h('li', { text: 'McKenzie (1978) uniform, instantaneous stretching for the predicted depth and β from subsidence; basement assumed at sea level before rifting.' }),
      h('li', { text: 'Magma-poor margin: thickness rules do not hold on magma-rich margins (seaward-dipping reflectors, thick early oceanic crust).' }),
      h('li', { text: 'Oceanic ages from depth are indicative only and shown as wide ranges.' }),
    ),
    h('h3', { text: 'Who decides' }),
    h('p', {
      text:
        'Licence valuation, survey permits, marine operations and drilling decisions belong to qualified professionals and to the local rules that govern them. ' +
        'Taperline is an aid to their judgement, not a substitute for it.',
    }),
    h('h3', { text: 'Your data' }),
    h('p', { text: 'Everything runs in this browser. Files are not uploaded anywhere; the project is kept in this browser’s storage until you clear it.' }),
    h('p', { class: 'hint', text: `The built-in demo (${DEMO_NAME}) is invented: not a real place, not real data.` }),
    h('form', { method: 'dialog' }, h('button', { text: 'Close' })),
  ) as HTMLDialogElement;
}
