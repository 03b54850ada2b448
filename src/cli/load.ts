/** Reading input files for the CLI: bytes, checksums and the right reader for each extension. */

import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
import { constants, inflateRawSync, inflateSync } from 'node:zlib';
import { basename, extname } from 'node:path';
import { readGeoJson } from '../io/geojson-read.js';
import { InputError } from '../io/errors.js';
import { readGeoTiff, type GridReadOptions } from '../io/geotiff-read.js';
import { readXyz } from '../io/xyz-read.js';
import type { GridInput, VectorInput } from '../pipeline.js';

function bytesOf(path: string): Buffer {
  try {
    if (!statSync(path).isFile()) throw new InputError(basename(path), 'is not a file');
    return readFileSync(path);
  } catch (err) {
    if (err instanceof InputError) throw err;
    throw new InputError(path, `cannot be read (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
  }
}

/**
 * Node's native zlib for DEFLATE blocks: several times faster than the portable decoder, and
 * bounded the same way (no more than the block's declared size is produced).
 */
export function nodeInflate(input: Uint8Array, out: Uint8Array): number {
  const zlibHeader = input.length >= 2 && (input[0] & 0x0f) === 8 && ((input[0] << 8) | input[1]) % 31 === 0;
  const opts = { maxOutputLength: out.length, finishFlush: constants.Z_SYNC_FLUSH };
  let got: Buffer;
  try {
    got = zlibHeader ? inflateSync(input, opts) : inflateRawSync(input, opts);
  } catch (err) {
    // more than the block's size: damaged
    if ((err as NodeJS.ErrnoException).code === 'ERR_BUFFER_TOO_LARGE') return out.length + 1;
    throw err;
  }
  out.set(got.subarray(0, out.length));
  return got.length;
}

export async function loadGrid(path: string, options: GridReadOptions & { assumeCrs?: string }): Promise<GridInput> {
  const bytes = bytesOf(path);
  const name = basename(path);
  const ext = extname(path).toLowerCase();
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  let result;
  if (ext === '.tif' || ext === '.tiff' || ext === '.gtiff') result = await readGeoTiff(bytes, name, { ...options, inflate: nodeInflate });
  else if (['.xyz', '.txt', '.csv', '.dat', '.asc'].includes(ext)) result = readXyz(bytes.toString('utf8'), name, options);
  else throw new InputError(name, `has extension "${ext}": Taperline reads GeoTIFF (.tif) and XYZ text (.xyz, .txt, .csv, .dat)`);
  return { name, bytes: bytes.length, sha256, grid: result.grid, report: result.report };
}

export function loadVectors(path: string): VectorInput {
  const bytes = bytesOf(path);
  const name = basename(path);
  return { name, bytes: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex'), set: readGeoJson(bytes.toString('utf8'), name) };
}
