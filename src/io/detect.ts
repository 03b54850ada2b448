/**
 * What a depth grid's raw numbers mean: units, sign convention, no-data sentinels, time vs depth.
 *
 * Metadata decides first (unit tags, descriptions, file names); value ranges and the grid's role
 * decide otherwise; a guess that values alone cannot settle is reported as a warning to confirm.
 * Every decision can be forced by an explicit option. The output is metres, positive down, NaN.
 */

import { InputError } from './errors.js';

export type Role = 'seabed' | 'top-basement' | 'moho' | 'other';
export type LengthUnit = 'm' | 'km' | 'ft';
export type Sign = 'depth' | 'elevation';
export type Source = 'metadata' | 'values' | 'option' | 'default';

export interface Decided<T> {
  readonly value: T;
  readonly source: Source;
  readonly detail: string;
}

/** Overrides a user can give for one file. */
export interface DepthOptions {
  role?: Role;
  units?: LengthUnit;
  sign?: Sign;
  /** Extra no-data value(s) to mask, on top of the file's tag and the usual sentinels. */
  noData?: number | number[];
  /** Set to 'depth' to accept a grid whose metadata looks like two-way time. */
  zDomain?: 'depth';
}

export interface NoDataReport {
  /** value → cells masked; NaN cells appear under 'NaN'. */
  readonly masked: Record<string, number>;
  readonly total: number;
}

export interface DepthReport {
  readonly role: Decided<Role>;
  readonly units: Decided<LengthUnit>;
  readonly sign: Decided<Sign>;
  readonly noData: NoDataReport;
  readonly warnings: string[];
  /** Range of the converted values, metres positive down. */
  readonly min: number;
  readonly max: number;
}

/** Sentinels commonly used for no data in depth grids (masked wherever they appear exactly). */
export const SENTINELS: readonly number[] = [-9999, -99999, 1e30, 1.70141e38, 3.4028e38, -3.4028e38];
const F32_MAX_NEAR = 3.4028e38;
/** Key in the no-data report for values a Float32 grid cannot hold. */
export const OUT_OF_RANGE = 'beyond Float32 range';

/** Split metadata text into lower-case words (underscores, dots and digits-to-letters split too). */
export function words(text: string): string[] {
  return text
    .toLowerCase()
    .replace(/([a-z])(\d)|(\d)([a-z])/g, '$1$3 $2$4')
    .split(/[^a-z0-9]+/)
    .filter(Boolean);
}

const TIME_WORDS = new Set(['twt', 'twtt', 'time', 'ms', 'msec', 'millisecond', 'milliseconds', 'seconds', 'sec', 'owt']);
const KM_WORDS = new Set(['km', 'kilometre', 'kilometres', 'kilometer', 'kilometers']);
const M_WORDS = new Set(['m', 'metre', 'metres', 'meter', 'meters']);
const FT_WORDS = new Set(['ft', 'feet', 'foot']);
const ELEV_WORDS = new Set(['elevation', 'elev', 'height', 'altitude', 'up']);
const DEPTH_WORDS = new Set(['depth', 'depths', 'down']);

export function guessRole(name: string): Role {
  const w = words(name);
  const has = (...xs: string[]) => xs.some((x) => w.includes(x));
  if (has('moho', 'mohorovicic')) return 'moho';
  if (has('basement', 'tbase', 'tob', 'acoustic')) return 'top-basement';
  if (has('seabed', 'seafloor', 'bathymetry', 'bathy', 'sea', 'wb', 'waterbottom')) return 'seabed';
  return 'other';
}

export interface Hints {
  /** File name (without directories). */
  readonly fileName: string;
  /** Unit tag from the file, e.g. GDAL's UNITTYPE. */
  readonly unitTag?: string;
  /** Descriptions and other free text from the file. */
  readonly descriptions?: string[];
}

/**
 * Convert raw samples into metres positive down, NaN = no data. Throws InputError for a time grid.
 * `fileNoData` is the no-data value the file itself declares (GDAL_NODATA), in raw (stored) units;
 * `linear` is the file's scale/offset, applied after no data is masked.
 */
export function toDepthMetres(
  raw: ArrayLike<number>,
  hints: Hints,
  options: DepthOptions = {},
  fileNoData: number | null = null,
  linear?: { scale: number; offset: number },
  /** Write the result over `raw` when it is a Float32Array the caller no longer needs (a decoded band). */
  inPlace = false,
): { values: Float32Array; report: DepthReport } {
  const file = hints.fileName;
  const warnings: string[] = [];
  const unitWords = hints.unitTag ? words(hints.unitTag) : [];
  const descWords = (hints.descriptions ?? []).flatMap(words);
  const nameWords = words(file.replace(/\.[a-z0-9]+$/i, ''));
  const allWords = [...unitWords, ...descWords, ...nameWords];

  // Time grids are refused: the science needs depths.
  if (options.zDomain !== 'depth') {
    const hit = allWords.find((w) => TIME_WORDS.has(w));
    if (hit || unitWords.includes('s')) {
      throw new InputError(
        file,
        `looks like a two-way-time grid ("${hit ?? 's'}" in its ${unitWords.includes(hit ?? 's') ? 'unit tag' : 'name or description'}); ` +
          'Taperline needs depth-converted grids. If it really holds depths, say so with the depth override (zDomain: depth).',
      );
    }
  }

  const role: Decided<Role> = options.role
    ? { value: options.role, source: 'option', detail: 'set by the user' }
    : (() => {
        const r = guessRole(file);
        return r === 'other'
          ? { value: r, source: 'default' as Source, detail: 'role not recognised from the file name' }
          : { value: r, source: 'metadata' as Source, detail: `from the file name "${file}"` };
      })();

  // No data: the file's own tag and the user's values (compared on raw samples, as stored), then the
  // usual sentinels wherever they appear exactly. Comparisons also at float32 precision, since a
  // tag written as "-3.4028e38" matches a float32 sample only after rounding.
  const n = raw.length;
  // in place: each sample is read before its cell is written, and later passes read only `values`
  const values = inPlace && raw instanceof Float32Array ? raw : new Float32Array(n);
  const masked: Record<string, number> = {};
  const explicit = new Map<number, number>();
  for (const e of [fileNoData ?? [], options.noData ?? []].flat()) {
    if (Number.isFinite(e)) explicit.set(Math.fround(e), e);
  }
  const sentinel = new Map<number, number>(SENTINELS.map((s) => [Math.fround(s), s]));
  const scale0 = linear?.scale ?? 1;
  const offset0 = linear?.offset ?? 0;
  let total = 0;
  let negCount = 0;
  let min1 = Infinity;
  let max1 = -Infinity;
  // the no-data values as two flat arrays (explicit ones first: they win), and a gate: a value
  // smaller in magnitude than every one of them (and than Float32's limit) needs no lookup at all
  const keyF: number[] = [];
  const keyV: number[] = [];
  for (const [f, e] of explicit) keyF.push(f), keyV.push(e);
  for (const [f, e] of sentinel) if (!explicit.has(f)) keyF.push(f), keyV.push(e);
  const kf = Float64Array.from(keyF);
  const nk = kf.length;
  let gate = F32_MAX_NEAR;
  for (let q = 0; q < nk; q++) gate = Math.min(gate, Math.abs(kf[q]));
  // NaN cells (often most of the no data) are counted in a local; their key is made on the first
  // one, so the report lists the kinds in the order met
  let nanCells = 0;
  for (let k = 0; k < n; k++) {
    const v = raw[k];
    let hit: number | undefined;
    if (v !== v) {
      if (nanCells++ === 0) masked.NaN = masked.NaN ?? 0;
      values[k] = NaN;
      continue;
    } else if (v === Infinity || v === -Infinity) hit = v;
    else if (v >= gate || v <= -gate) {
      const f = Math.fround(v);
      for (let q = 0; q < nk; q++) {
        if (kf[q] === f) {
          hit = keyV[q];
          break;
        }
      }
      if (hit === undefined && Math.abs(v) >= F32_MAX_NEAR) hit = Math.sign(v) * 3.4028e38;
    }
    if (hit !== undefined) {
      const key = String(hit);
      masked[key] = (masked[key] ?? 0) + 1;
      total++;
      values[k] = NaN;
    } else {
      const x = Math.fround(v * scale0 + offset0);
      if (x === Infinity || x === -Infinity) {
        // beyond what a Float32 grid holds (a damaged value or scale): no data, counted
        masked[OUT_OF_RANGE] = (masked[OUT_OF_RANGE] ?? 0) + 1;
        total++;
        values[k] = NaN;
      } else {
        values[k] = x;
        // fused: what the sign and range decisions need, in the same pass
        if (x < 0) negCount++;
        if (x < min1) min1 = x;
        if (x > max1) max1 = x;
      }
    }
  }
  if (nanCells) {
    masked.NaN += nanCells;
    total += nanCells;
  }
  if (total === n) throw new InputError(file, 'holds no data at all (every cell is a no-data value)');

  // Sign first (units are judged on magnitudes).
  const count = n - total;
  const negFrac = negCount / count;
  let sign: Decided<Sign>;
  const elevMeta = allWords.find((w) => ELEV_WORDS.has(w));
  const depthMeta = allWords.find((w) => DEPTH_WORDS.has(w));
  if (options.sign) sign = { value: options.sign, source: 'option', detail: 'set by the user' };
  else if (elevMeta && !depthMeta) sign = { value: 'elevation', source: 'metadata', detail: `"${elevMeta}" in the file's name or tags` };
  else if (depthMeta && !elevMeta) sign = { value: 'depth', source: 'metadata', detail: `"${depthMeta}" in the file's name or tags` };
  else {
    const pct = (negFrac * 100).toFixed(0);
    if (negFrac >= 0.9) sign = { value: 'elevation', source: 'values', detail: `${pct}% of values are negative: read as elevation (positive up)` };
    else if (negFrac <= 0.1) sign = { value: 'depth', source: 'values', detail: `${pct}% of values are negative: read as depth (positive down)` };
    else {
      const v: Sign = negFrac > 0.5 ? 'elevation' : 'depth';
      sign = { value: v, source: 'values', detail: `${pct}% of values are negative: guessed ${v}` };
      warnings.push(`sign convention guessed from values (${pct}% negative) as ${v}: please confirm`);
    }
  }

  // Units: the tag, then the role and the magnitudes.
  let units: Decided<LengthUnit>;
  const unitFromTag = unitWords.find((w) => KM_WORDS.has(w) || M_WORDS.has(w) || FT_WORDS.has(w));
  const unitFromName = [...descWords, ...nameWords].find((w) => KM_WORDS.has(w) || FT_WORDS.has(w));
  const asUnit = (w: string): LengthUnit => (KM_WORDS.has(w) ? 'km' : FT_WORDS.has(w) ? 'ft' : 'm');
  if (options.units) units = { value: options.units, source: 'option', detail: 'set by the user' };
  else if (unitFromTag) units = { value: asUnit(unitFromTag), source: 'metadata', detail: `unit tag "${hints.unitTag}"` };
  else if (unitFromName) units = { value: asUnit(unitFromName), source: 'metadata', detail: `"${unitFromName}" in the file's name or description` };
  else units = unitsFromValues(values, role.value, warnings);

  const scale = (units.value === 'km' ? 1000 : units.value === 'ft' ? 0.3048 : 1) * (sign.value === 'elevation' ? -1 : 1);
  let min = min1;
  let max = max1;
  if (scale !== 1) {
    min = Infinity;
    max = -Infinity;
    for (let k = 0; k < n; k++) {
      values[k] = values[k] * scale;
      const x = values[k];
      if (x === Infinity || x === -Infinity) {
        values[k] = NaN;
        masked[OUT_OF_RANGE] = (masked[OUT_OF_RANGE] ?? 0) + 1;
        total++;
      } else {
        if (x < min) min = x;
        if (x > max) max = x;
      }
    }
  }
  if (masked[OUT_OF_RANGE]) warnings.push(`${masked[OUT_OF_RANGE]} values beyond the Float32 range once converted to metres: no data there (damaged values?)`);
  if (role.value === 'moho' && max < 3000) warnings.push(`Moho no deeper than ${max.toFixed(0)} m: check units and role`);
  return { values, report: { role, units, sign, noData: { masked, total }, warnings, min, max } };
}

function unitsFromValues(values: Float32Array, role: Role, warnings: string[]): Decided<LengthUnit> {
  const mags: number[] = [];
  const step = Math.max(1, Math.floor(values.length / 20000));
  for (let k = 0; k < values.length; k += step) {
    const v = values[k];
    if (v === v) mags.push(Math.abs(v));
  }
  mags.sort((a, b) => a - b);
  const med = mags[Math.floor(mags.length / 2)] ?? 0;
  const maxAbs = mags[mags.length - 1] ?? 0;
  if (role === 'moho') {
    // A Moho 5–80 km deep is common; 5–80 m is impossible.
    if (med >= 5 && med <= 80) return { value: 'km', source: 'values', detail: `Moho median ${med.toFixed(1)}: kilometres` };
    if (med >= 3000) return { value: 'm', source: 'values', detail: `Moho median ${med.toFixed(0)}: metres` };
    warnings.push(`units of a Moho with median ${med.toPrecision(3)} cannot be told from values: read as metres, please confirm`);
    return { value: 'm', source: 'default', detail: 'undecided from values; metres assumed' };
  }
  if (maxAbs <= 15) {
    warnings.push(`all |values| ≤ ${maxAbs.toPrecision(3)}: read as kilometres, please confirm`);
    return { value: 'km', source: 'values', detail: `largest |value| ${maxAbs.toPrecision(3)}: kilometres (a guess)` };
  }
  if (maxAbs >= 100) return { value: 'm', source: 'values', detail: `largest |value| ${maxAbs.toFixed(0)}: metres` };
  warnings.push(`units cannot be told from values (largest |value| ${maxAbs.toPrecision(3)}): read as metres, please confirm`);
  return { value: 'm', source: 'default', detail: 'undecided from values; metres assumed' };
}
