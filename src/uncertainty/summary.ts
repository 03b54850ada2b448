/**
 * From realisations to the envelope. One convention, used for every figure (lines, widths, areas):
 *
 *   Pq is what at least q % of the realisations reach. The P90 crustal taper limit: continental crust
 *   reaches at least this far oceanward in 90 % of realisations; the P90 landward limit of oceanic
 *   crust: oceanic crust reaches at least this far landward in 90 %; the P90 licence area of a domain:
 *   at least this area in 90 %. So P90 is the cautious (low) case, P10 the generous one, P50 the median.
 *
 * Per cell and line, the realisations' side fields G_r (fields.ts: the line is the zero line of G,
 * G ≥ 0 on the side) give the field Q_q = the ⌈q·N⌉-th largest G_r: Q_q ≥ 0 exactly where at least
 * q % of the realisations reach the cell, and the Pq line is Q_q's zero line, traced as every line
 * is. Where every realisation is the same, Q_q is that realisation's G bit for bit, so the P50 line is
 * the deterministic line exactly. A cell is no data for a line where more than half the realisations
 * have none there. Q's sign comes from the per-cell counts; its value is only needed next to a change
 * of sign, and there it is rebuilt from each realisation's stored thickness, domain and level.
 */

import { colToX, rowToY, type GridGeometry } from '../grid/geometry.js';
import { LINE_RULES, NAMED_LINES, sideValue, type NamedLine } from '../boundaries/fields.js';
import { traceZero } from '../boundaries/extract.js';
import { onlapLines, onlapOffset, type OnlapPoint } from '../boundaries/onlap.js';
import { interpolateAlongStrike, strikeOf } from '../boundaries/strike.js';
import type { Ring } from '../boundaries/planar.js';
import { DELTA_UNIT, DOMAIN_CODES, NO_THICKNESS, type RealisationRecord, type SweepBase, type SweepPart } from './sweep.js';
import { SWEPT_PARAMS, type SweptParam, type UncertaintySpec } from './spec.js';
import { firstCrossing, type Stations } from './stations.js';

export const PERCENTILES = [90, 50, 10] as const;
export type Percentile = (typeof PERCENTILES)[number];

export interface PercentileFigure {
  readonly p90: number;
  readonly p50: number;
  readonly p10: number;
  /** Realisations with a value (NaN ones left out). */
  readonly count: number;
}

export interface UncertaintyResult {
  readonly spec: UncertaintySpec;
  readonly realisations: number;
  /** P(domain code) per cell, codes 0–6 (index = code); codes 1–5 no data where every realisation is no data or Moho not imaged. */
  readonly probability: Float32Array[];
  /** The Pq lines; `onlap` is the Pq oceanic limit moved by the offsets seen at the onlap picks from it (the run's own rule). */
  readonly lines: { line: NamedLine | 'onlap'; p: Percentile; rings: Ring[] }[];
  /** Zone width (m) per station along strike. */
  readonly widths: { strike: Float64Array; p90: Float32Array; p50: Float32Array; p10: Float32Array; count: Uint16Array };
  /** Envelope width (km) of the taper and oceanic limits: P90 to P10 along the oceanward direction, painted between them. */
  readonly positional: Float32Array;
  readonly areas: { code: number; km2: PercentileFigure }[];
  readonly licenceAreas: { code: number; km2: PercentileFigure }[] | null;
  readonly params: { key: SweptParam; min: number; p50: number; max: number; limited: number }[];
  readonly heldCells: number;
  /** Realisations in which oceanic-range crust ran unbroken to the landward edge somewhere (the sides joined). */
  readonly joinedRealisations: number;
  readonly limitedOffsets: number;
  readonly stations: Stations;
}

/** Pq of values by the convention above (the ⌈q·n⌉-th largest), NaN left out. */
export function exceedance(values: ArrayLike<number>, pct: number): number {
  const v = Array.from(values).filter((x) => x === x).sort((a, b) => a - b);
  if (!v.length) return NaN;
  const need = Math.floor((pct * v.length + 99) / 100);
  return v[v.length - Math.max(1, need)];
}

function figure(values: ArrayLike<number>): PercentileFigure {
  let count = 0;
  for (let k = 0; k < values.length; k++) if (values[k] === values[k]) count++;
  return { p90: exceedance(values, 90), p50: exceedance(values, 50), p10: exceedance(values, 10), count };
}

/**
 * Parts in order, covering `range` (default 0…N − 1 of the spec: a whole sweep) of one spec, as one.
 * Throws naming what does not fit.
 */
export function mergeParts(parts: readonly SweepPart[], spec: UncertaintySpec, range: readonly [number, number] = [0, spec.realisations]): SweepPart {
  if (!parts.length) throw new Error('no realisations to merge');
  const sorted = [...parts].sort((a, b) => a.start - b.start);
  const key = sorted[0].key;
  let next = range[0];
  for (const p of sorted) {
    if (p.key !== key) throw new Error(`realisations ${p.start}…${p.end - 1} were made from other inputs, parameters or spec`);
    if (p.start !== next) throw new Error(p.start > next ? `realisations ${next}…${p.start - 1} are missing` : `realisations ${p.start}…${Math.min(next, p.end) - 1} are given twice`);
    next = p.end;
  }
  if (next !== range[1]) throw new Error(`realisations ${next}…${range[1] - 1} are missing (${range[0] === 0 && range[1] === spec.realisations ? `the spec asks for ${spec.realisations}` : `the range is ${range[0]}…${range[1] - 1}`})`);
  if (sorted.length === 1) return sorted[0];
  const n = sorted[0].nx * sorted[0].ny;
  const sum = (pick: (p: SweepPart) => Uint16Array) => {
    const out = new Uint16Array(n);
    for (const p of sorted) {
      const a = pick(p);
      for (let k = 0; k < n; k++) out[k] += a[k];
    }
    return out;
  };
  return {
    key,
    start: range[0],
    end: next,
    nx: sorted[0].nx,
    ny: sorted[0].ny,
    records: sorted.flatMap((p) => p.records),
    delta: sorted.flatMap((p) => p.delta),
    cells: sorted.flatMap((p) => p.cells),
    reach: Object.fromEntries(NAMED_LINES.map((l) => [l, sum((p) => p.reach[l])])) as Record<NamedLine, Uint16Array>,
    noData: Object.fromEntries(NAMED_LINES.map((l) => [l, sum((p) => p.noData[l])])) as Record<NamedLine, Uint16Array>,
    domainCount: Array.from({ length: DOMAIN_CODES }, (_, c) => sum((p) => p.domainCount[c])),
  };
}

/** The envelope from a whole sweep (all realisations, merged). */
export function summarise(base: SweepBase, spec: UncertaintySpec, all: SweepPart): UncertaintyResult {
  const N = all.end - all.start;
  if (all.start !== 0 || N !== spec.realisations) throw new Error(`summarise: realisations 0…${spec.realisations - 1} needed, ${all.start}…${all.end - 1} given`);
  const g = base.stage.geometry;
  const n = g.nx * g.ny;
  // crust-type probabilities are no data where no realisation has crust to classify (no data or Moho not imaged in all)
  const never = (k: number) => all.domainCount[0][k] + all.domainCount[6][k] === N;
  const probability = all.domainCount.map((c, code) => {
    const p = new Float32Array(n);
    for (let k = 0; k < n; k++) p[k] = code >= 1 && code <= 5 && never(k) ? NaN : c[k] / N;
    return p;
  });
  const rebuild = rebuilder(base, all);
  const lines: UncertaintyResult['lines'] = [];
  const q: Record<string, Float32Array> = {};
  for (const line of NAMED_LINES) {
    for (const p of PERCENTILES) {
      const field = quantileField(g, all, line, p, rebuild);
      q[`${line}${p}`] = field;
      lines.push({ line, p, rings: traceZero(g, field) });
    }
  }
  for (const p of PERCENTILES) lines.push({ line: 'onlap', p, rings: onlapOf(base, lines.find((l) => l.line === 'oceanic' && l.p === p)!.rings) });
  // zone width per station; envelope of the two limits per station, painted onto the grid
  const st = base.stations;
  const S = st.strike.length;
  const w = { strike: st.strike, p90: new Float32Array(S), p50: new Float32Array(S), p10: new Float32Array(S), count: new Uint16Array(S) };
  const col = new Float64Array(N);
  for (let a = 0; a < S; a++) {
    for (let r = 0; r < N; r++) col[r] = all.records[r].widths[a];
    const f = figure(col);
    w.p90[a] = f.p90;
    w.p50[a] = f.p50;
    w.p10[a] = f.p10;
    w.count[a] = f.count;
  }
  const positional = new Float32Array(n).fill(NaN);
  for (let a = 0; a < S; a++) {
    for (const [line, entering] of [['taper', false], ['oceanic', true]] as const) {
      const t90 = firstCrossing(st, a, q[`${line}90`], entering);
      const t10 = firstCrossing(st, a, q[`${line}10`], entering);
      if (!(t90 === t90 && t10 === t10)) continue;
      const lo = Math.min(t90, t10);
      const hi = Math.max(t90, t10);
      const km = (hi - lo) / 1000;
      for (let b = 0; b < st.samples; b++) {
        const t = st.t0 + b * st.step;
        if (t < lo - st.step / 2 || t > hi + st.step / 2) continue;
        const k = st.cell[a * st.samples + b];
        if (k >= 0 && !(positional[k] >= km)) positional[k] = km;
      }
    }
  }
  const areaFig = (pick: (r: RealisationRecord) => Float64Array | null) =>
    Array.from({ length: DOMAIN_CODES }, (_, code) => ({ code, km2: figure(all.records.map((r) => pick(r)![code])) }));
  const params = SWEPT_PARAMS.filter((k) => all.records[0].params[k] !== null).map((key) => {
    const v = all.records.map((r) => r.params[key] as number).sort((a, b) => a - b);
    return { key, min: v[0], p50: exceedance(v, 50), max: v[v.length - 1], limited: all.records.filter((r) => r.limited.includes(key)).length };
  });
  return {
    spec,
    realisations: N,
    probability,
    lines,
    widths: w,
    positional,
    areas: areaFig((r) => r.areas),
    licenceAreas: base.licenceMask ? areaFig((r) => r.licenceAreas) : null,
    params,
    heldCells: all.records.reduce((s, r) => s + r.heldCells, 0),
    joinedRealisations: all.records.filter((r) => r.joinedCells > 0).length,
    limitedOffsets: all.records.reduce((s, r) => s + r.limitedOffsets, 0),
    stations: st,
  };
}

/**
 * The oldest onlapped crust for an oceanic line, by the run's rule (boundaries/onlap.ts): the line
 * moved by the offsets of the onlap picks from it, interpolated along strike; without usable onlap
 * picks, the oceanic line itself. With no variance this is the run's onlap line exactly.
 */
function onlapOf(base: SweepBase, oceanic: Ring[]): Ring[] {
  const st = base.stage;
  const g = st.geometry;
  const reach = Math.hypot(g.nx * g.dx, g.ny * g.dy);
  const points: OnlapPoint[] = [];
  for (const q of st.picks.filter((q) => q.kind === 'onlap')) {
    const offset = onlapOffset(q.x, q.y, oceanic, st.oceanward, reach);
    if (Number.isFinite(offset)) points.push({ x: q.x, y: q.y, id: q.id, offset, strike: strikeOf(st.oceanward, q.x, q.y) });
  }
  points.sort((a, b) => a.strike - b.strike);
  return onlapLines(oceanic, points, st.oceanward);
}

type Rebuild = (line: NamedLine, k: number, out: Float64Array) => number;

/** G_r at one cell for every realisation r, from the stored thickness offsets, domains and levels (returns how many are finite, packed first). */
function rebuilder(base: SweepBase, all: SweepPart): Rebuild {
  const st = base.stage;
  const g = st.geometry;
  const tcDet = st.tc;
  const recs = all.records;
  const N = recs.length;
  const pts = (p: [number, number][] | null) => (p ? p.map(([strike, thickness]) => ({ strike, thickness })) : null);
  const taperPts = recs.map((r) => pts(r.taperPoints));
  const oceanPts = recs.map((r) => pts(r.oceanPoints));
  const levelAt = (line: NamedLine, r: number, k: number): number => {
    const p = recs[r].params;
    if (line === 'necking') return st.params.neckingFraction * (p.tc0 as number);
    if (line === 'coupling') return st.params.couplingThickness;
    const cal = line === 'taper' ? taperPts[r] : oceanPts[r];
    if (!cal) return line === 'taper' ? (p.taperThreshold as number) : (p.oceanicThreshold as number);
    const i = k % g.nx;
    const j = (k - i) / g.nx;
    return Math.fround(interpolateAlongStrike(cal, strikeOf(st.oceanward, colToX(g, i), rowToY(g, j)), (q) => q.thickness));
  };
  return (line, k, out) => {
    const rule = LINE_RULES[line];
    let m = 0;
    for (let r = 0; r < N; r++) {
      const d = all.delta[r][k];
      const c = all.cells[r][k];
      const base0 = tcDet[k] === tcDet[k] ? tcDet[k] : 0;
      let t = d === NO_THICKNESS ? NaN : Math.fround(base0 + d * DELTA_UNIT);
      if (rule.skipUnresolved && c & 0x80) t = NaN;
      const v = sideValue(t, rule.side[c & 0x7f] === 1, levelAt(line, r, k), rule.clamp);
      if (v === v) out[m++] = v;
    }
    return m;
  };
}

/** Q_q for one line over the grid: ±1 away from a change of sign, the exact order statistic next to one. */
function quantileField(g: GridGeometry, all: SweepPart, line: NamedLine, pct: Percentile, rebuild: Rebuild): Float32Array {
  const { nx, ny } = g;
  const n = nx * ny;
  const N = all.end - all.start;
  const reach = all.reach[line];
  const nd = all.noData[line];
  const cls = new Int8Array(n); // 1 reached, −1 not, 0 no data
  for (let k = 0; k < n; k++) {
    if (2 * nd[k] > N) continue;
    const nf = N - nd[k];
    const need = Math.max(1, Math.floor((pct * nf + 99) / 100));
    cls[k] = reach[k] >= need ? 1 : -1;
  }
  const out = new Float32Array(n);
  const vals = new Float64Array(N);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const c = cls[k];
      if (c === 0) {
        out[k] = NaN;
        continue;
      }
      let band = false;
      for (let b = Math.max(0, j - 1); b <= Math.min(ny - 1, j + 1) && !band; b++) {
        for (let a = Math.max(0, i - 1); a <= Math.min(nx - 1, i + 1); a++) {
          const o = cls[b * nx + a];
          if (o !== 0 && o !== c) {
            band = true;
            break;
          }
        }
      }
      if (!band) {
        out[k] = c;
        continue;
      }
      const m = rebuild(line, k, vals);
      const need = Math.max(1, Math.floor((pct * m + 99) / 100));
      let v = m ? select(vals, m, m - need) : NaN;
      // the stored thickness is rounded to DELTA_UNIT: where that flips a value within it of 0, keep the counted side
      if (v === v && (v >= 0 ? 1 : -1) !== c) v = c > 0 ? 0 : -1e-3;
      out[k] = v;
    }
  }
  return out;
}

/** The k-th smallest (0-based) of a[0..m), reordering a (Hoare's quickselect, deterministic pivots). */
function select(a: Float64Array, m: number, k: number): number {
  let lo = 0;
  let hi = m - 1;
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}
