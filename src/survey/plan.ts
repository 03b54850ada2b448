/**
 * Proposed 2D seismic lines across the continent–ocean transition (a planning aid).
 *
 * 1. Zone midline: along the oceanward direction, halfway between the crustal taper limit and the
 *    landward limit of oceanic crust (first crossings from land), sampled every cell along strike.
 * 2. Smoothed by a moving average over `smoothingKm` of arc length; split into segments where its
 *    direction turns by more than `turnAngleDeg` from the segment's start.
 * 3. Per segment, straight parallel dip lines perpendicular to the segment's mean strike (its chord),
 *    `spacingKm` apart and centred on the segment, each running from `overhangLandwardKm` landward
 *    of the taper limit to `overhangOceanwardKm` oceanward of the oceanic limit; strike (tie) lines
 *    across every dip line of the segment along the necking zone, the midline and the first oceanic crust.
 * 4. Proposals within `existingToleranceKm` and `existingToleranceDeg` of an existing line are dropped.
 * 5. Coverage along the midline: distance to the nearest existing line or pick; gaps where it exceeds
 *    half the spacing (the most a programme at that spacing leaves). Dip lines are ranked by the
 *    transition they constrain per line-km: zone width crossed × distance from existing control ÷ length.
 *    Strike lines follow the dip lines in the list (they tie them; cut them last).
 * Lines are straight in the analysis CRS; reported lengths are geodesic (WGS 84).
 */

import { geodesicLength } from '../crs/geodesy.js';
import { WGS84, type Crs } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import type { Oceanward } from '../domains/direction.js';
import { clipLineToPolygon, distanceToControl, pointSegmentDistance, rayHits, type Ring } from '../boundaries/planar.js';
import { resamplePath } from './section.js';
import type { PlanParams } from './params.js';

export interface PlanInput {
  readonly crs: Crs;
  readonly oceanward: Oceanward;
  /** Analysis-grid footprint (map units) to bound the search. */
  readonly extent: { xmin: number; ymin: number; xmax: number; ymax: number };
  readonly cellSize: number;
  readonly taper: Ring[];
  readonly oceanic: Ring[];
  readonly necking: Ring[];
  readonly coupling: Ring[];
  readonly existing: { name: string; coords: Ring }[];
  readonly picks: [number, number][];
  readonly licence: Ring[] | null;
}

export interface ProposedLine {
  id: string;
  kind: 'dip' | 'strike';
  segment: number;
  coords: Ring;
  lengthKm: number;
  /** Dip lines: zone width crossed (km) and distance from existing control at the zone midpoint (km). */
  zoneWidthKm: number | null;
  controlDistanceKm: number | null;
  score: number | null;
  rank: number;
  cumulativeKm: number;
  note?: string;
}

export interface Gap {
  startKm: number;
  endKm: number;
  lengthKm: number;
  maxDistanceKm: number;
  /** Midpoint of the gap in map coordinates, and which midline piece it lies on. */
  at: [number, number];
  piece: number;
  rank: number;
}

export interface Plan {
  readonly midline: Ring[];
  readonly segments: { index: number; strikeDeg: number; coords: Ring }[];
  readonly lines: ProposedLine[];
  readonly dropped: { id: string; kind: string; reason: string }[];
  readonly coverage: { midline: Ring; chainageKm: number[]; distanceKm: number[] }[];
  readonly gaps: Gap[];
  readonly warnings: string[];
}

type P = [number, number];

/** Landward-most taper crossing and the first oceanic crossing beyond it along `dir` through `origin`. */
export function zoneCrossing(origin: P, dir: P, reach: number, taper: Ring[], oceanic: Ring[]): { tTaper: number; tOcean: number } | null {
  const t = rayHits(origin, dir, reach, taper);
  if (!t.length) return null;
  const o = rayHits(origin, dir, reach, oceanic).filter((v) => v > t[0]);
  if (!o.length) return null;
  return { tTaper: t[0], tOcean: o[0] };
}

function smooth(path: Ring, lengthM: number): Ring {
  if (lengthM <= 0 || path.length < 3) return path.map((p) => [p[0], p[1]] as P);
  const s = [0];
  for (let k = 1; k < path.length; k++) s.push(s[k - 1] + Math.hypot(path[k][0] - path[k - 1][0], path[k][1] - path[k - 1][1]));
  const half = lengthM / 2;
  const out: Ring = [];
  let lo = 0;
  let hi = 0;
  let sx = 0;
  let sy = 0;
  for (let k = 0; k < path.length; k++) {
    while (hi < path.length && s[hi] <= s[k] + half) (sx += path[hi][0]), (sy += path[hi][1]), hi++;
    while (s[lo] < s[k] - half) (sx -= path[lo][0]), (sy -= path[lo][1]), lo++;
    out.push([sx / (hi - lo), sy / (hi - lo)]);
  }
  return out;
}

const angleOf = (a: P, b: P) => Math.atan2(b[1] - a[1], b[0] - a[0]);
const angleDiff = (a: number, b: number) => {
  let d = Math.abs(a - b) % Math.PI; // lines, not directions
  if (d > Math.PI / 2) d = Math.PI - d;
  return d;
};

export function planSurvey(inp: PlanInput, p: PlanParams): Plan {
  const warnings: string[] = [];
  const { ex, ey } = inp.oceanward;
  const dip: P = [ex, ey];
  const strike: P = [ey, -ex];
  const e = inp.extent;
  const cx = (e.xmin + e.xmax) / 2;
  const cy = (e.ymin + e.ymax) / 2;
  const reach = Math.hypot(e.xmax - e.xmin, e.ymax - e.ymin);
  const corners: P[] = [[e.xmin, e.ymin], [e.xmax, e.ymin], [e.xmin, e.ymax], [e.xmax, e.ymax]];
  const sProj = corners.map((c) => (c[0] - cx) * strike[0] + (c[1] - cy) * strike[1]);
  const sMin = Math.min(...sProj);
  const sMax = Math.max(...sProj);
  const controlLines = inp.existing.map((l) => l.coords);
  const control = (x: number, y: number) => (inp.picks.length || controlLines.length ? distanceToControl(x, y, inp.picks, controlLines) : Infinity);

  // 1. Raw midline pieces (a new piece wherever the zone is not crossed).
  const pieces: Ring[] = [];
  let cur: Ring = [];
  for (let s = sMin; s <= sMax; s += inp.cellSize) {
    const o: P = [cx + strike[0] * s, cy + strike[1] * s];
    const z = zoneCrossing(o, dip, reach, inp.taper, inp.oceanic);
    if (!z) {
      if (cur.length > 1) pieces.push(cur);
      cur = [];
      continue;
    }
    const t = (z.tTaper + z.tOcean) / 2;
    cur.push([o[0] + dip[0] * t, o[1] + dip[1] * t]);
  }
  if (cur.length > 1) pieces.push(cur);
  if (!pieces.length) {
    warnings.push('no continent–ocean transition is crossed along the oceanward direction: no lines proposed');
    return { midline: [], segments: [], lines: [], dropped: [], coverage: [], gaps: [], warnings };
  }

  // 2. Smooth and split at turns.
  const midline = pieces.map((m) => smooth(m, p.smoothingKm * 1000));
  const segments: Plan['segments'] = [];
  const turn = (p.turnAngleDeg * Math.PI) / 180;
  for (const m of midline) {
    let start = 0;
    const tangent = (k: number) => angleOf(m[Math.max(0, k - 1)], m[Math.min(m.length - 1, k + 1)]);
    let a0 = tangent(0);
    for (let k = 1; k < m.length; k++) {
      if (angleDiff(tangent(k), a0) > turn || k === m.length - 1) {
        const coords = m.slice(start, k + 1);
        if (coords.length > 1) segments.push({ index: segments.length, strikeDeg: 0, coords });
        start = k;
        a0 = tangent(k);
      }
    }
  }

  // 3. Dip lines per segment, then strike lines across them.
  const lines: ProposedLine[] = [];
  const spacing = p.spacingKm * 1000;
  for (const seg of segments) {
    const a = seg.coords[0];
    const b = seg.coords[seg.coords.length - 1];
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    if (len === 0) continue;
    const u: P = [(b[0] - a[0]) / len, (b[1] - a[1]) / len]; // mean strike
    seg.strikeDeg = ((Math.atan2(u[0], u[1]) * 180) / Math.PI + 360) % 180;
    let n: P = [u[1], -u[0]]; // perpendicular; make it point oceanward
    if (n[0] * dip[0] + n[1] * dip[1] < 0) n = [-n[0], -n[1]];
    const count = Math.floor(len / spacing) + 1;
    const mid: P = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
    const segDips: { line: ProposedLine; z: { tTaper: number; tOcean: number }; o: P }[] = [];
    for (let q = 0; q < count; q++) {
      const off = (q - (count - 1) / 2) * spacing;
      const o: P = [mid[0] + u[0] * off, mid[1] + u[1] * off];
      const z = zoneCrossing(o, n, reach, inp.taper, inp.oceanic);
      if (!z) continue;
      const t0 = z.tTaper - p.overhangLandwardKm * 1000;
      const t1 = z.tOcean + p.overhangOceanwardKm * 1000;
      const coords: Ring = [[o[0] + n[0] * t0, o[1] + n[1] * t0], [o[0] + n[0] * t1, o[1] + n[1] * t1]];
      const tm = (z.tTaper + z.tOcean) / 2;
      const zoneMid: P = [o[0] + n[0] * tm, o[1] + n[1] * tm];
      const line: ProposedLine = {
        id: '', kind: 'dip', segment: seg.index, coords, lengthKm: 0,
        zoneWidthKm: (z.tOcean - z.tTaper) / 1000, controlDistanceKm: control(zoneMid[0], zoneMid[1]) / 1000, score: null, rank: 0, cumulativeKm: 0,
      };
      segDips.push({ line, z, o });
    }
    if (!segDips.length) continue;
    lines.push(...segDips.map((d) => d.line));
    // Strike lines: through the mean dip-offset of their reference points, spanning the segment's dip lines.
    const along = (pt: P) => (pt[0] - mid[0]) * u[0] + (pt[1] - mid[1]) * u[1];
    const across = (pt: P) => (pt[0] - mid[0]) * n[0] + (pt[1] - mid[1]) * n[1];
    const firstAlong = along(segDips[0].o) - 2000;
    const lastAlong = along(segDips[segDips.length - 1].o) + 2000;
    const strikeAt = (offsets: number[], note: string) => {
      if (!offsets.length) return;
      const c = offsets.reduce((s2, v) => s2 + v, 0) / offsets.length;
      const pt = (al: number): P => [mid[0] + u[0] * al + n[0] * c, mid[1] + u[1] * al + n[1] * c];
      lines.push({ id: '', kind: 'strike', segment: seg.index, coords: [pt(firstAlong), pt(lastAlong)], lengthKm: 0, zoneWidthKm: null, controlDistanceKm: null, score: null, rank: 0, cumulativeKm: 0, note });
    };
    const neck: number[] = [];
    const midOff: number[] = [];
    const ocean: number[] = [];
    for (const d of segDips) {
      const base = across(d.o);
      midOff.push(base + (d.z.tTaper + d.z.tOcean) / 2);
      ocean.push(base + d.z.tOcean + Math.min(5000, (p.overhangOceanwardKm * 1000) / 2));
      const tn = rayHits(d.o, n, reach, inp.necking).filter((t) => t < d.z.tTaper);
      const tc = rayHits(d.o, n, reach, inp.coupling).filter((t) => t < d.z.tTaper);
      if (tn.length && tc.length) neck.push(base + (tn[tn.length - 1] + tc[tc.length - 1]) / 2);
    }
    // Dip lines reach landward at least 2 km past the necking-zone strike line, so every dip line ties.
    if (neck.length) {
      const c = neck.reduce((s2, v) => s2 + v, 0) / neck.length;
      for (const d of segDips) {
        const tNeed = c - across(d.o) - 2000;
        const start = d.line.coords[0];
        const tNow = (start[0] - d.o[0]) * n[0] + (start[1] - d.o[1]) * n[1];
        if (tNeed < tNow) {
          d.line.coords[0] = [d.o[0] + n[0] * tNeed, d.o[1] + n[1] * tNeed];
          d.line.note = 'extended landward beyond the overhang to tie the necking-zone strike line';
        }
      }
    }
    strikeAt(neck, 'along the necking zone');
    strikeAt(midOff, 'along the COT zone midline');
    strikeAt(ocean, 'along the first oceanic crust');
  }

  // Licence clipping (longest part kept), then drop near-duplicates of existing lines.
  const kept: ProposedLine[] = [];
  const dropped: Plan['dropped'] = [];
  lines.forEach((l, k) => (l.id = `${l.kind === 'dip' ? 'D' : 'S'}${l.segment + 1}-${String(k + 1).padStart(2, '0')}`));
  for (const l of lines) {
    if (p.clipToLicence && inp.licence) {
      const parts = clipLineToPolygon(l.coords, inp.licence);
      if (!parts.length) {
        dropped.push({ id: l.id, kind: l.kind, reason: 'outside the licence' });
        continue;
      }
      l.coords = parts.reduce((best, q) => (pathLength(q) > pathLength(best) ? q : best));
    }
    const near = nearExisting(l.coords, inp.existing, p.existingToleranceKm * 1000, (p.existingToleranceDeg * Math.PI) / 180);
    if (near) {
      dropped.push({ id: l.id, kind: l.kind, reason: `within ${p.existingToleranceKm} km and ${p.existingToleranceDeg}° of existing line ${near}` });
      continue;
    }
    kept.push(l);
  }

  // Lengths (geodesic), scores, ranks and cumulative line-km.
  const toLL = transformer(inp.crs, WGS84);
  for (const l of kept) {
    const ll = resamplePath(l.coords, inp.crs.units === 'degree' ? 0.01 : 1000).flatMap((q) => toLL.forward(q));
    l.lengthKm = geodesicLength(ll) / 1000;
    if (l.kind === 'dip') l.score = ((l.zoneWidthKm ?? 0) * Math.min(l.controlDistanceKm ?? 0, reach / 1000)) / l.lengthKm;
  }
  kept.sort((a, b) => (a.kind === b.kind ? (b.score ?? 0) - (a.score ?? 0) : a.kind === 'dip' ? -1 : 1));
  let cum = 0;
  kept.forEach((l, k) => {
    l.rank = k + 1;
    cum += l.lengthKm;
    l.cumulativeKm = cum;
  });

  // Coverage and gaps along the (smoothed) midline.
  const coverage: Plan['coverage'] = [];
  const gaps: Gap[] = [];
  for (const m of midline) {
    const chain = [0];
    const dist: number[] = [];
    for (let k = 0; k < m.length; k++) {
      if (k > 0) chain.push(chain[k - 1] + geodesicLength([...toLL.forward(m[k - 1]), ...toLL.forward(m[k])]) / 1000);
      dist.push(control(m[k][0], m[k][1]) / 1000);
    }
    coverage.push({ midline: m, chainageKm: chain, distanceKm: dist });
    let k = 0;
    while (k < m.length) {
      if (dist[k] <= p.spacingKm / 2) {
        k++;
        continue;
      }
      const start = k;
      let worst = 0;
      while (k < m.length && dist[k] > p.spacingKm / 2) worst = Math.max(worst, dist[k++]);
      const end = k - 1;
      const at = m[Math.floor((start + end) / 2)];
      gaps.push({ startKm: chain[start], endKm: chain[end], lengthKm: chain[end] - chain[start], maxDistanceKm: worst, at: [at[0], at[1]], piece: coverage.length - 1, rank: 0 });
    }
  }
  gaps.sort((a, b) => b.lengthKm - a.lengthKm);
  gaps.forEach((g, k) => (g.rank = k + 1));
  return { midline, segments, lines: kept, dropped, coverage, gaps, warnings };
}

function pathLength(r: Ring): number {
  let s = 0;
  for (let k = 1; k < r.length; k++) s += Math.hypot(r[k][0] - r[k - 1][0], r[k][1] - r[k - 1][1]);
  return s;
}

/** Name of an existing line that most of `coords` runs along (within tol and angle), or null. */
function nearExisting(coords: Ring, existing: PlanInput['existing'], tol: number, angle: number): string | null {
  const a = angleOf(coords[0], coords[coords.length - 1]);
  const samples = resamplePath(coords, 500);
  for (const e of existing) {
    let near = 0;
    for (const [x, y] of samples) {
      for (let q = 0; q < e.coords.length - 1; q++) {
        const s0 = e.coords[q];
        const s1 = e.coords[q + 1];
        if (angleDiff(angleOf(s0, s1), a) <= angle && pointSegmentDistance(x, y, s0[0], s0[1], s1[0], s1[1]) <= tol) {
          near++;
          break;
        }
      }
    }
    if (near >= 0.5 * samples.length) return e.name;
  }
  return null;
}
