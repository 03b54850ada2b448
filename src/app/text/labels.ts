/** Plain-word names for what the app shows: grids, pick kinds, map layers, input roles. */

import { DERIVED, type DerivedName } from '../../derive/grids.js';

/** Each derived grid in words, with the unit its values are shown in. */
export const GRID_LABELS: Record<DerivedName, string> = {
  'water-depth': 'Water depth',
  'sediment-thickness': 'Sediment thickness',
  'crustal-thickness': 'Crustal thickness',
  'beta-crust': 'Stretching factor β (from crustal thickness)',
  gamma: 'Thinning factor γ',
  'water-loaded-basement': 'Water-loaded basement depth (sediment removed)',
  'predicted-water-loaded': 'Water-loaded depth predicted by McKenzie (1978)',
  'subsidence-residual': 'Subsidence residual (observed − predicted)',
  'beta-subsidence': 'Stretching factor β (from subsidence)',
  'beta-ratio': 'β ratio (subsidence ÷ crustal thickness)',
  'airy-thickness': 'Crustal thickness for Airy balance',
  'airy-residual': 'Airy residual (observed − balanced thickness)',
  'oceanic-age-min': 'Oceanic age, young end (indicative)',
  'oceanic-age-max': 'Oceanic age, old end (indicative)',
  'oceanic-depth-anomaly': 'Oceanic depth anomaly',
};

const UNIT_WORDS: Record<string, string> = { m: 'm', Ma: 'Ma', '': 'no unit' };

/** A raster layer's name for the layer list and the legend title, with its unit. */
/** The sweep's grids (shown after an uncertainty run): probabilities 0–1, the envelope width in km. */
export const SWEEP_LAYERS: Record<string, string> = {
  'p-continental': 'Probability of continental crust (realisations)',
  'p-transition': 'Probability of the transition zone (realisations)',
  'p-oceanic': 'Probability of oceanic crust (realisations)',
  'positional-uncertainty': 'Envelope width, P90–P10 of the limits (km)',
};

export function layerLabel(name: string): string {
  if (name === 'domains') return 'Margin domains (interpretation)';
  if (SWEEP_LAYERS[name]) return SWEEP_LAYERS[name];
  const d = DERIVED.find((x) => x.name === name);
  if (!d) return name;
  return `${GRID_LABELS[d.name]} (${UNIT_WORDS[d.unit] ?? d.unit})`;
}

export const PICK_KIND_LABELS: Record<string, string> = {
  'continental-limit': 'Continental-limit pick',
  'oceanic-limit': 'Oceanic-limit pick',
  onlap: 'Onlap pick',
};

/** Map overlays the user can show or hide. */
export const OVERLAY_LABELS: Record<string, string> = {
  boundaries: 'Boundary lines',
  cot: 'Continent–ocean transition zone',
  licence: 'Licence outline',
  seismic: 'Existing seismic lines',
  picks: 'Interpreter picks',
  isochrons: 'Magnetic isochrons',
  outlines: 'Domain cell outlines',
  envelope: 'Uncertainty envelope (P90 / P10 lines)',
  graticule: 'Graticule (0.5°)',
};

export const ROLE_LABELS: Record<string, string> = {
  'top-basement': 'Top basement (depth)',
  moho: 'Moho (depth)',
  seabed: 'Seabed (depth)',
  licence: 'Licence polygon',
  lines: 'Existing seismic lines',
  picks: 'Interpreter picks',
  isochrons: 'Magnetic isochrons',
  crust: 'Crust-type polygons',
  none: 'Not used',
};

/** The margin domains as the map and panels name them (the exports keep their own short names). */
export const DOMAIN_LABELS: Record<number, string> = {
  0: 'No data',
  1: 'Proximal continental crust',
  2: 'Necking zone',
  3: 'Hyperextended continental crust',
  4: 'Transition (exhumed mantle or unresolved)',
  5: 'Oceanic crust',
  6: 'Moho not imaged (basement picked, no Moho)',
};
