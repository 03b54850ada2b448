/**
 * The derived grids: names (also their export file names), units, what each holds and where its
 * model applies. `applies` is the rule the exported and displayed grid follows (derive/applicability):
 *  - all: a plain difference of the inputs, meaningful wherever they are;
 *  - continental: thickness-based stretching and the models of stretched continental lithosphere
 *    (McKenzie 1978 uniform stretching, the Airy balance against a continental reference column) —
 *    over the proximal, necking and hyperextended domains only;
 *  - oceanic: age–depth relations of oceanic lithosphere — over the oceanic domain only.
 */

export type Applies = 'all' | 'continental' | 'oceanic';

export const DERIVED = [
  { name: 'water-depth', unit: 'm', applies: 'all', optIn: 'the seabed depth in metres positive down, 0 on land', desc: 'water depth (seabed depth), m' },
  { name: 'sediment-thickness', unit: 'm', applies: 'all', optIn: 'top basement minus seabed, one subtraction of the inputs', desc: 'sediment thickness, basement minus seabed, m' },
  { name: 'crustal-thickness', unit: 'm', applies: 'all', desc: 'crustal thickness, Moho minus basement, m' },
  { name: 'beta-crust', unit: '', applies: 'continental', desc: 'whole-crust stretching factor beta = tc0/tc; no data where unbounded (zero crust, see unbounded-beta)' },
  { name: 'gamma', unit: '', applies: 'continental', optIn: '1 - 1/beta-crust', desc: 'thinning factor gamma = 1 - tc/tc0' },
  { name: 'water-loaded-basement', unit: 'm', applies: 'all', desc: 'basement depth with sediment unloaded (water-loaded), m' },
  { name: 'predicted-water-loaded', unit: 'm', applies: 'continental', optIn: 'water-loaded-basement minus subsidence-residual', desc: 'water-loaded depth predicted by McKenzie 1978 for beta-crust at the rift age, m' },
  { name: 'subsidence-residual', unit: 'm', applies: 'continental', desc: 'observed minus McKenzie-predicted water-loaded depth, m' },
  { name: 'beta-subsidence', unit: '', applies: 'continental', desc: 'stretching factor from subsidence, McKenzie 1978; no data where beyond beta infinity (see unbounded-beta)' },
  { name: 'beta-ratio', unit: '', applies: 'continental', optIn: 'beta-subsidence / beta-crust', desc: 'beta-subsidence / beta-crust' },
  { name: 'airy-thickness', unit: 'm', applies: 'continental', optIn: 'crustal-thickness minus airy-residual', desc: 'crustal thickness implied by water and sediment loads (Airy, continental reference column), m' },
  { name: 'airy-residual', unit: 'm', applies: 'continental', desc: 'observed minus Airy-implied crustal thickness (includes thermal subsidence still to come), m' },
  { name: 'oceanic-age-min', unit: 'Ma', applies: 'oceanic', desc: 'indicative oceanic age, young end (wide range; depth-derived; never older than the rift)' },
  { name: 'oceanic-age-max', unit: 'Ma', applies: 'oceanic', desc: 'indicative oceanic age, old end (wide range; depth-derived; capped at the rift age)' },
  { name: 'oceanic-depth-anomaly', unit: 'm', applies: 'oceanic', desc: 'residual depth anomaly where the depth-derived age would be older than the rift: water-loaded depth minus the age-depth curve at the isochron (else rift) age, m' },
] as const satisfies readonly { name: string; unit: string; applies: Applies; desc: string; optIn?: string }[];

export type DerivedName = (typeof DERIVED)[number]['name'];

/**
 * The grids a batch run writes unless asked for more: every grid except those one raster-calculator
 * step away from a written grid or an input (`optIn` says which step). A choice: at 4096² each
 * Float32 grid is 64 MiB to hold and compress, and these are six of the fifteen.
 */
export const DEFAULT_WRITTEN: readonly DerivedName[] = DERIVED.filter((d) => !('optIn' in d)).map((d) => d.name);

/**
 * A --grids value: comma-separated grid names, `default` (DEFAULT_WRITTEN) and `all`, combinable
 * ("default,gamma"). Throws naming the unknown entry.
 */
export function parseGridList(text: string): DerivedName[] {
  const out = new Set<DerivedName>();
  for (const raw of text.split(',').map((q) => q.trim()).filter(Boolean)) {
    if (raw === 'all') for (const d of DERIVED) out.add(d.name);
    else if (raw === 'default') for (const d of DEFAULT_WRITTEN) out.add(d);
    else {
      const d = DERIVED.find((q) => q.name === raw);
      if (!d) throw new Error(`unknown grid "${raw}" (one of: default, all, ${DERIVED.map((q) => q.name).join(', ')})`);
      out.add(d.name);
    }
  }
  if (!out.size) throw new Error('no grid named (default, all, or grid names separated by commas)');
  return DERIVED.filter((d) => out.has(d.name)).map((d) => d.name);
}

/** Where each grid's model applies, in words (for the summary and the legend). */
export const APPLIES_TEXT: Record<Applies, string> = {
  all: 'every cell with data',
  continental: 'continental domains only (proximal, necking, hyperextended): the model is of stretched continental lithosphere',
  oceanic: 'oceanic domain only: age–depth relations hold for oceanic lithosphere',
};

export function appliesOf(name: string): Applies {
  return DERIVED.find((d) => d.name === name)?.applies ?? 'all';
}
