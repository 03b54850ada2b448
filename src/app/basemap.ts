/**
 * The offline map style: a background, Natural Earth land (public domain, from the world-atlas
 * package, bundled), a graticule generated here, and empty GeoJSON sources for our data. No tiles,
 * no sprite, no glyphs: nothing is fetched.
 */

import type { StyleSpecification } from 'maplibre-gl';
import { feature } from 'topojson-client';
import land50 from 'world-atlas/land-50m.json';

export const COLOURS = {
  sea: '#dfe7ee',
  land: '#c9c3b6',
  coast: '#8d877b',
  graticule: '#9aa6b2',
  licence: '#111111',
  seismic: '#3b3b3b',
  picks: '#ffffff',
};

// Boundary styles: Okabe & Ito (2008) colour-blind-safe palette, plus distinct dash patterns, so the
// lines stay apart without colour too.
export const BOUNDARY_STYLES: { kind: string; label: string; colour: string; dash: number[] | null; width: number }[] = [
  { kind: 'crustal-taper-limit', label: 'Crustal taper limit', colour: '#D55E00', dash: null, width: 3 },
  { kind: 'oceanic-limit', label: 'Landward limit of oceanic crust', colour: '#0072B2', dash: null, width: 3 },
  { kind: 'oldest-onlapped-crust', label: 'Oldest onlapped crust (dashed; the oceanic limit where no onlap picks)', colour: '#0072B2', dash: [3, 1.5], width: 3 },
  { kind: 'necking-line', label: 'Necking line (0.8 · tc0)', colour: '#000000', dash: [0.6, 1.4], width: 2.5 },
  { kind: 'coupling-line', label: 'Coupling line (10 km crust)', colour: '#CC79A7', dash: [4, 1.5, 0.8, 1.5], width: 2.5 },
];
export const COT_FILL = '#E69F00';
export const SUSPECT_PICK = '#e63946';

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
        paint: { 'fill-color': COT_FILL, 'fill-opacity': 0.22, 'fill-outline-color': COT_FILL },
      },
      { id: 'isochrons', type: 'line', source: 'isochrons', paint: { 'line-color': '#5e3c99', 'line-width': 1.5, 'line-dasharray': [1, 2] } },
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
      { id: 'gaps', type: 'line', source: 'gaps', paint: { 'line-color': '#F0E442', 'line-width': 10, 'line-opacity': 0.75 } },
      { id: 'midline', type: 'line', source: 'midline', paint: { 'line-color': '#404040', 'line-width': 1.2, 'line-dasharray': [2, 2] } },
      {
        id: 'proposals',
        type: 'line',
        source: 'proposals',
        paint: {
          'line-color': ['case', ['==', ['get', 'kind'], 'dip'], '#009E73', '#56B4E9'] as never,
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
          // excluded: grey; suspect: red; otherwise white
          'circle-color': ['case', ['==', ['get', 'excluded'], true], '#9e9e9e', ['==', ['get', 'suspect'], true], SUSPECT_PICK, COLOURS.picks] as never,
          'circle-stroke-color': '#000',
          'circle-stroke-width': 1.5,
        },
      },
    ],
  };
}
