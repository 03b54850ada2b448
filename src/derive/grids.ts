/** The derived grids: names (also their export file names), units and what each holds. */

export const DERIVED = [
  { name: 'water-depth', unit: 'm', desc: 'water depth (seabed depth), m' },
  { name: 'sediment-thickness', unit: 'm', desc: 'sediment thickness, basement minus seabed, m' },
  { name: 'crustal-thickness', unit: 'm', desc: 'crustal thickness, Moho minus basement, m' },
  { name: 'beta-crust', unit: '', desc: 'whole-crust stretching factor beta = tc0/tc (+Inf = no crust)' },
  { name: 'gamma', unit: '', desc: 'thinning factor gamma = 1 - tc/tc0' },
  { name: 'water-loaded-basement', unit: 'm', desc: 'basement depth with sediment unloaded (water-loaded), m' },
  { name: 'predicted-water-loaded', unit: 'm', desc: 'water-loaded depth predicted by McKenzie 1978 for beta-crust at the rift age, m' },
  { name: 'subsidence-residual', unit: 'm', desc: 'observed minus predicted water-loaded depth, m' },
  { name: 'beta-subsidence', unit: '', desc: 'stretching factor from subsidence, McKenzie 1978 (+Inf = beyond beta infinity)' },
  { name: 'beta-ratio', unit: '', desc: 'beta-subsidence / beta-crust' },
  { name: 'airy-thickness', unit: 'm', desc: 'crustal thickness implied by water and sediment loads (Airy), m' },
  { name: 'airy-residual', unit: 'm', desc: 'observed minus Airy-implied crustal thickness, m' },
  { name: 'oceanic-age-min', unit: 'Ma', desc: 'indicative oceanic age, young end (wide range; depth-derived)' },
  { name: 'oceanic-age-max', unit: 'Ma', desc: 'indicative oceanic age, old end (wide range; depth-derived; +Inf = no finite age)' },
] as const;

export type DerivedName = (typeof DERIVED)[number]['name'];

/** Grids that describe stretched continental lithosphere: masked over the oceanic domain on export. */
export const CONTINENTAL_ONLY: readonly DerivedName[] = ['beta-crust', 'gamma', 'beta-subsidence', 'beta-ratio'];
/** Grids that only mean something over oceanic crust: masked elsewhere on export. */
export const OCEANIC_ONLY: readonly DerivedName[] = ['oceanic-age-min', 'oceanic-age-max'];
