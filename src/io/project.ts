/**
 * The project file (DESIGN.md "The project file"): parameters, inputs referenced by name, size and
 * sha256 (optionally with their bytes bundled, base64), and the view. Opening it with the same inputs
 * reproduces identical outputs, timestamps aside.
 */

import { nearestKey } from '../params.js';
import { InputError } from './errors.js';
import type { GridReadOptions } from './geotiff-read.js';

export const PROJECT_FORMAT = 'taperline-project';
export const PROJECT_VERSION = 1;

export interface ProjectInput {
  readonly name: string;
  readonly kind: 'grid' | 'vector';
  readonly role: string;
  readonly bytes: number;
  readonly sha256: string;
  readonly options: GridReadOptions;
  /** base64 of the file, when bundled. */
  readonly data?: string;
}

export interface ProjectView {
  readonly center: [number, number];
  readonly zoom: number;
  readonly layer: string;
  readonly opacity: number;
  readonly visible: Record<string, boolean>;
}

export interface Project {
  readonly format: typeof PROJECT_FORMAT;
  readonly version: number;
  readonly saved: string;
  readonly tool: string;
  readonly params: Record<string, unknown>;
  readonly inputs: ProjectInput[];
  readonly view: ProjectView | null;
  /** Survey-planning values the user set (absent keys take their defaults). */
  readonly plan: Record<string, unknown>;
  /** Ids of picks the user excluded. */
  readonly excludePicks: string[];
  /** Uncertainty settings (flat spec keys) and the last sweep's lines and figures, if any. */
  readonly uncertainty?: ProjectUncertainty;
}

export interface ProjectUncertainty {
  readonly settings: Record<string, number | null>;
  /** The last sweep as shown: lines (RFC 7946) and summary figures; its grids are not kept. */
  readonly sweep: { runKey: string; realisations: number; seed: number; lines: unknown; summary: Record<string, unknown>; millis: number } | null;
}

const B64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

export function toBase64(bytes: Uint8Array): string {
  let out = '';
  for (let k = 0; k < bytes.length; k += 3) {
    const a = bytes[k];
    const b = k + 1 < bytes.length ? bytes[k + 1] : 0;
    const c = k + 2 < bytes.length ? bytes[k + 2] : 0;
    const n = (a << 16) | (b << 8) | c;
    out += B64[(n >> 18) & 63] + B64[(n >> 12) & 63] + (k + 1 < bytes.length ? B64[(n >> 6) & 63] : '=') + (k + 2 < bytes.length ? B64[n & 63] : '=');
  }
  return out;
}

export function fromBase64(text: string): Uint8Array {
  const clean = text.replace(/[^A-Za-z0-9+/]/g, '');
  const out = new Uint8Array(Math.floor((clean.length * 3) / 4));
  const lut = new Int16Array(128).fill(-1);
  for (let k = 0; k < 64; k++) lut[B64.charCodeAt(k)] = k;
  let o = 0;
  for (let k = 0; k < clean.length; k += 4) {
    const n = (lut[clean.charCodeAt(k)] << 18) | (lut[clean.charCodeAt(k + 1)] << 12) | ((lut[clean.charCodeAt(k + 2)] & 63) << 6) | (lut[clean.charCodeAt(k + 3)] & 63);
    if (o < out.length) out[o++] = (n >> 16) & 255;
    if (o < out.length) out[o++] = (n >> 8) & 255;
    if (o < out.length) out[o++] = n & 255;
  }
  return out;
}

/** The roles an input can take, per kind ("none": loaded but not used). */
export const INPUT_ROLES: Record<'grid' | 'vector', readonly string[]> = {
  grid: ['top-basement', 'moho', 'seabed', 'none'],
  vector: ['licence', 'lines', 'picks', 'isochrons', 'crust', 'none'],
};

export interface ProjectSchema {
  /** Parameter keys the project may set (values must be JSON numbers, strings of the key's choices, or null). */
  readonly paramKeys?: readonly string[];
  /** Planning keys the project may set. */
  readonly planKeys?: readonly string[];
  /** Map layers the view may name. */
  readonly layers?: readonly string[];
  /** Uncertainty settings the project may set. */
  readonly uncertaintyKeys?: readonly string[];
}

type Json = unknown;
const isObject = (v: Json): v is Record<string, Json> => typeof v === 'object' && v !== null && !Array.isArray(v);
/** A value as the message shows it (JSON, short; "nothing" when absent). */
const shown = (v: unknown): string => (v === undefined ? 'nothing' : (JSON.stringify(v) ?? String(v)).slice(0, 40));
const isFiniteNumber = (v: Json): v is number => typeof v === 'number' && Number.isFinite(v);

/**
 * Parse and validate a project file field by field before the caller touches any of its current
 * state: every field's type and range, every input's name, kind, role, size, checksum, options and
 * bundled bytes. Refusals name the file and the field ("inputs[2].role").
 */
export function parseProject(text: string, file: string, schema: ProjectSchema = {}): Project {
  let p: Json;
  try {
    p = JSON.parse(text);
  } catch (err) {
    throw new InputError(file, `is not a project file (not JSON: ${(err as Error).message})`);
  }
  const bad = (field: string, problem: string): never => {
    throw new InputError(file, `field "${field}" ${problem}`);
  };
  if (!isObject(p) || p.format !== PROJECT_FORMAT) throw new InputError(file, `is not a Taperline project file (no "format": "${PROJECT_FORMAT}")`);
  if (!Number.isInteger(p.version) || (p.version as number) < 1 || (p.version as number) > PROJECT_VERSION) {
    throw new InputError(file, `${p.version === undefined ? 'has no project version' : `has project version ${JSON.stringify(p.version)}`}; this Taperline reads versions 1 to ${PROJECT_VERSION}`);
  }
  for (const k of ['saved', 'tool'] as const) if (p[k] !== undefined && typeof p[k] !== 'string') bad(k, 'must be text');

  const params = checkValues(p.params, 'params', schema.paramKeys, bad);
  const plan = checkValues(p.plan, 'plan', schema.planKeys, bad);
  if (!Array.isArray(p.inputs)) bad('inputs', 'must be a list of inputs');
  const inputs = (p.inputs as Json[]).map((i, k) => checkInput(i, `inputs[${k}]`, bad));
  const view = p.view === undefined || p.view === null ? null : checkView(p.view, schema.layers, bad);
  let excludePicks: string[] = [];
  if (p.excludePicks !== undefined) {
    if (!Array.isArray(p.excludePicks) || p.excludePicks.some((q) => typeof q !== 'string')) bad('excludePicks', 'must be a list of pick ids (text)');
    excludePicks = [...(p.excludePicks as string[])];
  }
  const uncertainty = p.uncertainty === undefined || p.uncertainty === null ? undefined : checkUncertainty(p.uncertainty, schema.uncertaintyKeys, bad);
  return {
    ...(uncertainty ? { uncertainty } : {}),
    format: PROJECT_FORMAT,
    version: p.version as number,
    saved: (p.saved as string | undefined) ?? '',
    tool: (p.tool as string | undefined) ?? '',
    params,
    inputs,
    view,
    plan,
    excludePicks,
  };
}

function checkValues(v: Json, field: string, keys: readonly string[] | undefined, bad: (f: string, m: string) => never): Record<string, unknown> {
  if (v === undefined) return {};
  if (!isObject(v)) return bad(field, 'must be an object of named values');
  for (const [k, x] of Object.entries(v)) {
    if (keys && !keys.includes(k)) {
      const near = nearestKey(k, keys);
      bad(`${field}.${k}`, `is not a known key${near ? ` — did you mean "${near}"?` : ''}`);
    }
    if (!(x === null || typeof x === 'boolean' || typeof x === 'string' || isFiniteNumber(x))) bad(`${field}.${k}`, `must be a number, text, true/false or null; got ${shown(x)}`);
  }
  return { ...v };
}

const OPTION_CHECKS: Record<string, (v: Json) => boolean> = {
  role: (v) => typeof v === 'string',
  units: (v) => v === 'm' || v === 'km' || v === 'ft',
  sign: (v) => v === 'depth' || v === 'elevation',
  zDomain: (v) => v === 'depth',
  crs: (v) => typeof v === 'string',
  registration: (v) => v === 'area' || v === 'node',
  noData: (v) => isFiniteNumber(v) || (Array.isArray(v) && v.every(isFiniteNumber)),
  readBudgetMB: (v) => isFiniteNumber(v) && v > 0,
  assumeCrs: (v) => typeof v === 'string',
};

function checkInput(i: Json, field: string, bad: (f: string, m: string) => never): ProjectInput {
  if (!isObject(i)) return bad(field, 'must be an object describing one input');
  if (typeof i.name !== 'string' || i.name.trim() === '' || i.name.length > 255) bad(`${field}.name`, 'must be a file name');
  if (i.kind !== 'grid' && i.kind !== 'vector') bad(`${field}.kind`, 'must be "grid" or "vector"');
  const kind = i.kind as 'grid' | 'vector';
  if (typeof i.role !== 'string' || !INPUT_ROLES[kind].includes(i.role)) bad(`${field}.role`, `must be one of ${INPUT_ROLES[kind].join(', ')}`);
  if (!Number.isInteger(i.bytes) || (i.bytes as number) < 0) bad(`${field}.bytes`, 'must be a whole number of bytes');
  if (typeof i.sha256 !== 'string' || !/^[0-9a-f]{64}$/.test(i.sha256)) bad(`${field}.sha256`, 'must be 64 hexadecimal digits');
  const options = i.options === undefined ? {} : i.options;
  if (!isObject(options)) return bad(`${field}.options`, 'must be an object');
  for (const [k, v] of Object.entries(options)) {
    const check = OPTION_CHECKS[k];
    if (!check) bad(`${field}.options.${k}`, 'is not a reader option');
    if (v !== undefined && !check(v)) bad(`${field}.options.${k}`, `has an impossible value ${shown(v)}`);
  }
  let data: string | undefined;
  if (i.data !== undefined) {
    if (typeof i.data !== 'string' || !/^[A-Za-z0-9+/\s]*={0,2}\s*$/.test(i.data)) bad(`${field}.data`, 'must be base64 text');
    data = i.data as string;
    const decoded = Math.floor((data.replace(/[^A-Za-z0-9+/]/g, '').length * 3) / 4);
    if (decoded !== i.bytes) bad(`${field}.data`, `holds ${decoded} bytes where "bytes" says ${i.bytes}: damaged`);
  }
  return { name: i.name as string, kind, role: i.role as string, bytes: i.bytes as number, sha256: i.sha256 as string, options: options as GridReadOptions, ...(data !== undefined ? { data } : {}) };
}

function checkView(v: Json, layers: readonly string[] | undefined, bad: (f: string, m: string) => never): ProjectView {
  if (!isObject(v)) return bad('view', 'must be an object or null');
  const c = v.center;
  if (!Array.isArray(c) || c.length !== 2 || !isFiniteNumber(c[0]) || !isFiniteNumber(c[1]) || Math.abs(c[0]) > 540 || Math.abs(c[1]) > 90) {
    bad('view.center', 'must be [longitude, latitude] in degrees');
  }
  if (!isFiniteNumber(v.zoom) || v.zoom < 0 || v.zoom > 24) bad('view.zoom', 'must be a number from 0 to 24');
  if (typeof v.layer !== 'string' || (layers && !layers.includes(v.layer))) bad('view.layer', `must name a map layer${layers ? ` (${layers.slice(0, 4).join(', ')}, …)` : ''}; got ${shown(v.layer)}`);
  if (!isFiniteNumber(v.opacity) || v.opacity < 0 || v.opacity > 1) bad('view.opacity', 'must be a number from 0 to 1');
  const visible = v.visible === undefined ? {} : v.visible;
  if (!isObject(visible) || Object.values(visible).some((x) => typeof x !== 'boolean')) bad('view.visible', 'must map layer names to true or false');
  return { center: [(c as number[])[0], (c as number[])[1]], zoom: v.zoom as number, layer: v.layer as string, opacity: v.opacity as number, visible: { ...(visible as Record<string, boolean>) } };
}

function checkUncertainty(v: Json, keys: readonly string[] | undefined, bad: (f: string, m: string) => never): ProjectUncertainty {
  if (!isObject(v)) bad('uncertainty', 'must be an object with "settings" and "sweep"');
  const u = v as Record<string, Json>;
  const settings: Record<string, number | null> = {};
  if (u.settings !== undefined) {
    if (!isObject(u.settings)) bad('uncertainty.settings', 'must be an object of numbers');
    for (const [k, x] of Object.entries(u.settings as Record<string, Json>)) {
      if (keys && !keys.includes(k)) bad(`uncertainty.settings.${k}`, `is not an uncertainty setting (known: ${keys.join(', ')})`);
      if (x !== null && !isFiniteNumber(x)) bad(`uncertainty.settings.${k}`, `must be a number or null, not ${shown(x)}`);
      settings[k] = x as number | null;
    }
  }
  let sweep: ProjectUncertainty['sweep'] = null;
  if (u.sweep !== undefined && u.sweep !== null) {
    const w = u.sweep;
    if (!isObject(w)) bad('uncertainty.sweep', 'must be an object');
    const o = w as Record<string, Json>;
    if (typeof o.runKey !== 'string') bad('uncertainty.sweep.runKey', 'must be text');
    for (const k of ['realisations', 'seed'] as const) if (!Number.isInteger(o[k]) || (o[k] as number) < 0) bad(`uncertainty.sweep.${k}`, `must be a whole number, not ${shown(o[k])}`);
    if (!isObject(o.lines) || (o.lines as Record<string, Json>).type !== 'FeatureCollection' || !Array.isArray((o.lines as Record<string, Json>).features)) bad('uncertainty.sweep.lines', 'must be a GeoJSON FeatureCollection');
    if (!isObject(o.summary)) bad('uncertainty.sweep.summary', 'must be an object');
    sweep = { runKey: o.runKey as string, realisations: o.realisations as number, seed: o.seed as number, lines: o.lines, summary: o.summary as Record<string, unknown>, millis: isFiniteNumber(o.millis) ? o.millis : 0 };
  }
  return { settings, sweep };
}
