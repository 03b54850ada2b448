import { describe, expect, it } from 'vitest';
import { airyCrustFromLoads, airyWaterDepth } from '../../src/science/airy.js';
import { LITHOLOGIES, meanPorosity, meanSedimentDensity } from '../../src/science/compaction.js';
import { ageFromDepth, ageTable, depthFromAge, PS77_SWITCH } from '../../src/science/age-depth.js';
import {
  betaFromSubsidence,
  initialSubsidence,
  makeBetaInverter,
  MCKENZIE_1978,
  thermalScale,
  thermalSubsidence,
  totalSubsidence,
} from '../../src/science/mckenzie.js';
import { betaFromThickness, gammaFromBeta, gammaFromThickness } from '../../src/science/stretching.js';
import { waterLoadedDepth, waterLoadedDepthCompacted } from '../../src/science/unloading.js';
import { prng } from '../../fixtures/demo-margin.js';

const D = { rhoMantle: 3300, rhoCrust: 2800, rhoWater: 1000 };

// Each row: what, computed value, published value, tolerance, source.
type Row = [string, () => number, number, number, string];
const AIRY_TS = 'Airy column balance, Turcotte & Schubert, Geodynamics ch. 2 (REFERENCES.md §1)';
const UNLOAD = 'Watts & Ryan 1976; Steckler & Watts 1978 (REFERENCES.md §2)';
const WANGEN = 'Athy 1930 with Sclater & Christie 1980 shale, Wangen 2010 Table 2.1 (REFERENCES.md §2)';
const MCK = 'McKenzie 1978, EPSL 40, with a = 125 km, Tm = 1333 °C, α = 3.28e-5, ρ0 = 3330, τ = 62.8 Myr, tc = 31.2 km (REFERENCES.md §3)';
const CK = 'Chappell & Kusznir 2008, GJI 174: γ = 1 − 1/β (REFERENCES.md §4)';
const GDH1 = 'Stein & Stein 1992, Nature 359, GDH1 (REFERENCES.md §5)';
const PS = 'Parsons & Sclater 1977, JGR 82 (REFERENCES.md §5)';

const ROWS: Row[] = [
  ['water depth for tc = 10 km, tc0 = 35 km', () => airyWaterDepth(10_000, 35_000, D), 5434.8, 0.05, AIRY_TS],
  ['water depth for tc = 0, tc0 = 35 km', () => airyWaterDepth(0, 35_000, D), 7608.7, 0.05, AIRY_TS],
  ['crust implied by w = 4000, s = 2000 (ρs 2400)', () => airyCrustFromLoads(4000, 2000, 2400, 35_000, D), 13_000.0, 0.5, AIRY_TS],
  ['water-loaded depth s = 3000, w = 1500, ρs = 2400', () => waterLoadedDepth(1500, 3000, 2400, 3300, 1000), 2673.91, 0.005, UNLOAD],
  ['mean shale density 0–3000 m, λ = 1960.78 m', () => meanSedimentDensity(3000, LITHOLOGIES.shale, 1000), 2165.12, 0.005, WANGEN],
  ['mean shale density 0–3000 m, λ = 1960 m (rounded)', () => meanSedimentDensity(3000, { ...LITHOLOGIES.shale, lambda: 1960 }, 1000), 2165.25, 0.005, WANGEN],
  ['initial subsidence β = 2', () => initialSubsidence(2, MCKENZIE_1978), 1681.5, 0.05, MCK],
  ['initial subsidence β = ∞', () => initialSubsidence(Infinity, MCKENZIE_1978), 3363.0, 0.05, MCK],
  ['E0', () => thermalScale(MCKENZIE_1978), 3165.65, 0.005, MCK],
  ['thermal subsidence, first term, β = 2, t = 50 Myr', () => thermalSubsidence(2, 50, MCKENZIE_1978, 'first-term'), 1106.3, 0.05, MCK],
  ['thermal subsidence, first term, β = ∞, t = 100 Myr', () => thermalSubsidence(Infinity, 100, MCKENZIE_1978, 'first-term'), 2521.6, 0.05, MCK],
  ['β for tc = 10 of 35 km', () => betaFromThickness(10, 35), 3.5, 1e-12, CK],
  ['γ for tc = 10 of 35 km', () => gammaFromThickness(10, 35), 0.7143, 5e-5, CK],
  ['β for tc = 7 of 35 km', () => betaFromThickness(7, 35), 5, 1e-12, CK],
  ['γ for tc = 7 of 35 km', () => gammaFromThickness(7, 35), 0.8, 1e-12, CK],
  ['GDH1 depth at 10 Ma', () => depthFromAge(10, 'GDH1'), 3754.23, 0.005, GDH1],
  ['GDH1 depth at 50 Ma', () => depthFromAge(50, 'GDH1'), 5035.04, 0.005, GDH1],
  ['GDH1 age at 4000 m', () => ageFromDepth(4000, 'GDH1'), 14.712, 0.0005, GDH1],
  ['PS77 branches cross at', () => PS77_SWITCH, 26.27, 0.005, PS],
  // Extra, own derivation from McKenzie's model: at β = ∞ and t → ∞ a plate at Tm cools to a linear
  // geotherm, mean deficit Tm/2, so St = a·ρ0·α·Tm / (2(ρ0 − ρw)) (the series must reach it; the first term cannot).
  ['series thermal subsidence β = ∞, t = 10 000 Myr', () => thermalSubsidence(Infinity, 10_000, MCKENZIE_1978, 'series'), (125_000 * 3330 * 3.28e-5 * 1333) / (2 * 2330), 1e-6, 'McKenzie 1978 plate model, t → ∞ limit (derived)'],
];

describe('published check values', () => {
  for (const [what, f, expected, tol, source] of ROWS) {
    it(`${what} = ${expected} (${source})`, () => {
      expect(Math.abs(f() - expected)).toBeLessThanOrEqual(tol);
    });
  }
});

describe('McKenzie thermal subsidence forms', () => {
  it('the closed-form series equals the brute-force Fourier sum (200 001 odd terms)', () => {
    for (const [beta, t] of [[1.5, 5], [2, 50], [4, 100], [Infinity, 30]]) {
      const E0 = thermalScale(MCKENZIE_1978);
      let s = 0;
      for (let n = 1; n < 400_002; n += 2) {
        const sinc = beta === Infinity ? 1 : Math.sin((n * Math.PI) / beta) / ((n * Math.PI) / beta);
        s += (sinc * -Math.expm1((-n * n * t) / 62.8)) / (n * n);
      }
      // the brute-force tail beyond n = 400 001 is below E0/(2·400 001) ≈ 4 mm
      expect(Math.abs(thermalSubsidence(beta, t, MCKENZIE_1978, 'series') - E0 * s)).toBeLessThan(5e-3);
    }
  });
  it('the series and the first term differ by several hundred metres at large β', () => {
    const d = thermalSubsidence(Infinity, 100, MCKENZIE_1978, 'series') - thermalSubsidence(Infinity, 100, MCKENZIE_1978, 'first-term');
    // the missing odd terms sum to E0·(π²/8 − 1) ≈ 740 m minus their still-decaying part
    expect(d).toBeGreaterThan(700);
    expect(d).toBeLessThan(780);
  });
  it('no stretching, no subsidence: β = 1 and t = 0 give zero thermal subsidence', () => {
    expect(totalSubsidence(1, 100, MCKENZIE_1978)).toBe(0);
    expect(thermalSubsidence(3, 0, MCKENZIE_1978)).toBe(0);
  });
});

describe('properties', () => {
  const rnd = prng(7);
  it('γ = 1 − 1/β for every thickness, β = ∞ and γ = 1 at zero crust', () => {
    for (let k = 0; k < 1000; k++) {
      const tc = rnd() * 40_000;
      expect(gammaFromThickness(tc, 35_000)).toBeCloseTo(gammaFromBeta(betaFromThickness(tc, 35_000)), 12);
    }
    expect(betaFromThickness(0, 35_000)).toBe(Infinity);
    expect(gammaFromBeta(Infinity)).toBe(1);
  });
  it('Airy: predicted water depth then inversion returns the thickness', () => {
    for (let k = 0; k < 200; k++) {
      const tc = rnd() * 35_000;
      const w = airyWaterDepth(tc, 35_000, D);
      expect(airyCrustFromLoads(w, 0, 2400, 35_000, D)).toBeCloseTo(tc, 6);
    }
  });
  it('β from subsidence, forward-modelled again, returns the subsidence to < 1 mm (both thermal forms)', () => {
    for (const form of ['series', 'first-term'] as const) {
      const t = 80;
      const inv = makeBetaInverter(t, MCKENZIE_1978, form);
      expect(inv.monotone).toBe(true);
      for (let k = 0; k < 300; k++) {
        const Y = rnd() * inv.sMax * 0.999 + 1;
        const b1 = betaFromSubsidence(Y, t, MCKENZIE_1978, form);
        const b2 = inv.invert(Y);
        expect(b1.status).toBe('ok');
        expect(Math.abs(totalSubsidence(b1.beta, t, MCKENZIE_1978, form) - Y)).toBeLessThan(1e-3);
        expect(Math.abs(totalSubsidence(b2, t, MCKENZIE_1978, form) - Y)).toBeLessThan(1e-3);
      }
    }
  });
  it('the grid tables match the direct formulas: S(β) to 1e-4 m, β(Y) to 1e-6 relative for β ≤ 20 (the tables replace per-cell series sums)', () => {
    for (const form of ['series', 'first-term'] as const) {
      for (const t of [10, 80, 150]) {
        const inv = makeBetaInverter(t, MCKENZIE_1978, form);
        for (let k = 0; k < 400; k++) {
          const beta = 1 + rnd() * 19;
          expect(Math.abs(inv.total(beta) - totalSubsidence(beta, t, MCKENZIE_1978, form))).toBeLessThan(1e-4);
          const Y = totalSubsidence(beta, t, MCKENZIE_1978, form);
          expect(Math.abs(inv.invert(Y) - beta) / beta).toBeLessThan(1e-6);
        }
        expect(inv.total(Infinity)).toBeCloseTo(totalSubsidence(Infinity, t, MCKENZIE_1978, form), 6);
      }
    }
  });
  it('subsidence beyond the β = ∞ value is reported, not clamped', () => {
    const sMax = totalSubsidence(Infinity, 50, MCKENZIE_1978);
    expect(betaFromSubsidence(sMax + 10, 50, MCKENZIE_1978)).toEqual({ beta: Infinity, status: 'beyond-infinite' });
    expect(betaFromSubsidence(-5, 50, MCKENZIE_1978).status).toBe('no-subsidence');
  });
  it('age from depth round trips on both curves, and the limits are explicit', () => {
    for (const curve of ['GDH1', 'PS77'] as const) {
      for (let t = 0.5; t < 180; t += 1.7) expect(ageFromDepth(depthFromAge(t, curve), curve)).toBeCloseTo(t, 8);
      expect(ageFromDepth(1000, curve)).toBe(0);
      expect(ageFromDepth(7000, curve)).toBe(Infinity);
    }
  });
  it('the age table agrees with the age–depth formula within 2e-4 Myr at every depth, limits included', () => {
    for (const curve of ['GDH1', 'PS77'] as const) {
      const table = ageTable(curve);
      let worst = 0;
      // every 0.037 m (not a multiple of the table step) from above sea level to beyond the asymptote
      for (let d = -100; d < 7000; d += 0.037) {
        const a = ageFromDepth(d, curve);
        const b = table(d);
        if (a === Infinity || a === 0) expect(b, `${curve} at ${d} m`).toBe(a);
        else worst = Math.max(worst, Math.abs(a - b));
      }
      expect(worst, curve).toBeLessThan(2e-4);
      expect(table(NaN)).toBeNaN();
    }
  });
  it('compaction: mean density equals a numerical integration of φ(z) (Simpson, 2000 intervals)', () => {
    for (const lith of Object.values(LITHOLOGIES)) {
      for (const S of [10, 500, 3000, 9000]) {
        const n = 2000;
        const h = S / n;
        let integral = 0;
        for (let k = 0; k <= n; k++) {
          const z = k * h;
          const wgt = k === 0 || k === n ? 1 : k % 2 ? 4 : 2;
          integral += wgt * lith.phi0 * Math.exp(-z / lith.lambda);
        }
        const phiBar = (integral * h) / 3 / S;
        expect(meanPorosity(S, lith)).toBeCloseTo(phiBar, 10);
        expect(meanSedimentDensity(S, lith, 1000)).toBeCloseTo(phiBar * 1000 + (1 - phiBar) * lith.rhoGrain, 6);
      }
    }
  });
  it('unloading with compaction lies between the surface-porosity and zero-porosity densities', () => {
    const lith = LITHOLOGIES.sandstone;
    const Y = waterLoadedDepthCompacted(1500, 3000, lith, 3300, 1000);
    const loose = waterLoadedDepth(1500, 3000, lith.phi0 * 1000 + (1 - lith.phi0) * lith.rhoGrain, 3300, 1000);
    const tight = waterLoadedDepth(1500, 3000, lith.rhoGrain, 3300, 1000);
    expect(Y).toBeLessThan(loose);
    expect(Y).toBeGreaterThan(tight);
  });
});
