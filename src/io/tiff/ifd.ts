/**
 * The TIFF container, read defensively: header, first image file directory (IFD) and tag values,
 * classic TIFF and BigTIFF, either byte order (TIFF 6.0, Adobe 1992; BigTIFF, Aware Systems 2004).
 *
 * Every offset and count is checked against the file's length before anything is read or
 * allocated, so a damaged directory is an InputError naming the tag, never a RangeError, a hang or
 * a huge allocation. Nothing here knows about pixels or georeferencing.
 */

import { InputError } from '../errors.js';

/** Bytes per value of each TIFF field type (0 = unknown type, skipped as the spec asks). */
const TYPE_SIZE = [0, 1, 1, 2, 4, 8, 1, 1, 2, 4, 8, 4, 8, 4, 0, 0, 8, 8, 8];

export const TAG_NAMES: Record<number, string> = {
  256: 'ImageWidth', 257: 'ImageLength', 258: 'BitsPerSample', 259: 'Compression', 270: 'ImageDescription',
  273: 'StripOffsets', 277: 'SamplesPerPixel', 278: 'RowsPerStrip', 279: 'StripByteCounts',
  284: 'PlanarConfiguration', 317: 'Predictor', 322: 'TileWidth', 323: 'TileLength', 324: 'TileOffsets',
  325: 'TileByteCounts', 339: 'SampleFormat', 33550: 'ModelPixelScale', 33922: 'ModelTiepoint',
  34264: 'ModelTransformation', 34735: 'GeoKeyDirectory', 34736: 'GeoDoubleParams', 34737: 'GeoAsciiParams',
  42112: 'GDAL_METADATA', 42113: 'GDAL_NODATA',
};

export interface TiffEntry {
  readonly tag: number;
  readonly type: number;
  readonly count: number;
  /** Where the value bytes start in the file (inline in the entry or pointed to). */
  readonly at: number;
}

export interface Ifd {
  readonly bytes: Uint8Array;
  readonly view: DataView;
  readonly little: boolean;
  readonly bigTiff: boolean;
  readonly entries: ReadonlyMap<number, TiffEntry>;
  readonly file: string;
}

/** Largest number of directory entries we accept (real files hold a few dozen). */
const MAX_ENTRIES = 4096;

export function readFirstIfd(bytes: Uint8Array, file: string): Ifd {
  const n = bytes.byteLength;
  if (n < 8) throw new InputError(file, `is ${n} bytes long: not a GeoTIFF`);
  const view = new DataView(bytes.buffer, bytes.byteOffset, n);
  const order = view.getUint16(0, false);
  if (order !== 0x4949 && order !== 0x4d4d) throw new InputError(file, 'is not a TIFF file (it does not start with a TIFF header)');
  const little = order === 0x4949;
  const version = view.getUint16(2, little);
  let bigTiff = false;
  let ifdAt: number;
  if (version === 42) ifdAt = view.getUint32(4, little);
  else if (version === 43) {
    if (n < 16) throw new InputError(file, 'is truncated inside its BigTIFF header');
    if (view.getUint16(4, little) !== 8) throw new InputError(file, 'has a BigTIFF header with an offset size other than 8: damaged');
    bigTiff = true;
    ifdAt = u64(view, 8, little);
  } else throw new InputError(file, `has TIFF version ${version} (expected 42, or 43 for BigTIFF): damaged or not a TIFF`);

  const countSize = bigTiff ? 8 : 2;
  const entrySize = bigTiff ? 20 : 12;
  const inline = bigTiff ? 8 : 4;
  if (!(ifdAt >= 8 && ifdAt + countSize <= n)) {
    throw new InputError(file, `points its first image directory at byte ${ifdAt}, outside the file (${n} bytes): truncated or damaged`);
  }
  const count = bigTiff ? u64(view, ifdAt, little) : view.getUint16(ifdAt, little);
  if (count === 0 || count > MAX_ENTRIES) throw new InputError(file, `has an image directory with ${count} entries: damaged`);
  if (ifdAt + countSize + count * entrySize > n) throw new InputError(file, 'is truncated inside its image directory');

  const entries = new Map<number, TiffEntry>();
  for (let k = 0; k < count; k++) {
    const e = ifdAt + countSize + k * entrySize;
    const tag = view.getUint16(e, little);
    const type = view.getUint16(e + 2, little);
    const size = TYPE_SIZE[type] ?? 0;
    if (size === 0) continue;
    const cnt = bigTiff ? u64(view, e + 4, little) : view.getUint32(e + 4, little);
    const total = cnt * size;
    const valueField = e + (bigTiff ? 12 : 8);
    const at = total <= inline ? valueField : bigTiff ? u64(view, valueField, little) : view.getUint32(valueField, little);
    if (!Number.isSafeInteger(total) || at + total > n) {
      if (TAG_NAMES[tag]) throw new InputError(file, `tag ${TAG_NAMES[tag]} points outside the file (${cnt} values at byte ${at}, file is ${n} bytes): truncated or damaged`);
      continue; // a damaged tag we do not use does not stop the read
    }
    if (!entries.has(tag)) entries.set(tag, { tag, type, count: cnt, at });
  }
  return { bytes, view, little, bigTiff, entries, file };
}

function u64(view: DataView, at: number, little: boolean): number {
  const lo = view.getUint32(at + (little ? 0 : 4), little);
  const hi = view.getUint32(at + (little ? 4 : 0), little);
  // Beyond 2^53 no file of ours can reach: return a value every bounds check refuses.
  return hi >= 0x200000 ? Number.MAX_SAFE_INTEGER : hi * 0x1_0000_0000 + lo;
}

function tagName(tag: number): string {
  return TAG_NAMES[tag] ?? `tag ${tag}`;
}

/** The numeric values of a tag (any integer, rational or float type), or undefined when absent. */
export function numbers(ifd: Ifd, tag: number): Float64Array | undefined {
  const e = ifd.entries.get(tag);
  if (!e) return undefined;
  const { view, little } = ifd;
  const out = new Float64Array(e.count);
  const size = TYPE_SIZE[e.type];
  for (let k = 0; k < e.count; k++) {
    const p = e.at + k * size;
    switch (e.type) {
      case 1: case 7: out[k] = view.getUint8(p); break;
      case 6: out[k] = view.getInt8(p); break;
      case 3: out[k] = view.getUint16(p, little); break;
      case 8: out[k] = view.getInt16(p, little); break;
      case 4: case 13: out[k] = view.getUint32(p, little); break;
      case 9: out[k] = view.getInt32(p, little); break;
      case 5: out[k] = view.getUint32(p, little) / view.getUint32(p + 4, little); break;
      case 10: out[k] = view.getInt32(p, little) / view.getInt32(p + 4, little); break;
      case 11: out[k] = view.getFloat32(p, little); break;
      case 12: out[k] = view.getFloat64(p, little); break;
      case 16: case 18: out[k] = u64(view, p, little); break;
      case 17: out[k] = Number(view.getBigInt64(p, little)); break;
      default: throw new InputError(ifd.file, `tag ${tagName(tag)} has text where numbers belong: damaged`);
    }
  }
  return out;
}

/** One number, or the fallback when the tag is absent; refuses an empty or non-finite value. */
export function number(ifd: Ifd, tag: number, fallback?: number): number {
  const v = numbers(ifd, tag);
  if (!v) {
    if (fallback === undefined) throw new InputError(ifd.file, `has no ${tagName(tag)} tag: not a complete TIFF image`);
    return fallback;
  }
  if (v.length === 0 || !Number.isFinite(v[0])) throw new InputError(ifd.file, `tag ${tagName(tag)} holds no usable value: damaged`);
  return v[0];
}

/** Text of an ASCII tag (trailing NULs dropped), or undefined when absent or not text. */
export function text(ifd: Ifd, tag: number): string | undefined {
  const e = ifd.entries.get(tag);
  if (!e || (e.type !== 2 && e.type !== 1 && e.type !== 7)) return undefined;
  let end = e.at + e.count;
  while (end > e.at && ifd.bytes[end - 1] === 0) end--;
  return new TextDecoder('utf-8').decode(ifd.bytes.subarray(e.at, end));
}
