/**
 * Browser shell: map, panels, worker, persistence. It computes nothing of the science itself; the
 * pipeline runs in the worker (src/app/worker.ts) and this file shows what comes back.
 */

import 'maplibre-gl/dist/maplibre-gl.css';
import maplibregl, { type GeoJSONSource, type MapMouseEvent } from 'maplibre-gl';
import { MapboxOverlay } from '@deck.gl/mapbox';
import { BitmapLayer } from '@deck.gl/layers';
import { WGS84 } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import { APPLIES_TEXT, DERIVED } from '../derive/grids.js';
import { guessRole } from '../io/detect.js';
import { parseProject, toBase64, fromBase64, INPUT_ROLES, PROJECT_FORMAT, PROJECT_VERSION, type Project } from '../io/project.js';
import { DEFAULT_PARAMS, PARAM_SPECS, resolveParams, type ParamSpec } from '../params.js';
import { baseStyle, BOUNDARY_STYLES, COT_FILL, graticule, SUSPECT_PICK } from './basemap.js';
import { colourBlock, displayRange, DOMAIN_STYLES, viridis, type RampSpec } from './colour.js';
import { clear, download, fmt, h } from './dom.js';
import { Engine, type LoadedFile } from './engine.js';
import type { DisplayResult, GridRole, VectorRole } from './messages.js';
import { clearAll, loadProject, saveProject, saveState, type StoredProject } from './store.js';
import { tilesFor, type Tile } from './tiles.js';
import { renderMapImage } from './map-image.js';
import { renderSection, svgToPng } from './section-view.js';
import { DEFAULT_PLAN, PLAN_SPECS, resolvePlan } from '../survey/params.js';
import type { PlanData, SectionData } from './messages.js';

const VERSION = '0.1.0';
const DEMO_NAME = 'Veyra margin, VM-3 Tessel licence';
const DEMO_PARAMS = { riftAge: 110 };

declare global {
  interface Window {
    __taperline: {
      ready: boolean;
      runs: number;
      lastMillis: number;
      error: string | null;
      state: typeof state;
      map: maplibregl.Map;
      planned?: number;
    };
  }
}

// ---------------------------------------------------------------- state
const state = {
  files: [] as LoadedFile[],
  params: {} as Record<string, unknown>,
  result: null as DisplayResult | null,
  layer: 'crustal-thickness',
  opacity: 0.85,
  visible: { boundaries: true, cot: true, licence: true, seismic: true, picks: true, isochrons: true, graticule: true, outlines: false } as Record<string, boolean>,
  demo: false,
  running: false,
  rerun: false,
  paramErrors: {} as Record<string, string>,
  /** Survey-planning values the user set; saved with the project. */
  plan: {} as Record<string, unknown>,
  /** Picks the user excluded (ids); saved with the project. */
  excludePicks: [] as string[],
};

let nextId = 1;
const engine = new Engine(() => state.files);

// ---------------------------------------------------------------- layout
const app = document.getElementById('app')!;
const statusText = h('span', { class: 'status-text', text: 'Starting…' });
const progressBar = h('progress', { max: 1, value: 0, hidden: true });
const cancelBtn = h('button', { class: 'small', hidden: true, onclick: () => cancelRun() }, 'Cancel');
const scenario = h('span', { class: 'scenario', id: 'scenario' });
const dataList = h('div', { class: 'files', id: 'files' });
const paramsBox = h('div', { id: 'params' });
const layersBox = h('div', { id: 'layers' });
const legendBox = h('div', { id: 'legend' });
const inspectBox = h('div', { id: 'inspect', class: 'inspect' }, h('p', { class: 'hint', text: 'Move the cursor over the map.' }));
const areasBox = h('div', { id: 'areas' });
const warningsBox = h('div', { id: 'warnings', class: 'warnings' });
const fileInput = h('input', { type: 'file', id: 'file-input', multiple: true, accept: '.tif,.tiff,.xyz,.txt,.csv,.dat,.geojson,.json' }) as HTMLInputElement;
const projectInput = h('input', { type: 'file', id: 'project-input', accept: '.json', hidden: true }) as HTMLInputElement;
const planBox = h('div', { id: 'plan' });
const sectionBody = h('div', { class: 'section-body', id: 'section-body' });
const veSelect = h('select', { id: 'section-ve', onchange: () => drawSection() }, ...[1, 2, 5, 10].map((v) => h('option', { value: v, text: v === 1 ? 'VE 1 (true scale)' : `VE ${v}` }))) as HTMLSelectElement;
const sectionPanel = h(
  'div',
  { id: 'section-panel', class: 'section-panel', hidden: true },
  h('div', { class: 'section-bar' },
    h('strong', { id: 'section-title', text: 'Section' }),
    h('span', { class: 'spacer' }),
    veSelect,
    h('button', { class: 'small', id: 'section-csv', onclick: () => currentSection && download('section.csv', currentSection.csv, 'text/csv') }, 'CSV'),
    h('button', { class: 'small', id: 'section-png', onclick: () => void sectionImage() }, 'Image'),
    h('button', { class: 'small', id: 'section-close', onclick: () => ((sectionPanel.hidden = true), setSource('drawn', { type: 'FeatureCollection', features: [] })) }, 'Close'),
  ),
  sectionBody,
);
const aboutDialog = h(
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
  h('p', { class: 'hint', text: 'The built-in demo (Veyra margin, VM-3 Tessel licence) is invented: not a real place, not real data.' }),
  h('form', { method: 'dialog' }, h('button', { text: 'Close' })),
);

app.append(
  h(
    'header',
    { class: 'top' },
    h('span', { class: 'brand', text: 'Taperline' }),
    scenario,
    h('span', { class: 'spacer' }),
    h('button', { id: 'btn-save', onclick: () => saveProjectFile(false) }, 'Save project'),
    h('button', { id: 'btn-save-bundle', onclick: () => saveProjectFile(true) }, 'Save with data'),
    h('button', { id: 'btn-open', onclick: () => projectInput.click() }, 'Open project'),
    projectInput,
    h('button', { id: 'btn-clear', onclick: () => clearLocal() }, 'Clear local data'),
    h('button', { id: 'btn-about', onclick: () => aboutDialog.showModal() }, 'About & cautions'),
  ),
  h(
    'div',
    { class: 'caution', id: 'caution' },
    'Interpretation aid: boundaries depend on picks, densities and thresholds. Decisions on licences, surveys and drilling rest with qualified professionals and local rules. ',
    h('a', { href: '#', onclick: (e: Event) => (e.preventDefault(), aboutDialog.showModal()) }, 'More'),
  ),
  h(
    'main',
    {},
    h(
      'aside',
      { class: 'left' },
      h('section', {},
        h('h2', { text: 'Data' }),
        h('label', { class: 'drop', id: 'drop' }, h('span', { text: 'Drop GeoTIFF, XYZ or GeoJSON files here, or ' }), h('u', { text: 'choose files' }), fileInput),
        dataList,
        h('button', { class: 'small', id: 'btn-demo', onclick: () => loadDemo(true) }, 'Reload the invented demo'),
      ),
      h('section', {}, h('h2', { text: 'Parameters' }), paramsBox),
      h('section', {}, h('h2', { text: 'Export' }), exportPanel()),
    ),
    h('div', { id: 'centre' }, h('div', { id: 'map' }), sectionPanel),
    h(
      'aside',
      { class: 'right' },
      h('section', {}, h('h2', { text: 'Layers' }), layersBox),
      h('section', {}, h('h2', { text: 'Legend' }), legendBox),
      h('section', {}, h('h2', { text: 'At cursor' }), inspectBox),
      h('section', {}, h('h2', { text: 'Areas and lengths' }), areasBox),
      h('section', {}, h('h2', { text: 'Survey plan and sections' }), planBox),
      h('section', {}, h('h2', { text: 'Warnings' }), warningsBox),
    ),
  ),
  h('footer', { id: 'status' }, statusText, progressBar, cancelBtn),
  aboutDialog,
);

// ---------------------------------------------------------------- map
const map = new maplibregl.Map({
  container: 'map',
  style: baseStyle(),
  center: [-129, -35],
  zoom: 6,
  attributionControl: false,
  canvasContextAttributes: { preserveDrawingBuffer: true, antialias: true },
});
map.addControl(new maplibregl.ScaleControl({ maxWidth: 140, unit: 'metric' }), 'bottom-left');
map.addControl(new maplibregl.NavigationControl({ showCompass: false }), 'top-left');
const overlay = new MapboxOverlay({ interleaved: true, layers: [] });
map.addControl(overlay as unknown as maplibregl.IControl);
const mapLoaded = new Promise<void>((resolve) => map.on('load', () => resolve()));
let tiles: Tile[] = [];
let tileKey = '';

window.__taperline = { ready: false, runs: 0, lastMillis: 0, error: null, state, map };

function setSource(id: string, data: unknown): void {
  const src = map.getSource(id) as GeoJSONSource | undefined;
  src?.setData(data as GeoJSON.FeatureCollection);
}

const layerInfo = (name: string) => DERIVED.find((d) => d.name === name);

function rasterLayers(): BitmapLayer[] {
  const r = state.result;
  if (!r) return [];
  const g = r.geometry;
  const key = `${g.nx}x${g.ny}@${g.x0},${g.y0},${g.dx},${g.dy}:${g.crs.proj4}`;
  if (key !== tileKey) {
    tiles = tilesFor({ ...g, crs: g.crs });
    tileKey = key;
  }
  const isDomains = state.layer === 'domains';
  const values = isDomains ? r.domains : r.grids[state.layer];
  if (!values) return [];
  const ramp = isDomains ? null : rampFor(state.layer, values as Float32Array);
  return tiles.map(
    (t, k) =>
      new BitmapLayer({
        id: `raster-${k}`,
        beforeId: 'domain-outlines',
        image: new ImageData(colourBlock(values, g.nx, t.i0, t.j0, t.w, t.h, isDomains ? { kind: 'domains' } : { kind: 'ramp', ramp: ramp! }) as Uint8ClampedArray<ArrayBuffer>, t.w, t.h),
        bounds: t.bounds,
        opacity: state.opacity,
        textureParameters: { minFilter: 'nearest', magFilter: 'nearest' },
        updateTriggers: { image: `${state.layer}:${window.__taperline.runs}` },
        pickable: false,
      } as never),
  );
}

const rampCache = new Map<string, RampSpec>();
function rampFor(name: string, v: Float32Array): RampSpec {
  const key = `${name}:${window.__taperline.runs}`;
  let r = rampCache.get(key);
  if (!r) {
    r = displayRange(v);
    if (name === 'crustal-thickness' || name === 'airy-thickness') r = { min: 0, max: Math.max(r.max, 1) };
    if (name === 'beta-crust' || name === 'beta-subsidence') r = { min: 1, max: Math.min(Math.max(r.max, 2), 10) };
    if (name === 'gamma') r = { min: 0, max: 1 };
    rampCache.clear();
    rampCache.set(key, r);
  }
  return r;
}

function renderRaster(): void {
  overlay.setProps({ layers: rasterLayers() });
  renderLegend();
}

function renderVectors(): void {
  const r = state.result;
  setSource('boundaries', r ? r.boundaries : { type: 'FeatureCollection', features: [] });
  setSource('outlines', r?.domainOutlines ?? { type: 'FeatureCollection', features: [] });
  const vec = (role: VectorRole) => {
    const f = state.files.find((x) => x.kind === 'vector' && x.role === role && !x.error);
    if (!f) return { type: 'FeatureCollection', features: [] };
    try {
      return JSON.parse(new TextDecoder().decode(f.bytes));
    } catch {
      return { type: 'FeatureCollection', features: [] };
    }
  };
  setSource('licence', vec('licence'));
  setSource('seismic', vec('lines'));
  setSource('picks', r ? r.picks : vec('picks'));
  setSource('isochrons', vec('isochrons'));
  applyVisibility();
}

function applyVisibility(): void {
  const vis = (id: string, on: boolean) => map.getLayer(id) && map.setLayoutProperty(id, 'visibility', on ? 'visible' : 'none');
  for (const s of BOUNDARY_STYLES) (vis(`b-${s.kind}`, state.visible.boundaries), vis(`bfar-${s.kind}`, state.visible.boundaries), vis(`casing-${s.kind}`, state.visible.boundaries));
  vis('cot-zone', state.visible.cot);
  vis('licence', state.visible.licence);
  vis('seismic', state.visible.seismic);
  vis('picks', state.visible.picks);
  vis('isochrons', state.visible.isochrons ?? true);
  vis('graticule', state.visible.graticule);
  vis('domain-outlines', state.visible.outlines);
}

function fitToGrid(): void {
  const r = state.result;
  if (!r) return;
  const g = r.geometry;
  const t = transformer({ ...g.crs }, WGS84);
  const xs: number[] = [];
  const ys: number[] = [];
  for (const [i, j] of [[0, 0], [g.nx - 1, 0], [0, g.ny - 1], [g.nx - 1, g.ny - 1]]) {
    const [lon, lat] = t.forward([g.x0 + i * g.dx, g.y0 + j * g.dy]);
    xs.push(lon);
    ys.push(lat);
  }
  const b: [number, number, number, number] = [Math.min(...xs), Math.min(...ys), Math.max(...xs), Math.max(...ys)];
  map.fitBounds([[b[0], b[1]], [b[2], b[3]]], { padding: 30, duration: 0 });
  setSource('graticule', graticule(b[0], b[1], b[2], b[3], 0.5));
}

// ---------------------------------------------------------------- inspect and click
map.on('mousemove', (e: MapMouseEvent) => inspect(e.lngLat.lng, e.lngLat.lat));
function inspect(lon: number, lat: number): void {
  const r = state.result;
  clear(inspectBox);
  const rows: [string, string][] = [['lon, lat', `${lon.toFixed(5)}°, ${lat.toFixed(5)}°`]];
  if (r) {
    const g = r.geometry;
    const [x, y] = transformer(WGS84, { ...g.crs }).forward([lon, lat]);
    rows.push([`x, y (${g.crs.id === 'PROJ4' ? 'analysis CRS' : g.crs.id})`, `${fmt(x)} m, ${fmt(y)} m`]);
    const i = Math.round((x - g.x0) / g.dx);
    const j = Math.round((y - g.y0) / g.dy);
    if (i >= 0 && j >= 0 && i < g.nx && j < g.ny) {
      const k = j * g.nx + i;
      const d = r.domains[k];
      rows.push(['cell (col, row)', `${i}, ${j}`]);
      rows.push(['domain', d ? DOMAIN_STYLES.find((s) => s.code === d)!.name : 'no data']);
      for (const info of DERIVED) {
        const v = r.grids[info.name][k];
        const digits = info.unit === 'm' ? 0 : info.unit === 'Ma' ? 1 : 3;
        const applies = info.applies === 'all' || (info.applies === 'continental' ? d >= 1 && d <= 3 : d === 5);
        const text = Number.isFinite(v) ? `${fmt(v, digits)}${info.unit ? ' ' + info.unit : ''}` : !applies ? `— (${info.applies === 'continental' ? 'continental domains only' : 'oceanic crust only'})` : '—';
        rows.push([info.name.replace(/-/g, ' '), text]);
      }
    } else rows.push(['', 'outside the analysis grid']);
  }
  inspectBox.append(h('table', {}, ...rows.map(([a, b]) => h('tr', {}, h('th', { text: a }), h('td', { text: b })))));
}

const lineLayers = BOUNDARY_STYLES.flatMap((s) => [`b-${s.kind}`, `bfar-${s.kind}`]);
const clickable = ['cot-zone', 'picks', ...lineLayers];
map.on('click', (e: MapMouseEvent) => {
  if (drawing) {
    drawing.push([e.lngLat.lng, e.lngLat.lat]);
    showDrawn();
    return;
  }
  // priority: a pick, a boundary line, then a seismic line (its section), then the COT zone fill
  const on = (ids: string[]) => map.queryRenderedFeatures(e.point, { layers: ids.filter((id) => map.getLayer(id)) });
  const pickHits = on(['picks']);
  if (pickHits.length) {
    pickPopup(pickHits[0].properties as Record<string, unknown>, e.lngLat);
    return;
  }
  let hits = on(lineLayers);
  if (!hits.length) {
    const lineHits = on(['proposals', 'seismic']);
    if (lineHits.length) {
      const f = lineHits[0];
      const coords = (f.geometry as GeoJSON.LineString).coordinates as [number, number][];
      const name = String(f.properties?.id ?? f.properties?.name ?? 'line');
      void openSection(coords, f.layer.id === 'proposals' ? `Proposed line ${name}` : `Existing line ${name}`);
      return;
    }
    hits = on(['cot-zone']);
  }
  if (!hits.length) return;
  const p = hits[0].properties as Record<string, unknown>;
  const table = h('table', { class: 'props' }, ...Object.entries(p).map(([k, v]) => h('tr', {}, h('th', { text: k.replace(/_/g, ' ') }), h('td', { text: typeof v === 'object' ? JSON.stringify(v) : String(v) }))));
  new maplibregl.Popup({ maxWidth: '380px' }).setLngLat(e.lngLat).setDOMContent(h('div', { class: 'popup', id: 'boundary-popup' }, table)).addTo(map);
});
/** A pick's popup: what it is, what the checks found (with the numbers), and exclude / use again. */
function pickPopup(p: Record<string, unknown>, at: maplibregl.LngLat): void {
  const id = String(p.id);
  const reasons = (typeof p.reasons === 'string' ? JSON.parse(p.reasons) : p.reasons ?? []) as string[];
  const excluded = state.excludePicks.includes(id);
  const km = (v: unknown) => (v === null || v === undefined || v === 'null' ? '—' : `${fmt(Number(v) / 1000, 2)} km`);
  const rows: [string, string][] = [
    ['pick', id],
    ['kind', String(p.kind)],
    ['seismic line', p.line && p.line !== 'null' ? String(p.line) : '—'],
    ['crustal thickness at the pick', km(p.thickness_m)],
    [p.kind === 'onlap' ? 'neighbours’ offset (median)' : 'neighbours’ thickness (median)', km(p.trend_m)],
    ['departure from the neighbours', km(p.departure_m)],
    ['distance from the uncalibrated line', km(p.proxy_distance_m)],
    ['status', excluded ? 'excluded by you: not used to place any line' : p.suspect === true || p.suspect === 'true' ? 'suspect: ' + reasons.join('; ') : 'consistent with its neighbours'],
  ];
  const button = h('button', {
    class: 'small',
    id: 'pick-exclude',
    onclick: () => {
      state.excludePicks = excluded ? state.excludePicks.filter((q) => q !== id) : [...state.excludePicks, id];
      popup.remove();
      scheduleRun();
      autosave();
    },
  }, excluded ? 'Use this pick again' : 'Exclude this pick');
  const popup = new maplibregl.Popup({ maxWidth: '380px' })
    .setLngLat(at)
    .setDOMContent(h('div', { class: 'popup', id: 'pick-popup' }, h('table', { class: 'props' }, ...rows.map(([a, b]) => h('tr', {}, h('th', { text: a }), h('td', { text: b })))), button))
    .addTo(map);
}

for (const id of [...clickable, 'proposals', 'seismic']) {
  map.on('mouseenter', id, () => (map.getCanvas().style.cursor = 'pointer'));
  map.on('mouseleave', id, () => (map.getCanvas().style.cursor = ''));
}

// ---------------------------------------------------------------- panels
function renderLayers(): void {
  clear(layersBox);
  const select = h('select', { id: 'layer-select', onchange: (e: Event) => ((state.layer = (e.target as HTMLSelectElement).value), renderRaster(), autosave()) },
    h('option', { value: 'domains', text: 'Margin domains' }),
    ...DERIVED.map((d) => h('option', { value: d.name, text: d.name.replace(/-/g, ' ') + (d.unit ? ` (${d.unit})` : '') })),
  ) as HTMLSelectElement;
  select.value = state.layer;
  const opacity = h('input', { type: 'range', min: 0, max: 1, step: 0.05, value: state.opacity, id: 'opacity',
    oninput: (e: Event) => ((state.opacity = Number((e.target as HTMLInputElement).value)), renderRaster()) });
  const check = (key: string, label: string) =>
    h('label', { class: 'check' }, h('input', { type: 'checkbox', id: `vis-${key}`, checked: state.visible[key],
      onchange: (e: Event) => {
        state.visible[key] = (e.target as HTMLInputElement).checked;
        applyVisibility();
        autosave();
        if (key === 'outlines' && state.visible.outlines && state.result && !state.result.domainOutlines) scheduleRun();
      } }), label);
  layersBox.append(
    h('label', { class: 'row' }, h('span', { text: 'Raster' }), select),
    h('label', { class: 'row' }, h('span', { text: 'Opacity' }), opacity),
    check('boundaries', 'Boundary lines'), check('cot', 'COT zone'), check('licence', 'Licence'), check('seismic', 'Existing seismic lines'),
    check('picks', 'Picks'), check('isochrons', 'Magnetic isochrons'), check('outlines', 'Domain cell outlines'), check('graticule', 'Graticule (0.5°)'),
  );
}

function swatchLine(colour: string, dash: number[] | null, width: number): SVGSVGElement {
  const ns = 'http://www.w3.org/2000/svg';
  const svg = document.createElementNS(ns, 'svg');
  svg.setAttribute('width', '44');
  svg.setAttribute('height', '12');
  const line = document.createElementNS(ns, 'line');
  line.setAttribute('x1', '2');
  line.setAttribute('x2', '42');
  line.setAttribute('y1', '6');
  line.setAttribute('y2', '6');
  line.setAttribute('stroke', colour);
  line.setAttribute('stroke-width', String(width));
  if (dash) line.setAttribute('stroke-dasharray', dash.map((d) => d * width).join(' '));
  svg.append(line);
  return svg;
}

function renderLegend(): void {
  clear(legendBox);
  const r = state.result;
  if (r) {
    if (state.layer === 'domains') {
      legendBox.append(h('div', { class: 'legend-title', text: 'Margin domains (interpretation)' }));
      for (const d of DOMAIN_STYLES) legendBox.append(h('div', { class: 'swatch-row' }, h('span', { class: 'swatch', style: `background: rgb(${d.colour.join(',')})` }), d.name));
    } else {
      const info = layerInfo(state.layer)!;
      const ramp = rampFor(state.layer, r.grids[state.layer]);
      const stops = Array.from({ length: 11 }, (_, k) => `rgb(${viridis(k / 10).join(',')}) ${k * 10}%`).join(', ');
      legendBox.append(
        h('div', { class: 'legend-title', text: `${info.desc}` }),
        h('div', { class: 'ramp', style: `background: linear-gradient(to right, ${stops})` }),
        h('div', { class: 'ramp-labels' }, h('span', { text: `${fmt(ramp.min, info.unit === 'm' ? 0 : 2)}` }), h('span', { text: info.unit || '(no unit)' }), h('span', { text: `${fmt(ramp.max, info.unit === 'm' ? 0 : 2)}` })),
      );
      if (info.applies !== 'all') legendBox.append(h('div', { class: 'hint', id: 'grid-rule', text: `Shown over ${APPLIES_TEXT[info.applies]}.` }));
      if (/^beta/.test(state.layer)) legendBox.append(h('div', { class: 'hint', text: 'Unbounded β (zero crust, or subsidence beyond β = ∞) is no data here; the unbounded-beta grid in the exports marks those cells.' }));
    }
  }
  legendBox.append(h('div', { class: 'legend-title', text: 'Boundaries' }));
  if (r?.summary.placedBy) {
    const pb = r.summary.placedBy;
    legendBox.append(h('div', { class: 'hint', id: 'placed-by' },
      ...[['crustal-taper-limit', 'Taper limit'], ['oceanic-limit', 'Oceanic limit'], ['oldest-onlapped-crust', 'Oldest onlapped crust']].map(([k, label]) => h('div', { text: `${label}: ${pb[k] ?? '—'}` }))));
  }
  for (const s of BOUNDARY_STYLES) legendBox.append(h('div', { class: 'swatch-row' }, swatchLine(s.colour, s.dash, s.width), s.label));
  legendBox.append(
    h('div', { class: 'swatch-row' }, h('span', { class: 'swatch', style: `background: ${COT_FILL}; opacity: 0.5` }), 'Continent–ocean transition zone'),
    h('div', { class: 'swatch-row' }, swatchLine('#555', null, 4.5), 'placed by picks (bold)'),
    h('div', { class: 'swatch-row' }, swatchLine('#555', null, 2), 'placed by the thickness proxy (thin)'),
    h('div', { class: 'swatch-row' }, swatchLine('rgba(85,85,85,0.45)', null, 1.5), `proxy more than ${fmt(r?.summary.farFromControlKm ?? DEFAULT_PARAMS.farFromControl / 1000, 0)} km from any pick or seismic line (faded)`),
    h('div', { class: 'swatch-row' }, swatchLine('#111', [2.5, 1], 2), 'Licence'),
    h('div', { class: 'swatch-row' }, swatchLine('#3b3b3b', null, 1.6), 'Existing seismic line'),
    h('div', { class: 'swatch-row' }, h('span', { class: 'swatch dot' }), 'Interpreter pick (click for its checks)'),
    h('div', { class: 'swatch-row' }, h('span', { class: 'swatch dot', style: `background: ${SUSPECT_PICK}` }), 'Suspect pick: disagrees with its neighbours or lies far from the line'),
    h('div', { class: 'swatch-row' }, h('span', { class: 'swatch dot', style: 'background: #9e9e9e' }), 'Pick excluded by you'),
    h('div', { class: 'swatch-row' }, swatchLine('#5e3c99', [1, 2], 1.5), 'Magnetic isochron'),
    h('div', { class: 'swatch-row' }, swatchLine('#009E73', null, 3), 'Proposed dip line'),
    h('div', { class: 'swatch-row' }, swatchLine('#56B4E9', null, 2.5), 'Proposed strike (tie) line'),
    h('div', { class: 'swatch-row' }, h('span', { class: 'swatch', style: 'background: #F0E442' }), 'Coverage gap on the zone midline'),
  );
}

function renderAreas(): void {
  clear(areasBox);
  const r = state.result;
  if (!r) return;
  const s = r.summary;
  const list = s.areasInLicence ?? s.areas;
  areasBox.append(h('div', { class: 'legend-title', text: s.areasInLicence ? `Inside ${s.licenceName}` : 'Whole grid' }));
  const rows = list.filter((a) => a.code > 0).map((a) => h('tr', {}, h('th', { text: DOMAIN_STYLES.find((d) => d.code === a.code)!.name }), h('td', { text: `${fmt(a.km2)} km²` })));
  const lengths = Object.entries(s.lengths).map(([k, v]) => h('tr', {}, h('th', { text: k.replace(/-/g, ' ') }), h('td', { text: `${fmt(v, 1)} km` })));
  areasBox.append(
    h('table', { id: 'areas-table' }, ...rows, h('tr', {}, h('th', { text: 'COT zone' }), h('td', { text: `${fmt(s.cotAreaKm2)} km²` })), ...lengths),
    h('p', { class: 'hint', text: `Geodesic (WGS84). Oceanward azimuth ${s.oceanwardAzimuth.toFixed(0)}°. Computed in ${fmt(r.millis)} ms.` }),
  );
  clear(warningsBox);
  const w = [...s.warnings];
  if (!w.length) warningsBox.append(h('p', { class: 'hint', text: 'None.' }));
  for (const text of w) warningsBox.append(h('p', { class: 'warning', text }));
}

function paramInput(spec: ParamSpec): HTMLElement {
  const current = state.params[spec.key] ?? DEFAULT_PARAMS[spec.key];
  const onchange = (e: Event) => {
    const raw = (e.target as HTMLInputElement | HTMLSelectElement).value;
    const v = spec.choices ? raw : raw.trim() === '' ? (spec.nullable ? null : raw) : Number(raw);
    const next = { ...state.params, [spec.key]: v };
    try {
      resolveParams(next);
      delete state.paramErrors[spec.key];
      state.params = next;
      scheduleRun();
      autosave();
    } catch (err) {
      state.paramErrors[spec.key] = (err as Error).message;
    }
    renderParams();
  };
  const input = spec.choices
    ? h('select', { id: `p-${spec.key}`, onchange }, ...spec.choices.map((c) => h('option', { value: c, text: c, selected: c === current })))
    : h('input', { id: `p-${spec.key}`, type: 'number', step: 'any', value: current === null ? '' : String(current), placeholder: spec.nullable ? 'not set' : '', onchange });
  const def = DEFAULT_PARAMS[spec.key];
  return h(
    'div',
    { class: 'param' },
    h('label', { for: `p-${spec.key}`, text: spec.label }),
    h('div', { class: 'param-input' }, input, h('span', { class: 'unit', text: spec.unit })),
    h('div', { class: 'doc', text: `${spec.doc} Default ${def === null ? 'none' : def}${spec.unit && def !== null && !spec.choices ? ' ' + spec.unit : ''}. Source: ${spec.source}.` }),
    state.paramErrors[spec.key] ? h('div', { class: 'error', text: state.paramErrors[spec.key] }) : null,
    spec.key === 'taperThreshold' && calibratedNote() ? h('div', { class: 'warning', id: 'calibration-note', text: calibratedNote()! }) : null,
    (spec.key === 'taperThreshold' || spec.key === 'oceanicThreshold') && state.result?.summary.placedBy
      ? h('div', { class: 'hint', id: `placed-${spec.key}`, text: `In this run: ${state.result.summary.placedBy[spec.key === 'taperThreshold' ? 'crustal-taper-limit' : 'oceanic-limit']}.` })
      : null,
  );
}

function calibratedNote(): string | null {
  const c = state.result?.summary.calibrated;
  if (!c || (!c.taper && !c.ocean && !c.onlap)) return null;
  return (
    `Picks in use (${c.taper} continental-limit, ${c.ocean} oceanic-limit, ${c.onlap} onlap): the taper limit and the oceanic limit each follow ` +
    'their own picks (the crustal thickness at the picks, interpolated along strike); a line with picks is not placed by its threshold value. ' +
    'Onlap picks move the oldest onlapped crust away from the oceanic limit. Set the picks file to "not used" to apply the values.'
  );
}

let lastNote: string | null = null;
let lastPlaced = '';

let renderingParams = false;

function renderParams(): void {
  // Removing a focused field fires its change (and blur) handlers, which render again: once is enough.
  if (renderingParams) return;
  renderingParams = true;
  try {
    renderParamsNow();
  } finally {
    renderingParams = false;
  }
}

function renderParamsNow(): void {
  lastNote = calibratedNote();
  lastPlaced = JSON.stringify(state.result?.summary.placedBy ?? null);
  clear(paramsBox);
  const groups: Record<string, string> = { crust: 'Crust', densities: 'Densities', sediment: 'Sediment', subsidence: 'Subsidence (McKenzie 1978)', age: 'Oceanic age', picks: 'Pick tolerances', domains: 'Domains', lines: 'Lines' };
  for (const [g, title] of Object.entries(groups)) {
    const specs = PARAM_SPECS.filter((s) => s.group === g);
    paramsBox.append(h('details', { open: g === 'crust' || g === 'domains' || g === 'subsidence' }, h('summary', { text: title }), ...specs.map(paramInput)));
  }
  paramsBox.append(h('button', { class: 'small', onclick: () => ((state.params = state.demo ? { ...DEMO_PARAMS } : {}), (state.paramErrors = {}), renderParams(), scheduleRun(), autosave()) }, 'Reset to defaults'));
}

const ROLES = INPUT_ROLES;

function renderFiles(): void {
  clear(dataList);
  for (const f of state.files) {
    const role = h('select', { class: 'role', 'data-file': f.name, onchange: (e: Event) => setRole(f, (e.target as HTMLSelectElement).value) },
      ...ROLES[f.kind].map((r) => h('option', { value: r, text: r === 'none' ? 'not used' : r, selected: r === f.role })));
    const rep = f.report;
    const details: (HTMLElement | null)[] = [];
    if (rep) {
      details.push(
        h('div', { class: 'report', text: `${rep.nx} × ${rep.ny} cells of ${fmt(Math.abs(rep.dx), 1)} m, ${rep.crs.value} (${rep.crs.detail}), ${rep.registration.value}-registered` }),
        h('div', { class: 'report', text: `units ${rep.units.value} (${rep.units.detail}); ${rep.sign.value} (${rep.sign.detail}); no data: ${rep.noData.total} cells${Object.keys(rep.noData.masked).length ? ' [' + Object.entries(rep.noData.masked).map(([k, n]) => `${k}: ${n}`).join(', ') + ']' : ''}` }),
        ...rep.warnings.map((w) => h('div', { class: 'warning', text: w })),
        h('div', { class: 'overrides' },
          h('label', {}, 'units ', h('select', { onchange: (e: Event) => override(f, 'units', (e.target as HTMLSelectElement).value) },
            ...['auto', 'm', 'km', 'ft'].map((u) => h('option', { value: u, text: u, selected: (f.options.units ?? 'auto') === u })))),
          h('label', {}, ' sign ', h('select', { onchange: (e: Event) => override(f, 'sign', (e.target as HTMLSelectElement).value) },
            ...['auto', 'depth', 'elevation'].map((u) => h('option', { value: u, text: u, selected: (f.options.sign ?? 'auto') === u })))),
        ),
      );
    }
    if (f.kind === 'grid') {
      // a CRS for files that carry none (XYZ text) or carry one Taperline cannot resolve
      details.push(h('div', { class: 'overrides' }, h('label', {}, 'CRS ',
        h('input', { class: 'crs-input', type: 'text', size: 16, placeholder: 'EPSG code or proj4', value: f.options.crs ?? '',
          onchange: (e: Event) => override(f, 'crs', (e.target as HTMLInputElement).value.trim() || 'auto') }))));
    } else if (f.kind === 'vector' && !f.error) {
      details.push(h('div', { class: 'report', text: `${f.features ?? 0} features (GeoJSON, WGS84)` }), ...(f.warnings ?? []).map((w) => h('div', { class: 'warning', text: w })));
    }
    dataList.append(
      h('div', { class: `file${f.error ? ' has-error' : ''}`, 'data-name': f.name },
        h('div', { class: 'file-head' }, h('span', { class: 'file-name', text: f.name }), role,
          h('button', { class: 'x', title: 'Remove', onclick: () => removeFile(f) }, '×')),
        f.error ? h('div', { class: 'error file-error', text: f.error }) : null,
        ...details,
      ),
    );
  }
}

function exportPanel(): HTMLElement {
  const gridSelect = h('select', { id: 'export-grid' }, h('option', { value: 'domains', text: 'domains' }), ...DERIVED.map((d) => h('option', { value: d.name, text: d.name }))) as HTMLSelectElement;
  const get = async (path: string, type: string) => {
    setStatus('Preparing export…');
    const files = await engine.exportAll(VERSION);
    if (!files[path]) {
      setStatus(`${path} is not written for this run: the grid holds no value anywhere (see the summary's grids_not_written)`, true);
      return;
    }
    download(path.split('/').pop()!, files[path], type);
    setStatus(`Exported ${path}`);
  };
  return h('div', { class: 'export' },
    h('button', { id: 'export-boundaries', onclick: () => get('boundaries.geojson', 'application/geo+json') }, 'boundaries.geojson'),
    h('button', { id: 'export-lines', onclick: () => get('boundary-lines.geojson', 'application/geo+json') }, 'boundary-lines.geojson'),
    h('button', { id: 'export-domains', onclick: () => get('domains.geojson', 'application/geo+json') }, 'domains.geojson'),
    h('button', { id: 'export-gpkg', onclick: () => get('boundaries.gpkg', 'application/geopackage+sqlite3') }, 'GeoPackage (all layers, WGS 84 and analysis CRS)'),
    h('button', { id: 'export-summary', onclick: () => get('summary.json', 'application/json') }, 'summary.json'),
    h('div', { class: 'row' }, gridSelect, h('button', { id: 'export-grid-btn', onclick: () => get(`grids/${gridSelect.value}.tif`, 'image/tiff') }, 'GeoTIFF')),
    h('button', { id: 'export-png', onclick: () => exportImage() }, 'Map image (PNG)'),
  );
}

async function exportImage(): Promise<void> {
  const png = await renderMapImage(map, {
    title: `${state.layer === 'domains' ? 'Margin domains' : layerInfo(state.layer)?.desc ?? state.layer}`,
    subtitle: state.demo ? `${DEMO_NAME} — INVENTED DEMO DATA` : state.files.filter((f) => f.role !== 'none').map((f) => f.name).join(', '),
    legend: legendBox,
  });
  download('taperline-map.png', await png.arrayBuffer(), 'image/png');
}

// ---------------------------------------------------------------- files
function kindOf(name: string): 'grid' | 'vector' | null {
  if (/\.(tif|tiff|gtiff|xyz|txt|csv|dat)$/i.test(name)) return 'grid';
  if (/\.(geojson|json)$/i.test(name)) return 'vector';
  return null;
}

function guessVectorRole(name: string): VectorRole | 'none' {
  const n = name.toLowerCase();
  if (/licen[cs]e|block|permit|concession/.test(n)) return 'licence';
  if (/pick/.test(n)) return 'picks';
  if (/isochron|chron|magnetic/.test(n)) return 'isochrons';
  if (/crust/.test(n)) return 'crust';
  if (/line|seismic|survey/.test(n)) return 'lines';
  return 'none';
}

async function addFile(name: string, bytes: ArrayBuffer, role?: string, options: LoadedFile['options'] = {}, quiet = false): Promise<LoadedFile | null> {
  const kind = kindOf(name);
  if (!kind) {
    setStatus(`${name}: not a file Taperline reads (GeoTIFF, XYZ text or GeoJSON)`, true);
    state.files.push({ id: `f${nextId++}`, name, kind: 'vector', role: 'none', bytes, options, report: null, error: 'not a file Taperline reads (GeoTIFF .tif, XYZ text .xyz/.txt/.csv, GeoJSON .geojson)' });
    renderFiles();
    return null;
  }
  let r = role;
  if (!r) {
    if (kind === 'grid') {
      const g = guessRole(name);
      r = g === 'other' ? (state.files.some((f) => f.role === 'top-basement') ? 'none' : 'top-basement') : g;
    } else r = guessVectorRole(name);
  }
  const f: LoadedFile = { id: `f${nextId++}`, name, kind, role: r as LoadedFile['role'], bytes, options: { ...options }, report: null, error: null };
  state.files.push(f);
  await reload(f);
  // values decide a role the name did not give: a surface deeper than 15 km on average is a Moho
  if (!role && kind === 'grid' && guessRole(name) === 'other' && f.report && (f.report.min + f.report.max) / 2 > 15_000 && !state.files.some((o) => o !== f && o.role === 'moho')) {
    f.role = 'moho';
  }
  // one file per role: a file that loaded takes its role over; one that failed takes nothing
  if (!f.error && f.role !== 'none') for (const o of state.files) if (o !== f && o.role === f.role) o.role = 'none';
  if (!quiet) {
    renderFiles();
    renderVectors();
    scheduleRun();
    autosave();
  }
  return f;
}

async function reload(f: LoadedFile): Promise<void> {
  if (f.kind === 'grid') {
    const basement = state.files.find((x) => x.role === 'top-basement' && x.report);
    f.options = { ...f.options, role: f.role === 'none' ? undefined : (f.role as GridRole) } as LoadedFile['options'];
    if (basement && basement !== f) (f.options as { assumeCrs?: string }).assumeCrs = basement.report!.crs.value;
  }
  try {
    const res = await engine.load(f);
    f.report = res.report;
    f.features = res.features;
    f.warnings = res.warnings;
    f.error = null;
  } catch (err) {
    f.error = (err as Error).message.replace(`${f.name}: `, '');
    f.report = null;
    if (f.role !== 'none') f.role = 'none';
    setStatus(`${f.name}: ${f.error}`, true);
  }
}

function setRole(f: LoadedFile, role: string): void {
  if (role !== 'none') for (const o of state.files) if (o !== f && o.role === role) o.role = 'none';
  f.role = role as LoadedFile['role'];
  void reload(f).then(() => (renderFiles(), renderVectors(), scheduleRun(), autosave()));
}

function override(f: LoadedFile, key: 'units' | 'sign' | 'crs', value: string): void {
  if (value === 'auto') delete (f.options as Record<string, unknown>)[key];
  else (f.options as Record<string, unknown>)[key] = value;
  void reload(f).then(() => {
    // a file that now loads may take its role back
    if (!f.error && f.role === 'none' && f.kind === 'grid') {
      const g = guessRole(f.name);
      if (g !== 'other' && !state.files.some((o) => o !== f && o.role === g && !o.error)) f.role = g;
    }
    renderFiles();
    renderVectors();
    scheduleRun();
    autosave();
  });
}

function removeFile(f: LoadedFile): void {
  state.files = state.files.filter((x) => x !== f);
  engine.remove(f.id);
  renderFiles();
  renderVectors();
  scheduleRun();
  autosave();
}

async function handleFiles(list: FileList | File[]): Promise<void> {
  for (const file of Array.from(list)) {
    state.demo = false;
    await addFile(file.name, await file.arrayBuffer());
  }
  renderScenario();
}

fileInput.addEventListener('change', () => {
  if (fileInput.files) void handleFiles(fileInput.files).then(() => (fileInput.value = ''));
});
const drop = document.getElementById('drop')!;
drop.addEventListener('dragover', (e) => (e.preventDefault(), drop.classList.add('over')));
drop.addEventListener('dragleave', () => drop.classList.remove('over'));
drop.addEventListener('drop', (e) => {
  e.preventDefault();
  drop.classList.remove('over');
  if (e.dataTransfer?.files) void handleFiles(e.dataTransfer.files);
});
map.getContainer().addEventListener('dragover', (e) => e.preventDefault());
map.getContainer().addEventListener('drop', (e) => {
  e.preventDefault();
  if (e.dataTransfer?.files) void handleFiles(e.dataTransfer.files);
});

async function loadDemo(reset: boolean): Promise<void> {
  setStatus('Building the invented demo scenario…');
  if (reset) {
    for (const f of state.files) engine.remove(f.id);
    state.files = [];
  }
  const files = await engine.makeDemo();
  const roles: Record<string, string> = { 'seabed.tif': 'seabed', 'top-basement.tif': 'top-basement', 'moho.tif': 'moho', 'licence.geojson': 'licence', 'seismic-lines.geojson': 'lines', 'picks.geojson': 'picks', 'isochrons.geojson': 'isochrons' };
  for (const name of ['top-basement.tif', 'moho.tif', 'seabed.tif', 'licence.geojson', 'seismic-lines.geojson', 'picks.geojson', 'isochrons.geojson']) {
    const f = files.find((x) => x.name === name)!;
    await addFile(name, f.bytes, roles[name], {}, true);
  }
  state.demo = true;
  state.params = { ...DEMO_PARAMS };
  state.excludePicks = [];
  renderScenario();
  renderFiles();
  renderParams();
  renderVectors();
  await run(true);
  autosave();
}

function renderScenario(): void {
  scenario.textContent = state.demo ? `${DEMO_NAME} — invented demo data, not a real place` : state.files.length ? 'Your data (kept in this browser only)' : 'No data loaded';
  scenario.classList.toggle('demo', state.demo);
}

// ---------------------------------------------------------------- run
let runTimer: ReturnType<typeof setTimeout> | null = null;
function scheduleRun(): void {
  if (runTimer) clearTimeout(runTimer);
  runTimer = setTimeout(() => void run(false), 250);
}

async function run(fit: boolean): Promise<void> {
  if (state.running) {
    state.rerun = true;
    return;
  }
  const ready = state.files.some((f) => f.role === 'top-basement' && !f.error) && state.files.some((f) => f.role === 'moho' && !f.error);
  if (!ready) {
    setStatus('Assign a top-basement grid and a Moho grid under Data to compute.');
    return;
  }
  state.running = true;
  const t0 = performance.now();
  const showProgress = setTimeout(() => ((progressBar.hidden = false), (cancelBtn.hidden = false)), 300);
  engine.onProgress = (stage, fraction) => {
    progressBar.value = fraction;
    statusText.textContent = `Computing: ${stage}…`;
  };
  statusText.textContent = 'Computing…';
  try {
    const result = await engine.run(state.params, state.visible.outlines, state.excludePicks);
    state.result = result;
    window.__taperline.runs++;
    window.__taperline.lastMillis = performance.now() - t0;
    await mapLoaded;
    if (fit || !state.result) fitToGrid();
    renderRaster();
    renderVectors();
    renderAreas();
    if (calibratedNote() !== lastNote || JSON.stringify(result.summary.placedBy) !== lastPlaced) renderParams();
    setStatus(`Done in ${fmt(performance.now() - t0)} ms (pipeline ${fmt(result.millis)} ms). ${result.summary.warnings.length} warnings.`);
    map.once('idle', () => (window.__taperline.ready = true));
    map.triggerRepaint();
  } catch (err) {
    const msg = (err as Error).message;
    window.__taperline.error = msg;
    setStatus(msg === 'cancelled' ? 'Cancelled: the previous results stay on the map.' : `Could not compute: ${msg}`, msg !== 'cancelled');
  } finally {
    clearTimeout(showProgress);
    progressBar.hidden = true;
    cancelBtn.hidden = true;
    state.running = false;
    if (state.rerun) {
      state.rerun = false;
      void run(false);
    }
  }
}

function cancelRun(): void {
  state.rerun = false;
  void engine.cancel();
}

function setStatus(text: string, error = false): void {
  statusText.textContent = text;
  statusText.classList.toggle('error', error);
}

// ---------------------------------------------------------------- keep the work
/** What the files record holds; it is rewritten only when this changes. */
let savedFiles = '';

/**
 * Save at once, on every change, so a reload right after it loses nothing: parameters, view and
 * planning always (small); the files' bytes only when the set of files, their roles or options changed.
 */
function autosave(): void {
  const failed = (e: unknown) => setStatus(`Autosave failed: ${(e as Error).message}`, true);
  const snap = snapshot();
  const sig = JSON.stringify(snap.files.map((f) => [f.id, f.name, f.role, f.options]));
  if (sig !== savedFiles) {
    savedFiles = sig;
    void saveProject(snap).catch((e) => ((savedFiles = ''), failed(e)));
  } else void saveState(snap).catch(failed);
}

function viewState() {
  const c = map.getCenter();
  return { center: [c.lng, c.lat] as [number, number], zoom: map.getZoom(), layer: state.layer, opacity: state.opacity, visible: { ...state.visible } };
}

function snapshot(): StoredProject {
  return {
    files: state.files.filter((f) => !f.error).map((f) => ({ id: f.id, name: f.name, kind: f.kind, role: f.role, options: { ...f.options } as Record<string, unknown>, bytes: f.bytes })),
    params: { ...state.params },
    view: viewState(),
    demo: state.demo,
    plan: { ...state.plan },
    excludePicks: [...state.excludePicks],
  };
}
map.on('moveend', () => autosave());

async function restore(p: StoredProject): Promise<void> {
  setStatus('Restoring your last session…');
  for (const f of p.files) await addFile(f.name, f.bytes, f.role, f.options as LoadedFile['options'], true);
  state.params = p.params ?? {};
  state.demo = p.demo;
  state.plan = { ...(p.plan ?? {}) };
  state.excludePicks = [...(p.excludePicks ?? [])];
  renderPlanBox();
  // a view saved by another version may name a layer this one lacks: keep the default then
  if (p.view && PROJECT_SCHEMA.layers.includes(p.view.layer)) {
    state.layer = p.view.layer;
    state.opacity = p.view.opacity;
    state.visible = { ...state.visible, ...p.view.visible };
  }
  renderScenario();
  renderFiles();
  renderParams();
  renderLayers();
  renderVectors();
  await run(!p.view);
  if (p.view) map.jumpTo({ center: p.view.center, zoom: p.view.zoom });
}

async function sha256(bytes: ArrayBuffer): Promise<string> {
  const d = await crypto.subtle.digest('SHA-256', bytes);
  return [...new Uint8Array(d)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

async function saveProjectFile(bundle: boolean): Promise<void> {
  const inputs = [];
  for (const f of state.files.filter((x) => !x.error)) {
    inputs.push({ name: f.name, kind: f.kind, role: f.role, bytes: f.bytes.byteLength, sha256: await sha256(f.bytes), options: f.options, ...(bundle ? { data: toBase64(new Uint8Array(f.bytes)) } : {}) });
  }
  const project: Project = { format: PROJECT_FORMAT, version: PROJECT_VERSION, saved: new Date().toISOString(), tool: `taperline ${VERSION}`, params: resolveParams(state.params) as unknown as Record<string, unknown>, inputs, view: viewState(), plan: { ...state.plan }, excludePicks: [...state.excludePicks] };
  download(bundle ? 'project-with-data.taperline.json' : 'project.taperline.json', JSON.stringify(project, null, 1), 'application/json');
}

/** What a project file may name: the parameter and planning keys, the map layers. */
const PROJECT_SCHEMA = {
  paramKeys: PARAM_SPECS.map((sp) => sp.key as string),
  planKeys: PLAN_SPECS.map((sp) => sp.key as string),
  layers: ['domains', ...DERIVED.map((d) => d.name as string)],
};

/**
 * Open a project file. Everything is checked — the file's fields, the parameters, and every input
 * loaded under a new id — before the current files, settings or autosave are touched; a failure
 * anywhere leaves them exactly as they were.
 */
async function openProjectFile(file: File): Promise<void> {
  const keep = `${file.name} was not opened; your current files and settings are unchanged.`;
  let p: Project;
  try {
    p = parseProject(await file.text(), file.name, PROJECT_SCHEMA);
    resolveParams(p.params);
    resolvePlan(p.plan);
  } catch (err) {
    setStatus(`${(err as Error).message}. ${keep}`, true);
    return;
  }
  const byHash = new Map<string, LoadedFile>();
  for (const f of state.files) byHash.set(await sha256(f.bytes), f);
  const missing: string[] = [];
  const staged: LoadedFile[] = [];
  for (const i of p.inputs) {
    const have = byHash.get(i.sha256);
    const bytes = i.data ? (fromBase64(i.data).slice().buffer as ArrayBuffer) : have?.bytes;
    if (!bytes) {
      missing.push(`${i.name} (${i.bytes} bytes)`);
      continue;
    }
    if (i.data && (await sha256(bytes)) !== i.sha256) {
      missing.push(`${i.name} (its bundled bytes do not match its checksum)`);
      continue;
    }
    staged.push({ id: `f${nextId++}`, name: i.name, kind: i.kind, role: i.role as LoadedFile['role'], bytes, options: { ...i.options } as LoadedFile['options'], report: null, error: null });
  }
  if (missing.length) {
    setStatus(`${file.name}: load these inputs first, then open the project again: ${missing.join(', ')}. ${keep}`, true);
    return;
  }
  const failures: string[] = [];
  for (const f of staged) {
    try {
      const res = await engine.load(f);
      Object.assign(f, { report: res.report, features: res.features, warnings: res.warnings });
    } catch (err) {
      failures.push((err as Error).message);
    }
  }
  if (failures.length) {
    for (const f of staged) engine.remove(f.id);
    setStatus(`${failures.join('; ')}. ${keep}`, true);
    return;
  }
  for (const f of state.files) engine.remove(f.id);
  state.files = staged;
  state.params = { ...p.params };
  state.demo = false;
  state.plan = { ...p.plan };
  state.excludePicks = [...p.excludePicks];
  if (p.view) {
    state.layer = p.view.layer;
    state.opacity = p.view.opacity;
    state.visible = { ...state.visible, ...p.view.visible };
  }
  renderPlanBox();
  renderScenario();
  renderFiles();
  renderParams();
  renderLayers();
  renderVectors();
  await run(!p.view);
  if (p.view) map.jumpTo({ center: p.view.center, zoom: p.view.zoom });
  autosave();
  setStatus(`Opened ${file.name}`);
}

projectInput.addEventListener('change', () => {
  const file = projectInput.files?.[0];
  projectInput.value = '';
  if (file) void openProjectFile(file);
});

async function clearLocal(): Promise<void> {
  if (!confirm('Remove every file and setting Taperline keeps in this browser, and start again on the invented demo?')) return;
  await clearAll();
  location.reload();
}

// ---------------------------------------------------------------- sections and survey planning
let drawing: [number, number][] | null = null;
let currentSection: SectionData | null = null;

function showDrawn(): void {
  const pts = drawing ?? [];
  setSource('drawn', {
    type: 'FeatureCollection',
    features: [
      ...(pts.length > 1 ? [{ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: pts } }] : []),
      ...pts.map((p) => ({ type: 'Feature', properties: {}, geometry: { type: 'Point', coordinates: p } })),
    ],
  });
}

function startDrawing(): void {
  drawing = [];
  map.doubleClickZoom.disable();
  map.getCanvas().style.cursor = 'crosshair';
  setStatus('Click points along the section; double-click (or press Enter) to finish, Escape to cancel.');
}

function finishDrawing(): void {
  const pts = drawing;
  drawing = null;
  map.getCanvas().style.cursor = '';
  setTimeout(() => map.doubleClickZoom.enable(), 0);
  if (pts && pts.length >= 2) void openSection(pts, 'Drawn section');
  else setStatus('A section needs at least two points.');
}

map.on('dblclick', (e) => {
  if (!drawing) return;
  e.preventDefault();
  finishDrawing();
});
window.addEventListener('keydown', (e) => {
  if (!drawing) return;
  if (e.key === 'Enter') finishDrawing();
  if (e.key === 'Escape') {
    drawing = null;
    showDrawn();
    map.getCanvas().style.cursor = '';
    map.doubleClickZoom.enable();
    setStatus('Drawing cancelled.');
  }
});

async function openSection(lonlat: [number, number][], title: string): Promise<void> {
  try {
    drawing = null;
    setSource('drawn', { type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: lonlat } }] });
    currentSection = await engine.section(lonlat, title);
    sectionPanel.hidden = false;
    drawSection();
    setStatus(`${title}: ${fmt(currentSection.lengthKm, 1)} km, ${currentSection.crossings.length} boundary crossings.`);
  } catch (err) {
    setStatus(`Section: ${(err as Error).message}`, true);
  }
}

function drawSection(): void {
  clear(sectionBody);
  if (!currentSection) return;
  document.getElementById('section-title')!.textContent = `${currentSection.title} — ${fmt(currentSection.lengthKm, 1)} km`;
  const width = Math.max(400, sectionBody.clientWidth - 8 || 900);
  sectionBody.append(renderSection(currentSection, width, Number(veSelect.value)));
}

async function sectionImage(): Promise<void> {
  const svg = sectionBody.querySelector('svg');
  if (!svg) return;
  const png = await svgToPng(svg as SVGSVGElement);
  download('section.png', await png.arrayBuffer(), 'image/png');
}

function renderPlanBox(result: PlanData | null = null): void {
  clear(planBox);
  planBox.append(
    h('p', { class: 'warning', text: 'Planning aid only: marine surveys need permits, environmental mitigation and qualified operators, under local rules.' }),
    h('button', { class: 'small', id: 'btn-draw', onclick: () => startDrawing() }, 'Draw a section line'),
    h('p', { class: 'hint', text: 'Or click an existing or proposed line to see its section.' }),
  );
  const field = (spec: (typeof PLAN_SPECS)[number]) => {
    const v = state.plan[spec.key] ?? DEFAULT_PLAN[spec.key];
    const input = spec.boolean
      ? h('input', { type: 'checkbox', id: `plan-${spec.key}`, checked: v === true, onchange: (e: Event) => ((state.plan = { ...state.plan, [spec.key]: (e.target as HTMLInputElement).checked }), autosave()) })
      : h('input', { type: 'number', step: 'any', id: `plan-${spec.key}`, value: v === null ? '' : String(v), placeholder: spec.nullable ? 'not set' : '',
          onchange: (e: Event) => ((state.plan = { ...state.plan, [spec.key]: (e.target as HTMLInputElement).value === '' ? null : Number((e.target as HTMLInputElement).value) }), autosave()) });
    return h('div', { class: 'param' }, h('label', { for: `plan-${spec.key}`, text: spec.label }), h('div', { class: 'param-input' }, input, h('span', { class: 'unit', text: spec.unit })),
      h('div', { class: 'doc', text: `${spec.doc} Default ${DEFAULT_PLAN[spec.key] ?? 'none'}. Source: ${spec.source}.` }));
  };
  const main = ['spacingKm', 'overhangLandwardKm', 'overhangOceanwardKm', 'clipToLicence', 'costPerKm'];
  planBox.append(
    ...PLAN_SPECS.filter((sp) => main.includes(sp.key)).map(field),
    h('details', {}, h('summary', { text: 'More planning parameters' }), ...PLAN_SPECS.filter((sp) => !main.includes(sp.key)).map(field)),
    h('button', { class: 'small', id: 'btn-plan', onclick: () => void propose() }, 'Propose lines'),
  );
  if (!result) return;
  const pr = result.programme;
  const fc = result.lines as { features: { properties: Record<string, unknown>; geometry: { coordinates: [number, number][] } }[] };
  planBox.append(
    h('table', { id: 'programme', class: 'props' },
      h('tr', {}, h('th', { text: 'lines' }), h('td', { text: String(pr.lines) })),
      h('tr', {}, h('th', { text: 'line-km (geodesic)' }), h('td', { text: fmt(pr.lineKm, 1) })),
      h('tr', {}, h('th', { text: 'acquisition' }), h('td', { text: `${fmt(pr.totalDays, 1)} days incl. downtime (${fmt(pr.productiveHours, 0)} h productive)` })),
      h('tr', {}, h('th', { text: 'cost' }), h('td', { text: pr.cost === null ? 'set a cost per line-km' : fmt(pr.cost, 0) })),
    ),
    h('div', { class: 'legend-title', text: 'Ranked proposals (cut the list at your budget)' }),
    h('table', { id: 'proposal-list', class: 'props' },
      h('tr', {}, h('th', { text: '#' }), h('th', { text: 'line' }), h('th', { text: 'km' }), h('th', { text: 'cum. km' }), h('th', { text: 'record s' }), h('th', { text: '' })),
      ...fc.features.map((f) => h('tr', {},
        h('td', { text: String(f.properties.rank) }),
        h('td', {
          text: `${f.properties.id} (${f.properties.kind === 'strike' ? 'tie' : 'dip'})`,
          title: f.properties.kind === 'strike' ? `ties ${(f.properties.ties as string[] | null)?.join(', ') ?? '—'}; ${f.properties.note ?? ''}` : String(f.properties.note ?? ''),
        }),
        h('td', { text: fmt(Number(f.properties.length_km), 1) }),
        h('td', { text: fmt(Number(f.properties.cumulative_km), 0) }),
        h('td', { text: String(f.properties.record_length_s) }),
        h('td', {}, h('button', { class: 'small', title: 'Show its section', onclick: () => void openSection(f.geometry.coordinates, `Proposed line ${f.properties.id}`) }, 'View')),
      )),
    ),
    h('p', { class: 'hint', text: result.dropped.length ? `Dropped: ${result.dropped.map((d) => `${d.id} (${d.reason})`).join('; ')}` : 'No proposal dropped.' }),
    h('p', { class: 'hint', text: 'Yellow stretches on the midline: farther than half the spacing from any existing line or pick.' }),
    h('button', { class: 'small', id: 'export-plan-geojson', onclick: () => download('survey-lines.geojson', result.geojson, 'application/geo+json') }, 'survey-lines.geojson'),
    h('button', { class: 'small', id: 'export-plan-csv', onclick: () => download('survey-lines.csv', result.csv, 'text/csv') }, 'survey-lines.csv'),
  );
}

async function propose(): Promise<void> {
  try {
    setStatus('Proposing lines…');
    const r = await engine.plan(state.plan);
    setSource('proposals', r.lines);
    setSource('midline', r.midline);
    setSource('gaps', r.gaps);
    renderPlanBox(r);
    setStatus(`Proposed ${r.programme.lines} lines, ${fmt(r.programme.lineKm, 0)} line-km.${r.warnings.length ? ' ' + r.warnings.join(' ') : ''}`);
    window.__taperline.planned = (window.__taperline.planned ?? 0) + 1;
  } catch (err) {
    setStatus(`Planning: ${(err as Error).message}`, true);
  }
}

// ---------------------------------------------------------------- start
renderLayers();
renderLegend();
renderParams();
renderPlanBox();
void (async () => {
  let stored: StoredProject | null = null;
  try {
    stored = await loadProject();
  } catch {
    stored = null;
  }
  if (stored && stored.files.length) await restore(stored);
  else await loadDemo(false);
})();
