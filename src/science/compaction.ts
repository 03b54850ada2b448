/**
 * Sediment porosity and density with exponential compaction (Athy 1930): φ(z) = φ0·exp(−z/λ).
 * Lithology parameters of Sclater & Christie (1980) as tabulated by Wangen (2010, Physical Principles
 * of Sedimentary Basin Analysis, Table 2.1); λ = 1/c with c in km⁻¹. Grain densities from memory.
 */

export interface Lithology {
  readonly name: string;
  /** Surface porosity (0..1). */
  readonly phi0: number;
  /** Compaction length λ (m). */
  readonly lambda: number;
  /** Grain density (kg/m³). */
  readonly rhoGrain: number;
}

export const LITHOLOGIES: Readonly<Record<'shale' | 'sandstone' | 'chalk' | 'shaly-sandstone', Lithology>> = {
  shale: { name: 'shale', phi0: 0.63, lambda: 1000 / 0.51, rhoGrain: 2720 },
  sandstone: { name: 'sandstone', phi0: 0.49, lambda: 1000 / 0.27, rhoGrain: 2650 },
  chalk: { name: 'chalk', phi0: 0.7, lambda: 1000 / 0.71, rhoGrain: 2710 },
  // Wangen prints 2464 m; 1/0.39 km⁻¹ = 2564 m, which we use (REFERENCES.md §2).
  'shaly-sandstone': { name: 'shaly sandstone', phi0: 0.56, lambda: 1000 / 0.39, rhoGrain: 2680 },
};

/** Mean porosity over a column 0..S (m): φ̄ = φ0·λ·(1 − e^(−S/λ))/S; φ0 at S = 0. */
export function meanPorosity(S: number, lith: Lithology): number {
  if (S <= 0) return lith.phi0;
  return (lith.phi0 * lith.lambda * -Math.expm1(-S / lith.lambda)) / S;
}

/** Mean bulk density of a water-saturated column 0..S: ρ̄ = φ̄·ρw + (1 − φ̄)·ρg. */
export function meanSedimentDensity(S: number, lith: Lithology, rhoWater: number): number {
  const phi = meanPorosity(S, lith);
  return phi * rhoWater + (1 - phi) * lith.rhoGrain;
}
