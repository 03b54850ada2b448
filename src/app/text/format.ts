/** Numbers as people read them: units, sensible precision, thousands separators, no "NaN". */

/** A plain number with a fixed count of decimals ("—" when there is none, "∞" for infinity). */
export function num(v: number, digits = 0): string {
  if (v === Infinity) return '∞';
  if (v === -Infinity) return '−∞';
  if (!Number.isFinite(v)) return '—';
  return v.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits }).replace(/^-/, '−');
}

/**
 * A value with its unit, at the precision that unit deserves: metres of depth or thickness at or
 * beyond 10 km read as km with one decimal, below as whole metres; ages to 0.1 Ma; ratios to 0.01.
 */
export function withUnit(v: number, unit: string): string {
  if (!Number.isFinite(v)) return num(v);
  switch (unit) {
    case 'm':
      return Math.abs(v) >= 10_000 ? `${num(v / 1000, 1)} km` : `${num(v, 0)} m`;
    case 'km':
      return `${num(v, Math.abs(v) >= 100 ? 0 : 1)} km`;
    case 'km²':
      return `${num(v, 0)} km²`;
    case 'Ma':
      return `${num(v, 1)} Ma`;
    case 'fraction':
      return `${num(v * 100, 0)} %`;
    case '':
      return num(v, 2);
    default:
      return `${num(v, 1)} ${unit}`;
  }
}

/** Longitude and latitude with hemisphere letters, 0.00001° (about a metre). */
export function lonLat(lon: number, lat: number): string {
  return `${num(Math.abs(lat), 5)}° ${lat < 0 ? 'S' : 'N'}, ${num(Math.abs(lon), 5)}° ${lon < 0 ? 'W' : 'E'}`;
}

/** "1 warning", "3 warnings", "no warnings". */
export function countOf(n: number, one: string, many = `${one}s`): string {
  return n === 0 ? `no ${many}` : `${n} ${n === 1 ? one : many}`;
}
