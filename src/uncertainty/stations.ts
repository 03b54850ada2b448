/**
 * Stations along strike: straight rays in the oceanward direction, one per cell width along strike,
 * across the whole grid. Along each ray a named line's position is its first crossing from land:
 * the taper limit where the continental side field first goes from ≥ 0 to < 0, the oceanic limit
 * where the oceanic side field first goes from < 0 to ≥ 0 (as survey planning's zone midline, "first
 * crossings from land"). Samples are the nearest cell, one cell apart; the crossing is interpolated
 * linearly between the two samples either side of it; a cell without data breaks the ray there.
 */

import type { Oceanward } from '../domains/direction.js';
import type { GridGeometry } from '../grid/geometry.js';

export interface Stations {
  /** Strike coordinate of each station (map units; strike axis (ey, −ex)). */
  readonly strike: Float64Array;
  /** Dip coordinate of each ray's first sample and the step between samples. */
  readonly t0: number;
  readonly step: number;
  readonly samples: number;
  /** Cell index of each sample of each station (−1 outside the grid), station-major. */
  readonly cell: Int32Array;
  readonly oceanward: Oceanward;
}

export function stationsOf(g: GridGeometry, o: Oceanward): Stations {
  const step = Math.min(Math.abs(g.dx), Math.abs(g.dy));
  const xs = [g.x0 - g.dx / 2, g.x0 + (g.nx - 0.5) * g.dx];
  const ys = [g.y0 - g.dy / 2, g.y0 + (g.ny - 0.5) * g.dy];
  let smin = Infinity, smax = -Infinity, tmin = Infinity, tmax = -Infinity;
  for (const x of xs) {
    for (const y of ys) {
      const s = x * o.ey - y * o.ex;
      const t = x * o.ex + y * o.ey;
      smin = Math.min(smin, s); smax = Math.max(smax, s); tmin = Math.min(tmin, t); tmax = Math.max(tmax, t);
    }
  }
  const ns = Math.max(1, Math.floor((smax - smin) / step));
  const samples = Math.max(2, Math.floor((tmax - tmin) / step) + 1);
  const strike = new Float64Array(ns);
  const cell = new Int32Array(ns * samples);
  for (let a = 0; a < ns; a++) {
    const s = smin + (a + 0.5) * step;
    strike[a] = s;
    for (let b = 0; b < samples; b++) {
      const t = tmin + b * step;
      const x = s * o.ey + t * o.ex;
      const y = -s * o.ex + t * o.ey;
      const i = Math.round((x - g.x0) / g.dx);
      const j = Math.round((y - g.y0) / g.dy);
      cell[a * samples + b] = i >= 0 && i < g.nx && j >= 0 && j < g.ny ? j * g.nx + i : -1;
    }
  }
  return { strike, t0: tmin, step, samples, cell, oceanward: o };
}

/**
 * Dip coordinate of the first crossing along station a: `entering` false finds the first ≥ 0 → < 0
 * (a side left), true the first < 0 → ≥ 0 (a side entered). NaN if none.
 */
export function firstCrossing(st: Stations, a: number, field: Float32Array, entering: boolean): number {
  const base = a * st.samples;
  let prev = NaN;
  for (let b = 0; b < st.samples; b++) {
    const k = st.cell[base + b];
    const v = k < 0 ? NaN : field[k];
    if (v === v && prev === prev && (entering ? prev < 0 && v >= 0 : prev >= 0 && v < 0)) {
      const f = prev / (prev - v);
      return st.t0 + (b - 1 + f) * st.step;
    }
    prev = v;
  }
  return NaN;
}

/** The map point at dip coordinate t on station a. */
export function stationPoint(st: Stations, a: number, t: number): [number, number] {
  const s = st.strike[a];
  const o = st.oceanward;
  return [s * o.ey + t * o.ex, -s * o.ex + t * o.ey];
}
