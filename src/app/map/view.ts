/**
 * The map: MapLibre with the offline style, the deck.gl overlay that carries the raster, and the
 * vector sources. Fitting to data, setting sources and showing or hiding overlays live here.
 */

import maplibregl, { type GeoJSONSource } from 'maplibre-gl';
import { MapboxOverlay } from '@deck.gl/mapbox';
import { WGS84 } from '../../crs/registry.js';
import { transformer } from '../../crs/transform.js';
import { baseStyle, graticule } from '../basemap.js';
import type { DisplayGeometry } from '../messages.js';
import { BOUNDARY_STYLES } from './styles.js';

export interface MapView {
  readonly map: maplibregl.Map;
  readonly overlay: MapboxOverlay;
  readonly loaded: Promise<void>;
  setSource(id: string, data: unknown): void;
  /** Zoom to a grid's footprint (WGS 84 bounds of its corners and edges) and lay a graticule over it. */
  fitTo(g: DisplayGeometry): void;
  applyVisibility(visible: Record<string, boolean>): void;
}

const EMPTY = { type: 'FeatureCollection', features: [] };

/** WGS 84 bounds of a grid: its corners and points along its edges (a projected edge is curved). */
export function gridBounds(g: DisplayGeometry): [number, number, number, number] {
  const t = transformer({ ...g.crs }, WGS84);
  const xs: number[] = [];
  const ys: number[] = [];
  for (let s = 0; s <= 8; s++) {
    for (const [i, j] of [[(s / 8) * (g.nx - 1), 0], [(s / 8) * (g.nx - 1), g.ny - 1], [0, (s / 8) * (g.ny - 1)], [g.nx - 1, (s / 8) * (g.ny - 1)]]) {
      const [lon, lat] = t.forward([g.x0 + i * g.dx, g.y0 + j * g.dy]);
      xs.push(lon);
      ys.push(lat);
    }
  }
  return [Math.min(...xs), Math.min(...ys), Math.max(...xs), Math.max(...ys)];
}

export function createMapView(container: HTMLElement): MapView {
  const map = new maplibregl.Map({
    container,
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
  const loaded = new Promise<void>((resolve) => map.on('load', () => resolve()));
  const setSource = (id: string, data: unknown) => (map.getSource(id) as GeoJSONSource | undefined)?.setData((data ?? EMPTY) as GeoJSON.FeatureCollection);
  return {
    map,
    overlay,
    loaded,
    setSource,
    fitTo(g) {
      const b = gridBounds(g);
      map.fitBounds([[b[0], b[1]], [b[2], b[3]]], { padding: 30, duration: 0 });
      setSource('graticule', graticule(b[0], b[1], b[2], b[3], 0.5));
    },
    applyVisibility(visible) {
      const vis = (id: string, on: boolean) => map.getLayer(id) && map.setLayoutProperty(id, 'visibility', on ? 'visible' : 'none');
      for (const s of BOUNDARY_STYLES) for (const p of ['b', 'bfar', 'casing']) vis(`${p}-${s.kind}`, visible.boundaries);
      vis('cot-zone', visible.cot);
      vis('cot-outline', visible.cot);
      vis('licence', visible.licence);
      vis('seismic', visible.seismic);
      vis('picks', visible.picks);
      vis('envelope', visible.envelope !== false);
      vis('isochrons', visible.isochrons ?? true);
      vis('isochrons-casing', visible.isochrons ?? true);
      vis('graticule', visible.graticule);
      vis('domain-outlines', visible.outlines);
    },
  };
}
