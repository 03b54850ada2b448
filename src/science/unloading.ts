/**
 * Sediment unloading (Watts & Ryan 1976; Steckler & Watts 1978): the depth the basement would have
 * with the sediment replaced by water, loaded by water only (Airy):
 *   Y = w + s·(ρm − ρ̄s)/(ρm − ρw)
 * It equals the tectonic subsidence only if the basement started at sea level with no palaeo-water
 * depth; outputs that use it say so.
 */

import { meanSedimentDensity, type Lithology } from './compaction.js';

export function waterLoadedDepth(w: number, s: number, rhoSed: number, rhoMantle: number, rhoWater: number): number {
  return w + (s * (rhoMantle - rhoSed)) / (rhoMantle - rhoWater);
}

/** The same with the mean density of an exponentially compacted column (Athy 1930). */
export function waterLoadedDepthCompacted(w: number, s: number, lith: Lithology, rhoMantle: number, rhoWater: number): number {
  if (s <= 0) return w;
  return waterLoadedDepth(w, s, meanSedimentDensity(s, lith, rhoWater), rhoMantle, rhoWater);
}
