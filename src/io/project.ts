/**
 * The project file (DESIGN.md "The project file"): parameters, inputs referenced by name, size and
 * sha256 (optionally with their bytes bundled, base64), and the view. Opening it with the same inputs
 * reproduces identical outputs, timestamps aside.
 */

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

export function parseProject(text: string, file: string): Project {
  let p: Partial<Project>;
  try {
    p = JSON.parse(text);
  } catch (err) {
    throw new InputError(file, `is not a project file (not JSON: ${(err as Error).message})`);
  }
  if (!p || p.format !== PROJECT_FORMAT) throw new InputError(file, `is not a Taperline project file (no "format": "${PROJECT_FORMAT}")`);
  if (typeof p.version !== 'number' || p.version > PROJECT_VERSION) throw new InputError(file, `has project version ${p.version}; this Taperline reads up to ${PROJECT_VERSION}`);
  if (!Array.isArray(p.inputs)) throw new InputError(file, 'has no list of inputs');
  for (const [k, i] of p.inputs.entries()) {
    if (!i || typeof i.name !== 'string' || (i.kind !== 'grid' && i.kind !== 'vector') || typeof i.sha256 !== 'string') {
      throw new InputError(file, `input ${k} lacks a name, kind or sha256`);
    }
  }
  if (p.plan !== undefined && (p.plan === null || typeof p.plan !== 'object' || Array.isArray(p.plan))) throw new InputError(file, '"plan" must be an object of planning values');
  if (p.excludePicks !== undefined && (!Array.isArray(p.excludePicks) || p.excludePicks.some((q) => typeof q !== 'string'))) throw new InputError(file, '"excludePicks" must be a list of pick ids');
  return {
    format: PROJECT_FORMAT,
    version: p.version,
    saved: String(p.saved ?? ''),
    tool: String(p.tool ?? ''),
    params: p.params ?? {},
    inputs: p.inputs,
    view: p.view ?? null,
    plan: p.plan ?? {},
    excludePicks: p.excludePicks ?? [],
  };
}
