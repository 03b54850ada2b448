/**
 * Colours and symbols shared by the map style, the legend and the exported image (one place, so
 * the legend always shows what the map draws). Boundary colours: Okabe & Ito (2008) colour-blind-
 * safe palette, with distinct dash patterns so the lines stay apart without colour too.
 */

export const COLOURS = {
  sea: '#dfe7ee',
  land: '#c9c3b6',
  coast: '#8d877b',
  graticule: '#9aa6b2',
  licence: '#111111',
  seismic: '#3b3b3b',
  picks: '#ffffff',
  isochron: '#5e3c99',
  dip: '#009E73',
  strike: '#56B4E9',
  gap: '#F0E442',
};

export const BOUNDARY_STYLES: { kind: string; label: string; colour: string; dash: number[] | null; width: number }[] = [
  { kind: 'crustal-taper-limit', label: 'Crustal taper limit', colour: '#D55E00', dash: null, width: 3 },
  { kind: 'oceanic-limit', label: 'Landward limit of oceanic crust', colour: '#0072B2', dash: null, width: 3 },
  { kind: 'oldest-onlapped-crust', label: 'Oldest onlapped crust (dashed; the oceanic limit where no onlap picks)', colour: '#0072B2', dash: [3, 1.5], width: 3 },
  { kind: 'necking-line', label: 'Necking line (0.8 · tc0)', colour: '#000000', dash: [0.6, 1.4], width: 2.5 },
  { kind: 'coupling-line', label: 'Coupling line (10 km crust)', colour: '#CC79A7', dash: [4, 1.5, 0.8, 1.5], width: 2.5 },
];

/** The envelope (P90 and P10 of each line from a sweep): thin, dashed, in the colour of its line. */
export const ENVELOPE_DASH = [2, 2];

/**
 * The COT zone: a pink no domain colour comes near (tests/app/text.test.ts checks the distance),
 * drawn translucent with a solid outline so the domains stay readable under it.
 */
export const COT_FILL = '#FF4FA0';
export const SUSPECT_PICK = '#e63946';
export const EXCLUDED_PICK = '#9e9e9e';

/** One symbol per pick kind: the colour of the line it calibrates, hollow or filled. */
export const PICK_STYLES: Record<string, { fill: string; stroke: string; strokeWidth: number }> = {
  'continental-limit': { fill: '#ffffff', stroke: '#D55E00', strokeWidth: 2.5 },
  'oceanic-limit': { fill: '#ffffff', stroke: '#0072B2', strokeWidth: 2.5 },
  onlap: { fill: '#0072B2', stroke: '#ffffff', strokeWidth: 1.5 },
};
