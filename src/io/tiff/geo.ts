/**
 * What a GeoTIFF says about place and meaning: the GeoKey directory (OGC GeoTIFF 1.1, 19-008r4),
 * the model tie point, pixel scale or transformation, and GDAL's metadata and no-data tags.
 * Every key and value is bounds-checked; a damaged directory is refused naming what is wrong.
 */

import { InputError } from '../errors.js';
import { numbers, text, type Ifd } from './ifd.js';

export const GEOKEY = { model: 1024, raster: 1025, geographic: 2048, projected: 3072 } as const;

/** GeoKey id → value (a number, a list of doubles, or text). */
export type GeoKeys = Map<number, number | number[] | string>;

export function readGeoKeys(ifd: Ifd): GeoKeys | null {
  const dir = numbers(ifd, 34735);
  if (!dir) return null;
  const file = ifd.file;
  if (dir.length < 4) throw new InputError(file, 'has a GeoKey directory shorter than its header: damaged');
  const count = dir[3];
  if (4 + count * 4 > dir.length) throw new InputError(file, `has a GeoKey directory declaring ${count} keys but holding ${Math.floor((dir.length - 4) / 4)}: damaged`);
  const doubles = numbers(ifd, 34736);
  const ascii = text(ifd, 34737);
  const keys: GeoKeys = new Map();
  for (let k = 0; k < count; k++) {
    const [id, where, n, value] = [dir[4 + 4 * k], dir[5 + 4 * k], dir[6 + 4 * k], dir[7 + 4 * k]];
    if (where === 0) keys.set(id, value);
    else if (where === 34736) {
      if (!doubles || value + n > doubles.length) throw new InputError(file, `GeoKey ${id} points outside the GeoDoubleParams tag: damaged`);
      keys.set(id, Array.from(doubles.subarray(value, value + n)));
    } else if (where === 34737) {
      if (ascii === undefined || value + n > ascii.length + 1) throw new InputError(file, `GeoKey ${id} points outside the GeoAsciiParams tag: damaged`);
      keys.set(id, ascii.slice(value, value + n).replace(/[|\0]+$/, ''));
    } else if (where === 34735) {
      if (value + n > dir.length) throw new InputError(file, `GeoKey ${id} points outside the GeoKey directory: damaged`);
      keys.set(id, n === 1 ? dir[value] : Array.from(dir.subarray(value, value + n)));
    }
    // A key stored in some other tag is not one we use; it is ignored.
  }
  return keys;
}

/** A numeric GeoKey, or undefined when absent; refuses one of the wrong type. */
export function geoKeyNumber(keys: GeoKeys, id: number, file: string): number | undefined {
  const v = keys.get(id);
  if (v === undefined) return undefined;
  if (typeof v !== 'number' || !Number.isInteger(v)) throw new InputError(file, `GeoKey ${id} should hold a code but holds ${JSON.stringify(v).slice(0, 40)}: damaged`);
  return v;
}

export interface Georeference {
  /** Map position of pixel (0, 0)'s reference point (its corner, as stored) and the pixel steps. */
  readonly x: number;
  readonly y: number;
  readonly dx: number;
  readonly dy: number;
}

/** Tie point + pixel scale, or an axis-aligned model transformation; anything else is refused. */
export function readGeoreference(ifd: Ifd): Georeference {
  const file = ifd.file;
  const scale = numbers(ifd, 33550);
  const tie = numbers(ifd, 33922);
  const matrix = numbers(ifd, 34264);
  let g: Georeference;
  if (scale && tie) {
    if (scale.length < 2 || tie.length < 6) throw new InputError(file, 'has a tie point or pixel scale with too few values: damaged');
    // Tie point (I, J, K, X, Y, Z): raster (I, J) sits at model (X, Y).
    g = { x: tie[3] - tie[0] * scale[0], y: tie[4] + tie[1] * scale[1], dx: scale[0], dy: -scale[1] };
  } else if (matrix) {
    if (matrix.length < 16) throw new InputError(file, 'has a model transformation with fewer than 16 values: damaged');
    if (matrix[1] !== 0 || matrix[4] !== 0) throw new InputError(file, 'is a rotated or sheared grid; warp it to a north-up grid first (gdalwarp)');
    g = { x: matrix[3], y: matrix[7], dx: matrix[0], dy: matrix[5] };
  } else {
    throw new InputError(file, 'has no georeferencing (no tie point and pixel scale): not a GeoTIFF grid');
  }
  if (!(Number.isFinite(g.dx) && g.dx > 0)) throw new InputError(file, `declares a cell width of ${g.dx}: it must be a positive number (damaged georeferencing)`);
  if (!(Number.isFinite(g.dy) && g.dy !== 0)) throw new InputError(file, `declares a cell height of ${-g.dy}: it must be a non-zero number (damaged georeferencing)`);
  if (!Number.isFinite(g.x) || !Number.isFinite(g.y)) throw new InputError(file, 'declares a grid origin that is not a finite number: damaged georeferencing');
  return g;
}

/** GDAL's metadata items (tag 42112): dataset items and those of band 1 (sample 0). */
export function readGdalMetadata(ifd: Ifd): { dataset: Record<string, string>; band: Record<string, string> } {
  const xml = text(ifd, 42112) ?? '';
  const dataset: Record<string, string> = {};
  const band: Record<string, string> = {};
  for (const m of xml.matchAll(/<Item\b([^>]*)>([^<]*)<\/Item>/g)) {
    const attrs = m[1];
    const name = /\bname="([^"]*)"/.exec(attrs)?.[1];
    if (!name) continue;
    const sample = /\bsample="([^"]*)"/.exec(attrs)?.[1];
    const value = unescapeXml(m[2]);
    if (sample === undefined) dataset[name] = value;
    else if (sample === '0') band[name] = value;
  }
  return { dataset, band };
}

function unescapeXml(s: string): string {
  return s.replace(/&(lt|gt|amp|quot|apos|#\d+|#x[0-9a-f]+);/gi, (all, e: string) => {
    const named: Record<string, string> = { lt: '<', gt: '>', amp: '&', quot: '"', apos: "'" };
    if (named[e.toLowerCase()]) return named[e.toLowerCase()];
    const code = e[1] === 'x' || e[1] === 'X' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10);
    return code > 0 && code <= 0x10ffff ? String.fromCodePoint(code) : all;
  });
}

/** GDAL's no-data tag (42113) as a number; null when absent; refused when it is not a number. */
export function readGdalNoData(ifd: Ifd): number | null {
  const t = text(ifd, 42113);
  if (t === undefined) return null;
  const s = t.trim();
  if (/^nan$/i.test(s)) return NaN;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(s)) throw new InputError(ifd.file, `has a no-data tag "${s.slice(0, 40)}" that is not a number: damaged`);
  return Number(s);
}
