/** Insert vertices so no segment is longer than maxStep (CRS units): straight lines in a projected
 * CRS are curves in lon/lat, so edges are densified before reprojection. */
export function densify(coords: [number, number][], maxStep: number): [number, number][] {
  if (coords.length < 2) return coords.map((c) => [c[0], c[1]]);
  const out: [number, number][] = [[coords[0][0], coords[0][1]]];
  for (let k = 1; k < coords.length; k++) {
    const [ax, ay] = coords[k - 1];
    const [bx, by] = coords[k];
    const n = Math.max(1, Math.ceil(Math.hypot(bx - ax, by - ay) / maxStep));
    for (let s = 1; s <= n; s++) out.push([ax + ((bx - ax) * s) / n, ay + ((by - ay) * s) / n]);
  }
  return out;
}
