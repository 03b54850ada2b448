// Seeded random numbers and the moving-average random field (Oliver 1995: white noise convolved
// with a kernel has the kernel's autocorrelation as its covariance). Check values: the standard
// normal's mean 0 and variance 1; the field's variance 1 and, at each lag, the exact correlation of
// its discrete kernel; the correlation length ℓ giving about 1/e (the Gaussian approximation).
import { describe, expect, it } from 'vitest';
import { boxWidth, correlationAt, fieldGenerator, kernel1d } from '../../src/uncertainty/field.js';
import { rng } from '../../src/uncertainty/random.js';

describe('seeded random numbers', () => {
  it('depend only on (seed, index, stream)', () => {
    const a = rng(7, 3, 'moho');
    const b = rng(7, 3, 'moho');
    const first = Array.from({ length: 5 }, () => a.normal());
    expect(Array.from({ length: 5 }, () => b.normal())).toEqual(first);
    expect(rng(8, 3, 'moho').normal()).not.toBe(first[0]);
    expect(rng(7, 4, 'moho').normal()).not.toBe(first[0]);
    expect(rng(7, 3, 'basement').normal()).not.toBe(first[0]);
  });

  it('give standard normal deviates (mean 0, variance 1, within 5 standard errors of 200 000 draws)', () => {
    const r = rng(1, 0, 'test');
    const n = 200_000;
    let s = 0, s2 = 0, s4 = 0;
    for (let k = 0; k < n; k++) {
      const z = r.normal();
      s += z; s2 += z * z; s4 += z ** 4;
    }
    expect(Math.abs(s / n)).toBeLessThan(5 / Math.sqrt(n));
    // the variance of z² is 2 for a normal
    expect(Math.abs(s2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    // the fourth moment of a standard normal is 3
    expect(Math.abs(s4 / n - 3)).toBeLessThan(0.1);
  });
});

describe('moving-average random field', () => {
  it('kernel: three boxes of w, length 3w − 2, sum w³ (a quadratic B-spline)', () => {
    const k = kernel1d(5);
    expect(k.length).toBe(13);
    expect(k.reduce((a, b) => a + b, 0)).toBe(125);
    expect(Array.from(k.slice(0, 4))).toEqual([1, 3, 6, 10]);
  });

  it('the correlation length ℓ is where the correlation is about 1/e (within 0.05 for ℓ of 4–40 cells)', () => {
    for (const cells of [4, 10, 20, 40]) {
      const w = boxWidth(cells * 500, 500);
      expect(Math.abs(correlationAt(w, cells) - Math.exp(-1))).toBeLessThan(0.05);
    }
  });

  it('has unit variance and, at lags along both axes, the kernel’s exact correlation (sampling error of 30 fields)', () => {
    const shape = { nx: 160, ny: 120, dx: 1000, dy: -1000 };
    const gen = fieldGenerator(shape, 8000);
    const out = new Float32Array(shape.nx * shape.ny);
    const lags = [0, 2, 4, 8, 16];
    const sx = lags.map(() => 0);
    const sy = lags.map(() => 0);
    const cx = lags.map(() => 0);
    const cy = lags.map(() => 0);
    let sum = 0, sum2 = 0, count = 0;
    for (let f = 0; f < 30; f++) {
      gen.fill(rng(3, f, 'field'), out);
      for (let j = 0; j < shape.ny; j++) for (let i = 0; i < shape.nx; i++) {
        const v = out[j * shape.nx + i];
        sum += v; sum2 += v * v; count++;
        lags.forEach((l, q) => {
          if (i + l < shape.nx) (sx[q] += v * out[j * shape.nx + i + l]), cx[q]++;
          if (j + l < shape.ny) (sy[q] += v * out[(j + l) * shape.nx + i]), cy[q]++;
        });
      }
    }
    // many correlated cells: the effective sample is far smaller than the cell count, hence 0.08
    expect(Math.abs(sum / count)).toBeLessThan(0.08);
    expect(Math.abs(sum2 / count - 1)).toBeLessThan(0.08);
    lags.forEach((l, q) => {
      const want = correlationAt(gen.wx, l);
      expect(Math.abs(sx[q] / cx[q] - want)).toBeLessThan(0.08);
      expect(Math.abs(sy[q] / cy[q] - correlationAt(gen.wy, l))).toBeLessThan(0.08);
    });
  });
});
