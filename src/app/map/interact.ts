/**
 * Map interaction: the cursor position for the readout, clicks (a pick's checks, a boundary's
 * fields, a line's section), and drawing a section line. Popup contents come from text/popup.ts.
 */

import maplibregl, { type MapMouseEvent } from 'maplibre-gl';
import { h } from '../dom.js';
import type { Actions, Store } from '../state.js';
import { boundaryRows, pickRows, type Row } from '../text/popup.js';
import type { MapView } from './view.js';
import { BOUNDARY_STYLES } from './styles.js';

const table = (rows: Row[]) => h('table', { class: 'props' }, ...rows.map(([a, b]) => h('tr', {}, h('th', { text: a }), h('td', { text: b }))));

export interface Drawing {
  start(): void;
}

export function wireMap(view: MapView, store: Store, actions: Actions, status: (text: string) => void): Drawing {
  const { map } = view;
  let drawing: [number, number][] | null = null;
  const showDrawn = () => {
    const pts = drawing ?? [];
    view.setSource('drawn', {
      type: 'FeatureCollection',
      features: [
        ...(pts.length > 1 ? [{ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: pts } }] : []),
        ...pts.map((p) => ({ type: 'Feature', properties: {}, geometry: { type: 'Point', coordinates: p } })),
      ],
    });
  };
  const finish = () => {
    const pts = drawing;
    drawing = null;
    map.getCanvas().style.cursor = '';
    setTimeout(() => map.doubleClickZoom.enable(), 0);
    if (pts && pts.length >= 2) void actions.openSection(pts, 'Drawn section');
    else status('A section needs at least two points.');
  };

  map.on('mousemove', (e: MapMouseEvent) => store.update({ cursor: [e.lngLat.lng, e.lngLat.lat] }));

  const lineLayers = BOUNDARY_STYLES.flatMap((s) => [`b-${s.kind}`, `bfar-${s.kind}`]);
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
      const p = pickHits[0].properties as Record<string, unknown>;
      const id = String(p.id);
      const excluded = store.state.excludePicks.includes(id);
      const button = h('button', { class: 'small', id: 'pick-exclude', onclick: () => (popup.remove(), actions.togglePick(id)) }, excluded ? 'Use this pick again' : 'Exclude this pick');
      const popup = new maplibregl.Popup({ maxWidth: '380px' }).setLngLat(e.lngLat).setDOMContent(h('div', { class: 'popup', id: 'pick-popup' }, table(pickRows(p, excluded)), button)).addTo(map);
      return;
    }
    let hits = on(lineLayers);
    if (!hits.length) {
      const lineHits = on(['proposals', 'seismic']);
      if (lineHits.length) {
        const f = lineHits[0];
        const coords = (f.geometry as GeoJSON.LineString).coordinates as [number, number][];
        const name = String(f.properties?.id ?? f.properties?.name ?? 'line');
        void actions.openSection(coords, f.layer.id === 'proposals' ? `Proposed line ${name}` : `Existing line ${name}`);
        return;
      }
      hits = on(['cot-zone']);
    }
    if (!hits.length) return;
    new maplibregl.Popup({ maxWidth: '380px' }).setLngLat(e.lngLat).setDOMContent(h('div', { class: 'popup', id: 'boundary-popup' }, table(boundaryRows(hits[0].properties as Record<string, unknown>)))).addTo(map);
  });
  for (const id of ['cot-zone', 'picks', ...lineLayers, 'proposals', 'seismic']) {
    map.on('mouseenter', id, () => (map.getCanvas().style.cursor = 'pointer'));
    map.on('mouseleave', id, () => (map.getCanvas().style.cursor = ''));
  }
  map.on('dblclick', (e) => {
    if (!drawing) return;
    e.preventDefault();
    finish();
  });
  window.addEventListener('keydown', (e) => {
    if (!drawing) return;
    if (e.key === 'Enter') finish();
    if (e.key === 'Escape') {
      drawing = null;
      showDrawn();
      map.getCanvas().style.cursor = '';
      map.doubleClickZoom.enable();
      status('Drawing cancelled.');
    }
  });
  return {
    start() {
      drawing = [];
      map.doubleClickZoom.disable();
      map.getCanvas().style.cursor = 'crosshair';
      status('Click points along the section; double-click (or press Enter) to finish, Escape to cancel.');
    },
  };
}
