/**
 * Rings made valid polygon rings (OGC Simple Features: closed, at least four positions, non-zero
 * area, no self-intersection, no self-touching), the way a tracer's raw output needs it when
 * samples sit exactly on a level or beside no data:
 *  1. consecutive repeated positions dropped (zero-length edges);
 *  2. spikes removed (A → B → A collapses to A: an out-and-back along one path has no area);
 *  3. the ring split at every position it passes twice, into loops that each pass once — a loop
 *     keeps its own orientation, so a pinched-off pocket becomes a hole touching the shell at a
 *     point and two lobes become two shells touching at a point, both valid;
 *  4. loops of fewer than four positions or zero area dropped.
 * Exact arithmetic on the given coordinates: nothing is moved.
 */

export type Position = [number, number];

/** Shoelace area (positive when counter-clockwise in x-right, y-up numbers). */
export function signedArea(ring: readonly Position[]): number {
  let s = 0;
  for (let k = 0; k + 1 < ring.length; k++) s += ring[k][0] * ring[k + 1][1] - ring[k + 1][0] * ring[k][1];
  return s / 2;
}

const same = (a: Position, b: Position) => a[0] === b[0] && a[1] === b[1];

/** Split a closed ring (first position repeated last) into simple closed rings. */
export function simpleRings(ring: readonly Position[]): Position[][] {
  // 1–2: an open cycle without repeats, spikes and the closing repeat.
  const cyc: Position[] = [];
  for (const p of ring) {
    if (cyc.length && same(cyc[cyc.length - 1], p)) continue;
    cyc.push(p);
    while (cyc.length >= 3 && same(cyc[cyc.length - 1], cyc[cyc.length - 3])) cyc.splice(cyc.length - 2, 2);
  }
  if (cyc.length > 1 && same(cyc[0], cyc[cyc.length - 1])) cyc.pop();
  // spikes across the seam
  for (let changed = true; changed && cyc.length >= 3; ) {
    changed = false;
    const n = cyc.length;
    if (same(cyc[n - 1], cyc[1])) {
      cyc.splice(0, 1); // the spike tip was cyc[0]
      cyc.pop();
      changed = true;
    } else if (same(cyc[n - 2], cyc[0])) {
      cyc.splice(n - 2, 2);
      changed = true;
    }
  }
  if (cyc.length < 3) return [];
  // 3: split at repeats with a stack: when a position comes back, what lies between is a loop.
  const loops: Position[][] = [];
  const stack: Position[] = [];
  const where = new Map<string, number>();
  const key = (p: Position) => `${p[0]},${p[1]}`;
  for (const p of [...cyc, cyc[0]]) {
    const k = where.get(key(p));
    if (k !== undefined) {
      const loop = stack.splice(k + 1);
      for (const q of loop) where.delete(key(q));
      loops.push([stack[k], ...loop, stack[k]]);
      continue;
    }
    where.set(key(p), stack.length);
    stack.push(p);
  }
  // 4: the first position closes the last loop; keep loops with area.
  return loops.filter((l) => l.length >= 4 && signedArea(l) !== 0);
}

/** A point just to the right of a ring's first edge (inside a region the ring bounds on its right). */
export function besideFirstEdge(ring: readonly Position[], distance: number): Position {
  const [x0, y0] = ring[0];
  const [x1, y1] = ring[1];
  const len = Math.hypot(x1 - x0, y1 - y0);
  const d = Math.min(distance, len / 4);
  // right of the direction (dx, dy) in x-right, y-down index space is (−dy, dx)
  return [(x0 + x1) / 2 - ((y1 - y0) / len) * d, (y0 + y1) / 2 + ((x1 - x0) / len) * d];
}
