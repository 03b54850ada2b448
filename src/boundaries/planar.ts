/** Planar geometry in the analysis CRS: point in polygon, clipping lines and polygons to polygons, distances. */

import { featureCollection, intersect, polygon as turfPolygon } from '@turf/turf';

export type Ring = [number, number][];

/** Even-odd point-in-polygon over all rings (outer and holes). */
export function insideRings(rings: Ring[], x: number, y: number): boolean {
  let inside = false;
  for (const ring of rings) {
    for (let a = 0, b = ring.length - 1; a < ring.length; b = a++) {
      const [xa, ya] = ring[a];
      const [xb, yb] = ring[b];
      if (ya > y !== yb > y && x < ((xb - xa) * (y - ya)) / (yb - ya) + xa) inside = !inside;
    }
  }
  return inside;
}

/** Parts of a polyline inside a polygon (rings, even-odd). */
export function clipLineToPolygon(line: Ring, rings: Ring[]): Ring[] {
  const out: Ring[] = [];
  let current: Ring = [];
  const flush = () => {
    if (current.length >= 2) out.push(current);
    current = [];
  };
  for (let k = 0; k < line.length - 1; k++) {
    const [x1, y1] = line[k];
    const [x2, y2] = line[k + 1];
    const ts = [0, 1];
    for (const ring of rings) {
      for (let a = 0, b = ring.length - 1; a < ring.length; b = a++) {
        const t = segmentIntersection(x1, y1, x2, y2, ring[b][0], ring[b][1], ring[a][0], ring[a][1]);
        if (t !== null && t > 0 && t < 1) ts.push(t);
      }
    }
    ts.sort((p, q) => p - q);
    for (let q = 0; q < ts.length - 1; q++) {
      const t0 = ts[q];
      const t1 = ts[q + 1];
      if (t1 - t0 < 1e-12) continue;
      const tm = (t0 + t1) / 2;
      const inside = insideRings(rings, x1 + (x2 - x1) * tm, y1 + (y2 - y1) * tm);
      const p0: [number, number] = [x1 + (x2 - x1) * t0, y1 + (y2 - y1) * t0];
      const p1: [number, number] = [x1 + (x2 - x1) * t1, y1 + (y2 - y1) * t1];
      if (inside) {
        if (current.length === 0) current.push(p0);
        current.push(p1);
      } else flush();
    }
  }
  flush();
  return out;
}

/** Parameter t along p1→p2 where it crosses q1–q2, or null. */
function segmentIntersection(
  x1: number, y1: number, x2: number, y2: number, x3: number, y3: number, x4: number, y4: number,
): number | null {
  const den = (x2 - x1) * (y4 - y3) - (y2 - y1) * (x4 - x3);
  if (den === 0) return null;
  const t = ((x3 - x1) * (y4 - y3) - (y3 - y1) * (x4 - x3)) / den;
  const u = ((x3 - x1) * (y2 - y1) - (y3 - y1) * (x2 - x1)) / den;
  if (u < 0 || u > 1) return null;
  return t;
}

/** Distance from (x, y) to segment a–b. */
export function pointSegmentDistance(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  const t = len2 > 0 ? Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / len2)) : 0;
  return Math.hypot(x - ax - t * dx, y - ay - t * dy);
}

/** Nearest distance from (x, y) to any point or polyline of a control set. */
export function distanceToControl(x: number, y: number, points: [number, number][], lines: Ring[]): number {
  let d = Infinity;
  for (const p of points) d = Math.min(d, Math.hypot(x - p[0], y - p[1]));
  for (const l of lines) {
    for (let k = 0; k < l.length - 1; k++) d = Math.min(d, pointSegmentDistance(x, y, l[k][0], l[k][1], l[k + 1][0], l[k + 1][1]));
  }
  return d;
}

/** Signed shoelace area (positive = counter-clockwise in x-right, y-up coordinates). */
export function signedArea(ring: Ring): number {
  let s = 0;
  for (let k = 0; k < ring.length - 1; k++) s += ring[k][0] * ring[k + 1][1] - ring[k + 1][0] * ring[k][1];
  return s / 2;
}

/** Douglas–Peucker keep-flags over path[a..b] (iterative), with a and b kept; tolerance in map units. */
export function douglasPeuckerMark(path: Ring, a: number, b: number, tolerance: number, keep: Uint8Array): void {
  keep[a] = keep[b] = 1;
  const stack: [number, number][] = [[a, b]];
  while (stack.length) {
    const [s, e] = stack.pop()!;
    let worst = -1;
    let at = -1;
    for (let k = s + 1; k < e; k++) {
      const d = pointSegmentDistance(path[k][0], path[k][1], path[s][0], path[s][1], path[e][0], path[e][1]);
      if (d > worst) (worst = d), (at = k);
    }
    if (worst > tolerance) {
      keep[at] = 1;
      stack.push([s, at], [at, e]);
    }
  }
}

/** Douglas–Peucker simplification of a path, keeping its end points. */
export function simplifyPath(path: Ring, tolerance: number): Ring {
  if (path.length <= 2) return path.slice();
  const keep = new Uint8Array(path.length);
  douglasPeuckerMark(path, 0, path.length - 1, tolerance, keep);
  return path.filter((_, k) => keep[k]);
}

/** Parameter along a→b where it crosses c–d (a→b half-open, c–d closed), or null. */
export function segmentHit(a: [number, number], b: [number, number], c: [number, number], d: [number, number]): number | null {
  const den = (b[0] - a[0]) * (d[1] - c[1]) - (b[1] - a[1]) * (d[0] - c[0]);
  if (den === 0) return null;
  const t = ((c[0] - a[0]) * (d[1] - c[1]) - (c[1] - a[1]) * (d[0] - c[0])) / den;
  const u = ((c[0] - a[0]) * (b[1] - a[1]) - (c[1] - a[1]) * (b[0] - a[0])) / den;
  if (t < 0 || t >= 1 || u < 0 || u > 1) return null;
  return t;
}

/** Signed distances t (map units along the unit vector dir from origin, within ±reach) where the
 * line through origin crosses any of the lines, sorted ascending. */
export function rayHits(origin: [number, number], dir: [number, number], reach: number, lines: Ring[]): number[] {
  const a: [number, number] = [origin[0] - dir[0] * reach, origin[1] - dir[1] * reach];
  const b: [number, number] = [origin[0] + dir[0] * reach, origin[1] + dir[1] * reach];
  const ts: number[] = [];
  for (const l of lines) {
    for (let q = 0; q < l.length - 1; q++) {
      const t = segmentHit(a, b, l[q], l[q + 1]);
      if (t !== null) ts.push(t * 2 * reach - reach);
    }
  }
  return ts.sort((p, q) => p - q);
}

/** Polygons (outer + holes) intersected with the licence rings (each ring one licence polygon). */
export function clipPolygons(polys: Ring[][], licence: Ring[]): Ring[][] {
  const close = (r: Ring): Ring => (r[0][0] === r[r.length - 1][0] && r[0][1] === r[r.length - 1][1] ? r : [...r, r[0]]);
  const lic = licence.filter((r) => r.length >= 3).map((r) => turfPolygon([close(r)]));
  const out: Ring[][] = [];
  for (const rings of polys) {
    const zone = turfPolygon(rings.map(close));
    for (const l of lic) {
      const hit = intersect(featureCollection([zone, l]));
      if (!hit) continue;
      const parts = hit.geometry.type === 'Polygon' ? [hit.geometry.coordinates] : hit.geometry.coordinates;
      for (const p of parts) out.push(p.map((r) => r.map(([x, y]) => [x, y] as [number, number])));
    }
  }
  return out;
}

