/**
 * The page's frame: header (project actions), caution, a fixed action bar over the map (add files,
 * fit to data, propose lines, export, warnings — reachable on a 1366 × 768 screen without scrolling
 * past the parameters), the left column (data, parameters, export, with a sticky index), the map
 * with its section panel, the right column, and the status line. Panels mount into the slots.
 */

import { h } from './dom.js';

export interface Slots {
  files: HTMLElement;
  params: HTMLElement;
  exports: HTMLElement;
  layers: HTMLElement;
  legend: HTMLElement;
  readout: HTMLElement;
  areas: HTMLElement;
  plan: HTMLElement;
  uncertainty: HTMLElement;
  warnings: HTMLElement;
  map: HTMLElement;
  section: HTMLElement;
  scenario: HTMLElement;
  statusText: HTMLElement;
  statusWarnings: HTMLAnchorElement;
  barWarnings: HTMLButtonElement;
  progress: HTMLProgressElement;
  cancel: HTMLButtonElement;
  fileInput: HTMLInputElement;
  projectInput: HTMLInputElement;
  drop: HTMLElement;
}

export interface LayoutHandlers {
  newProject(): void;
  openProject(): void;
  saveProject(bundle: boolean): void;
  clearLocal(): void;
  about(): void;
  fit(): void;
  propose(): void;
  reloadDemo(): void;
  cancel(): void;
  showWarnings(): void;
}

const section = (id: string, title: string, body: HTMLElement) => h('section', { id: `sec-${id}` }, h('h2', { text: title }), body);

export function buildLayout(app: HTMLElement, on: LayoutHandlers): Slots {
  const s = {
    files: h('div', { class: 'files', id: 'files' }),
    params: h('div', { id: 'params' }),
    exports: h('div', { id: 'export' }),
    layers: h('div', { id: 'layers' }),
    legend: h('div', { id: 'legend' }),
    readout: h('div', { id: 'inspect', class: 'inspect' }),
    areas: h('div', { id: 'areas' }),
    plan: h('div', { id: 'plan' }),
    uncertainty: h('div', { id: 'uncertainty' }),
    warnings: h('div', { id: 'warnings', class: 'warnings' }),
    map: h('div', { id: 'map' }),
    section: h('div', { id: 'section-panel', class: 'section-panel', hidden: true }),
    scenario: h('span', { class: 'scenario', id: 'scenario' }),
    statusText: h('span', { class: 'status-text', text: 'Starting…' }),
    statusWarnings: h('a', { href: '#sec-warnings', id: 'status-warnings', class: 'warnings-link', onclick: (e: Event) => (e.preventDefault(), on.showWarnings()) }) as HTMLAnchorElement,
    barWarnings: h('button', { id: 'bar-warnings', class: 'warnings-link', onclick: () => on.showWarnings() }, 'No warnings') as HTMLButtonElement,
    progress: h('progress', { max: 1, value: 0, hidden: true }) as HTMLProgressElement,
    cancel: h('button', { class: 'small', hidden: true, onclick: () => on.cancel() }, 'Cancel') as HTMLButtonElement,
    fileInput: h('input', { type: 'file', id: 'file-input', multiple: true, accept: '.tif,.tiff,.xyz,.txt,.csv,.dat,.geojson,.json' }) as HTMLInputElement,
    projectInput: h('input', { type: 'file', id: 'project-input', accept: '.json', hidden: true }) as HTMLInputElement,
    drop: h('label', { class: 'drop', id: 'drop' }),
  };
  s.drop.append(h('span', { text: 'Drop GeoTIFF, XYZ or GeoJSON files here, or ' }), h('u', { text: 'choose files' }), s.fileInput);
  const jump = (id: string) => (e: Event) => (e.preventDefault(), document.getElementById(id)?.scrollIntoView({ block: 'start' }));
  app.append(
    h('header', { class: 'top' },
      h('span', { class: 'brand', text: 'Taperline' }),
      s.scenario,
      h('span', { class: 'spacer' }),
      h('button', { id: 'btn-new', title: 'Remove every loaded file and start again with your own data', onclick: () => on.newProject() }, 'New project'),
      h('button', { id: 'btn-open', onclick: () => on.openProject() }, 'Open project'),
      s.projectInput,
      h('button', { id: 'btn-save', onclick: () => on.saveProject(false) }, 'Save project'),
      h('button', { id: 'btn-save-bundle', onclick: () => on.saveProject(true) }, 'Save with data'),
      h('button', { id: 'btn-clear', onclick: () => on.clearLocal() }, 'Clear local data'),
      h('button', { id: 'btn-about', onclick: () => on.about() }, 'About & cautions'),
    ),
    h('div', { class: 'caution', id: 'caution' },
      'Interpretation aid: boundaries depend on picks, densities and thresholds. Decisions on licences, surveys and drilling rest with qualified professionals and local rules. ',
      h('a', { href: '#', onclick: (e: Event) => (e.preventDefault(), on.about()) }, 'More'),
    ),
    h('main', {},
      h('aside', { class: 'left' },
        h('nav', { class: 'index' },
          h('a', { href: '#sec-data', onclick: jump('sec-data') }, 'Data'),
          h('a', { href: '#sec-params', onclick: jump('sec-params') }, 'Parameters'),
          h('a', { href: '#sec-export', onclick: jump('sec-export') }, 'Export'),
        ),
        h('section', { id: 'sec-data' }, h('h2', { text: 'Data' }), s.drop, s.files,
          h('button', { class: 'small', id: 'btn-demo', onclick: () => on.reloadDemo() }, 'Reload the invented demo')),
        section('params', 'Parameters', s.params),
        section('export', 'Export', s.exports),
      ),
      h('div', { id: 'centre' },
        h('div', { class: 'actionbar', id: 'actionbar' },
          h('button', { id: 'btn-add', onclick: () => s.fileInput.click() }, 'Add files'),
          h('button', { id: 'btn-fit', title: 'Zoom the map to the analysis grid', onclick: () => on.fit() }, 'Fit to data'),
          h('button', { id: 'btn-propose', onclick: () => on.propose() }, 'Propose survey lines'),
          h('button', { id: 'btn-export', onclick: jump('sec-export') }, 'Export'),
          s.barWarnings,
        ),
        s.map,
        s.section,
      ),
      h('aside', { class: 'right' },
        section('layers', 'Layers', s.layers),
        section('legend', 'Legend', s.legend),
        section('inspect', 'At cursor', s.readout),
        section('areas', 'Areas and lengths', s.areas),
        section('uncertainty', 'How sure are we? (realisations)', s.uncertainty),
        section('plan', 'Survey plan and sections', s.plan),
        section('warnings', 'Warnings', s.warnings),
      ),
    ),
    h('footer', { id: 'status' }, s.statusText, s.statusWarnings, s.progress, s.cancel),
  );
  return s;
}

/** A question with named answers in a dialog of our own; resolves with the chosen key, or null. */
export function ask(question: string, answers: { key: string; label: string }[]): Promise<string | null> {
  return new Promise((resolve) => {
    const dlg = h('dialog', { id: 'ask' }, h('p', { text: question }),
      h('div', { class: 'ask-buttons' }, ...answers.map((a) => h('button', { id: `ask-${a.key}`, onclick: () => (dlg.close(a.key)) }, a.label)),
        h('button', { id: 'ask-cancel', onclick: () => dlg.close('') }, 'Cancel'))) as HTMLDialogElement;
    dlg.addEventListener('close', () => (dlg.remove(), resolve(dlg.returnValue || null)));
    document.body.append(dlg);
    dlg.showModal();
  });
}
