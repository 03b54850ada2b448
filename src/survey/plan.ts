/**
 * Proposed 2D seismic lines across the continent–ocean transition (a planning aid).
 *
 * 1. Zone midline: along the oceanward direction, halfway between the crustal taper limit and the
 *    landward limit of oceanic crust (first crossings from land), sampled every cell along strike.
 * 2. Smoothed by a moving average over `smoothingKm` of arc length; split into segments where its
 *    direction turns by more than `turnAngleDeg` from the segment's start.
 * 3. Per segment, straight parallel dip lines perpendicular to the segment's mean strike (its chord),
 *    `spacingKm` apart and centred on the segment, each running from `overhangLandwardKm` landward
 *    of the taper limit to `overhangOceanwardKm` oceanward of the oceanic limit, and reaching at least
 *    2 km landward of its necking-zone tie point.
 * 4. Proposals within `existingToleranceKm` and `existingToleranceDeg` of an existing line are dropped;
 *    where dip lines of neighbouring segments would cross inside the COT zone (segments fan around a
 *    bend), the one that constrains less is dropped, and the dropped list says which.
 * 5. Tie (strike) lines: per midline piece, one continuous line each along the necking zone, the zone
 *    midline and the first oceanic crust, through the tie point of every kept dip line, 2 km beyond
 *    the end ones (a choice).
 * 6. Ranking: dip lines by the transition they constrain per line-km (zone width crossed × distance
 *    from existing control ÷ length); with an uncertainty envelope, by the P90–P10 envelope width
 *    crossed instead (the uncertainty the line would remove), overhangs then measured from the P90
 *    limits (the envelope's outer edges). Each dip line is preceded in the list by the tie pieces that join
 *    it to the dip lines ranked before it (or a 4 km stub across it), so a programme cut at any dip
 *    line's cumulative line-km keeps all its dip lines tied.
 * 7. Coverage along the midline: distance to the nearest existing line or pick; gaps where it exceeds
 *    half the spacing (the most a programme at that spacing leaves).
 * Lines are straight in the analysis CRS; reported lengths are geodesic (WGS 84).
 */

import { geodesicLength } from '../crs/geodesy.js';
import { WGS84, type Crs } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import type { Oceanward } from '../domains/direction.js';
import { clipLineToPolygon, distanceToControl, pointSegmentDistance, rayHits, segmentHit, type Ring } from '../boundaries/planar.js';
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
  /**
   * The P90/P10 envelope of the two limits from an uncertainty sweep (uncertainty/summary.ts): when
   * given, dip lines run from the overhang landward of the P90 taper limit (the landward-most) to the
   * overhang oceanward of the P90 oceanic limit (the oceanward-most), and are ranked by the envelope
   * width they cross, the uncertainty a line would remove.
   */
  readonly envelope?: { readonly taper: { p90: Ring[]; p10: Ring[] }; readonly oceanic: { p90: Ring[]; p10: Ring[] } } | null;
}

export interface ProposedLine {
  id: string;
  kind: 'dip' | 'strike';
  segment: number;
  coords: Ring;
  lengthKm: number;
  /** Dip lines: zone width crossed (km) and distance from existing control at the zone midpoint (km). */
  zoneWidthKm: number | null;
  /** Dip lines with an envelope: P90–P10 width of the taper limit plus that of the oceanic limit, crossed (km). */
  envelopeWidthKm: number | null;
  controlDistanceKm: number | null;
  score: number | null;
  rank: number;
  cumulativeKm: number;
  note?: string;
  /** Tie lines: the dip lines this piece ties (crosses). */
  ties?: string[];
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
  readonly segments: { index: number; strikeDeg: number; coords: Ring; piece: number }[];
  readonly lines: ProposedLine[];
  readonly dropped: { id: string; kind: string; reason: string }[];
  readonly coverage: { midline: Ring; chainageKm: number[]; distanceKm: number[] }[];
  readonly gaps: Gap[];
  readonly warnings: string[];
  /** What ranked the dip lines, in words (the zone width, or with an envelope the uncertainty crossed). */
  readonly rankedBy: string;
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
    return { midline: [], segments: [], lines: [], dropped: [], coverage: [], gaps: [], warnings, rankedBy: 'nothing to rank' };
  }

  // 2. Smooth and split at turns.
  const midline = pieces.map((m) => smooth(m, p.smoothingKm * 1000));
  const segments: Plan['segments'] = [];
  const turn = (p.turnAngleDeg * Math.PI) / 180;
  for (const [pieceIndex, m] of midline.entries()) {
    let start = 0;
    const tangent = (k: number) => angleOf(m[Math.max(0, k - 1)], m[Math.min(m.length - 1, k + 1)]);
    let a0 = tangent(0);
    for (let k = 1; k < m.length; k++) {
      if (angleDiff(tangent(k), a0) > turn || k === m.length - 1) {
        const coords = m.slice(start, k + 1);
        if (coords.length > 1) segments.push({ index: segments.length, strikeDeg: 0, coords, piece: pieceIndex });
        start = k;
        a0 = tangent(k);
      }
    }
  }

  // 3. Dip lines per segment, each with its tie points (necking zone, zone midline, first oceanic crust).
  const spacing = p.spacingKm * 1000;
  const dips: DipDraft[] = [];
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
    for (let q = 0; q < count; q++) {
      const off = (q - (count - 1) / 2) * spacing;
      const o: P = [mid[0] + u[0] * off, mid[1] + u[1] * off];
      const z = zoneCrossing(o, n, reach, inp.taper, inp.oceanic);
      if (!z) continue;
      const at = (t: number): P => [o[0] + n[0] * t, o[1] + n[1] * t];
      const env = inp.envelope ? envelopeCrossing(o, n, reach, z, inp.envelope) : null;
      let t0 = (env ? Math.min(env.landward, z.tTaper) : z.tTaper) - p.overhangLandwardKm * 1000;
      const t1 = (env ? Math.max(env.oceanward, z.tOcean) : z.tOcean) + p.overhangOceanwardKm * 1000;
      const tn = rayHits(o, n, reach, inp.necking).filter((t) => t < z.tTaper);
      const tcp = rayHits(o, n, reach, inp.coupling).filter((t) => t < z.tTaper);
      const tNeck = tn.length && tcp.length ? (tn[tn.length - 1] + tcp[tcp.length - 1]) / 2 : null;
      let note: string | undefined;
      // a dip line reaches at least 2 km landward of its necking-zone tie point, so the tie crosses it
      if (tNeck !== null && tNeck - 2000 < t0) {
        t0 = tNeck - 2000;
        note = 'extended landward beyond the overhang to reach the necking-zone tie line';
      }
      const tm = (z.tTaper + z.tOcean) / 2;
      const zoneMid = at(tm);
      dips.push({
        line: {
          id: '', kind: 'dip', segment: seg.index, coords: [at(t0), at(t1)], lengthKm: 0,
          zoneWidthKm: (z.tOcean - z.tTaper) / 1000, envelopeWidthKm: env ? env.widthKm : inp.envelope ? 0 : null, controlDistanceKm: control(zoneMid[0], zoneMid[1]) / 1000, score: null, rank: 0, cumulativeKm: 0, note,
        },
        piece: seg.piece,
        zone: [at(z.tTaper), at(z.tOcean)],
        tiePoints: { necking: tNeck === null ? null : at(tNeck), midline: zoneMid, oceanic: at(z.tOcean + Math.min(5000, (p.overhangOceanwardKm * 1000) / 2)) },
      });
    }
  }

  // Licence clipping (longest part kept), then drop near-duplicates of existing lines.
  const dropped: Plan['dropped'] = [];
  dips.forEach((d, k) => (d.line.id = `D${d.line.segment + 1}-${String(k + 1).padStart(2, '0')}`));
  let kept: DipDraft[] = [];
  for (const d of dips) {
    const l = d.line;
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
    kept.push(d);
  }

  // Lengths (geodesic) and scores.
  const toLL = transformer(inp.crs, WGS84);
  const geodesicKm = (coords: Ring) => geodesicLength(resamplePath(coords, inp.crs.units === 'degree' ? 0.01 : 1000).flatMap((q) => toLL.forward(q))) / 1000;
  for (const { line: l } of kept) {
    l.lengthKm = geodesicKm(l.coords);
    // with an envelope, the uncertainty crossed; else the zone width crossed
    const crossed = inp.envelope ? (l.envelopeWidthKm ?? 0) : (l.zoneWidthKm ?? 0);
    l.score = (crossed * Math.min(l.controlDistanceKm ?? 0, reach / 1000)) / l.lengthKm;
  }
  const rankedBy = inp.envelope
    ? 'by the P90–P10 envelope width of the taper and oceanic limits each dip line crosses (the uncertainty it would remove) × distance from control ÷ length; overhangs measured from the P90 limits (the envelope\'s outer edges), not from the single lines'
    : 'by the zone width each dip line crosses × distance from control ÷ length; overhangs measured from the taper and oceanic limits';

  // Dip lines of neighbouring segments must not cross inside the zone: where two do, the one that
  // constrains less (lower score) is dropped, and the list says so.
  kept.sort((x, y) => (y.line.score ?? 0) - (x.line.score ?? 0));
  const survivors: DipDraft[] = [];
  for (const d of kept) {
    const hit = survivors.find((o) => crossInsideZone(d, o));
    if (hit) dropped.push({ id: d.line.id, kind: 'dip', reason: `crosses ${hit.line.id} (segment ${hit.line.segment + 1}) inside the COT zone where the segments fan; ${hit.line.id} constrains more` });
    else survivors.push(d);
  }
  kept = survivors;

  // 4. Tie lines: one continuous line per kind and midline piece through the tie points of its dip
  // lines, in along-strike order; 5. ranking: each dip line comes with the tie pieces that join it to
  // the dip lines already ranked (or a short stub across it), listed just before it, so a programme
  // cut at any dip line's cumulative line-km keeps every dip line in it tied.
  const ties = buildTies(kept, strike, 2000);
  const lines: ProposedLine[] = [];
  let tieCount = 0;
  for (const d of kept) {
    for (const t of ties) {
      const k = t.dips.indexOf(d);
      if (k < 0) continue;
      for (const part of t.claim(k)) {
        let coords = part.coords;
        if (p.clipToLicence && inp.licence) {
          const clipped = clipLineToPolygon(coords, inp.licence);
          if (!clipped.length) continue;
          coords = clipped.reduce((best, q) => (pathLength(q) > pathLength(best) ? q : best));
        }
        if (coords.length < 2 || pathLength(coords) < 1) continue;
        tieCount++;
        lines.push({
          id: `S${d.line.segment + 1}-${String(tieCount).padStart(2, '0')}`, kind: 'strike', segment: d.line.segment, coords, lengthKm: geodesicKm(coords),
          zoneWidthKm: null, envelopeWidthKm: null, controlDistanceKm: null, score: null, rank: 0, cumulativeKm: 0,
          note: part.dips.length ? `tie ${t.note}` : `tie ${t.note} (joins the tie pieces either side of ${d.line.id})`, ties: part.dips.map((q) => q.line.id),
        });
      }
    }
    lines.push(d.line);
  }
  let cum = 0;
  lines.forEach((l, k) => {
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
  return { midline, segments, lines, dropped, coverage, gaps, warnings, rankedBy };
}

/**
 * Where a dip ray meets the envelope: the first hit from land of the P90 taper limit (landward edge of
 * its envelope) and of the P10 taper limit beyond it; the first hits of the P10 and P90 oceanic limits
 * beyond the P90 taper limit. Widths are P10 − P90 for the taper limit and P90 − P10 for the oceanic
 * limit, each 0 where a percentile line is not crossed.
 */
function envelopeCrossing(o: P, n: P, reach: number, z: { tTaper: number; tOcean: number }, e: NonNullable<PlanInput['envelope']>): { landward: number; oceanward: number; widthKm: number } {
  const first = (lines: Ring[], after: number) => rayHits(o, n, reach, lines).find((t) => t >= after) ?? NaN;
  const from = -reach;
  const t90 = first(e.taper.p90, from);
  const t10 = first(e.taper.p10, t90 === t90 ? t90 : from);
  const o10 = first(e.oceanic.p10, t90 === t90 ? t90 : from);
  const o90 = first(e.oceanic.p90, o10 === o10 ? o10 : z.tTaper);
  const w = (a: number, b: number) => (a === a && b === b && b > a ? b - a : 0);
  return {
    landward: t90 === t90 ? t90 : z.tTaper,
    oceanward: o90 === o90 ? o90 : z.tOcean,
    widthKm: (w(t90, t10) + w(o10, o90)) / 1000,
  };
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

interface DipDraft {
  line: ProposedLine;
  piece: number;
  /** Where the line crosses the taper limit and the oceanic limit. */
  zone: [P, P];
  tiePoints: { necking: P | null; midline: P; oceanic: P };
}

/** Whether two dip lines cross at a point inside the COT zone of either. */
function crossInsideZone(a: DipDraft, b: DipDraft): boolean {
  const [a0, a1] = [a.line.coords[0], a.line.coords[a.line.coords.length - 1]];
  const [b0, b1] = [b.line.coords[0], b.line.coords[b.line.coords.length - 1]];
  const t = segmentHit(a0, a1, b0, b1);
  if (t === null) return false;
  const x: P = [a0[0] + (a1[0] - a0[0]) * t, a0[1] + (a1[1] - a0[1]) * t];
  const within = (d: DipDraft) => {
    const [z0, z1] = d.zone;
    const len = Math.hypot(z1[0] - z0[0], z1[1] - z0[1]);
    const s = ((x[0] - z0[0]) * (z1[0] - z0[0]) + (x[1] - z0[1]) * (z1[1] - z0[1])) / (len * len);
    return s >= 0 && s <= 1;
  };
  return within(a) || within(b);
}

interface TieLine {
  note: string;
  /** Dip lines along the tie, in along-strike order. */
  dips: DipDraft[];
  /** The parts of the tie needed to join dip k to the dips already claimed (or a stub across it). */
  claim: (k: number) => { coords: Ring; dips: DipDraft[] }[];
}

/**
 * Continuous tie lines per kind (necking zone, midline, first oceanic crust) and midline piece:
 * a polyline through the tie points of the dip lines, extended `ext` beyond the end ones. Parts are
 * handed out by arc length, so claimed parts never overlap and together stay one line.
 */
function buildTies(dips: DipDraft[], strike: P, ext: number): TieLine[] {
  const out: TieLine[] = [];
  const kinds: [keyof DipDraft['tiePoints'], string][] = [['necking', 'along the necking zone'], ['midline', 'along the COT zone midline'], ['oceanic', 'along the first oceanic crust']];
  const pieces = [...new Set(dips.map((d) => d.piece))];
  for (const piece of pieces) {
    for (const [kind, note] of kinds) {
      const mine = dips.filter((d) => d.piece === piece && d.tiePoints[kind]).sort((a, b) => proj(a.tiePoints[kind]!, strike) - proj(b.tiePoints[kind]!, strike));
      if (mine.length === 0) continue;
      const pts = mine.map((d) => d.tiePoints[kind]!);
      const first = pts[0];
      const last = pts[pts.length - 1];
      const dirA = pts.length > 1 ? unit(pts[1], first) : [-strike[0], -strike[1]];
      const dirB = pts.length > 1 ? unit(pts[pts.length - 2], last) : strike;
      const path: Ring = [[first[0] + dirA[0] * ext, first[1] + dirA[1] * ext], ...pts, [last[0] + dirB[0] * ext, last[1] + dirB[1] * ext]];
      const s = [0];
      for (let k = 1; k < path.length; k++) s.push(s[k - 1] + Math.hypot(path[k][0] - path[k - 1][0], path[k][1] - path[k - 1][1]));
      const at = mine.map((_, k) => s[k + 1]);
      const taken = new Array<boolean>(mine.length).fill(false);
      const covered: [number, number][] = [];
      out.push({
        note,
        dips: mine,
        claim: (k) => {
          let lo = -1;
          for (let q = k - 1; q >= 0; q--) if (taken[q]) { lo = q; break; }
          let hi = -1;
          for (let q = k + 1; q < mine.length; q++) if (taken[q]) { hi = q; break; }
          taken[k] = true;
          const from = lo >= 0 ? at[lo] : Math.max(0, at[k] - ext);
          const to = hi >= 0 ? at[hi] : Math.min(s[s.length - 1], at[k] + ext);
          const parts: { coords: Ring; dips: DipDraft[] }[] = [];
          for (const [a, b] of subtract([from, to], covered)) {
            if (b - a < 1) continue;
            parts.push({ coords: subPath(path, s, a, b), dips: mine.filter((_, q) => at[q] >= a - 1e-6 && at[q] <= b + 1e-6) });
          }
          covered.push([from, to]);
          return parts;
        },
      });
    }
  }
  return out;
}

const proj = (q: P, d: P) => q[0] * d[0] + q[1] * d[1];
function unit(from: P, to: P): P {
  const l = Math.hypot(to[0] - from[0], to[1] - from[1]) || 1;
  return [(to[0] - from[0]) / l, (to[1] - from[1]) / l];
}

/** [a, b] minus the union of intervals. */
function subtract(iv: [number, number], cover: [number, number][]): [number, number][] {
  let parts: [number, number][] = [iv];
  for (const [c0, c1] of cover) {
    const next: [number, number][] = [];
    for (const [a, b] of parts) {
      if (c1 <= a || c0 >= b) next.push([a, b]);
      else {
        if (c0 > a) next.push([a, c0]);
        if (c1 < b) next.push([c1, b]);
      }
    }
    parts = next;
  }
  return parts;
}

/** The part of a polyline between arc lengths a and b (s = cumulative arc length per vertex). */
function subPath(path: Ring, s: number[], a: number, b: number): Ring {
  const point = (t: number): P => {
    let k = 1;
    while (k < s.length - 1 && s[k] < t) k++;
    const f = s[k] > s[k - 1] ? (t - s[k - 1]) / (s[k] - s[k - 1]) : 0;
    return [path[k - 1][0] + (path[k][0] - path[k - 1][0]) * f, path[k - 1][1] + (path[k][1] - path[k - 1][1]) * f];
  };
  const out: Ring = [point(a)];
  for (let k = 0; k < path.length; k++) if (s[k] > a && s[k] < b) out.push([path[k][0], path[k][1]]);
  out.push(point(b));
  return out;
}
