/**
 * Block decoders for TIFF strips and tiles, each writing into a buffer of exactly the block's
 * declared size: a damaged block can neither allocate more than that nor run longer than its input.
 *
 * LZW (TIFF 6.0 §13: MSB-first codes of 9–12 bits, ClearCode 256, EndOfInformation 257, the code
 * width growing one code early as libtiff writes it), PackBits (TIFF 6.0 §9), DEFLATE (zlib stream,
 * RFC 1950/1951, through fflate) and ZSTD (RFC 8878, through the zstd reference decoder compiled to
 * WebAssembly, given the output size so it never grows its own buffers).
 */

import { inflateSync, unzlibSync } from 'fflate';
import { ZSTDDecoder } from 'zstddec';

/** A block that cannot be decoded; the reader adds the file and the block's number. */
export class BlockError extends Error {}

/** Decode TIFF LZW into `out`; returns the number of bytes written. */
export function lzwDecode(input: Uint8Array, out: Uint8Array): number {
  const start = new Int32Array(4096);
  const length = new Int32Array(4096);
  const nBits = input.length * 8;
  let bit = 0;
  let width = 9;
  let next = 258;
  let o = 0;
  let prevStart = -1;
  let prevLen = 0;
  while (bit + width <= nBits) {
    // Read `width` bits MSB-first.
    let code = 0;
    for (let k = 0; k < width; k++, bit++) code = (code << 1) | ((input[bit >> 3] >> (7 - (bit & 7))) & 1);
    if (code === 257) break;
    if (code === 256) {
      width = 9;
      next = 258;
      prevStart = -1;
      continue;
    }
    const at = o;
    let len: number;
    if (code < 256) {
      if (o >= out.length) throw new BlockError('decodes to more bytes than declared');
      out[o++] = code;
      len = 1;
    } else if (prevStart < 0) {
      throw new BlockError(`LZW code ${code} before any string`);
    } else if (code < next) {
      len = length[code];
      if (o + len > out.length) throw new BlockError('decodes to more bytes than declared');
      out.copyWithin(o, start[code], start[code] + len);
      o += len;
    } else if (code === next) {
      len = prevLen + 1;
      if (o + len > out.length) throw new BlockError('decodes to more bytes than declared');
      out.copyWithin(o, prevStart, prevStart + prevLen);
      out[o + prevLen] = out[prevStart];
      o += len;
    } else {
      throw new BlockError(`LZW code ${code} beyond the table (${next})`);
    }
    if (prevStart >= 0 && next < 4096) {
      // The previous string plus this string's first byte: contiguous in the output.
      start[next] = prevStart;
      length[next] = prevLen + 1;
      next++;
      if (next >= (1 << width) - 1 && width < 12) width++;
    }
    prevStart = at;
    prevLen = len;
  }
  return o;
}

/** Decode PackBits into `out`; returns the number of bytes written. */
export function packBitsDecode(input: Uint8Array, out: Uint8Array): number {
  let o = 0;
  let k = 0;
  while (k < input.length && o < out.length) {
    const n = (input[k++] << 24) >> 24;
    if (n >= 0) {
      const len = n + 1;
      if (k + len > input.length || o + len > out.length) throw new BlockError('a PackBits run reaches past the block');
      out.set(input.subarray(k, k + len), o);
      k += len;
      o += len;
    } else if (n !== -128) {
      const len = 1 - n;
      if (k >= input.length || o + len > out.length) throw new BlockError('a PackBits run reaches past the block');
      out.fill(input[k++], o, o + len);
      o += len;
    }
  }
  return o;
}

/** Decode a zlib (or, failing its header, raw deflate) stream into `out`; returns the bytes written. */
export function deflateDecode(input: Uint8Array, out: Uint8Array): number {
  // fflate given an output buffer writes within it and stops; a block that would need more comes
  // back as long as the buffer, which only the size check can catch, as with any damaged data.
  const zlibHeader = input.length >= 2 && (input[0] & 0x0f) === 8 && ((input[0] << 8) | input[1]) % 31 === 0;
  const got = zlibHeader ? unzlibSync(input, { out }) : inflateSync(input, { out });
  return got.length;
}

let zstd: ZSTDDecoder | undefined;
let zstdReady: Promise<void> | undefined;

/** Start the ZSTD decoder (a WebAssembly module inside the package, no network). */
export function zstdInit(): Promise<void> {
  zstd ??= new ZSTDDecoder();
  zstdReady ??= zstd.init();
  return zstdReady;
}

/** Decode a ZSTD frame of known decoded size (call zstdInit first); returns its bytes. */
export function zstdDecode(input: Uint8Array, size: number): Uint8Array {
  if (!zstd) throw new BlockError('ZSTD decoder not started');
  return zstd.decode(input, size);
}
