/**
 * How the first image's pixels are laid out — size, sample type, codec, strips or tiles — checked
 * against the file's length and a memory budget before a single pixel buffer is allocated.
 *
 * The checks that refuse before allocating:
 *  - every strip or tile the first band needs is listed, and lies inside the file;
 *  - an uncompressed block holds at least its declared bytes;
 *  - a compressed block cannot expand beyond its codec's largest possible ratio, so a few kilobytes
 *    declaring gigabytes are refused at once (ratios below; ZSTD has no useful bound and is instead
 *    decoded into a buffer of exactly the block's size);
 *  - the decoded band plus its conversion to Float32 fit the memory budget.
 */

import { InputError } from '../errors.js';
import { number, numbers, type Ifd } from './ifd.js';

export type SampleKind = 'uint' | 'int' | 'float';

export interface TiffLayout {
  readonly width: number;
  readonly height: number;
  readonly samplesPerPixel: number;
  readonly bitsPerSample: number;
  readonly kind: SampleKind;
  readonly compression: number;
  readonly predictor: number;
  readonly planar: 1 | 2;
  readonly tiled: boolean;
  /** Block size in pixels (a strip is `width` × rows-per-strip). */
  readonly blockWidth: number;
  readonly blockHeight: number;
  readonly blocksAcross: number;
  readonly blocksDown: number;
  /** Offsets and byte counts of the first band's blocks, row-major. */
  readonly offsets: Float64Array;
  readonly byteCounts: Float64Array;
}

/** Codec names for messages, and the largest expansion each can produce. */
export const CODECS: Record<number, { name: string; maxRatio: number }> = {
  1: { name: 'none', maxRatio: 1 },
  5: { name: 'LZW', maxRatio: 2730 }, // a 12-bit code can stand for at most 4 096 bytes (TIFF 6.0 §13): 4096 / 1.5
  8: { name: 'DEFLATE', maxRatio: 1032 }, // deflate's limit, 258 bytes per 2-bit match (RFC 1951; zlib's technical notes, from memory)
  32946: { name: 'DEFLATE', maxRatio: 1032 },
  32773: { name: 'PackBits', maxRatio: 64 }, // two bytes stand for at most 128 (TIFF 6.0 §9)
  50000: { name: 'ZSTD', maxRatio: Infinity },
};

const UNSUPPORTED: Record<number, string> = {
  2: 'CCITT', 3: 'CCITT T.4', 4: 'CCITT T.6', 6: 'old JPEG', 7: 'JPEG', 34712: 'JPEG 2000', 34887: 'LERC', 34925: 'LZMA', 50001: 'WebP', 50002: 'JPEG XL',
};

/** Default memory a grid file may take while read: a choice that leaves a 4 GB browser tab room for the derived grids. */
export const DEFAULT_READ_BUDGET_MB = 1024;

export function readLayout(ifd: Ifd, budgetMB = DEFAULT_READ_BUDGET_MB): TiffLayout {
  const file = ifd.file;
  const width = number(ifd, 256);
  const height = number(ifd, 257);
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    throw new InputError(file, `declares an image of ${width} × ${height} pixels: damaged`);
  }
  const samplesPerPixel = number(ifd, 277, 1);
  if (!Number.isInteger(samplesPerPixel) || samplesPerPixel < 1 || samplesPerPixel > 1024) throw new InputError(file, `declares ${samplesPerPixel} samples per pixel: damaged`);
  const bits = numbers(ifd, 258) ?? Float64Array.of(1);
  if (bits.length === 0) throw new InputError(file, 'has an empty BitsPerSample tag: damaged');
  const bitsPerSample = bits[0];
  for (const b of bits) if (b !== bitsPerSample) throw new InputError(file, 'has bands of different bit depths: re-save it with one sample type (gdal_translate -ot Float32)');
  const format = number(ifd, 339, 1);
  const kind: SampleKind | undefined = format === 1 ? 'uint' : format === 2 ? 'int' : format === 3 ? 'float' : undefined;
  const typeOk = kind === 'float' ? bitsPerSample === 32 || bitsPerSample === 64 : kind !== undefined && [8, 16, 32].includes(bitsPerSample);
  if (!kind || !typeOk) {
    throw new InputError(file, `holds ${bitsPerSample}-bit samples of format ${format}; Taperline reads 8/16/32-bit integers and 32/64-bit floats (convert with gdal_translate -ot Float32)`);
  }

  const compression = number(ifd, 259, 1);
  if (!CODECS[compression]) {
    const what = UNSUPPORTED[compression] ? `${UNSUPPORTED[compression]} compression` : `compression code ${compression}`;
    throw new InputError(file, `uses ${what}, which Taperline does not decode; re-save it with gdal_translate -co COMPRESS=DEFLATE`);
  }
  const predictor = number(ifd, 317, 1);
  if (predictor !== 1 && predictor !== 2 && predictor !== 3) throw new InputError(file, `declares predictor ${predictor} (TIFF knows 1, 2 and 3): damaged`);
  if (predictor === 3 && kind !== 'float') throw new InputError(file, 'declares the floating-point predictor on integer samples: damaged');
  const planarValue = number(ifd, 284, 1);
  if (planarValue !== 1 && planarValue !== 2) throw new InputError(file, `declares planar configuration ${planarValue}: damaged`);
  const planar = planarValue as 1 | 2;

  const tiled = ifd.entries.has(322) || ifd.entries.has(324);
  let blockWidth: number;
  let blockHeight: number;
  if (tiled) {
    blockWidth = number(ifd, 322);
    blockHeight = number(ifd, 323);
  } else {
    blockWidth = width;
    const rps = number(ifd, 278, height);
    blockHeight = Math.min(rps, height); // 2^32 − 1 means "one strip"
  }
  if (!Number.isInteger(blockWidth) || !Number.isInteger(blockHeight) || blockWidth < 1 || blockHeight < 1) {
    throw new InputError(file, `declares ${tiled ? 'tiles' : 'strips'} of ${blockWidth} × ${blockHeight} pixels: damaged`);
  }
  const blocksAcross = Math.ceil(width / blockWidth);
  const blocksDown = Math.ceil(height / blockHeight);
  const perBand = blocksAcross * blocksDown;
  // Memory: the decoded band in its own type, its Float32 copy, and one block buffer.
  const bytesPerSample = bitsPerSample / 8;
  const pixelBytes = planar === 1 ? bytesPerSample * samplesPerPixel : bytesPerSample;
  const blockBytes = blockWidth * blockHeight * pixelBytes;
  const need = width * height * (bytesPerSample + 4) + blockBytes;
  if (need > budgetMB * 1024 * 1024) {
    throw new InputError(file, `declares ${width} × ${height} cells (${(need / 2 ** 20).toFixed(0)} MB to read), beyond the ${budgetMB} MB read budget`);
  }

  const offsetsAll = numbers(ifd, tiled ? 324 : 273);
  const countsAll = numbers(ifd, tiled ? 325 : 279);
  const what = tiled ? 'tile' : 'strip';
  if (!offsetsAll || !countsAll) throw new InputError(file, `lists no ${what} offsets or byte counts: not a complete TIFF image`);
  if (offsetsAll.length < perBand || countsAll.length < perBand) {
    throw new InputError(file, `lists ${Math.min(offsetsAll.length, countsAll.length)} ${what}s where its size needs ${perBand}: damaged`);
  }
  const offsets = offsetsAll.slice(0, perBand);
  const byteCounts = countsAll.slice(0, perBand);

  const fileLength = ifd.bytes.byteLength;
  const codec = CODECS[compression];
  for (let b = 0; b < perBand; b++) {
    const off = offsets[b];
    const cnt = byteCounts[b];
    if (!Number.isInteger(off) || !Number.isInteger(cnt) || off < 0 || cnt < 0 || off + cnt > fileLength) {
      throw new InputError(file, `${what} ${b} lies outside the file (bytes ${off}–${off + cnt} of ${fileLength}): truncated or damaged`);
    }
    if (off === 0 && cnt === 0) continue; // a block the writer left out (sparse file): no data
    const rows = tiled ? blockHeight : Math.min(blockHeight, height - Math.floor(b / blocksAcross) * blockHeight);
    const expected = blockWidth * rows * pixelBytes;
    if (cnt * codec.maxRatio < expected) {
      throw new InputError(
        file,
        compression === 1
          ? `${what} ${b} holds ${cnt} bytes where ${expected} are declared: truncated or damaged`
          : `${what} ${b} holds ${cnt} ${codec.name} bytes, too few to expand to the ${expected} bytes declared: damaged`,
      );
    }
  }
  return { width, height, samplesPerPixel, bitsPerSample, kind, compression, predictor, planar, tiled, blockWidth, blockHeight, blocksAcross, blocksDown, offsets, byteCounts };
}
