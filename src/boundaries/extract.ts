/**
 * The named boundaries (DESIGN.md "Named boundaries") from the domain map, the crustal thickness and
 * the (possibly pick-calibrated) thresholds, in analysis-CRS coordinates with their properties.
 * Steps:
 *  1. trace the side fields: taper limit, landward limit of oceanic crust, necking and coupling lines;
 *  2. optional shared-border simplification of those lines and the COT rings together;
 *  3. the oldest onlapped crust: the oceanic limit moved by the offsets seen at onlap picks (onlap.ts);
 *  4. pieces: each line split where its evidence changes (near a pick of its kind, proxy near control,
 *     proxy far from control) and into pieces of at most MAX_PIECE metres; ends that stop at a Moho
 *     gap are marked;
 *  5. the COT zone polygons, each with the fraction of its border placed by picks;
 *  6. clipping to the licence.
 */

import { colToX, rowToY, xToCol, yToRow, type GridGeometry } from '../grid/geometry.js';
import { lineCount, lineRange, ringArea, traceLevel, type Lines } from '../contour/marching-squares.js';
import { DOMAIN_MOHO_GAP, FLAG_UNRESOLVED } from '../domains/classify.js';
import type { Oceanward } from '../domains/direction.js';
import type { Params } from '../params.js';
import { CONTINENTAL_SIDE, namedLineField, OCEANIC_SIDE, sideField, type LineLevels } from './fields.js';
import { dilate8 } from '../grid/dilate.js';
import { offsetAt, onlapLines, onlapOffset, strikeOf, type OnlapPoint } from './onlap.js';
import { simplifyShared } from './simplify.js';
import { clipLineToPolygon, clipPolygons, distanceToControl, insideRings, signedArea, type Ring } from './planar.js';

export type BoundaryKind = 'crustal-taper-limit' | 'cot-zone' | 'oceanic-limit' | 'oldest-onlapped-crust' | 'necking-line' | 'coupling-line';
export type LineKind = Exclude<BoundaryKind, 'cot-zone'>;

export interface Pick {
  readonly x: number;
  readonly y: number;
  readonly kind: 'continental-limit' | 'oceanic-limit' | 'onlap';
  readonly line?: string;
  /** Stable identity: the feature's id, else line/kind, else its position in the file. */
  readonly id: string;
  /** Excluded by the user: shown, never used to place or to measure control. */
  readonly excluded?: boolean;
}

export interface Isochron {
  readonly coords: Ring;
  readonly age: number;
  readonly label?: string;
}

export interface BoundaryPiece {
  readonly kind: BoundaryKind;
  /** LineString coordinates, or for cot-zone a polygon's rings (outer first). */
  readonly coords: Ring[];
  readonly properties: Record<string, unknown>;
}

export interface BoundaryInput {
  readonly geometry: GridGeometry;
  readonly thickness: Float32Array;
  readonly domains: Uint8Array;
  /** Per-cell classification flags: unresolved cells stop the taper and oceanic lines. */
  readonly flags?: Uint8Array;
  readonly oceanward: Oceanward;
  readonly taperLevel: Float32Array | number;
  readonly oceanLevel: Float32Array | number;
  /** What placed each thickness line, in words (parameter or calibration). */
  readonly taperSource: string;
  readonly oceanSource: string;
  readonly params: Params;
  /** Picks in use (excluded ones left out). */
  readonly picks: Pick[];
  readonly seismicLines: Ring[];
  readonly isochrons: Isochron[];
  /** Licence rings in the analysis CRS, or null. */
  readonly licence: Ring[] | null;
  readonly oceanicAgeMin: Float32Array | null;
  readonly oceanicAgeMax: Float32Array | null;
}

export interface GapInterruption {
  readonly kind: LineKind;
  readonly x: number;
  readonly y: number;
  /** What the line ran into: the Moho not imaged, or a transition thickness cannot resolve. */
  readonly cause: 'moho-gap' | 'unresolved';
}

export interface BoundaryResult {
  readonly pieces: BoundaryPiece[];
  /** Lines clipped to the licence (same pieces model), or null without a licence. Computed when first read (the exact COT clip). */
  readonly inLicence: BoundaryPiece[] | null;
  /** Whether the run has a licence (inLicence is then not null), without computing inLicence. */
  readonly hasLicence: boolean;
  /** One feature per continuous line (whole grid), and clipped to the licence (null without one). */
  readonly lines: BoundaryPiece[];
  readonly linesInLicence: BoundaryPiece[] | null;
  readonly missing: { kind: BoundaryKind; reason: string }[];
  readonly notes: string[];
  /** Line ends where a line stops because the Moho is not imaged beyond it. */
  readonly interruptions: GapInterruption[];
  /** Onlap picks used (offset from the oceanic limit) and those that could not be used. */
  readonly onlap: { points: OnlapPoint[]; skipped: { id: string; reason: string }[] };
  /** Whole lines in map coordinates for survey planning and sections. */
  readonly support: { taper: Ring[]; oceanic: Ring[]; onlap: Ring[]; necking: Ring[]; coupling: Ring[] };
}

const MAX_PIECE = 10_000;
/** Metres: "far from either side" in the COT field, beyond any thickness difference. */
const FAR = 1e7;


type Evidence = 'picks' | 'proxy-near' | 'proxy-far';

export function extractBoundaries(inp: BoundaryInput): BoundaryResult {
  const g = inp.geometry;
  const { nx, ny } = g;
  const p = inp.params;
  const dom = inp.domains;
  const tc = inp.thickness;

  // 1. Side fields and their lines. Where thickness cannot resolve the transition the taper and
  // oceanic limits are not drawn (NaN: lines stop there, as at a Moho gap).
  const flags = inp.flags;
  const tcLimits = flags ? tc.map((v, k) => (flags[k] & FLAG_UNRESOLVED ? NaN : v)) : tc;
  const grid = (v: Float32Array) => ({ values: v, nx, ny });
  // one field at a time where it can be: necking and coupling share a buffer (traced, then reused
  // for the COT field); the taper and oceanic fields are kept for the COT field
  const spare = new Float32Array(nx * ny);
  const levels = lineLevels(p, inp.taperLevel, inp.oceanLevel);
  const necking = traceZero(g, namedLineField('necking', tc, tcLimits, dom, levels, spare));
  const coupling = traceZero(g, namedLineField('coupling', tc, tcLimits, dom, levels, spare));
  const gTaper = namedLineField('taper', tc, tcLimits, dom, levels);
  const gOcean = namedLineField('oceanic', tc, tcLimits, dom, levels);
  const lines: Record<'taper' | 'oceanic' | 'necking' | 'coupling', Ring[]> = {
    taper: traceZero(g, gTaper),
    oceanic: traceZero(g, gOcean),
    necking,
    coupling,
  };

  // COT zone: between the taper limit and the oceanic limit, {G_taper < 0 and G_ocean < 0}, traced
  // on H = min(T, O) with T = −G_taper next to continental cells (8-neighbours) and FAR elsewhere,
  // O likewise for oceanic cells. Each border edge then interpolates exactly the values its line
  // does, so ring and line share vertices bit for bit even where the two thresholds differ (a
  // transition cell thicker than the taper threshold would otherwise read as "just inside").
  // cells that are, or have an 8-neighbour that is, on each side (domain codes, see sideOf)
  const nearC = dilate8(dom, CONTINENTAL_SIDE, nx, ny);
  const nearO = dilate8(dom, OCEANIC_SIDE, nx, ny);
  const cotField = spare;
  for (let k = 0; k < cotField.length; k++) {
    const t = nearC[k] ? -gTaper[k] : FAR;
    const o = nearO[k] ? -gOcean[k] : FAR;
    cotField[k] = gTaper[k] !== gTaper[k] ? NaN : Math.min(t, o);
  }
  let cot = zonePolygons(traceLevel(grid(cotField), 0, true), g);

  // 2. Optional simplification, once for all lines and the COT rings together, so shared borders stay shared.
  if (p.simplifyTolerance > 0) {
    const keys = ['taper', 'oceanic', 'necking', 'coupling'] as const;
    const lineList = keys.flatMap((k) => lines[k]);
    const simp = simplifyShared(lineList, cot.flat(), p.simplifyTolerance);
    let q = 0;
    for (const k of keys) lines[k] = lines[k].map(() => simp.lines[q++]);
    q = 0;
    cot = cot.map((rings) => rings.map(() => simp.rings[q++]));
  }

  // 3. Oldest onlapped crust from the oceanic limit and the onlap picks.
  const reach = Math.hypot(nx * g.dx, ny * g.dy);
  const onlapPoints: OnlapPoint[] = [];
  const onlapSkipped: BoundaryResult['onlap']['skipped'] = [];
  for (const q of inp.picks.filter((q) => q.kind === 'onlap')) {
    const offset = onlapOffset(q.x, q.y, lines.oceanic, inp.oceanward, reach);
    if (!Number.isFinite(offset)) onlapSkipped.push({ id: q.id, reason: 'the landward limit of oceanic crust is not drawn along the oceanward direction through the pick (unresolved transition, Moho gap or no data), so its offset cannot be measured' });
    else onlapPoints.push({ x: q.x, y: q.y, id: q.id, offset, strike: strikeOf(inp.oceanward, q.x, q.y) });
  }
  onlapPoints.sort((a, b) => a.strike - b.strike);
  const onlap = onlapLines(lines.oceanic, onlapPoints, inp.oceanward);

  // 4. Pieces.
  const usedPicks = inp.picks;
  const controlPoints = usedPicks.map((q) => [q.x, q.y] as [number, number]);
  const hasControl = controlPoints.length > 0 || inp.seismicLines.length > 0;
  const controlDistance = (x: number, y: number) => (hasControl ? distanceToControl(x, y, controlPoints, inp.seismicLines) : Infinity);
  const missing: BoundaryResult['missing'] = [];
  const notes: string[] = [];
  const pieces: BoundaryPiece[] = [];
  const interruptions: GapInterruption[] = [];
  const wholeLines: BoundaryPiece[] = [];
  /** What stops a line end: a Moho gap or an unresolved cell among the cells around it, or nothing. */
  const stopAt = (x: number, y: number): GapInterruption['cause'] | null => {
    const ci = xToCol(g, x);
    const cj = yToRow(g, y);
    let cause: GapInterruption['cause'] | null = null;
    for (let j = Math.floor(cj) - 1; j <= Math.ceil(cj) + 1; j++) {
      for (let i = Math.floor(ci) - 1; i <= Math.ceil(ci) + 1; i++) {
        if (i < 0 || j < 0 || i >= nx || j >= ny) continue;
        const k = j * nx + i;
        if (dom[k] === DOMAIN_MOHO_GAP) return 'moho-gap';
        if (flags && flags[k] & FLAG_UNRESOLVED) cause = 'unresolved';
      }
    }
    return cause;
  };
  const offsets = onlapPoints.map((q) => q.offset);
  const onlapRule = onlapPoints.length
    ? `landward limit of oceanic crust moved oceanward by the offset seen at ${onlapPoints.length} onlap pick${onlapPoints.length > 1 ? 's' : ''} (${km(Math.min(...offsets))}…${km(Math.max(...offsets))} km), interpolated along strike`
    : 'no onlap picks: the landward limit of oceanic crust stands in for it (onlap is seen only on seismic)';
  const specs: { kind: LineKind; lines: Ring[]; rule: string; threshold: Float32Array | number | null; source: string; pickKind: Pick['kind'] | null; proxy: string }[] = [
    { kind: 'crustal-taper-limit', lines: lines.taper, rule: 'crustal thickness = taper threshold, continental side', threshold: inp.taperLevel, source: inp.taperSource, pickKind: 'continental-limit', proxy: 'crustal thickness at the taper threshold' },
    { kind: 'oceanic-limit', lines: lines.oceanic, rule: 'crustal thickness = oceanic-crust threshold, oceanic side', threshold: inp.oceanLevel, source: inp.oceanSource, pickKind: 'oceanic-limit', proxy: 'crustal thickness at the oceanic-crust threshold' },
    { kind: 'oldest-onlapped-crust', lines: onlap, rule: onlapRule, threshold: null, source: onlapPoints.length ? `onlap picks (${onlapPoints.length}) and the oceanic limit (${inp.oceanSource})` : `the oceanic limit (${inp.oceanSource})`, pickKind: 'onlap', proxy: 'oceanic-limit' },
    { kind: 'necking-line', lines: lines.necking, rule: `crustal thickness = ${p.neckingFraction} × tc0, continental side`, threshold: p.neckingFraction * p.tc0, source: `parameters neckingFraction × tc0 = ${p.neckingFraction * p.tc0} m`, pickKind: null, proxy: 'crustal thickness at the necking limit' },
    { kind: 'coupling-line', lines: lines.coupling, rule: 'crustal thickness = coupling thickness, continental side', threshold: p.couplingThickness, source: `parameter couplingThickness = ${p.couplingThickness} m`, pickKind: null, proxy: 'crustal thickness at the coupling thickness' },
  ];
  const oldestIsochron = inp.isochrons.reduce<Isochron | null>((a, b) => (!a || b.age > a.age ? b : a), null);

  for (const spec of specs) {
    if (spec.lines.length === 0) {
      missing.push({ kind: spec.kind, reason: `no ${spec.kind} in the data: the rule (${spec.rule}) is never met between the two sides` });
      continue;
    }
    const relevant = spec.pickKind ? usedPicks.filter((q) => q.kind === spec.pickKind).map((q) => [q.x, q.y] as [number, number]) : [];
    for (const line of spec.lines) {
      const closed = isClosed(line);
      const startStop = closed ? null : stopAt(line[0][0], line[0][1]);
      const endStop = closed ? null : stopAt(line[line.length - 1][0], line[line.length - 1][1]);
      if (startStop) interruptions.push({ kind: spec.kind, x: line[0][0], y: line[0][1], cause: startStop });
      if (endStop) interruptions.push({ kind: spec.kind, x: line[line.length - 1][0], y: line[line.length - 1][1], cause: endStop });
      const startGap = startStop === 'moho-gap';
      const endGap = endStop === 'moho-gap';
      const dist = line.map(([x, y]) => controlDistance(x, y));
      const ev: Evidence[] = line.map(([x, y], k) =>
        relevant.some((q) => Math.hypot(q[0] - x, q[1] - y) <= p.pickReach) ? 'picks' : dist[k] > p.farFromControl ? 'proxy-far' : 'proxy-near',
      );
      const parts = splitByEvidence(line, ev);
      parts.forEach((piece, q) => {
        const d = dist.slice(piece.from, piece.to + 1);
        const maxD = Math.max(...d);
        const props: Record<string, unknown> = {
          kind: spec.kind,
          rule: spec.rule,
          threshold_m: typeof spec.threshold === 'number' ? spec.threshold : null,
          threshold_range_m: spec.threshold !== null && typeof spec.threshold !== 'number' ? rangeAlong(piece.coords, g, spec.threshold) : null,
          placed_by: spec.source,
          evidence: piece.evidence === 'picks' ? 'picks' : 'proxy',
          proxy: piece.evidence === 'picks' ? null : spec.proxy,
          far_from_control: piece.evidence === 'proxy-far',
          control_distance_km: Number.isFinite(maxD) ? round3(maxD / 1000) : null,
          ends_at_moho_gap: (q === 0 && startGap) || (q === parts.length - 1 && endGap),
          ends_at_unresolved: (q === 0 && startStop === 'unresolved') || (q === parts.length - 1 && endStop === 'unresolved'),
          closed: closed && parts.length === 1,
        };
        if (spec.kind === 'oldest-onlapped-crust') {
          props.onlap_offset_km = offsetRange(piece.coords, onlapPoints, inp.oceanward);
          Object.assign(props, ageProperties(piece.coords, g, oldestIsochron, inp.oceanicAgeMin, inp.oceanicAgeMax));
        }
        pieces.push({ kind: spec.kind, coords: [piece.coords], properties: props });
      });
      // the same line whole, for GIS use: evidence as shares of its length
      const len = (c: Ring) => c.reduce((a, pt, k) => (k ? a + Math.hypot(pt[0] - c[k - 1][0], pt[1] - c[k - 1][1]) : 0), 0);
      const total = len(line);
      const share = (e: Evidence) => (total > 0 ? parts.filter((q) => q.evidence === e).reduce((a, q) => a + len(q.coords), 0) / total : 0);
      const picked = share('picks');
      const maxD = Math.max(...dist);
      wholeLines.push({
        kind: spec.kind,
        coords: [line],
        properties: {
          kind: spec.kind,
          rule: spec.rule,
          placed_by: spec.source,
          evidence: picked >= 0.999 ? 'picks' : picked > 0 ? 'mixed' : 'proxy',
          evidence_picks_fraction: round3(picked),
          far_from_control_fraction: round3(share('proxy-far')),
          control_distance_km: Number.isFinite(maxD) ? round3(maxD / 1000) : null,
          ends_at_moho_gap: startGap || endGap,
          ends_at_unresolved: startStop === 'unresolved' || endStop === 'unresolved',
          closed,
        },
      });
    }
  }

  // 5. COT zone polygons with the share of their border placed by picks.
  const limitPicks = usedPicks.filter((q) => q.kind !== 'onlap').map((q) => [q.x, q.y] as [number, number]);
  const cotProps = (rings: Ring[], clipped: boolean) => {
    const f = pickedFraction(rings, limitPicks, p.pickReach);
    return {
      kind: 'cot-zone',
      rule: 'between the crustal taper limit and the landward limit of oceanic crust' + (clipped ? '; clipped exactly to the licence' : ''),
      placed_by: `taper limit: ${inp.taperSource}; oceanic limit: ${inp.oceanSource}`,
      evidence: f >= 0.999 ? 'picks' : f > 0 ? 'mixed' : 'proxy',
      evidence_picks_fraction: round3(f),
      ...(clipped ? { clipped_to_licence: true } : {}),
    };
  };
  if (cot.length === 0) missing.push({ kind: 'cot-zone', reason: 'no continent–ocean transition zone: no cells lie between continental and oceanic crust' });
  for (const rings of cot) pieces.push({ kind: 'cot-zone', coords: rings, properties: cotProps(rings, false) });

  // 6. Licence. The lines are clipped here; the pieces inside the licence (with the COT zone
  // intersected exactly in the analysis CRS by turf's intersect, polyclip-ts, the costliest step of
  // an interactive run) when first read: the app draws the whole-grid pieces and asks for the
  // licence's figures after the map is drawn; exports read them as before.
  let linesInLicence: BoundaryPiece[] | null = null;
  let inLicence: (() => BoundaryPiece[]) | null = null;
  if (inp.licence) {
    const licence = inp.licence;
    linesInLicence = [];
    for (const l of wholeLines) {
      for (const part of clipLineToPolygon(l.coords[0], licence)) {
        const c = dedupe(part);
        if (c.length >= 2) linesInLicence.push({ kind: l.kind, coords: [c], properties: { ...l.properties, clipped_to_licence: true, closed: isClosed(c) } });
      }
    }
    inLicence = () => {
      const out: BoundaryPiece[] = [];
      for (const piece of pieces) {
        if (piece.kind === 'cot-zone') continue;
        for (const part of clipLineToPolygon(piece.coords[0], licence)) {
          const c = dedupe(part);
          if (c.length >= 2) out.push({ kind: piece.kind, coords: [c], properties: { ...piece.properties, clipped_to_licence: true, closed: isClosed(c) } });
        }
      }
      for (const rings of clipPolygons(cot, licence)) out.push({ kind: 'cot-zone', coords: rings, properties: cotProps(rings, true) });
      return out;
    };
    notes.push('inside the licence, lines and the COT zone polygon are clipped exactly (in the analysis CRS)');
  }
  const gaps = interruptions.filter((q) => q.cause === 'moho-gap').length;
  const unres = interruptions.length - gaps;
  if (gaps) notes.push(`${gaps} line end${gaps > 1 ? 's stop' : ' stops'} where the Moho is not imaged (see lines_interrupted_by_moho_gap)`);
  if (unres) notes.push(`${unres} line end${unres > 1 ? 's stop' : ' stops'} where thickness cannot resolve the transition (see lines_interrupted_by_unresolved_transition)`);
  const support = { taper: lines.taper, oceanic: lines.oceanic, onlap, necking: lines.necking, coupling: lines.coupling };
  let memo: BoundaryPiece[] | undefined;
  return {
    pieces,
    get inLicence() {
      return inLicence ? (memo ??= inLicence()) : null;
    },
    hasLicence: inLicence !== null,
    lines: wholeLines,
    linesInLicence,
    missing,
    notes,
    interruptions,
    onlap: { points: onlapPoints, skipped: onlapSkipped },
    support,
  };
}

const km = (m: number) => (m / 1000).toFixed(1);

/** The levels of the four thickness lines of a run (the limits' may be fields calibrated to picks). */
export function lineLevels(p: Params, taperLevel: Float32Array | number, oceanLevel: Float32Array | number): LineLevels {
  return { taper: taperLevel, oceanic: oceanLevel, necking: p.neckingFraction * p.tc0, coupling: p.couplingThickness };
}

/** The zero line of a field on the grid, in map coordinates: how every named line is traced. */
export function traceZero(g: GridGeometry, field: Float32Array): Ring[] {
  return linesToMap(g, traceLevel({ values: field, nx: g.nx, ny: g.ny }, 0));
}

/** The zero line of a side field (fields.ts) in map coordinates: one boundary line alone. */
export function traceSideLine(g: GridGeometry, tc: Float32Array, domains: Uint8Array, side: 'continental' | 'oceanic', level: Float32Array | number): Ring[] {
  const table = side === 'continental' ? CONTINENTAL_SIDE : OCEANIC_SIDE;
  return linesToMap(g, traceLevel({ values: sideField(tc, domains, table, level, true), nx: g.nx, ny: g.ny }, 0));
}

/** Traced lines (index space) → rings in map coordinates. */
function linesToMap(g: GridGeometry, l: Lines): Ring[] {
  const out: Ring[] = [];
  for (let k = 0; k < lineCount(l); k++) {
    const [b, e] = lineRange(l, k);
    const r: Ring = [];
    for (let q = b; q < e; q++) r.push([colToX(g, l.positions[2 * q]), rowToY(g, l.positions[2 * q + 1])]);
    const c = dedupe(r);
    // a line of one distinct position (a sample exactly at the level) is no line
    if (c.length >= 2 && !(c.length === 2 && c[0][0] === c[1][0] && c[0][1] === c[1][1])) out.push(c);
  }
  return out;
}

/** Without consecutive duplicate positions. */
function dedupe(r: Ring): Ring {
  const out: Ring = [];
  for (const p of r) if (!out.length || out[out.length - 1][0] !== p[0] || out[out.length - 1][1] !== p[1]) out.push(p);
  return out;
}

function offsetRange(coords: Ring, points: OnlapPoint[], o: Oceanward): [number, number] {
  if (!points.length) return [0, 0];
  let lo = Infinity;
  let hi = -Infinity;
  for (const [x, y] of coords) {
    // the moved vertex keeps its strike coordinate, so the offset is read at the same strike
    const s = strikeOf(o, x, y);
    const d = offsetAt(points, s);
    lo = Math.min(lo, d);
    hi = Math.max(hi, d);
  }
  return [round3(lo / 1000), round3(hi / 1000)];
}

/** Share (by length) of a polygon's border within `reach` of a pick. */
function pickedFraction(rings: Ring[], picks: [number, number][], reach: number): number {
  if (!picks.length) return 0;
  let total = 0;
  let near = 0;
  const isNear = ([x, y]: [number, number]) => picks.some((q) => Math.hypot(q[0] - x, q[1] - y) <= reach);
  for (const r of rings) {
    let prev = isNear(r[0]);
    for (let k = 1; k < r.length; k++) {
      const cur = isNear(r[k]);
      const len = Math.hypot(r[k][0] - r[k - 1][0], r[k][1] - r[k - 1][1]);
      total += len;
      if (prev && cur) near += len;
      prev = cur;
    }
  }
  return total > 0 ? near / total : 0;
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}

function isClosed(r: Ring): boolean {
  return r.length > 2 && r[0][0] === r[r.length - 1][0] && r[0][1] === r[r.length - 1][1];
}

/** Split a line where its vertices' evidence changes, and into parts of at most MAX_PIECE metres. */
function splitByEvidence(line: Ring, ev: Evidence[]): { coords: Ring; evidence: Evidence; from: number; to: number }[] {
  const out: { coords: Ring; evidence: Evidence; from: number; to: number }[] = [];
  let from = 0;
  let len = 0;
  for (let k = 1; k < line.length; k++) {
    const step = Math.hypot(line[k][0] - line[k - 1][0], line[k][1] - line[k - 1][1]);
    if (ev[k] !== ev[from] || len + step > MAX_PIECE) {
      out.push({ coords: line.slice(from, k + 1), evidence: ev[from], from, to: k });
      from = k;
      len = 0;
      continue;
    }
    len += step;
  }
  if (from < line.length - 1) out.push({ coords: line.slice(from), evidence: ev[from], from, to: line.length - 1 });
  return out;
}

function sampleAt(g: GridGeometry, v: Float32Array | number, x: number, y: number): number {
  if (typeof v === 'number') return v;
  const i = Math.min(g.nx - 1, Math.max(0, Math.round((x - g.x0) / g.dx)));
  const j = Math.min(g.ny - 1, Math.max(0, Math.round((y - g.y0) / g.dy)));
  return v[j * g.nx + i];
}

function rangeAlong(coords: Ring, g: GridGeometry, v: Float32Array | number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const [x, y] of coords) {
    const t = sampleAt(g, v, x, y);
    if (Number.isFinite(t)) (lo = Math.min(lo, t)), (hi = Math.max(hi, t));
  }
  return [Math.round(lo), Math.round(hi)];
}

function ageProperties(coords: Ring, g: GridGeometry, oldest: Isochron | null, aMin: Float32Array | null, aMax: Float32Array | null) {
  const props: Record<string, unknown> = {};
  if (oldest) {
    let d = Infinity;
    for (const [x, y] of coords) d = Math.min(d, distanceToControl(x, y, [], [oldest.coords]));
    props.age_evidence = 'isochrons';
    props.age_min_ma = oldest.age;
    props.age_note = `at least as old as the oldest isochron (${oldest.age} Ma, ${round3(d / 1000)} km away)`;
  }
  if (aMin && aMax) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const [x, y] of coords) {
      const a = sampleAt(g, aMin, x, y);
      const b = sampleAt(g, aMax, x, y);
      if (Number.isFinite(a)) lo = Math.min(lo, a);
      if (!Number.isNaN(b)) hi = Math.max(hi, b);
    }
    if (Number.isFinite(lo)) {
      props.depth_age_min_ma = Math.round(lo * 10) / 10;
      props.depth_age_max_ma = Number.isFinite(hi) ? Math.round(hi * 10) / 10 : null;
      props.depth_age_note = 'indicative only: from water-loaded basement depth and two age–depth curves over ± the depth uncertainty; never older than the rift';
      if (!oldest) props.age_evidence = 'depth (indicative)';
    }
  }
  return props;
}

/** Filled rings → polygons (outer ring + holes) in map coordinates. */
function zonePolygons(l: Lines, g: GridGeometry): Ring[][] {
  // In index space outer rings have positive shoelace area (y-down); the map transform may flip y.
  // Rings that collapse to fewer than four distinct-consecutive positions are dropped.
  const all: { r: Ring; a: number }[] = [];
  for (let k = 0; k < lineCount(l); k++) {
    const [b, e] = lineRange(l, k);
    const r: Ring = [];
    for (let q = b; q < e; q++) r.push([colToX(g, l.positions[2 * q]), rowToY(g, l.positions[2 * q + 1])]);
    const c = dedupe(r);
    if (c.length >= 4) all.push({ r: c, a: ringArea(l, k) });
  }
  const rings = all.map((q) => q.r);
  const indexAreas = all.map((q) => q.a);
  const outers = all.filter((o) => o.a > 0).map((o) => ({ ring: o.r, size: Math.abs(signedArea(o.r)), holes: [] as Ring[] }));
  outers.sort((a, b) => a.size - b.size);
  rings.forEach((r, k) => {
    if (indexAreas[k] >= 0) return;
    const host = outers.find((o) => insideRings([o.ring], r[0][0], r[0][1]));
    if (host) host.holes.push(r);
  });
  return outers.map((o) => [o.ring, ...o.holes]);
}
