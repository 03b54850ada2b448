/**
 * Side fields: what the named lines are traced on. For a side S (a set of cells) and a threshold
 * L (one value or per cell), G = tc − L inside S (clamped to ≥ 0 when asked, so thin spots enclosed by
 * S draw no rings) and min(tc − L, −ε) outside S (crust of the other side can never be "above").
 * Between a cell of S and a cell outside S whose thickness is below L, G is tc − L on both ends, so
 * its zero crossing is exactly the thickness isoline at L. NaN stays NaN: lines stop there.
 */

const EPS = 1e-3; // metres: keeps outside cells strictly below the level

/** A side as a lookup by domain code (1: the code belongs to the side), for `sideField`. */
export function sideOf(member: (code: number) => boolean): Uint8Array {
  const t = new Uint8Array(256);
  for (let c = 0; c < 256; c++) t[c] = member(c) ? 1 : 0;
  return t;
}

/**
 * G for the side of cells whose domain code is in `side` (see sideOf), written into `out` when given
 * (a buffer reused between fields) else a new grid.
 */
export function sideField(
  tc: Float32Array,
  domains: Uint8Array,
  side: Uint8Array,
  threshold: Float32Array | number,
  clampInside: boolean,
  out: Float32Array = new Float32Array(tc.length),
): Float32Array {
  const n = tc.length;
  const level = typeof threshold === 'number' ? null : threshold;
  const fixed = typeof threshold === 'number' ? threshold : 0;
  for (let k = 0; k < n; k++) {
    const t = tc[k];
    if (t !== t) {
      out[k] = NaN;
      continue;
    }
    const g = t - (level ? level[k] : fixed);
    out[k] = side[domains[k]] ? (clampInside && g < 0 ? 0 : g) : Math.min(g, -EPS);
  }
  return out;
}
