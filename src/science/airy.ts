/**
 * Airy isostasy (Turcotte & Schubert, Geodynamics, ch. 2; Allen & Allen, Basin Analysis): a column of
 * water w, sediment s and crust tc over mantle balances a reference column of crust tc0 whose top is
 * at sea level:  w(ρm − ρw) + s(ρm − ρs) = (ρm − ρc)(tc0 − tc).  Lengths in m, densities in kg/m³.
 */

export interface AiryDensities {
  readonly rhoMantle: number;
  readonly rhoCrust: number;
  readonly rhoWater: number;
}

/** Water depth that a crust of thickness tc supports with no sediment. */
export function airyWaterDepth(tc: number, tc0: number, d: AiryDensities): number {
  return ((tc0 - tc) * (d.rhoMantle - d.rhoCrust)) / (d.rhoMantle - d.rhoWater);
}

/** Crustal thickness implied by the water and sediment loads (sediment of mean density rhoSed). */
export function airyCrustFromLoads(w: number, s: number, rhoSed: number, tc0: number, d: AiryDensities): number {
  return tc0 - (w * (d.rhoMantle - d.rhoWater) + s * (d.rhoMantle - rhoSed)) / (d.rhoMantle - d.rhoCrust);
}
