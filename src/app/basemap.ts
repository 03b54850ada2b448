/**
 * The offline map style: a background, Natural Earth land (public domain, from the world-atlas
 * package, bundled), a graticule generated here, and empty GeoJSON sources for our data. No tiles,
 * no sprite, no glyphs: nothing is fetched.
 */

import type { StyleSpecification } from 'maplibre-gl';
import { feature } from 'topojson-client';
import land50 from 'world-atlas/land-50m.json';

import { BOUNDARY_STYLES, COLOURS, COT_FILL, ENVELOPE_DASH, EXCLUDED_PICK, PICK_STYLES, SUSPECT_PICK } from './map/styles.js';

export { BOUNDARY_STYLES, COLOURS, COT_FILL, PICK_STYLES, SUSPECT_PICK };

export function landGeoJson(): GeoJSON.FeatureCollection {
  // topojson-client's feature() returns a FeatureCollection for a GeometryCollection object.
  const topo = land50 as unknown as Parameters<typeof feature>[0];
  return feature(topo, (topo as unknown as { objects: Record<string, never> }).objects.land) as unknown as GeoJSON.FeatureCollection;
}

export function graticule(west: number, south: number, east: number, north: number, step = 1): GeoJSON.FeatureCollection {
  const features: GeoJSON.Feature[] = [];
  const w = Math.floor(west / step) * step - 5 * step;
  const e = Math.ceil(east / step) * step + 5 * step;
  const s = Math.max(-85, Math.floor(south / step) * step - 5 * step);
  const n = Math.min(85, Math.ceil(north / step) * step + 5 * step);
  for (let lon = w; lon <= e; lon += step) {
    const coords: [number, number][] = [];
    for (let lat = s; lat <= n; lat += step / 10) coords.push([lon, lat]);
    features.push({ type: 'Feature', properties: { lon }, geometry: { type: 'LineString', coordinates: coords } });
  }
  for (let lat = s; lat <= n; lat += step) {
    const coords: [number, number][] = [];
    for (let lon = w; lon <= e; lon += step / 10) coords.push([lon, lat]);
    features.push({ type: 'Feature', properties: { lat }, geometry: { type: 'LineString', coordinates: coords } });
  }
  return { type: 'FeatureCollection', features };
}

const empty: GeoJSON.FeatureCollection = { type: 'FeatureCollection', features: [] };

/** A MapLibre match expression on the pick's kind for one PICK_STYLES property. */
function byKind(prop: 'fill' | 'stroke' | 'strokeWidth'): unknown[] {
  return ['match', ['get', 'kind'], ...Object.entries(PICK_STYLES).flatMap(([k, s]) => [k, s[prop]]), prop === 'strokeWidth' ? 1.5 : prop === 'fill' ? COLOURS.picks : '#000'];
}

export function baseStyle(): StyleSpecification {
  const src = (data: GeoJSON.FeatureCollection = empty) => ({ type: 'geojson' as const, data });
  return {
    version: 8,
    sources: {
      land: src(landGeoJson()),
      graticule: src(),
      licence: src(),
      seismic: src(),
      picks: src(),
      boundaries: src(),
      outlines: src(),
      proposals: src(),
      envelope: src(),
      midline: src(),
      gaps: src(),
      drawn: src(),
      isochrons: src(),
    },
    layers: [
      { id: 'sea', type: 'background', paint: { 'background-color': COLOURS.sea } },
      { id: 'land', type: 'fill', source: 'land', paint: { 'fill-color': COLOURS.land } },
      { id: 'coast', type: 'line', source: 'land', paint: { 'line-color': COLOURS.coast, 'line-width': 0.8 } },
      { id: 'graticule', type: 'line', source: 'graticule', paint: { 'line-color': COLOURS.graticule, 'line-width': 0.6, 'line-opacity': 0.7 } },
      { id: 'domain-outlines', type: 'line', source: 'outlines', layout: { visibility: 'none' }, paint: { 'line-color': '#202020', 'line-width': 1 } },
      {
        id: 'cot-zone',
        type: 'fill',
        source: 'boundaries',
        filter: ['==', ['get', 'kind'], 'cot-zone'],
        paint: { 'fill-color': COT_FILL, 'fill-opacity': 0.3 },
      },
      { id: 'cot-outline', type: 'line', source: 'boundaries', filter: ['==', ['get', 'kind'], 'cot-zone'], paint: { 'line-color': COT_FILL, 'line-width': 1.5 } },
      // a white casing keeps the isochrons visible over every raster ramp (dark and light ends alike)
      { id: 'isochrons-casing', type: 'line', source: 'isochrons', paint: { 'line-color': '#ffffff', 'line-width': 4, 'line-opacity': 0.9 } },
      { id: 'isochrons', type: 'line', source: 'isochrons', paint: { 'line-color': COLOURS.isochron, 'line-width': 2, 'line-dasharray': [1, 1.5] } },
      { id: 'seismic', type: 'line', source: 'seismic', paint: { 'line-color': COLOURS.seismic, 'line-width': 1.6, 'line-dasharray': [1, 0] } },
      { id: 'licence', type: 'line', source: 'licence', paint: { 'line-color': COLOURS.licence, 'line-width': 2, 'line-dasharray': [5, 2] } },
      // a pale casing under every boundary keeps it readable over dark and light rasters alike
      ...BOUNDARY_STYLES.map((s) => ({
        id: `casing-${s.kind}`,
        type: 'line' as const,
        source: 'boundaries',
        filter: ['all', ['==', ['get', 'kind'], s.kind], ['!=', ['get', 'far_from_control'], true]] as never,
        layout: { 'line-join': 'round' as const },
        paint: { 'line-color': '#ffffff', 'line-opacity': 0.85, 'line-width': ['case', ['==', ['get', 'evidence'], 'picks'], s.width + 3, s.width + 1.5] as never },
      })),
      // proxy pieces far from every pick and seismic line: faded, thin, no casing
      ...BOUNDARY_STYLES.map((s) => ({
        id: `bfar-${s.kind}`,
        type: 'line' as const,
        source: 'boundaries',
        filter: ['all', ['==', ['get', 'kind'], s.kind], ['==', ['get', 'far_from_control'], true]] as never,
        layout: { 'line-cap': 'butt' as const, 'line-join': 'round' as const },
        paint: { 'line-color': s.colour, 'line-opacity': 0.45, 'line-width': Math.max(1, s.width - 1.5), ...(s.dash ? { 'line-dasharray': s.dash } : {}) },
      })),
      ...BOUNDARY_STYLES.map((s) => ({
        id: `b-${s.kind}`,
        type: 'line' as const,
        source: 'boundaries',
        filter: ['all', ['==', ['get', 'kind'], s.kind], ['!=', ['get', 'far_from_control'], true]] as never,
        layout: { 'line-cap': 'butt' as const, 'line-join': 'round' as const },
        paint: {
          'line-color': s.colour,
          // placed by picks: bold; by the thickness proxy: thinner
          'line-width': ['case', ['==', ['get', 'evidence'], 'picks'], s.width + 1.5, s.width - 0.5] as never,
          ...(s.dash ? { 'line-dasharray': s.dash } : {}),
        },
      })),
      // the sweep's P90 and P10 lines either side of each line (its P50 lies near the line itself)
      {
        id: 'envelope',
        type: 'line',
        source: 'envelope',
        filter: ['!=', ['get', 'p'], 50],
        paint: {
          'line-color': ['match', ['get', 'kind'], ...BOUNDARY_STYLES.flatMap((s) => [s.kind, s.colour]), '#555555'] as never,
          'line-width': 1.5,
          'line-dasharray': ENVELOPE_DASH,
        },
      },
      { id: 'gaps', type: 'line', source: 'gaps', paint: { 'line-color': COLOURS.gap, 'line-width': 10, 'line-opacity': 0.75 } },
      { id: 'midline', type: 'line', source: 'midline', paint: { 'line-color': '#404040', 'line-width': 1.2, 'line-dasharray': [2, 2] } },
      {
        id: 'proposals',
        type: 'line',
        source: 'proposals',
        paint: {
          'line-color': ['case', ['==', ['get', 'kind'], 'dip'], COLOURS.dip, COLOURS.strike] as never,
          'line-width': ['case', ['==', ['get', 'kind'], 'dip'], 3, 2.5] as never,
        },
      },
      { id: 'drawn', type: 'line', source: 'drawn', paint: { 'line-color': '#000000', 'line-width': 2.5 } },
      { id: 'drawn-points', type: 'circle', source: 'drawn', paint: { 'circle-radius': 3.5, 'circle-color': '#000' } },
      {
        id: 'picks',
        type: 'circle',
        source: 'picks',
        paint: {
          'circle-radius': ['case', ['==', ['get', 'suspect'], true], 7, 5] as never,
          // excluded: grey; suspect: red; otherwise the kind's own symbol (PICK_STYLES)
          'circle-color': ['case', ['==', ['get', 'excluded'], true], EXCLUDED_PICK, ['==', ['get', 'suspect'], true], SUSPECT_PICK, byKind('fill')] as never,
          'circle-stroke-color': byKind('stroke') as never,
          'circle-stroke-width': byKind('strokeWidth') as never,
        },
      },
    ],
  };
}
