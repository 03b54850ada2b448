/**
 * Browser shell bootstrap: the store, the worker engine, the map, the panels and the actions that
 * join them. It computes nothing of the science itself; the pipeline runs in the worker
 * (src/app/worker.ts). Changes flow one way: an action updates the store, panels and map layers
 * re-render from the slices they subscribe to; runs and autosave follow from the same subscriptions.
 */

import 'maplibre-gl/dist/maplibre-gl.css';
import { resolveParams } from '../params.js';
import { loadProject, type StoredProject } from './autosave-db.js';
import { download } from './dom.js';
import { Engine } from './engine.js';
import { ask, buildLayout } from './layout.js';
import { renderMapImage } from './map-image.js';
import { wireMap, type Drawing } from './map/interact.js';
import { RasterLayer } from './map/raster.js';
import { createMapView } from './map/view.js';
import { Store, sweepCurrent, type Actions } from './state.js';
import { countOf } from './text/format.js';
import { layerLabel } from './text/labels.js';
import { aboutDialog } from './panels/about.js';
import { legendInput, probe, scenarioText, shownResult } from './views.js';
import { mountAreas, mountWarnings } from './panels/areas.js';
import { mountExport } from './panels/export.js';
import { mountFiles } from './panels/files.js';
import { mountLayers } from './panels/layers.js';
import { mountLegend } from './panels/legend.js';
import { mountParams } from './panels/params.js';
import { mountPlan } from './panels/plan.js';
import { mountUncertainty } from './panels/uncertainty.js';
import { mountReadout } from './panels/readout.js';
import { mountSection } from './panels/section.js';
import type { Ctx } from './actions/context.js';
import * as files from './actions/files.js';
import * as persist from './actions/persist.js';
import { cancelRun, run, scheduleRun } from './actions/run.js';
import * as sweeps from './actions/sweep.js';

const VERSION = '0.1.0';
const store = new Store();
const engine = new Engine(() => store.state.files);
let nextId = 1;

const about = aboutDialog();
const slots = buildLayout(document.getElementById('app')!, {
  newProject: () => actions.newProject(),
  openProject: () => slots.projectInput.click(),
  saveProject: (bundle) => void persist.saveProjectFile(ctx, bundle),
  clearLocal: () => void persist.clearLocal(),
  about: () => about.showModal(),
  fit: () => actions.fitToData(),
  propose: () => void actions.propose(),
  reloadDemo: () => void actions.loadDemo(),
  cancel: () => actions.cancelRun(),
  showWarnings: () => actions.showWarnings(),
});
document.body.append(about);

const view = createMapView(slots.map);
const raster = new RasterLayer();
const ctx: Ctx = {
  store,
  engine,
  view,
  version: VERSION,
  status: (text, error = false) => store.update({ status: { ...store.state.status, text, error } }),
  newId: () => `f${nextId++}`,
  ask,
};
let drawing: Drawing;

const actions: Actions = {
  addFiles: (list) => files.addFiles(ctx, list),
  removeFile: (id) => files.removeFile(ctx, id),
  setRole: (id, role) => files.setRole(ctx, id, role),
  override: (id, key, value) => files.override(ctx, id, key, value),
  loadDemo: () => files.loadDemo(ctx, true),
  newProject: () => files.newProject(ctx),
  setParam(key, raw) {
    const spec = (raw: string) => (raw.trim() === '' ? null : Number.isNaN(Number(raw)) ? raw : Number(raw));
    const next = { ...store.state.params, [key]: spec(raw) };
    try {
      resolveParams(next);
      const { [key]: _gone, ...errors } = store.state.paramErrors;
      store.update({ params: next, paramErrors: errors });
    } catch (err) {
      store.update({ paramErrors: { ...store.state.paramErrors, [key]: (err as Error).message } });
    }
  },
  resetParams: () => store.update({ params: store.state.files.some((f) => f.demo) ? { ...files.DEMO_PARAMS } : {}, paramErrors: {} }),
  setPlan: (key, value) => store.update({ plan: { ...store.state.plan, [key]: value } }),
  async propose() {
    try {
      ctx.status('Proposing lines…');
      const r = await engine.plan(store.state.plan);
      store.update({ planResult: r });
      ctx.status(`Proposed ${r.programme.lines} lines, ${Math.round(r.programme.lineKm)} line-km.${r.warnings.length ? ' ' + r.warnings.join(' ') : ''}`);
      window.__taperline.planned = (window.__taperline.planned ?? 0) + 1;
    } catch (err) {
      ctx.status(`Planning: ${(err as Error).message}`, true);
    }
  },
  startDrawing: () => drawing.start(),
  async openSection(lonlat, title) {
    try {
      view.setSource('drawn', { type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: lonlat } }] });
      const section = await engine.section(lonlat, title);
      store.update({ section });
      ctx.status(`${title}: ${section.lengthKm.toFixed(1)} km, ${section.crossings.length} boundary crossings.`);
    } catch (err) {
      ctx.status(`Section: ${(err as Error).message}`, true);
    }
  },
  closeSection: () => (store.update({ section: null }), view.setSource('drawn', null)),
  async exportFile(path, type) {
    ctx.status('Preparing export…');
    const out = await engine.exportAll(VERSION);
    if (!out[path] && path.startsWith('uncertainty/')) return ctx.status(`${path}: run the realisations for this run first (How sure are we?)`, true);
    if (!out[path]) return ctx.status(`${path} is not written for this run: the grid holds no value anywhere (see the summary's grids_not_written)`, true);
    download(path.split('/').pop()!, out[path], type);
    ctx.status(`Exported ${path}`);
  },
  async exportImage() {
    const s = store.state;
    const png = await renderMapImage(view.map, {
      title: layerLabel(s.layer),
      subtitle: scenarioText(s),
      legend: legendInput(s),
      crs: s.result ? `${s.result.geometry.crs.id === 'PROJ4' ? 'analysis CRS (proj4)' : s.result.geometry.crs.id} ${s.result.geometry.crs.name}` : '',
      demo: s.files.some((f) => f.demo),
    });
    download('taperline-map.png', await png.arrayBuffer(), 'image/png');
  },
  fitToData: () => store.state.result && view.fitTo(store.state.result.geometry),
  cancelRun: () => cancelRun(ctx),
  togglePick(id) {
    const ex = store.state.excludePicks;
    store.update({ excludePicks: ex.includes(id) ? ex.filter((q) => q !== id) : [...ex, id] });
  },
  showWarnings: () => document.getElementById('sec-warnings')?.scrollIntoView({ block: 'start' }),
  setUncertainty: (key, raw) => sweeps.setUncertainty(ctx, key, raw),
  runSweep: () => sweeps.runSweep(ctx),
  cancelSweep: () => sweeps.cancelSweep(ctx),
};
drawing = wireMap(view, store, actions, (t) => ctx.status(t));

// ---------------------------------------------------------------- panels
mountFiles(slots.files, store, actions);
mountParams(slots.params, store, actions);
mountExport(slots.exports, actions);
mountLayers(slots.layers, store);
mountLegend(slots.legend, store, legendInput);
mountReadout(slots.readout, store, probe);
mountAreas(slots.areas, store);
mountPlan(slots.plan, store, actions);
mountUncertainty(slots.uncertainty, store, actions);
mountWarnings(slots.warnings, store);
mountSection(slots.section, store, actions);

// ---------------------------------------------------------------- map layers from the state
const empty = { type: 'FeatureCollection', features: [] };
store.subscribe(['result', 'layer', 'opacity', 'sweep'], (s) => view.overlay.setProps({ layers: raster.layers(shownResult(s), s.layer, s.opacity) }));
store.subscribe(['result', 'files', 'visible', 'planResult', 'sweep'], (s) => {
  const r = s.result;
  const vec = (role: string) => s.files.find((f) => f.kind === 'vector' && f.role === role && !f.error)?.display ?? empty;
  view.setSource('boundaries', r?.boundaries ?? empty);
  view.setSource('outlines', r?.domainOutlines ?? empty);
  view.setSource('licence', vec('licence'));
  view.setSource('seismic', vec('lines'));
  view.setSource('picks', r ? r.picks : vec('picks'));
  view.setSource('isochrons', vec('isochrons'));
  view.setSource('proposals', s.planResult?.lines ?? empty);
  view.setSource('midline', s.planResult?.midline ?? empty);
  view.setSource('gaps', s.planResult?.gaps ?? empty);
  view.setSource('envelope', s.sweep && sweepCurrent(s) ? s.sweep.lines : empty);
  view.applyVisibility(s.visible);
});
void view.loaded.then(() => view.applyVisibility(store.state.visible));

// ---------------------------------------------------------------- header, status line
store.subscribe(['files'], (s) => {
  slots.scenario.textContent = scenarioText(s);
  slots.scenario.classList.toggle('demo', s.files.some((f) => f.demo));
});
store.subscribe(['status', 'result'], (s) => {
  slots.statusText.textContent = s.status.text;
  slots.statusText.title = s.status.text; // the whole text on hover (the line may be cut)
  slots.statusText.classList.toggle('error', s.status.error);
  const n = s.result?.summary.warnings.length ?? 0;
  slots.statusWarnings.textContent = s.result ? countOf(n, 'warning') : '';
  slots.barWarnings.textContent = s.result ? countOf(n, 'warning').replace(/^no/, 'No') : 'No warnings';
  slots.barWarnings.classList.toggle('has-warnings', n > 0);
});
store.subscribe(['progress'], (s) => {
  slots.progress.hidden = !s.progress;
  slots.cancel.hidden = !s.progress;
  if (s.progress) slots.progress.value = s.progress.fraction;
});

// ---------------------------------------------------------------- runs and autosave follow the state
store.subscribe(['files', 'params', 'excludePicks'], () => scheduleRun(ctx));
let outlines = store.state.visible.outlines;
store.subscribe(['visible'], (s) => {
  if (s.visible.outlines && !outlines && s.result && !s.result.domainOutlines) scheduleRun(ctx);
  outlines = s.visible.outlines;
});
let restoring = true;
store.subscribe(['files', 'params', 'layer', 'opacity', 'visible', 'plan', 'excludePicks', 'uncertainty', 'sweep'], () => restoring || persist.autosave(ctx));
view.map.on('moveend', () => restoring || persist.autosave(ctx));

// ---------------------------------------------------------------- files in
slots.fileInput.addEventListener('change', () => {
  const list = Array.from(slots.fileInput.files ?? []);
  slots.fileInput.value = '';
  void actions.addFiles(list);
});
slots.projectInput.addEventListener('change', () => {
  const file = slots.projectInput.files?.[0];
  slots.projectInput.value = '';
  if (file) void persist.openProjectFile(ctx, file);
});
for (const target of [slots.drop, slots.map]) {
  target.addEventListener('dragover', (e) => (e.preventDefault(), slots.drop.classList.add('over')));
  target.addEventListener('dragleave', () => slots.drop.classList.remove('over'));
  target.addEventListener('drop', (e) => {
    e.preventDefault();
    slots.drop.classList.remove('over');
    if (e.dataTransfer?.files) void actions.addFiles(Array.from(e.dataTransfer.files));
  });
}

// ---------------------------------------------------------------- start
window.__taperline = { ready: false, runs: 0, lastMillis: 0, drawnMillis: 0, figuresMillis: 0, error: null, colourings: () => raster.colourings, state: store.state, map: view.map };
void (async () => {
  let stored: StoredProject | null = null;
  try {
    stored = await loadProject();
  } catch {
    stored = null;
  }
  if (stored && stored.files.length) await persist.restore(ctx, stored);
  else await files.loadDemo(ctx, false);
  restoring = false;
  persist.autosave(ctx);
  await run(ctx);
})();
