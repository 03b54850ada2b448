/**
 * A sweep part as one file, so realisations k…m run by one job can be merged with the others'
 * (uncertainty/summary.ts mergeParts). Layout: the ASCII magic "TAPERLINE-SWEEP-PART 1\n", a
 * little-endian uint32 header length, the header as UTF-8 JSON (key, range, grid size, the records'
 * scalar fields), then the zlib-compressed arrays in a fixed order (per realisation: thickness offsets
 * Int16, cells UInt8, widths Float32, areas Float64 and licence areas Float64; then per line the
 * reach and no-data counts, per domain code the counts, all UInt16), all little-endian.
 */

import { unzlibSync, zlibSync } from 'fflate';
import { NAMED_LINES, type NamedLine } from '../boundaries/fields.js';
import { DOMAIN_CODES, type RealisationRecord, type SweepPart } from '../uncertainty/sweep.js';
import { InputError } from './errors.js';

const MAGIC = 'TAPERLINE-SWEEP-PART 1\n';
if (new Uint8Array(new Uint16Array([1]).buffer)[0] !== 1) throw new Error('sweep parts are written on little-endian hosts only');

type Scalars = Omit<RealisationRecord, 'widths' | 'areas' | 'licenceAreas'> & { hasLicence: boolean };

const bytesOf = (a: ArrayBufferView) => new Uint8Array(a.buffer, a.byteOffset, a.byteLength);

export function writeSweepPart(p: SweepPart): Uint8Array {
  const S = p.records[0]?.widths.length ?? 0;
  const header = {
    key: p.key, start: p.start, end: p.end, nx: p.nx, ny: p.ny, stations: S,
    records: p.records.map(({ widths: _w, areas: _a, licenceAreas, ...rest }): Scalars => ({ ...rest, hasLicence: licenceAreas !== null })),
  };
  const arrays: ArrayBufferView[] = [];
  p.records.forEach((r, k) => {
    arrays.push(p.delta[k], p.cells[k], r.widths, r.areas);
    if (r.licenceAreas) arrays.push(r.licenceAreas);
  });
  for (const l of NAMED_LINES) arrays.push(p.reach[l], p.noData[l]);
  for (const c of p.domainCount) arrays.push(c);
  let total = 0;
  for (const a of arrays) total += a.byteLength;
  const raw = new Uint8Array(total);
  let at = 0;
  for (const a of arrays) {
    raw.set(bytesOf(a), at);
    at += a.byteLength;
  }
  const head = new TextEncoder().encode(MAGIC + '\0\0\0\0' + JSON.stringify(header));
  const len = head.length - MAGIC.length - 4;
  new DataView(head.buffer).setUint32(MAGIC.length, len, true);
  const body = zlibSync(raw, { level: 1 });
  const out = new Uint8Array(head.length + body.length);
  out.set(head);
  out.set(body, head.length);
  return out;
}

export function readSweepPart(bytes: Uint8Array, name: string): SweepPart {
  const magic = new TextDecoder().decode(bytes.subarray(0, MAGIC.length));
  if (magic !== MAGIC) throw new InputError(name, 'is not a Taperline sweep part (written by synth --realisation-range)');
  const len = new DataView(bytes.buffer, bytes.byteOffset + MAGIC.length, 4).getUint32(0, true);
  const start = MAGIC.length + 4;
  if (start + len > bytes.length) throw new InputError(name, 'is cut short (its header runs past the end of the file)');
  let header: { key: string; start: number; end: number; nx: number; ny: number; stations: number; records: Scalars[] };
  try {
    header = JSON.parse(new TextDecoder().decode(bytes.subarray(start, start + len)));
  } catch {
    throw new InputError(name, 'has a damaged header');
  }
  let raw: Uint8Array;
  try {
    raw = unzlibSync(bytes.subarray(start + len));
  } catch {
    throw new InputError(name, 'has damaged data (the compressed arrays do not decompress)');
  }
  const n = header.nx * header.ny;
  const S = header.stations;
  let at = 0;
  const take = <T extends ArrayBufferView>(count: number, size: number, make: (b: ArrayBuffer) => T): T => {
    const bytesNeeded = count * size;
    if (at + bytesNeeded > raw.length) throw new InputError(name, 'is cut short (fewer arrays than its header lists)');
    const copy = raw.slice(at, at + bytesNeeded);
    at += bytesNeeded;
    return make(copy.buffer);
  };
  const delta: Int16Array[] = [];
  const cells: Uint8Array[] = [];
  const records: RealisationRecord[] = header.records.map(({ hasLicence, ...rest }) => {
    delta.push(take(n, 2, (b) => new Int16Array(b)));
    cells.push(take(n, 1, (b) => new Uint8Array(b)));
    const widths = take(S, 4, (b) => new Float32Array(b));
    const areas = take(DOMAIN_CODES, 8, (b) => new Float64Array(b));
    const licenceAreas = hasLicence ? take(DOMAIN_CODES, 8, (b) => new Float64Array(b)) : null;
    return { ...rest, widths, areas, licenceAreas };
  });
  const reach = {} as Record<NamedLine, Uint16Array>;
  const noData = {} as Record<NamedLine, Uint16Array>;
  for (const l of NAMED_LINES) {
    reach[l] = take(n, 2, (b) => new Uint16Array(b));
    noData[l] = take(n, 2, (b) => new Uint16Array(b));
  }
  const domainCount = Array.from({ length: DOMAIN_CODES }, () => take(n, 2, (b) => new Uint16Array(b)));
  if (at !== raw.length) throw new InputError(name, 'holds more data than its header lists');
  return { key: header.key, start: header.start, end: header.end, nx: header.nx, ny: header.ny, records, delta, cells, reach, noData, domainCount };
}
