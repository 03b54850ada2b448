/** The Data panel: each loaded file with its role, what the reader found, and overrides. */

import { INPUT_ROLES } from '../../io/project.js';
import { clear, h } from '../dom.js';
import type { Actions, Store } from '../state.js';
import { num } from '../text/format.js';
import { ROLE_LABELS } from '../text/labels.js';

export function mountFiles(el: HTMLElement, store: Store, actions: Actions): void {
  const render = () => {
    clear(el);
    if (store.state.filesNote) el.append(h('p', { class: 'warning', id: 'files-note', text: store.state.filesNote }));
    for (const f of store.state.files) {
      const role = h('select', { class: 'role', 'data-file': f.name, title: 'What this file is used as', onchange: (e: Event) => actions.setRole(f.id, (e.target as HTMLSelectElement).value) },
        ...INPUT_ROLES[f.kind].map((r) => h('option', { value: r, text: ROLE_LABELS[r] ?? r, selected: r === f.role })));
      const rep = f.report;
      const details: (HTMLElement | null)[] = [];
      if (rep) {
        const masked = Object.entries(rep.noData.masked);
        details.push(
          h('div', { class: 'report', text: `${rep.nx} × ${rep.ny} cells of ${num(Math.abs(rep.dx), 1)} m, ${rep.crs.value} (${rep.crs.detail}), ${rep.registration.value === 'area' ? 'cell-centred' : 'node'} samples` }),
          h('div', { class: 'report', text: `Units ${rep.units.value} (${rep.units.detail}); ${rep.sign.value === 'depth' ? 'depth, positive down' : 'elevation, positive up'} (${rep.sign.detail}); no data in ${num(rep.noData.total)} cells${masked.length ? ' (' + masked.map(([k, n]) => `${k}: ${num(n)}`).join(', ') + ')' : ''}` }),
          ...rep.warnings.map((w) => h('div', { class: 'warning', text: w })),
          h('div', { class: 'overrides' },
            h('label', {}, 'Units ', h('select', { onchange: (e: Event) => actions.override(f.id, 'units', (e.target as HTMLSelectElement).value) },
              ...['auto', 'm', 'km', 'ft'].map((u) => h('option', { value: u, text: u === 'auto' ? 'as detected' : u, selected: (f.options.units ?? 'auto') === u })))),
            h('label', {}, ' Sign ', h('select', { onchange: (e: Event) => actions.override(f.id, 'sign', (e.target as HTMLSelectElement).value) },
              ...['auto', 'depth', 'elevation'].map((u) => h('option', { value: u, text: u === 'auto' ? 'as detected' : u, selected: (f.options.sign ?? 'auto') === u })))),
          ),
        );
      }
      if (f.kind === 'grid') {
        // a CRS for files that carry none (XYZ text) or carry one Taperline cannot resolve
        details.push(h('div', { class: 'overrides' }, h('label', {}, 'CRS ',
          h('input', { class: 'crs-input', type: 'text', size: 16, placeholder: 'EPSG code or proj4', value: f.options.crs ?? '',
            onchange: (e: Event) => actions.override(f.id, 'crs', (e.target as HTMLInputElement).value.trim() || 'auto') }))));
      } else if (!f.error) {
        details.push(h('div', { class: 'report', text: `${num(f.features ?? 0)} feature${f.features === 1 ? '' : 's'}` }), ...(f.warnings ?? []).map((w) => h('div', { class: 'warning', text: w })));
      }
      el.append(
        h('div', { class: `file${f.error ? ' has-error' : ''}`, 'data-name': f.name },
          h('div', { class: 'file-head' }, h('span', { class: 'file-name', text: f.name }), role,
            h('button', { class: 'x', title: 'Remove this file', onclick: () => actions.removeFile(f.id) }, '×')),
          f.error ? h('div', { class: 'error file-error', text: f.error }) : null,
          ...details,
        ),
      );
    }
    if (!store.state.files.length) el.append(h('p', { class: 'hint', text: 'No files yet: add a top-basement grid and a Moho grid to start.' }));
  };
  store.subscribe(['files', 'filesNote'], render);
  render();
}
