/**
 * The named boundaries (DESIGN.md "Named boundaries") from the domain map, the crustal thickness and
 * the (possibly pick-calibrated) thresholds, in analysis-CRS coordinates with their properties.
 * Each line is split where its evidence changes and into pieces of at most MAX_PIECE metres, so every
 * piece can say what placed it and how far it is from the nearest pick or seismic line.
 */

import { colToX, rowToY, type GridGeometry } from '../grid/geometry.js';
import { lineCount, lineRange, ringArea, traceLevel, type Lines } from '../contour/marching-squares.js';
import type { Params } from '../params.js';
import { sideField } from './fields.js';
import { simplifyShared } from './simplify.js';
import { clipLineToPolygon, distanceToControl, insideRings, signedArea, type Ring } from './planar.js';

export type BoundaryKind = 'crustal-taper-limit' | 'cot-zone' | 'oldest-onlapped-crust' | 'necking-line' | 'coupling-line';

export interface Pick {
  readonly x: number;
  readonly y: number;
  readonly kind: 'continental-limit' | 'oceanic-limit' | 'onlap';
  readonly line?: string;
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
  readonly taperLevel: Float32Array | number;
  readonly oceanLevel: Float32Array | number;
  /** Threshold calibrated to onlap picks, or null when there are none. */
  readonly onlapLevel: Float32Array | number | null;
  readonly params: Params;
  readonly picks: Pick[];
  readonly seismicLines: Ring[];
  readonly isochrons: Isochron[];
  /** Licence rings in the analysis CRS, or null. */
  readonly licence: Ring[] | null;
  readonly licenceMask: Uint8Array | null;
  readonly oceanicAgeMin: Float32Array | null;
  readonly oceanicAgeMax: Float32Array | null;
}

export interface BoundaryResult {
  readonly pieces: BoundaryPiece[];
  /** Lines clipped to the licence (same pieces model), or null without a licence. */
  readonly inLicence: BoundaryPiece[] | null;
  readonly missing: { kind: BoundaryKind; reason: string }[];
  readonly notes: string[];
  /** Whole lines in map coordinates for survey planning: the taper limit and the landward limit of
   * oceanic crust (which, with onlap picks, is not the exported onlap line). */
  readonly support: { taper: Ring[]; oceanic: Ring[]; necking: Ring[]; coupling: Ring[] };
}

const MAX_PIECE = 10_000;

export function extractBoundaries(inp: BoundaryInput): BoundaryResult {
  const g = inp.geometry;
  const { nx, ny } = g;
  const p = inp.params;
  const dom = inp.domains;
  const tc = inp.thickness;
  const continental = (k: number) => dom[k] >= 1 && dom[k] <= 3;
  const oceanic = (k: number) => dom[k] === 5;
  const notContinental = (k: number) => dom[k] === 4 || dom[k] === 5;

  const gTaper = sideField(tc, continental, inp.taperLevel, true);
  const gOcean = sideField(tc, oceanic, inp.oceanLevel, true);
  const gNeck = sideField(tc, continental, p.neckingFraction * p.tc0, false);
  const gCoupling = sideField(tc, continental, p.couplingThickness, false);
  const gOnlap = inp.onlapLevel !== null ? sideField(tc, notContinental, inp.onlapLevel, false) : null;

  const toMap = (l: Lines): Ring[] => {
    const out: Ring[] = [];
    for (let k = 0; k < lineCount(l); k++) {
      const [b, e] = lineRange(l, k);
      const r: Ring = [];
      for (let q = b; q < e; q++) r.push([colToX(g, l.positions[2 * q]), rowToY(g, l.positions[2 * q + 1])]);
      out.push(r);
    }
    return out;
  };
  const grid = (v: Float32Array) => ({ values: v, nx, ny });
  const traced = new Map<Float32Array, Ring[]>();
  const lineOf = (field: Float32Array) => {
    let l = traced.get(field);
    if (!l) traced.set(field, (l = toMap(traceLevel(grid(field), 0))));
    return l;
  };

  // COT zone: between the taper limit and the oceanic limit: {G_taper < 0 and G_ocean < 0}.
  const cotField = (mask: Uint8Array | null) => {
    const h = new Float32Array(nx * ny);
    for (let k = 0; k < h.length; k++) {
      h[k] = mask && !mask[k] ? NaN : Math.min(-gTaper[k], -gOcean[k]);
    }
    return h;
  };
  let cot = zonePolygons(traceLevel(grid(cotField(null)), 0, true), toMap);
  let cotLicence = inp.licence ? zonePolygons(traceLevel(grid(cotField(inp.licenceMask)), 0, true), toMap) : [];

  // Optional simplification, once for all lines and the COT rings together, so shared borders stay shared.
  if (p.simplifyTolerance > 0) {
    for (const f of [gTaper, gOnlap ?? gOcean, gNeck, gCoupling, gOcean]) lineOf(f);
    const lineList: Ring[] = [];
    const owner: [Float32Array, number][] = [];
    traced.forEach((ls, f) => ls.forEach((l, i) => (lineList.push(l), owner.push([f, i]))));
    const polys = [...cot, ...cotLicence];
    const simp = simplifyShared(lineList, polys.flat(), p.simplifyTolerance);
    owner.forEach(([f, i], k) => (traced.get(f)![i] = simp.lines[k]));
    let q = 0;
    const rebuilt = polys.map((rings) => rings.map(() => simp.rings[q++]));
    cot = rebuilt.slice(0, cot.length);
    cotLicence = rebuilt.slice(cot.length);
  }
  const controlPoints = inp.picks.map((q) => [q.x, q.y] as [number, number]);
  const missing: BoundaryResult['missing'] = [];
  const notes: string[] = [];
  const pieces: BoundaryPiece[] = [];

  const thresholdText = (t: Float32Array | number, picksKind: string) =>
    typeof t === 'number' ? `${t} m` : `calibrated to ${picksKind} picks, interpolated along strike`;
  const lineSpecs: { kind: BoundaryKind; field: Float32Array; rule: string; threshold: Float32Array | number; pickKind: Pick['kind'] | null }[] = [
    {
      kind: 'crustal-taper-limit',
      field: gTaper,
      rule: `crustal thickness = taper threshold (${thresholdText(inp.taperLevel, 'continental-limit')}), continental side`,
      threshold: inp.taperLevel,
      pickKind: 'continental-limit',
    },
    {
      kind: 'oldest-onlapped-crust',
      field: gOnlap ?? gOcean,
      rule: gOnlap
        ? `crustal thickness = threshold ${thresholdText(inp.onlapLevel!, 'onlap')}, oceanic side of the continental crust`
        : `no onlap picks: landward limit of oceanic-type crust (crustal thickness = ${thresholdText(inp.oceanLevel, 'oceanic-limit')}, oceanic side)`,
      threshold: inp.onlapLevel ?? inp.oceanLevel,
      pickKind: gOnlap ? 'onlap' : 'oceanic-limit',
    },
    {
      kind: 'necking-line',
      field: gNeck,
      rule: `crustal thickness = ${p.neckingFraction} × tc0 = ${p.neckingFraction * p.tc0} m, continental side`,
      threshold: p.neckingFraction * p.tc0,
      pickKind: null,
    },
    {
      kind: 'coupling-line',
      field: gCoupling,
      rule: `crustal thickness = coupling thickness ${p.couplingThickness} m, continental side`,
      threshold: p.couplingThickness,
      pickKind: null,
    },
  ];

  const oldestIsochron = inp.isochrons.reduce<Isochron | null>((a, b) => (!a || b.age > a.age ? b : a), null);

  for (const spec of lineSpecs) {
    const lines = lineOf(spec.field);
    if (lines.length === 0) {
      missing.push({ kind: spec.kind, reason: `no ${spec.kind} in the data: the rule (${spec.rule}) is never met between the two sides` });
      continue;
    }
    const relevant = spec.pickKind ? inp.picks.filter((q) => q.kind === spec.pickKind).map((q) => [q.x, q.y] as [number, number]) : [];
    for (const line of lines) {
      for (const piece of splitByEvidence(line, relevant, p.pickReach)) {
        const dists = piece.coords.map(([x, y]) =>
          controlPoints.length || inp.seismicLines.length ? distanceToControl(x, y, controlPoints, inp.seismicLines) : Infinity,
        );
        const props: Record<string, unknown> = {
          kind: spec.kind,
          rule: spec.rule,
          threshold_m: typeof spec.threshold === 'number' ? spec.threshold : 'calibrated',
          ...(typeof spec.threshold !== 'number' ? { threshold_range_m: rangeAlong(piece.coords, g, spec.threshold) } : {}),
          evidence: piece.evidence,
          control_distance_km: Number.isFinite(Math.max(...dists)) ? round3(Math.max(...dists) / 1000) : null,
          closed: isClosed(line),
        };
        if (spec.kind === 'oldest-onlapped-crust') {
          Object.assign(props, ageProperties(piece.coords, g, oldestIsochron, inp.oceanicAgeMin, inp.oceanicAgeMax));
        }
        pieces.push({ kind: spec.kind, coords: [piece.coords], properties: props });
      }
    }
  }

  if (cot.length === 0) missing.push({ kind: 'cot-zone', reason: 'no continent–ocean transition zone: no cells lie between continental and oceanic crust' });
  const hasTaper = pieces.some((q) => q.kind === 'crustal-taper-limit');
  for (const rings of cot) {
    pieces.push({
      kind: 'cot-zone',
      coords: rings,
      properties: {
        kind: 'cot-zone',
        rule: 'between the crustal taper limit and the landward limit of oceanic crust',
        evidence: inp.picks.length ? 'picks' : 'proxy',
        bounded_by_taper_limit: hasTaper,
      },
    });
  }

  let inLicence: BoundaryPiece[] | null = null;
  if (inp.licence) {
    inLicence = [];
    for (const piece of pieces) {
      if (piece.kind === 'cot-zone') continue;
      for (const part of clipLineToPolygon(piece.coords[0], inp.licence)) {
        inLicence.push({ kind: piece.kind, coords: [part], properties: { ...piece.properties, clipped_to_licence: true, closed: false } });
      }
    }
    for (const rings of cotLicence) {
      inLicence.push({
        kind: 'cot-zone',
        coords: rings,
        properties: {
          kind: 'cot-zone',
          rule: 'between the crustal taper limit and the landward limit of oceanic crust; cut to the licence at cell centres',
          evidence: inp.picks.length ? 'picks' : 'proxy',
          clipped_to_licence: true,
        },
      });
    }
    notes.push('inside the licence, lines are clipped exactly; the COT zone polygon is cut at the cell centres inside the licence (within one cell of its edge)');
  }
  const support = { taper: lineOf(gTaper), oceanic: lineOf(gOcean), necking: lineOf(gNeck), coupling: lineOf(gCoupling) };
  return { pieces, inLicence, missing, notes, support };
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}

function isClosed(r: Ring): boolean {
  return r.length > 2 && r[0][0] === r[r.length - 1][0] && r[0][1] === r[r.length - 1][1];
}

/** Split a line where vertices change from near a relevant pick (≤ reach) to not, and into ≤ MAX_PIECE parts. */
function splitByEvidence(line: Ring, picks: [number, number][], reach: number): { coords: Ring; evidence: 'picks' | 'proxy' }[] {
  const ev = line.map(([x, y]) => (picks.some((q) => Math.hypot(q[0] - x, q[1] - y) <= reach) ? 'picks' : 'proxy') as 'picks' | 'proxy');
  const out: { coords: Ring; evidence: 'picks' | 'proxy' }[] = [];
  let cur: Ring = [line[0]];
  let curEv = ev[0];
  let len = 0;
  for (let k = 1; k < line.length; k++) {
    const step = Math.hypot(line[k][0] - line[k - 1][0], line[k][1] - line[k - 1][1]);
    if (ev[k] !== curEv || len + step > MAX_PIECE) {
      cur.push(line[k]);
      out.push({ coords: cur, evidence: curEv });
      cur = [line[k]];
      curEv = ev[k];
      len = 0;
      continue;
    }
    cur.push(line[k]);
    len += step;
  }
  if (cur.length >= 2) out.push({ coords: cur, evidence: curEv });
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
      props.depth_age_range_ma = [Math.round(lo * 10) / 10, Number.isFinite(hi) ? Math.round(hi * 10) / 10 : null];
      props.depth_age_note = 'indicative only: from water-loaded basement depth and two age–depth curves; wide';
      if (!oldest) props.age_evidence = 'depth (indicative)';
    }
  }
  return props;
}

/** Filled rings → polygons (outer ring + holes) in map coordinates. */
function zonePolygons(l: Lines, toMap: (l: Lines) => Ring[]): Ring[][] {
  const rings = toMap(l);
  // In index space outer rings have positive shoelace area (y-down); the map transform may flip y.
  const indexAreas = rings.map((_, k) => ringArea(l, k));
  const outers = rings.map((r, k) => ({ r, a: indexAreas[k] })).filter((o) => o.a > 0).map((o) => ({ ring: o.r, size: Math.abs(signedArea(o.r)), holes: [] as Ring[] }));
  outers.sort((a, b) => a.size - b.size);
  rings.forEach((r, k) => {
    if (indexAreas[k] >= 0) return;
    const host = outers.find((o) => insideRings([o.ring], r[0][0], r[0][1]));
    if (host) host.holes.push(r);
  });
  return outers.map((o) => [o.ring, ...o.holes]);
}
