/**
 * Side fields: what the named lines are traced on. For a side S (a set of cells) and a threshold
 * L (one value or per cell), G = tc − L inside S (clamped to ≥ 0 when asked, so thin spots enclosed by
 * S draw no rings) and min(tc − L, −ε) outside S (crust of the other side can never be "above").
 * Between a cell of S and a cell outside S whose thickness is below L, G is tc − L on both ends, so
 * its zero crossing is exactly the thickness isoline at L. NaN stays NaN: lines stop there.
 */

const EPS = 1e-3; // metres: keeps outside cells strictly below the level

export function sideField(
  tc: Float32Array,
  inside: (k: number) => boolean,
  threshold: Float32Array | number,
  clampInside: boolean,
): Float32Array {
  const n = tc.length;
  const out = new Float32Array(n);
  for (let k = 0; k < n; k++) {
    const t = tc[k];
    if (t !== t) {
      out[k] = NaN;
      continue;
    }
    const g = t - (typeof threshold === 'number' ? threshold : threshold[k]);
    out[k] = inside(k) ? (clampInside && g < 0 ? 0 : g) : Math.min(g, -EPS);
  }
  return out;
}
