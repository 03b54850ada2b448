/**
 * The first band of a TIFF image, decoded block by block into one typed array of its own sample
 * type (row-major, row 0 first). Steps per block: decode into a reused buffer of the block's exact
 * size, undo the predictor (TIFF 6.0 §14 horizontal differencing; the floating-point predictor of
 * Adobe's Technical Note 3, 2005: byte planes, most significant first, differenced), then copy
 * sample 0 of each pixel into place, swapping bytes from a big-endian file.
 */

import { InputError } from '../errors.js';
import { BlockError, deflateDecode, lzwDecode, packBitsDecode, zstdDecode, zstdInit } from './codecs.js';
import type { Ifd } from './ifd.js';
import type { TiffLayout } from './layout.js';

export type BandArray = Uint8Array | Uint16Array | Uint32Array | Int8Array | Int16Array | Int32Array | Float32Array | Float64Array;

if (new Uint8Array(Uint16Array.of(1).buffer)[0] !== 1) throw new Error('Taperline assumes a little-endian platform');

function allocate(layout: TiffLayout, n: number): BandArray {
  const { kind, bitsPerSample: b } = layout;
  if (kind === 'float') return b === 32 ? new Float32Array(n) : new Float64Array(n);
  if (kind === 'int') return b === 8 ? new Int8Array(n) : b === 16 ? new Int16Array(n) : new Int32Array(n);
  return b === 8 ? new Uint8Array(n) : b === 16 ? new Uint16Array(n) : new Uint32Array(n);
}

/**
 * Decode band 1. `sparseFill` is the value of a block the file leaves out (offset and byte count
 * zero, as GDAL writes empty blocks): its no-data value, else 0. `inflate` may be a faster native
 * DEFLATE decoder (the CLI passes Node's zlib); it must write within `out` as fflate's does.
 */
/** A DEFLATE (zlib) block decoder writing into `out`, returning the bytes written. */
export type Inflate = (input: Uint8Array, out: Uint8Array) => number;

export async function decodeBand(ifd: Ifd, layout: TiffLayout, sparseFill: number, inflate: Inflate = deflateDecode): Promise<BandArray> {
  const { width, height, blockWidth, blockHeight, blocksAcross, compression, predictor, tiled } = layout;
  const bps = layout.bitsPerSample / 8;
  const spp = layout.planar === 1 ? layout.samplesPerPixel : 1;
  const pixelBytes = bps * spp;
  const out = allocate(layout, width * height);
  const outBytes = new Uint8Array(out.buffer);
  const block = new Uint8Array(blockWidth * blockHeight * pixelBytes);
  if (compression === 50000) await zstdInit();
  const what = tiled ? 'tile' : 'strip';
  // the common layout (Float32, one sample, floating-point predictor): rows go straight into the band
  // (the host is little-endian: checked when this module loads)
  const words = layout.kind === 'float' && bps === 4 && spp === 1 && predictor === 3 ? new Uint32Array(out.buffer) : null;

  for (let b = 0; b < layout.offsets.length; b++) {
    const bx = b % blocksAcross;
    const by = Math.floor(b / blocksAcross);
    const rows = tiled ? blockHeight : Math.min(blockHeight, height - by * blockHeight);
    const expected = blockWidth * rows * pixelBytes;
    const off = layout.offsets[b];
    const cnt = layout.byteCounts[b];
    const x0 = bx * blockWidth;
    const y0 = by * blockHeight;
    const cols = Math.min(blockWidth, width - x0);
    const usedRows = Math.min(rows, height - y0);
    if (cnt === 0) {
      for (let r = 0; r < usedRows; r++) out.fill(sparseFill, (y0 + r) * width + x0, (y0 + r) * width + x0 + cols);
      continue;
    }
    const data = ifd.bytes.subarray(off, off + cnt);
    const buf = block.subarray(0, expected);
    try {
      let got: number;
      if (compression === 1) {
        buf.set(data.subarray(0, expected));
        got = Math.min(cnt, expected);
      } else if (compression === 5) got = lzwDecode(data, buf);
      else if (compression === 8 || compression === 32946) got = inflate(data, buf);
      else if (compression === 32773) got = packBitsDecode(data, buf);
      else {
        const z = zstdDecode(data, expected);
        got = z.length;
        if (got === expected) buf.set(z);
      }
      if (got !== expected) throw new BlockError(`decodes to ${got} bytes where ${expected} are declared`);
    } catch (err) {
      const why = err instanceof BlockError ? err.message : `${err instanceof Error ? err.message : String(err)}`;
      throw new InputError(ifd.file, `${what} ${b} cannot be decoded (${why || 'damaged data'}): the file is damaged or truncated`);
    }
    if (words) {
      floatPredictorInto(buf, blockWidth, usedRows, words, y0 * width + x0, width, cols);
      continue;
    }
    let native = ifd.little;
    if (predictor === 2) undoHorizontal(buf, rows, blockWidth * spp, bps, spp, ifd.little);
    else if (predictor === 3) {
      undoFloatingPoint(buf, rows, blockWidth * spp, bps, spp);
      native = true;
    }
    place(buf, outBytes, { x0, y0, cols, usedRows, blockWidth, width, bps, pixelBytes, native });
  }
  return out;
}

/**
 * The floating-point predictor for one-sample Float32 blocks, undone row by row straight into the
 * band: the byte differences summed, then the four byte planes (most
 * significant first) joined into little-endian words at their place in the band. Padding rows and columns of an
 * edge block are not placed.
 */
function floatPredictorInto(buf: Uint8Array, blockWidth: number, usedRows: number, words: Uint32Array, start: number, width: number, cols: number): void {
  const rowBytes = blockWidth * 4;
  for (let r = 0; r < usedRows; r++) {
    const o = r * rowBytes;
    let acc = buf[o];
    for (let k = o + 1; k < o + rowBytes; k++) buf[k] = acc = (acc + buf[k]) & 0xff;
    const p1 = o + blockWidth;
    const p2 = p1 + blockWidth;
    const p3 = p2 + blockWidth;
    const d = start + r * width;
    for (let c = 0; c < cols; c++) words[d + c] = ((buf[o + c] << 24) | (buf[p1 + c] << 16) | (buf[p2 + c] << 8) | buf[p3 + c]) >>> 0;
  }
}

/** Copy sample 0 of each pixel of a decoded block into the band, byte-swapping when needed. */
function place(
  buf: Uint8Array,
  outBytes: Uint8Array,
  p: { x0: number; y0: number; cols: number; usedRows: number; blockWidth: number; width: number; bps: number; pixelBytes: number; native: boolean },
): void {
  const { x0, y0, cols, usedRows, blockWidth, width, bps, pixelBytes, native } = p;
  for (let r = 0; r < usedRows; r++) {
    const src = r * blockWidth * pixelBytes;
    const dst = ((y0 + r) * width + x0) * bps;
    if (native && pixelBytes === bps) {
      outBytes.set(buf.subarray(src, src + cols * bps), dst);
      continue;
    }
    for (let c = 0; c < cols; c++) {
      const s = src + c * pixelBytes;
      const d = dst + c * bps;
      if (native) for (let k = 0; k < bps; k++) outBytes[d + k] = buf[s + k];
      else for (let k = 0; k < bps; k++) outBytes[d + k] = buf[s + bps - 1 - k];
    }
  }
}

/** TIFF predictor 2: each sample is stored as its difference from the same sample one pixel left. */
function undoHorizontal(buf: Uint8Array, rows: number, rowSamples: number, bps: number, spp: number, little: boolean): void {
  const view = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
  for (let r = 0; r < rows; r++) {
    const row = r * rowSamples * bps;
    for (let s = spp; s < rowSamples; s++) {
      const at = row + s * bps;
      const left = at - spp * bps;
      if (bps === 1) buf[at] = (buf[at] + buf[left]) & 0xff;
      else if (bps === 2) view.setUint16(at, view.getUint16(at, little) + view.getUint16(left, little), little);
      else view.setUint32(at, (view.getUint32(at, little) + view.getUint32(left, little)) >>> 0, little);
    }
  }
}

/** Floating-point predictor: bytes differenced along the row, then regrouped from byte planes. */
function undoFloatingPoint(buf: Uint8Array, rows: number, rowSamples: number, bps: number, spp: number): void {
  // (one-sample Float32 blocks go through floatPredictorInto instead)
  const rowBytes = rowSamples * bps;
  const tmp = new Uint8Array(rowBytes);
  for (let r = 0; r < rows; r++) {
    const row = buf.subarray(r * rowBytes, (r + 1) * rowBytes);
    for (let k = spp; k < rowBytes; k++) row[k] = (row[k] + row[k - spp]) & 0xff;
    // Plane k holds byte k (most significant first) of every sample; write little-endian.
    for (let k = 0; k < bps; k++) {
      const plane = k * rowSamples;
      const to = bps - 1 - k;
      for (let s = 0; s < rowSamples; s++) tmp[s * bps + to] = row[plane + s];
    }
    row.set(tmp);
  }
}
