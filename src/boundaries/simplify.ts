/**
 * Simplification that keeps shared borders shared. The COT zone polygon's rings run along the taper
 * limit and the oceanic limit vertex for vertex (the same crossings, bit-identical); simplifying lines
 * and rings independently would pull them apart. Here:
 *  1. ring vertices found on a line (exact coordinates) mark shared runs; where a ring joins or leaves a
 *     line, that line vertex becomes a fixed junction;
 *  2. each line is simplified with Douglas–Peucker between its fixed vertices and ends;
 *  3. each ring keeps, along a shared run, exactly the vertices its line kept, and is simplified by
 *     Douglas–Peucker between anchors elsewhere.
 * Every output vertex is an input vertex; no vertex moves more than `tolerance` from its original path.
 */

import { douglasPeuckerMark, type Ring } from './planar.js';

const key = (p: [number, number]) => `${p[0]},${p[1]}`;

const dpMark = douglasPeuckerMark;

export function simplifyShared(lines: Ring[], rings: Ring[], tolerance: number): { lines: Ring[]; rings: Ring[] } {
  if (!(tolerance > 0)) return { lines, rings };
  const where = new Map<string, [number, number]>(); // vertex → [line, index]
  lines.forEach((l, li) => l.forEach((p, i) => where.set(key(p), [li, i])));
  const fixed = lines.map((l) => {
    const f = new Uint8Array(l.length);
    f[0] = f[l.length - 1] = 1;
    return f;
  });
  // Shared-run analysis per ring (closed rings: last vertex repeats the first).
  const ringInfo = rings.map((r) => {
    const n = r.length - 1;
    const on = Array.from({ length: n }, (_, v) => where.get(key(r[v])) ?? null);
    for (let v = 0; v < n; v++) {
      const here = on[v];
      if (!here) continue;
      for (const w of [(v + n - 1) % n, (v + 1) % n]) {
        const there = on[w];
        const continues = there && there[0] === here[0] && Math.abs(there[1] - here[1]) === 1;
        if (!continues) fixed[here[0]][here[1]] = 1; // the ring joins or leaves the line here
      }
    }
    return on;
  });
  // Lines: Douglas–Peucker between consecutive fixed vertices.
  const kept = lines.map((l, li) => {
    const keep = new Uint8Array(l.length);
    let a = 0;
    for (let i = 1; i < l.length; i++) {
      if (fixed[li][i]) {
        dpMark(l, a, i, tolerance, keep);
        a = i;
      }
    }
    return keep;
  });
  const outLines = lines.map((l, li) => l.filter((_, i) => kept[li][i]));
  // Rings: shared vertices follow their line's decision; other stretches are simplified between anchors.
  const outRings = rings.map((r, ri) => {
    const n = r.length - 1;
    const on = ringInfo[ri];
    const keep = new Uint8Array(n + 1);
    const anchors: number[] = [];
    for (let v = 0; v < n; v++) {
      const here = on[v];
      if (here) {
        if (kept[here[0]][here[1]]) keep[v] = 1;
        const prev = on[(v + n - 1) % n];
        const next = on[(v + 1) % n];
        const joins = !prev || prev[0] !== here[0] || Math.abs(prev[1] - here[1]) !== 1;
        const leaves = !next || next[0] !== here[0] || Math.abs(next[1] - here[1]) !== 1;
        if (joins || leaves) anchors.push(v);
      }
    }
    if (!anchors.length) {
      // a ring sharing nothing: simplify it in two halves between its first vertex and the farthest one
      let far = 0;
      let best = -1;
      for (let v = 1; v < n; v++) {
        const d = Math.hypot(r[v][0] - r[0][0], r[v][1] - r[0][1]);
        if (d > best) (best = d), (far = v);
      }
      dpMark(r, 0, far, tolerance, keep);
      dpMark(r, far, n, tolerance, keep);
    } else {
      // unshared stretches run from an anchor that leaves a line to the next anchor
      for (let q = 0; q < anchors.length; q++) {
        const a = anchors[q];
        const b = anchors[(q + 1) % anchors.length];
        const next = on[(a + 1) % n];
        const here = on[a]!;
        const sharedStep = next && next[0] === here[0] && Math.abs(next[1] - here[1]) === 1;
        if (sharedStep) continue; // a shared run: already decided by the line
        const path: Ring = [];
        for (let v = a; ; v = (v + 1) % n) {
          path.push(r[v]);
          if (v === b && path.length > 1) break;
          if (path.length > n + 1) break;
        }
        const pk = new Uint8Array(path.length);
        dpMark(path, 0, path.length - 1, tolerance, pk);
        for (let k = 0; k < path.length; k++) if (pk[k]) keep[(a + k) % n] = 1;
      }
    }
    const out: Ring = [];
    for (let v = 0; v < n; v++) if (keep[v]) out.push(r[v]);
    if (out.length) out.push([out[0][0], out[0][1]]);
    return out.length >= 4 ? out : r;
  });
  return { lines: outLines, rings: outRings };
}
