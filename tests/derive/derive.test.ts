import { describe, expect, it } from 'vitest';
import { generateDemoGrids, DEMO_RIFT_AGE_MYR } from '../../fixtures/demo-margin.js';
import { derive } from '../../src/derive/derive.js';
import { DEFAULT_PARAMS, resolveParams } from '../../src/params.js';
import { betaFromSubsidence, MCKENZIE_1978, totalSubsidence } from '../../src/science/mckenzie.js';
import { ageFromDepth } from '../../src/science/age-depth.js';

const f32 = (...v: number[]) => Float32Array.from(v);

describe('derive: hand-checked cells', () => {
  // cells: 0 normal | 1 Moho 300 m above basement (zero crust) | 2 Moho 900 m above (pick error)
  //        3 basement 20 m above seabed (no sediment) | 4 basement 400 m above seabed (pick error)
  //        5 land (seabed −50) | 6 crust thicker than tc0 | 7 Moho not imaged | 8 no basement
  const seabed = f32(1500, 4000, 4000, 3000, 3000, -50, 200, 3000, 3000);
  const basement = f32(4500, 9000, 9000, 2980, 2600, 500, 1200, 6000, NaN);
  const moho = f32(14500, 8700, 8100, 20000, 20000, 30000, 41200, NaN, 20000);
  const p = resolveParams({ sedimentMode: 'constant', rhoSediment: 2400, riftAge: 50 });
  const d = derive({ seabed, basement, moho }, p);
  const g = d.grids;

  it('thickness, β and γ of a normal cell (tc0 35 km)', () => {
    expect(g['water-depth'][0]).toBe(1500);
    expect(g['sediment-thickness'][0]).toBe(3000);
    expect(g['crustal-thickness'][0]).toBe(10000);
    expect(g['beta-crust'][0]).toBeCloseTo(3.5, 6); // Chappell & Kusznir 2008 check: tc 10 of 35 km → β 3.5
    expect(g.gamma[0]).toBeCloseTo(0.7143, 4);
  });
  it('water-loaded depth of the normal cell = 2673.91 m (Watts & Ryan 1976 check, REFERENCES.md §2)', () => {
    expect(g['water-loaded-basement'][0]).toBeCloseTo(2673.91, 2);
  });
  it('Airy-implied crust of the normal cell from the loads (REFERENCES.md §1 formula, computed by hand here)', () => {
    // 35000 − (1500·2300 + 3000·900)/500 = 35000 − 12300 = 22700
    expect(g['airy-thickness'][0]).toBeCloseTo(22700, 2);
    expect(g['airy-residual'][0]).toBeCloseTo(10000 - 22700, 2);
  });
  it('predicted depth and β from subsidence agree with the science functions at the rift age', () => {
    const mk = { ...MCKENZIE_1978, tc: 35_000, rhoMantle: 3300 };
    expect(g['predicted-water-loaded'][0]).toBeCloseTo(totalSubsidence(3.5, 50, mk), 2);
    expect(g['beta-subsidence'][0]).toBeCloseTo(betaFromSubsidence(2673.91, 50, mk).beta, 3);
    expect(g['beta-ratio'][0]).toBeCloseTo(g['beta-subsidence'][0] / g['beta-crust'][0], 5);
    expect(g['subsidence-residual'][0]).toBeCloseTo(g['water-loaded-basement'][0] - g['predicted-water-loaded'][0], 2);
  });
  it('indicative age range spans both curves over ±500 m', () => {
    const Y = g['water-loaded-basement'][0];
    expect(g['oceanic-age-min'][0]).toBeCloseTo(Math.min(ageFromDepth(Y - 500, 'GDH1'), ageFromDepth(Y - 500, 'PS77')), 3);
    expect(g['oceanic-age-max'][0]).toBeCloseTo(Math.max(ageFromDepth(Y + 500, 'GDH1'), ageFromDepth(Y + 500, 'PS77')), 3);
  });
  it('Moho above basement within tolerance is zero crust: β = +∞, γ = 1', () => {
    expect(g['crustal-thickness'][1]).toBe(0);
    expect(g['beta-crust'][1]).toBe(Infinity);
    expect(g.gamma[1]).toBe(1);
  });
  it('Moho above basement beyond tolerance is a pick error: no crust values, counted', () => {
    expect(g['crustal-thickness'][2]).toBeNaN();
    expect(g['beta-crust'][2]).toBeNaN();
    expect(d.flags.mohoAboveBasement).toBe(1);
    expect(d.warnings.join()).toMatch(/1 cells with Moho above basement/);
  });
  it('basement just above seabed is no sediment; far above is a pick error', () => {
    expect(g['sediment-thickness'][3]).toBe(0);
    expect(d.flags.basementAtSeabed).toBe(1);
    expect(g['crustal-thickness'][4]).toBeNaN();
    expect(d.flags.basementAboveSeabed).toBe(1);
  });
  it('land: water depth 0, no unloading', () => {
    expect(g['water-depth'][5]).toBe(0);
    expect(g['water-loaded-basement'][5]).toBeNaN();
    expect(g['crustal-thickness'][5]).toBe(29500);
    expect(d.flags.land).toBe(1);
  });
  it('crust thicker than tc0: β < 1 kept and reported', () => {
    expect(g['beta-crust'][6]).toBeCloseTo(35 / 40, 6);
    expect(d.flags.betaBelowOne).toBe(1);
    expect(d.warnings.join()).toMatch(/thicker than tc0/);
  });
  it('Moho not imaged is not "no data": unloading still computed', () => {
    expect(g['crustal-thickness'][7]).toBeNaN();
    expect(g['water-loaded-basement'][7]).toBeGreaterThan(0);
    expect(d.flags.mohoNotImaged).toBe(1);
    expect(d.flags.noData).toBe(1); // cell 8 only
  });
  it('swapped files are called out', () => {
    const r = derive({ seabed: null, basement: moho.map((v) => v + 1e5), moho: basement }, DEFAULT_PARAMS as never);
    expect(r.warnings.join()).toMatch(/swapped/);
  });
});

describe('parameter validation', () => {
  it('rejects impossible values with a clear message', () => {
    expect(() => resolveParams({ rhoMantle: 2700 })).toThrow(/mantle density \(2700\) must exceed crust density \(2800\)/);
    expect(() => resolveParams({ tc0: -1 })).toThrow(/tc0 = -1 m is outside/);
    expect(() => resolveParams({ riftAge: -5 })).toThrow(/riftAge = -5 Myr is outside/);
    expect(() => resolveParams({ lithology: 'basalt' })).toThrow(/lithology must be one of/);
    expect(() => resolveParams({ tcZero: 3 })).toThrow(/unknown parameter "tcZero"/);
    expect(() => resolveParams({ taperThreshold: 9000, couplingThickness: 8000 })).toThrow(/taper threshold \(9000 m\) must be below/);
  });
  it('numbers must be JSON numbers; a misspelt key gets the nearest known one suggested', () => {
    expect(() => resolveParams({ tc0: '0x8000' })).toThrow(/parameter tc0 must be a number \(m\); got "0x8000"/);
    expect(() => resolveParams({ tc0: '35000' })).toThrow(/must be a number/);
    expect(() => resolveParams({ taperThreshhold: 2500 })).toThrow(/unknown parameter "taperThreshhold" — did you mean "taperThreshold"\?/);
    expect(() => resolveParams({ RIFTAGE: 100 })).toThrow(/did you mean "riftAge"/);
    expect(() => resolveParams({ zzz: 1 })).toThrow(/^unknown parameter "zzz" \(taperline --help lists them all\)$/);
    expect(() => resolveParams({ spacingKn: 20 }, ['spacingKm'])).toThrow(/did you mean "spacingKm"/);
  });
  it('defaults are the documented ones', () => {
    expect(resolveParams()).toEqual(DEFAULT_PARAMS);
    expect(DEFAULT_PARAMS.tc0).toBe(35_000);
    expect(DEFAULT_PARAMS.mohoTolerance).toBe(500);
  });
});

describe('derive on the invented demo (acceptance against the generator)', () => {
  const demo = generateDemoGrids();
  const p = resolveParams({ riftAge: DEMO_RIFT_AGE_MYR });
  const d = derive({ seabed: demo.seabed, basement: demo.basement, moho: demo.moho }, p);
  const tc = d.grids['crustal-thickness'];
  const beta = d.grids['beta-crust'];

  it('crustal thickness equals what the generator built in, to float32 rounding', () => {
    let compared = 0;
    for (let k = 0; k < tc.length; k++) {
      const t = demo.thickness[k];
      if (Number.isNaN(t)) {
        expect(tc[k]).toBeNaN();
        continue;
      }
      compared++;
      expect(Math.abs(tc[k] - t)).toBeLessThanOrEqual(Math.abs(t) * 6e-8 + 1e-9);
    }
    expect(compared).toBeGreaterThan(230_000);
  });
  it('β = tc0/tc within rounding, γ = 1 − 1/β everywhere', () => {
    for (let k = 0; k < tc.length; k += 13) {
      const t = demo.thickness[k];
      if (!(t > 0)) continue;
      expect(Math.abs(beta[k] / (35_000 / t) - 1)).toBeLessThan(1e-6);
      expect(d.grids.gamma[k]).toBeCloseTo(1 - 1 / beta[k], 5);
    }
  });
  it('the exhumed-mantle corridor shows as unbounded β', () => {
    let inf = 0;
    let zero = 0;
    for (let k = 0; k < tc.length; k++) {
      if (demo.thickness[k] === 0) {
        zero++;
        if (beta[k] === Infinity) inf++;
      }
    }
    expect(zero).toBeGreaterThan(5_000);
    expect(inf).toBe(zero);
  });
  it('the Moho gap is reported as "not imaged", the hole as no data', () => {
    expect(d.flags.mohoNotImaged).toBeGreaterThan(300);
    let missing = 0; // no seabed (the coverage gap) or no basement (also the volcanic centre)
    for (let k = 0; k < demo.seabed.length; k++) if (Number.isNaN(demo.seabed[k]) || Number.isNaN(demo.basement[k])) missing++;
    expect(d.flags.noData).toBe(missing);
  });
});

describe('pipeline cache (interactive recompute)', () => {
  it('reuses the derived grids when only line parameters change, and gives the same result as a fresh run', async () => {
    const { demoInputs } = await import('../helpers/demo-run.js');
    const { createPipelineCache, runPipeline } = await import('../../src/pipeline.js');
    const inputs = await demoInputs({ licence: true, lines: true, isochrons: true, picks: true });
    const cache = createPipelineCache();
    const a = runPipeline(inputs, { params: { riftAge: 110 }, cache });
    const b = runPipeline(inputs, { params: { riftAge: 110, taperThreshold: 3000 }, cache });
    expect(b.derived).toBe(a.derived); // reused
    // the evidence in the analysis CRS too
    expect(b.evidence.lines[0].coords).toBe(a.evidence.lines[0].coords);
    expect(b.evidence.licence![0]).toBe(a.evidence.licence![0]);
    expect(b.evidence.isochrons[0].coords).toBe(a.evidence.isochrons[0].coords);
    const fresh = runPipeline(inputs, { params: { riftAge: 110, taperThreshold: 3000 } });
    expect(Array.from(b.classified.domains)).toEqual(Array.from(fresh.classified.domains));
    expect(b.warnings).toEqual(fresh.warnings);
    expect(b.evidence).toEqual(fresh.evidence);
    expect(b.boundaries.pieces).toEqual(fresh.boundaries.pieces);
    expect(b.boundaries.inLicence).toEqual(fresh.boundaries.inLicence);
    const c = runPipeline(inputs, { params: { riftAge: 100, taperThreshold: 3000 }, cache });
    expect(c.derived).not.toBe(a.derived); // rift age changes the grids: recomputed
  });
});
