/**
 * Per-cell derived grids from seabed, top basement and Moho on one analysis geometry.
 * One pass over typed arrays; no allocation inside the loop. Every awkward cell is counted by kind:
 *  - Moho above basement by more than mohoTolerance: pick error → no data (counted);
 *    by less: zero crust (β = +∞, γ = 1);
 *  - basement above seabed by more than basementTolerance: pick error → no data; by less: no sediment;
 *  - seabed above sea level (land): water depth 0; unloading and subsidence not computed there;
 *  - crust thicker than tc0 (β < 1): kept as computed and counted (tc0 may be too small);
 *  - basement but no Moho: "Moho not imaged" (not "no data"): thickness-based grids NaN, others kept.
 * The grids here are raw (β may be +∞, ages +∞ beyond an age–depth asymptote, every model over
 * every cell); derive/applicability turns them into what is shown and exported, per domain.
 */

import { ageTable, type AgeDepthCurve } from '../science/age-depth.js';
import { LITHOLOGIES, type Lithology } from '../science/compaction.js';
import { makeBetaInverter, type McKenzieParams } from '../science/mckenzie.js';
import type { Params } from '../params.js';
import { DERIVED, type DerivedName } from './grids.js';

export interface DeriveInput {
  /** Depths in metres positive down, NaN = no data; one length for all. seabed may be null. */
  readonly seabed: Float32Array | null;
  readonly basement: Float32Array;
  readonly moho: Float32Array;
}

export interface DeriveFlags {
  noData: number;
  mohoAboveBasement: number;
  zeroCrust: number;
  mohoNotImaged: number;
  basementAboveSeabed: number;
  basementAtSeabed: number;
  land: number;
  betaBelowOne: number;
  noSubsidence: number;
}

/**
 * Grids the pipeline itself reads after derive (thickness for the domains and lines, sediment for the
 * data mask, water-loaded depth for the oceanward fit and the ages, both β for the unbounded mask,
 * the age range for the oceanic lines): always computed, whatever the caller asked for (a lean
 * pipeline run drops the sediment grid once its data mask is made, unless asked for).
 */
/** What a thickness-only derive (the uncertainty sweep's realisations: domains need no more) keeps. */
export const THICKNESS_ONLY: ReadonlySet<DerivedName> = new Set<DerivedName>(['crustal-thickness', 'sediment-thickness']);

export const NEEDED: ReadonlySet<DerivedName> = new Set<DerivedName>(['crustal-thickness', 'sediment-thickness', 'water-loaded-basement', 'beta-crust', 'beta-subsidence', 'oceanic-age-min', 'oceanic-age-max']);

export interface Derived<G = Partial<Record<DerivedName, Float32Array>>> {
  /** Every derived grid, or (when derive was given `keep`) only those kept and NEEDED. */
  readonly grids: G;
  readonly flags: DeriveFlags;
  readonly warnings: string[];
  /** A data-based suggestion for tc0 (m): shown to the user, never applied. NaN if none. */
  readonly suggestedTc0: number;
}

export function lithologyOf(p: Params): Lithology {
  if (p.lithology === 'custom') return { name: 'custom', phi0: p.customPhi0, lambda: p.customLambda, rhoGrain: p.customRhoGrain };
  return LITHOLOGIES[p.lithology];
}

export function mckenzieOf(p: Params): McKenzieParams {
  return {
    a: p.lithosphereThickness,
    tc: p.tc0,
    Tm: p.mantleTemperature,
    alpha: p.thermalExpansion,
    rhoMantle: p.rhoMantle,
    rhoCrust: p.rhoCrust,
    rhoWater: p.rhoWater,
    tau: p.thermalTau,
  };
}

/** A derived grid the run must have (NEEDED ones always are): throws if a lean run dropped it. */
export function gridOf(grids: Partial<Record<DerivedName, Float32Array>>, name: DerivedName): Float32Array {
  const v = grids[name];
  if (!v) throw new Error(`derived grid ${name} was not kept in this run`);
  return v;
}

/**
 * `keep`: the grids to keep (default: all). The others are still computed cell by cell (one loop
 * for all) but into one shared scratch grid, and left out of the result, so a
 * batch run that writes only some grids holds only those (plus NEEDED) in memory.
 * `thicknessOnly`: crustal and sediment thickness alone (and the flags), the rest not computed —
 * what the domain rules read, for the uncertainty sweep's realisations.
 */
export function derive(input: DeriveInput, p: Params): Derived<Record<DerivedName, Float32Array>>;
export function derive(input: DeriveInput, p: Params, keep: ReadonlySet<DerivedName> | undefined, thicknessOnly?: boolean): Derived;
export function derive(input: DeriveInput, p: Params, keep?: ReadonlySet<DerivedName>, thicknessOnly = false): Derived {
  const n = input.basement.length;
  if (input.moho.length !== n || (input.seabed && input.seabed.length !== n)) {
    throw new Error('derive: seabed, basement and Moho must share one analysis grid');
  }
  let scratch: Float32Array | null = null;
  const all = Object.fromEntries(
    DERIVED.map((d) => [
      d.name,
      thicknessOnly ? (THICKNESS_ONLY.has(d.name) ? new Float32Array(n) : (scratch ??= new Float32Array(n))) : !keep || keep.has(d.name) || NEEDED.has(d.name) ? new Float32Array(n) : (scratch ??= new Float32Array(n)),
    ]),
  ) as Record<DerivedName, Float32Array>;
  const grids: Partial<Record<DerivedName, Float32Array>> = {};
  for (const d of DERIVED) if (all[d.name] !== scratch) grids[d.name] = all[d.name];
  const outputs = DERIVED.map((d) => all[d.name]);
  const flags: DeriveFlags = {
    noData: 0, mohoAboveBasement: 0, zeroCrust: 0, mohoNotImaged: 0, basementAboveSeabed: 0, basementAtSeabed: 0,
    land: 0, betaBelowOne: 0, noSubsidence: 0,
  };
  const warnings: string[] = [];

  const {
    tc0, rhoMantle: rm, rhoCrust: rc, rhoWater: rw, mohoTolerance, basementTolerance, riftAge, ageDepthUncertainty: dAge,
  } = p;
  const curve: AgeDepthCurve = p.ageCurve;
  const other: AgeDepthCurve = curve === 'GDH1' ? 'PS77' : 'GDH1';
  // the age–depth inverse from tables (within 2e-4 Myr of the formula; science/age-depth.ts)
  const ageMain = ageTable(curve);
  const ageOther = ageTable(other);
  const lith = lithologyOf(p);
  const compaction = p.sedimentMode === 'compaction';
  const mk = mckenzieOf(p);
  const haveAge = riftAge !== null;
  const inverter = haveAge && !thicknessOnly ? makeBetaInverter(riftAge, mk, p.thermalForm) : null;
  if (inverter && !inverter.monotone) warnings.push('McKenzie subsidence is not monotone in β for these parameters: β from subsidence solved cell by cell');
  if (!haveAge) warnings.push('time since rifting not given: predicted depth, subsidence residual and β from subsidence are not computed');
  if (!input.seabed) warnings.push('no seabed grid: water depth, sediment, unloading, subsidence and age grids are not computed');

  const g = all;
  const seabed = input.seabed;
  const basement = input.basement;
  const moho = input.moho;
  const airyK = 1 / (rm - rc);
  // the output grids as locals: one lookup each, not one per cell
  const oAiryResidual = g['airy-residual'];
  const oAiryThickness = g['airy-thickness'];
  const oBetaCrust = g['beta-crust'];
  const oBetaRatio = g['beta-ratio'];
  const oBetaSubsidence = g['beta-subsidence'];
  const oCrustalThickness = g['crustal-thickness'];
  const oOceanicAgeMax = g['oceanic-age-max'];
  const oOceanicAgeMin = g['oceanic-age-min'];
  const oOceanicDepthAnomaly = g['oceanic-depth-anomaly'];
  const oPredictedWaterLoaded = g['predicted-water-loaded'];
  const oSedimentThickness = g['sediment-thickness'];
  const oSubsidenceResidual = g['subsidence-residual'];
  const oWaterDepth = g['water-depth'];
  const oWaterLoadedBasement = g['water-loaded-basement'];
  const oGamma = g.gamma;
  const hist = new Uint32Array(1001); // 100 m bins of crustal thickness, for the tc0 suggestion

  for (let k = 0; k < n; k++) {
    const b = basement[k];
    const m = moho[k];
    const sb = seabed ? seabed[k] : NaN;
    // Defaults: no data everywhere, filled below as far as the inputs allow.
    let tc = NaN;
    let w = NaN;
    let s = NaN;
    let ok = b === b;
    if (seabed && ok && sb === sb) {
      s = b - sb;
      if (s < 0) {
        if (-s > basementTolerance) {
          flags.basementAboveSeabed++;
          ok = false;
        } else {
          flags.basementAtSeabed++;
          s = 0;
        }
      }
      w = sb;
      if (w < 0) {
        flags.land++;
        w = 0;
      }
    }
    if (b !== b || (seabed && sb !== sb)) flags.noData++;
    if (!ok) {
      for (let q = 0; q < outputs.length; q++) outputs[q][k] = NaN;
      continue;
    }
    if (m === m) {
      tc = m - b;
      if (tc < 0) {
        if (-tc > mohoTolerance) {
          flags.mohoAboveBasement++;
          tc = NaN;
        } else {
          flags.zeroCrust++;
          tc = 0;
        }
      } else if (tc === 0) flags.zeroCrust++;
    } else {
      flags.mohoNotImaged++;
    }
    const beta = tc === tc ? (tc === 0 ? Infinity : tc0 / tc) : NaN;
    if (beta < 1) flags.betaBelowOne++;
    const gamma = tc === tc ? 1 - tc / tc0 : NaN;
    oWaterDepth[k] = w;
    oSedimentThickness[k] = s;
    oCrustalThickness[k] = tc;
    oBetaCrust[k] = beta;
    oGamma[k] = gamma;
    if (tc === tc) hist[Math.min(1000, Math.floor(tc / 100))]++;
    if (thicknessOnly) continue;

    // Sediment unloading (Watts & Ryan 1976): Y = w + s·(ρm − ρ̄s)/(ρm − ρw).
    let Y = NaN;
    let rhoS = NaN;
    const subaerial = seabed !== null && sb < 0;
    if (w === w && s === s && !subaerial) {
      if (compaction) {
        const phi = s > 0 ? (lith.phi0 * lith.lambda * -Math.expm1(-s / lith.lambda)) / s : lith.phi0;
        rhoS = phi * rw + (1 - phi) * lith.rhoGrain;
      } else rhoS = p.rhoSediment;
      Y = w + (s * (rm - rhoS)) / (rm - rw);
    }
    oWaterLoadedBasement[k] = Y;
    // Airy: crust implied by the loads, and observed minus implied.
    const tIso = Y === Y ? tc0 - (w * (rm - rw) + s * (rm - rhoS)) * airyK : NaN;
    oAiryThickness[k] = tIso;
    oAiryResidual[k] = tc - tIso;

    // McKenzie (1978) prediction for β_crust, and β from subsidence.
    let pred = NaN;
    let bs = NaN;
    if (haveAge) {
      if (beta === beta) {
        const be = beta < 1 ? 1 : beta; // β < 1 is outside the model: no stretching predicted
        pred = inverter!.total(be);
      }
      if (Y === Y) {
        bs = inverter!.invert(Y);
        if (bs !== Infinity && !(Y > 0)) flags.noSubsidence++;
      }
    }
    oPredictedWaterLoaded[k] = pred;
    oSubsidenceResidual[k] = Y - pred;
    oBetaSubsidence[k] = bs;
    oBetaRatio[k] = beta === Infinity && bs === Infinity ? NaN : bs / beta;

    // Indicative oceanic age: widest of both curves over Y ± the depth uncertainty. Raw here (+∞
    // beyond an asymptote); derive/applicability masks it to oceanic crust and caps it at the rift.
    let aMin = NaN;
    let aMax = NaN;
    if (Y === Y) {
      aMin = Math.min(ageMain(Y - dAge), ageOther(Y - dAge));
      aMax = Math.max(ageMain(Y + dAge), ageOther(Y + dAge));
    }
    oOceanicAgeMin[k] = aMin;
    oOceanicAgeMax[k] = aMax;
    oOceanicDepthAnomaly[k] = NaN; // needs the domains and isochrons: derive/applicability
  }

  if (flags.mohoAboveBasement > 0.5 * n) {
    warnings.push(`Moho above basement in ${flags.mohoAboveBasement} of ${n} cells: are the Moho and basement files swapped?`);
  } else if (flags.mohoAboveBasement) {
    warnings.push(`${flags.mohoAboveBasement} cells with Moho above basement by more than ${mohoTolerance} m: pick errors, set to no data`);
  }
  if (flags.basementAboveSeabed) warnings.push(`${flags.basementAboveSeabed} cells with basement above seabed by more than ${basementTolerance} m: pick errors, set to no data`);
  if (flags.land) warnings.push(`${flags.land} cells above sea level: water depth 0; unloading, subsidence and ages not computed there`);
  if (flags.betaBelowOne) warnings.push(`${flags.betaBelowOne} cells with crust thicker than tc0 = ${tc0} m (β < 1): consider a larger reference thickness`);

  // Suggest tc0 as the 95th percentile of crustal thickness (never applied).
  let total = 0;
  for (let q = 0; q < hist.length; q++) total += hist[q];
  let suggestedTc0 = NaN;
  if (total > 0) {
    let acc = 0;
    for (let q = 0; q < hist.length; q++) {
      acc += hist[q];
      if (acc >= 0.95 * total) {
        suggestedTc0 = (q + 0.5) * 100;
        break;
      }
    }
  }
  return { grids, flags, warnings, suggestedTc0 };
}
