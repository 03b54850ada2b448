// The derived grids restricted to where their models apply (derive/applicability.ts), checked
// against the rules written out cell by cell with the age–depth inverse as published (Stein & Stein
// 1992 GDH1; Parsons & Sclater 1977), so the fused loops and the depth comparison that replaces the
// logarithm per cell change no value.
import { describe, expect, it } from 'vitest';
import { applyDomains, olderThan } from '../../src/derive/applicability.js';
import type { Derived } from '../../src/derive/derive.js';
import { DERIVED, type DerivedName } from '../../src/derive/grids.js';
import { resolveParams } from '../../src/params.js';
import { ageFromDepth, depthFromAge, type AgeDepthCurve } from '../../src/science/age-depth.js';

describe('olderThan: the age–depth inverse compared without a logarithm', () => {
  it('equals ageFromDepth(d) > limit or no finite age, for every depth near and far from each limit, both curves', () => {
    for (const curve of ['GDH1', 'PS77'] as AgeDepthCurve[]) {
      for (const limit of [-1, 0, 0.5, 19.99, 20, 20.000001, 26.27, 60, 110, 180, 500, Infinity]) {
        const fast = olderThan(limit, curve);
        const depths: number[] = [];
        for (let d = 2000; d <= 7000; d += 0.37) depths.push(d);
        if (Number.isFinite(limit) && limit >= 0) {
          const dl = depthFromAge(limit, curve);
          for (let e = -0.02; e <= 0.02; e += 0.0005) depths.push(dl + e, Math.fround(dl + e));
        }
        depths.push(2600, 2500, 5651, 6400, Math.fround(depthFromAge(20, curve)), Math.fround(365 * Math.sqrt(20) + 2600));
        for (const d of depths) {
          const a = ageFromDepth(d, curve);
          expect(fast(d), `${curve} limit ${limit} depth ${d}`).toBe(a > limit || a === Infinity);
        }
      }
    }
  });
});

/** The rules as the module's docblock states them, one cell at a time (the reference). */
function direct(raw: Partial<Record<DerivedName, Float32Array>>, domains: Uint8Array, riftAge: number | null, curve: AgeDepthCurve, iso: Float32Array | null) {
  const n = domains.length;
  const out: Record<string, Float32Array> = {};
  const cont = (k: number) => domains[k] >= 1 && domains[k] <= 3;
  const limit = riftAge ?? Infinity;
  for (const d of DERIVED) {
    const v = raw[d.name];
    if (!v) continue;
    const o = new Float32Array(n).fill(NaN);
    for (let k = 0; k < n; k++) {
      if (d.applies === 'all' && Number.isFinite(v[k])) o[k] = v[k];
      if (d.applies === 'continental' && cont(k) && Number.isFinite(v[k])) o[k] = v[k];
      if (d.name === 'beta-ratio' && raw['beta-crust']![k] === Infinity) o[k] = NaN;
      if (d.applies === 'oceanic' && domains[k] === 5) {
        const y = raw['water-loaded-basement']![k];
        if (y !== y) continue;
        const a = ageFromDepth(y, curve);
        const old = a > limit || a === Infinity;
        if (d.name === 'oceanic-age-min' && !old) o[k] = v[k];
        if (d.name === 'oceanic-age-max' && !old) o[k] = Number.isFinite(Math.min(v[k], limit)) ? Math.min(v[k], limit) : NaN;
        if (d.name === 'oceanic-depth-anomaly' && old) {
          const r = iso && iso[k] === iso[k] ? Math.min(iso[k], limit) : riftAge ?? NaN;
          if (r === r) o[k] = y - depthFromAge(r, curve);
        }
      }
    }
    out[d.name] = o;
  }
  return out;
}

describe('applyDomains', () => {
  it('gives the direct rules bit for bit on random grids with ±∞, NaN, every domain and ages either side of the rift', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const n = 20_000;
    const domains = new Uint8Array(n).map(() => Math.floor(rnd() * 7));
    const raw: Partial<Record<DerivedName, Float32Array>> = {};
    for (const d of DERIVED) {
      raw[d.name] = new Float32Array(n).map(() => {
        const u = rnd();
        return u < 0.03 ? NaN : u < 0.05 ? Infinity : u < 0.06 ? -Infinity : (rnd() - 0.2) * 200;
      });
    }
    raw['water-loaded-basement'] = new Float32Array(n).map(() => (rnd() < 0.02 ? NaN : 2400 + rnd() * 4200));
    const iso = new Float32Array(n).map(() => (rnd() < 0.5 ? NaN : rnd() * 150));
    for (const [riftAge, curve] of [[110, 'GDH1'], [20, 'GDH1'], [null, 'GDH1'], [60, 'PS77'], [null, 'PS77']] as [number | null, AgeDepthCurve][]) {
      const params = resolveParams({ riftAge, ageCurve: curve });
      for (const isochrons of [null, iso]) {
        const want = direct(raw, domains, riftAge, curve, isochrons);
        const got = applyDomains({ grids: raw } as unknown as Derived, domains, params, isochrons);
        for (const name of Object.keys(want)) expect(Array.from(got.grids[name as DerivedName]!), `${name}, rift ${riftAge}, ${curve}`).toEqual(Array.from(want[name]));
        // the same raw grids with other domains (an interactive domain change): the domain-independent
        // grids are the same arrays, the rest follow the new domains
        const derived = { grids: raw } as unknown as Derived;
        const first = applyDomains(derived, domains, params, isochrons);
        const other = domains.map((d) => (d + 2) % 7);
        const second = applyDomains(derived, other, params, isochrons);
        const want2 = direct(raw, other, riftAge, curve, isochrons);
        for (const d of DERIVED) {
          if (d.applies === 'all') expect(second.grids[d.name]).toBe(first.grids[d.name]);
          expect(Array.from(second.grids[d.name]!), `${d.name} after a domain change`).toEqual(Array.from(want2[d.name]));
        }
        // in place gives the same values and leaves no copy
        const copy = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, v!.slice()])) as Partial<Record<DerivedName, Float32Array>>;
        const inPlace = applyDomains({ grids: copy } as unknown as Derived, domains, params, isochrons, true);
        for (const name of Object.keys(want)) {
          expect(inPlace.grids[name as DerivedName]).toBe(copy[name as DerivedName]);
          expect(Array.from(inPlace.grids[name as DerivedName]!), name).toEqual(Array.from(want[name]));
        }
      }
    }
  });
});
