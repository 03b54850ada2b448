/**
 * Programme figures for proposed lines: boundaries crossed, record length, acquisition duration, cost.
 *
 * Two-way time to the Moho from interval velocities: water at vw; sediment with a linear velocity
 * gradient v(z) = v0 + k·z below the seabed, whose one-way time through thickness s is
 * ln(1 + k·s/v0)/k (the integral of dz/(v0 + k z)); crust at vc.
 */

import type { Section } from './section.js';
import type { PlanParams } from './params.js';

export function twoWayTimeToMoho(water: number, sediment: number, crust: number, p: PlanParams): number {
  const tw = water / p.vWater;
  const ts = p.sedimentGradient > 0 ? Math.log1p((p.sedimentGradient * sediment) / p.vSediment0) / p.sedimentGradient : sediment / p.vSediment0;
  const tc = crust / p.vCrust;
  return 2 * (tw + ts + tc);
}

export interface LineFigures {
  readonly maxTwtS: number;
  readonly recordLengthS: number;
  readonly crossings: { kind: string; chainageKm: number }[];
}

/** Largest two-way time to the Moho along a sampled line, plus the margin (rounded up to 0.5 s). */
export function lineFigures(s: Section, p: PlanParams): LineFigures {
  let max = 0;
  for (let k = 0; k < s.x.length; k++) {
    const w = Math.max(0, s.seabed[k]);
    const sed = s.basement[k] - s.seabed[k];
    const crust = s.moho[k] - s.basement[k];
    if (!Number.isFinite(w) || !Number.isFinite(sed) || !Number.isFinite(crust)) continue;
    max = Math.max(max, twoWayTimeToMoho(w, Math.max(0, sed), Math.max(0, crust), p));
  }
  return {
    maxTwtS: max,
    recordLengthS: Math.ceil((max + p.recordMarginS) * 2) / 2,
    crossings: s.crossings.map((c) => ({ kind: c.kind, chainageKm: Math.round(c.chainageKm * 1000) / 1000 })),
  };
}

export interface ProgrammeFigures {
  readonly lines: number;
  readonly lineKm: number;
  readonly productiveHours: number;
  readonly totalDays: number;
  readonly cost: number | null;
}

/** Duration: sailed km (line + run-in/out) at vessel speed, plus line changes, times (1 + downtime). */
export function programmeFigures(lengthsKm: number[], p: PlanParams): ProgrammeFigures {
  const lineKm = lengthsKm.reduce((a, b) => a + b, 0);
  const speedKmH = p.vesselSpeedKn * 1.852; // 1 knot = 1.852 km/h (international nautical mile, exact)
  const sailed = lineKm + lengthsKm.length * p.runInOutKm;
  const productiveHours = sailed / speedKmH + Math.max(0, lengthsKm.length - 1) * p.lineChangeH;
  return {
    lines: lengthsKm.length,
    lineKm,
    productiveHours,
    totalDays: (productiveHours * (1 + p.downtimeFraction)) / 24,
    cost: p.costPerKm === null ? null : p.costPerKm * lineKm,
  };
}
