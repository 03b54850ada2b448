/**
 * Stretching and thinning factors from crustal thickness: β = tc0/tc, γ = 1 − 1/β = 1 − tc/tc0
 * (γ as defined by Chappell & Kusznir 2008, GJI 174). tc = 0 gives β = +∞ and γ = 1.
 */
export function betaFromThickness(tc: number, tc0: number): number {
  if (tc === 0) return Infinity;
  return tc0 / tc;
}

export function gammaFromThickness(tc: number, tc0: number): number {
  return 1 - tc / tc0;
}

export function gammaFromBeta(beta: number): number {
  return beta === Infinity ? 1 : 1 - 1 / beta;
}
