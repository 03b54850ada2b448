/** The Export panel: each output file of the run, the grids as GeoTIFF, and the map image. */

import { DERIVED } from '../../derive/grids.js';
import { h } from '../dom.js';
import type { Actions } from '../state.js';
import { layerLabel } from '../text/labels.js';

export function mountExport(el: HTMLElement, actions: Actions): void {
  const gridSelect = h('select', { id: 'export-grid', 'aria-label': 'Grid to export' }, h('option', { value: 'domains', text: layerLabel('domains') }), ...DERIVED.map((d) => h('option', { value: d.name, text: layerLabel(d.name) }))) as HTMLSelectElement;
  const get = (path: string, type: string) => () => void actions.exportFile(path, type);
  el.append(
    h('div', { class: 'export' },
      h('button', { id: 'export-boundaries', title: 'Boundary pieces and the COT zone, GeoJSON (WGS 84)', onclick: get('boundaries.geojson', 'application/geo+json') }, 'Boundaries (GeoJSON)'),
      h('button', { id: 'export-lines', title: 'One feature per continuous line, GeoJSON', onclick: get('boundary-lines.geojson', 'application/geo+json') }, 'Whole lines (GeoJSON)'),
      h('button', { id: 'export-domains', title: 'Domain polygons, GeoJSON', onclick: get('domains.geojson', 'application/geo+json') }, 'Domains (GeoJSON)'),
      h('button', { id: 'export-gpkg', onclick: get('boundaries.gpkg', 'application/geopackage+sqlite3') }, 'GeoPackage (all layers, WGS 84 and analysis CRS)'),
      h('button', { id: 'export-summary', onclick: get('summary.json', 'application/json') }, 'Run summary (JSON)'),
      h('div', { class: 'row' }, gridSelect, h('button', { id: 'export-grid-btn', onclick: () => void actions.exportFile(`grids/${gridSelect.value}.tif`, 'image/tiff') }, 'GeoTIFF')),
      h('button', { id: 'export-png', onclick: () => void actions.exportImage() }, 'Map image (PNG)'),
      h('div', { class: 'legend-title', text: 'After running realisations' }),
      h('button', { id: 'export-envelope', title: 'P90, P50 and P10 lines, GeoJSON (WGS 84); property p', onclick: get('uncertainty/lines.geojson', 'application/geo+json') }, 'Envelope lines (GeoJSON)'),
      h('button', { id: 'export-zone-width', title: 'Zone width along strike, P90/P50/P10', onclick: get('uncertainty/zone-width.csv', 'text/csv') }, 'Zone width (CSV)'),
      h('button', { id: 'export-positional', title: 'P90–P10 envelope width of the limits, km', onclick: get('uncertainty/positional-uncertainty.tif', 'image/tiff') }, 'Envelope width (GeoTIFF)'),
    ),
  );
}
