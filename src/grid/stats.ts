/** NaN-aware statistics over Float32 grid values. ±Infinity are counted apart, never averaged. */

export interface GridStats {
  readonly count: number; // finite values
  readonly nan: number;
  readonly infinite: number;
  readonly min: number;
  readonly max: number;
  readonly mean: number;
  readonly std: number;
}

export function stats(values: ArrayLike<number>, mask?: Uint8Array): GridStats {
  let count = 0;
  let nan = 0;
  let inf = 0;
  let min = Infinity;
  let max = -Infinity;
  // Welford's running mean and variance: stable over millions of cells.
  let mean = 0;
  let m2 = 0;
  for (let k = 0; k < values.length; k++) {
    if (mask && !mask[k]) continue;
    const v = values[k];
    if (Number.isNaN(v)) {
      nan++;
      continue;
    }
    if (!Number.isFinite(v)) {
      inf++;
      continue;
    }
    count++;
    if (v < min) min = v;
    if (v > max) max = v;
    const d = v - mean;
    mean += d / count;
    m2 += d * (v - mean);
  }
  return {
    count,
    nan,
    infinite: inf,
    min: count ? min : NaN,
    max: count ? max : NaN,
    mean: count ? mean : NaN,
    std: count > 1 ? Math.sqrt(m2 / (count - 1)) : count === 1 ? 0 : NaN,
  };
}

/**
 * Quantile q (0..1) of the finite values, linear interpolation between order statistics
 * (the "type 7" definition used by R and numpy by default).
 */
export function quantile(values: ArrayLike<number>, q: number): number {
  const finite: number[] = [];
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (Number.isFinite(v)) finite.push(v);
  }
  if (finite.length === 0) return NaN;
  const sorted = Float64Array.from(finite).sort();
  const h = (sorted.length - 1) * Math.min(1, Math.max(0, q));
  const lo = Math.floor(h);
  const hi = Math.min(sorted.length - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

