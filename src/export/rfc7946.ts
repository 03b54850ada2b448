/**
 * RFC 7946 geometry from analysis-CRS coordinates: edges densified before reprojection, WGS84
 * longitude/latitude, exterior rings counter-clockwise and holes clockwise (right-hand rule), lines
 * and polygons split at the antimeridian, positions rounded to 1e-7° (about 1 cm), never a third
 * coordinate. Used by every GeoJSON writer.
 */

import { densify } from '../crs/densify.js';
import { WGS84, type Crs } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';

export type Pos = [number, number];

const round = (v: number) => Math.round(v * 1e7) / 1e7;

/** Positions closer than the 1e-7° rounding become one: drop the repeats that rounding makes. */
function noRepeats(path: Pos[]): Pos[] {
  const out: Pos[] = [];
  for (const p of path) if (!out.length || out[out.length - 1][0] !== p[0] || out[out.length - 1][1] !== p[1]) out.push(p);
  return out;
}

/** Project a map-coordinate path to lon/lat, densified to maxStep map units. */
export function toLonLat(path: Pos[], crs: Crs, maxStep: number): Pos[] {
  const t = transformer(crs, WGS84);
  const dense = crs.units === 'degree' ? path : densify(path, maxStep);
  return dense.map((p) => t.forward(p) as Pos);
}

/** Make longitudes continuous along a path (no jumps over 180°). */
function unwrap(path: Pos[]): Pos[] {
  const out: Pos[] = [];
  let prev = path[0]?.[0] ?? 0;
  for (const [lon, lat] of path) {
    let l = lon;
    while (l - prev > 180) l -= 360;
    while (l - prev < -180) l += 360;
    out.push([l, lat]);
    prev = l;
  }
  return out;
}

const wrapLon = (l: number) => {
  let v = ((((l + 180) % 360) + 360) % 360) - 180;
  if (v === -180 && l > 0) v = 180;
  return v;
};

/** Split an (unwrapped) line where it crosses ±180°. */
export function splitLine(pathIn: Pos[]): Pos[][] {
  const path = unwrap(pathIn);
  const parts: Pos[][] = [];
  let cur: Pos[] = [];
  for (let k = 0; k < path.length; k++) {
    const p = path[k];
    if (k > 0) {
      const q = path[k - 1];
      const kq = Math.floor((q[0] + 180) / 360);
      const kp = Math.floor((p[0] + 180) / 360);
      if (kq !== kp) {
        const edge = kp > kq ? kp * 360 - 180 : kq * 360 - 180;
        const t = (edge - q[0]) / (p[0] - q[0]);
        const lat = q[1] + t * (p[1] - q[1]);
        cur.push([kp > kq ? 180 : -180, round(lat)]);
        parts.push(cur);
        cur = [[kp > kq ? -180 : 180, round(lat)]];
      }
    }
    cur.push([round(wrapLon(p[0])), round(p[1])]);
  }
  if (cur.length) parts.push(cur);
  return parts.map(noRepeats).filter((l) => l.length >= 2);
}

/** Signed area in lon/lat degrees² (positive = counter-clockwise). */
export function lonLatSignedArea(ring: Pos[]): number {
  let s = 0;
  for (let k = 0; k < ring.length - 1; k++) s += ring[k][0] * ring[k + 1][1] - ring[k + 1][0] * ring[k][1];
  return s / 2;
}

function orient(ring: Pos[], ccw: boolean): Pos[] {
  const a = lonLatSignedArea(ring);
  return a > 0 === ccw ? ring : [...ring].reverse();
}

/** Clip an unwrapped ring to lon ≤ edge (keepBelow) or lon ≥ edge (Sutherland–Hodgman, one half-plane). */
function clipHalf(ring: Pos[], edge: number, keepBelow: boolean): Pos[] {
  const inside = (p: Pos) => (keepBelow ? p[0] <= edge : p[0] >= edge);
  const out: Pos[] = [];
  for (let k = 0; k < ring.length - 1; k++) {
    const a = ring[k];
    const b = ring[k + 1];
    if (inside(a)) out.push(a);
    if (inside(a) !== inside(b)) {
      const t = (edge - a[0]) / (b[0] - a[0]);
      out.push([edge, a[1] + t * (b[1] - a[1])]);
    }
  }
  if (out.length) out.push(out[0]);
  return out;
}

/**
 * A polygon (rings in lon/lat, outer first) as one or more RFC 7946 polygons: unwrapped, split at
 * the antimeridian when it spans it, right-hand wound, rounded.
 */
export function rfcPolygons(rings: Pos[][]): Pos[][][] {
  const unwrapped = rings.map((r) => unwrap(r));
  let lo = Infinity;
  let hi = -Infinity;
  for (const r of unwrapped) for (const p of r) (lo = Math.min(lo, p[0])), (hi = Math.max(hi, p[0]));
  const finish = (rs: Pos[][]) =>
    rs
      .map((r) => noRepeats(r.map(([x, y]) => [round(wrapLon(x)), round(y)] as Pos)))
      .filter((r) => r.length >= 4)
      .map((r, k) => orient(r, k === 0));
  const crosses = Math.floor((lo + 180) / 360) !== Math.floor((hi + 180) / 360);
  if (!crosses) return [finish(unwrapped)];
  // The ring spans the line lon = edge (an odd multiple of 180°): clip each side, then bring each
  // side into [−180, 180] by a whole turn so the cut sits exactly at +180 (west) and −180 (east).
  const edge = Math.floor((hi + 180) / 360) * 360 - 180;
  const shiftWest = 180 - edge;
  const shiftEast = -180 - edge;
  const west = unwrapped.map((r) => clipHalf(r, edge, true).map(([x, y]) => [x + shiftWest, y] as Pos));
  const east = unwrapped.map((r) => clipHalf(r, edge, false).map(([x, y]) => [x + shiftEast, y] as Pos));
  const done = (rs: Pos[][]) =>
    rs.map((r) => noRepeats(r.map(([x, y]) => [round(x), round(y)] as Pos))).filter((r) => r.length >= 4).map((r, k) => orient(r, k === 0));
  return [done(west), done(east)].filter((poly) => poly.length > 0);
}
