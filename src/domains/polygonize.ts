/**
 * Raster → polygons, the way GIS tools vectorise class rasters: each cell is a square around its
 * sample, and the polygons follow cell edges, so areas equal cell counts × cell area exactly and
 * neighbouring classes share their borders vertex for vertex. Cells touching only at a corner become
 * separate polygons; a ring that would pass one corner twice is split there (src/geometry/rings.ts),
 * so every ring is simple and valid (OGC). Collinear vertices are removed. Coordinates are in index space (cell (i, j)
 * spans i ± 0.5, j ± 0.5).
 */

import { besideFirstEdge, simpleRings } from '../geometry/rings.js';

export type Ring = [number, number][];

export interface RasterPolygon {
  readonly key: number;
  readonly outer: Ring;
  readonly holes: Ring[];
  /** Cells inside (outer minus holes). */
  readonly cells: number;
}

const DX = [1, 0, -1, 0]; // right, down, left, up (clockwise on a y-down screen)
const DY = [0, 1, 0, -1];

export function polygonize(keys: ArrayLike<number>, nx: number, ny: number, skip: (key: number) => boolean = () => false): RasterPolygon[] {
  const present = new Set<number>();
  for (let k = 0; k < nx * ny; k++) present.add(keys[k]);
  const out: RasterPolygon[] = [];
  const W = nx + 1;
  for (const key of [...present].sort((a, b) => a - b)) {
    if (skip(key)) continue;
    // Directed boundary edges with the class on the right: corner id → outgoing directions (bit mask).
    const outgoing = new Map<number, number>();
    const add = (ci: number, cj: number, dir: number) => {
      const id = cj * W + ci;
      outgoing.set(id, (outgoing.get(id) ?? 0) | (1 << dir));
    };
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        if (keys[j * nx + i] !== key) continue;
        if (j === 0 || keys[(j - 1) * nx + i] !== key) add(i, j, 0);
        if (i === nx - 1 || keys[j * nx + i + 1] !== key) add(i + 1, j, 1);
        if (j === ny - 1 || keys[(j + 1) * nx + i] !== key) add(i + 1, j + 1, 2);
        if (i === 0 || keys[j * nx + i - 1] !== key) add(i, j + 1, 3);
      }
    }
    // Each incoming edge pairs with one outgoing edge at its end corner (right turn first, then
    // straight, then left); rings are the cycles of that pairing.
    const orig = new Map(outgoing);
    const rings: Ring[] = [];
    for (const [start, mask0] of orig) {
      for (let d0 = 0; d0 < 4; d0++) {
        if (!(mask0 & (1 << d0)) || !((outgoing.get(start) ?? 0) & (1 << d0))) continue;
        const ring: Ring = [];
        let id = start;
        let dir = d0;
        for (let guard = 0; guard < 4 * orig.size + 4; guard++) {
          outgoing.set(id, (outgoing.get(id) ?? 0) & ~(1 << dir));
          ring.push([(id % W) - 0.5, Math.floor(id / W) - 0.5]);
          id = (Math.floor(id / W) + DY[dir]) * W + (id % W) + DX[dir];
          const m = orig.get(id) ?? 0;
          const right = (dir + 1) % 4;
          const left = (dir + 3) % 4;
          dir = m & (1 << right) ? right : m & (1 << dir) ? dir : left;
          if (id === start && dir === d0) break;
        }
        ring.push([ring[0][0], ring[0][1]]);
        // a ring that passes a corner twice (a pocket pinched off diagonally) is split there
        for (const loop of simpleRings(ring)) rings.push(dropCollinear(loop));
      }
    }
    // Outer rings run clockwise on screen (positive shoelace in y-down numbers); holes the other way.
    const outers = rings.filter((r) => shoelace(r) > 0).map((r) => ({ ring: r, area: shoelace(r), holes: [] as Ring[] }));
    outers.sort((a, b) => a.area - b.area);
    for (const h of rings.filter((r) => shoelace(r) < 0)) {
      // A point just right of the hole's first edge lies in the class region that the hole cuts.
      const [px, py] = besideFirstEdge(h, 0.25);
      const host = outers.find((o) => inRing(o.ring, px, py));
      if (host) host.holes.push(h);
    }
    for (const o of outers) {
      const cells = Math.round(o.area + o.holes.reduce((s, h) => s + shoelace(h), 0));
      out.push({ key, outer: o.ring, holes: o.holes, cells });
    }
  }
  return out;
}

function shoelace(r: Ring): number {
  let s = 0;
  for (let k = 0; k < r.length - 1; k++) s += r[k][0] * r[k + 1][1] - r[k + 1][0] * r[k][1];
  return s / 2;
}

function inRing(ring: Ring, x: number, y: number): boolean {
  let inside = false;
  for (let a = 0, b = ring.length - 1; a < ring.length; b = a++) {
    const [xa, ya] = ring[a];
    const [xb, yb] = ring[b];
    if (ya > y !== yb > y && x < ((xb - xa) * (y - ya)) / (yb - ya) + xa) inside = !inside;
  }
  return inside;
}

function dropCollinear(r: Ring): Ring {
  const n = r.length - 1; // closed: r[n] = r[0]
  const keep: Ring = [];
  for (let k = 0; k < n; k++) {
    const p = r[(k + n - 1) % n];
    const q = r[k];
    const s = r[(k + 1) % n];
    const cross = (q[0] - p[0]) * (s[1] - q[1]) - (q[1] - p[1]) * (s[0] - q[0]);
    if (cross !== 0) keep.push(q);
  }
  keep.push([keep[0][0], keep[0][1]]);
  return keep;
}
