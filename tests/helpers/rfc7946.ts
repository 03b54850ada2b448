import { lonLatSignedArea } from '../../src/export/rfc7946.js';

type Geo = { type: string; coordinates: unknown };

/** RFC 7946 rules: §3.1.1 positions of two numbers (no depth), lon/lat ranges; §3.1.4 LineStrings of
 * two or more positions; §3.1.6 linear rings closed with four or more positions, exterior rings
 * counter-clockwise and holes clockwise; §4 no "crs" member. Returns the violations found. */
export function rfc7946Violations(fc: { type: string; crs?: unknown; features: { geometry: Geo }[] }): string[] {
  const bad: string[] = [];
  if ('crs' in fc) bad.push('has a crs member');
  const pos = (p: unknown, where: string) => {
    if (!Array.isArray(p) || p.length !== 2 || !p.every(Number.isFinite)) bad.push(`${where}: position ${JSON.stringify(p)} is not two numbers`);
    else if (Math.abs(p[0]) > 180 || Math.abs(p[1]) > 90) bad.push(`${where}: ${p} out of range`);
  };
  const ring = (r: [number, number][], where: string, exterior: boolean) => {
    r.forEach((p, k) => pos(p, `${where}[${k}]`));
    if (r.length < 4) bad.push(`${where}: ring of ${r.length} positions`);
    const a = r[0];
    const b = r[r.length - 1];
    if (a[0] !== b[0] || a[1] !== b[1]) bad.push(`${where}: ring not closed`);
    const area = lonLatSignedArea(r);
    if (exterior && !(area > 0)) bad.push(`${where}: exterior ring not counter-clockwise`);
    if (!exterior && !(area < 0)) bad.push(`${where}: hole not clockwise`);
  };
  fc.features.forEach((f, k) => {
    const g = f.geometry;
    const w = `feature ${k}`;
    if (g.type === 'LineString') {
      const c = g.coordinates as [number, number][];
      if (c.length < 2) bad.push(`${w}: LineString of ${c.length} positions`);
      c.forEach((p, q) => pos(p, `${w}[${q}]`));
    } else if (g.type === 'MultiLineString') (g.coordinates as [number, number][][]).forEach((c, q) => c.forEach((p, s) => pos(p, `${w}[${q}][${s}]`)));
    else if (g.type === 'Polygon') (g.coordinates as [number, number][][]).forEach((r, q) => ring(r, `${w} ring ${q}`, q === 0));
    else if (g.type === 'MultiPolygon') (g.coordinates as [number, number][][][]).forEach((poly, s) => poly.forEach((r, q) => ring(r, `${w} part ${s} ring ${q}`, q === 0)));
    else bad.push(`${w}: unexpected geometry ${g.type}`);
  });
  return bad;
}

