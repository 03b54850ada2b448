/**
 * Grid → GeoTIFF bytes (classic little-endian TIFF, uncompressed strips), written directly so that
 * every tag is under our control (geotiff.js's writer corrupts signed integers and cannot compress;
 * see STACK.md). Float32 for measured grids, UInt8 for class grids. GDAL reads these back
 * bit-identically (tests/io/geotiff-write.test.ts checks it with gdal_translate).
 *
 * GeoTIFF 1.0 keys written: GTModelType, GTRasterType, GTCitation, GeographicType or ProjectedCSType.
 * A CRS without an EPSG code is written as user-defined (32767) with its proj4 string in the
 * citation: GDAL will not recognise it, and the summary says so.
 */

import type { GridGeometry } from '../grid/geometry.js';

export interface TiffWriteOptions {
  /** Written as GDAL_NODATA; 'nan' for Float32 grids whose no data is NaN. */
  noData?: number | 'nan';
  /** GDAL unit type of band 1, e.g. "m". */
  unit?: string;
  /** Free-text description of band 1 (what the grid holds). */
  description?: string;
  /** TIFF Software tag: the program and version that made the file (provenance). */
  software?: string;
  /** TIFF DateTime tag, "YYYY:MM:DD HH:MM:SS" (the caller supplies the time; the core reads no clock). */
  dateTime?: string;
}

type Sample = Float32Array | Uint8Array;

const SHORT = 3;
const LONG = 4;
const ASCII = 2;
const DOUBLE = 12;

interface Entry {
  tag: number;
  type: number;
  values: number[] | string;
}

export function writeGeoTiff(geometry: GridGeometry, data: Sample, options: TiffWriteOptions = {}): Uint8Array {
  const { nx, ny } = geometry;
  if (data.length !== nx * ny) throw new Error(`data length ${data.length} does not match ${nx} × ${ny}`);
  const isFloat = data instanceof Float32Array;
  const bytesPerSample = isFloat ? 4 : 1;

  // Rows must run north to south in a GeoTIFF with a plain pixel scale; flip grids stored south-up.
  const flip = geometry.dy > 0;
  const dyAbs = Math.abs(geometry.dy);
  const yTop = flip ? geometry.y0 + (ny - 1) * geometry.dy : geometry.y0;
  const half = geometry.registration === 'area' ? 0.5 : 0;
  const tieX = geometry.x0 - half * geometry.dx;
  const tieY = yTop + half * dyAbs;

  const rowBytes = nx * bytesPerSample;
  const rowsPerStrip = Math.max(1, Math.min(ny, Math.floor(262144 / rowBytes)));
  const nStrips = Math.ceil(ny / rowsPerStrip);

  const crs = geometry.crs;
  const geographic = crs.units === 'degree';
  const code = crs.epsg ?? 32767;
  const citation = `${crs.epsg ? crs.name : crs.proj4}|`;
  const geoKeys = [
    1, 1, 0, 4,
    1024, 0, 1, geographic ? 2 : 1,
    1025, 0, 1, geometry.registration === 'area' ? 1 : 2,
    1026, 34737, citation.length, 0,
    geographic ? 2048 : 3072, 0, 1, code,
  ];

  const entries: Entry[] = [
    { tag: 256, type: LONG, values: [nx] },
    { tag: 257, type: LONG, values: [ny] },
    { tag: 258, type: SHORT, values: [bytesPerSample * 8] },
    { tag: 259, type: SHORT, values: [1] },
    { tag: 262, type: SHORT, values: [1] },
    { tag: 273, type: LONG, values: new Array(nStrips).fill(0) },
    { tag: 277, type: SHORT, values: [1] },
    { tag: 278, type: LONG, values: [rowsPerStrip] },
    { tag: 279, type: LONG, values: Array.from({ length: nStrips }, (_, s) => Math.min(rowsPerStrip, ny - s * rowsPerStrip) * rowBytes) },
    { tag: 284, type: SHORT, values: [1] },
    ...(options.software ? [{ tag: 305, type: ASCII, values: options.software }] : []),
    ...(options.dateTime ? [{ tag: 306, type: ASCII, values: options.dateTime }] : []),
    { tag: 339, type: SHORT, values: [isFloat ? 3 : 1] },
    { tag: 33550, type: DOUBLE, values: [geometry.dx, dyAbs, 0] },
    { tag: 33922, type: DOUBLE, values: [0, 0, 0, tieX, tieY, 0] },
    { tag: 34735, type: SHORT, values: geoKeys },
    { tag: 34737, type: ASCII, values: citation },
  ];
  const items: string[] = [];
  if (options.unit) items.push(`<Item name="UNITTYPE" sample="0" role="unittype">${xml(options.unit)}</Item>`);
  if (options.description) items.push(`<Item name="DESCRIPTION" sample="0" role="description">${xml(options.description)}</Item>`);
  if (items.length) entries.push({ tag: 42112, type: ASCII, values: `<GDALMetadata>${items.join('')}</GDALMetadata>` });
  if (options.noData !== undefined) entries.push({ tag: 42113, type: ASCII, values: String(options.noData) });

  // Layout: header (8) | IFD | out-of-line values | pixel data.
  const ifdSize = 2 + entries.length * 12 + 4;
  let extra = 0;
  const extraOffsets: number[] = [];
  for (const e of entries) {
    const size = byteSize(e);
    extraOffsets.push(size > 4 ? extra : -1);
    if (size > 4) extra += size + (size % 2);
  }
  const ifdOffset = 8;
  const extraStart = ifdOffset + ifdSize;
  const dataStart = extraStart + extra + ((extraStart + extra) % 8 === 0 ? 0 : 8 - ((extraStart + extra) % 8));
  const total = dataStart + ny * rowBytes;
  const strips = entries.find((e) => e.tag === 273)!;
  strips.values = Array.from({ length: nStrips }, (_, s) => dataStart + s * rowsPerStrip * rowBytes);
  if (total > 0xffffffff) throw new Error('grid too large for a classic TIFF (over 4 GB)');

  const out = new Uint8Array(total);
  const dv = new DataView(out.buffer);
  out[0] = 0x49;
  out[1] = 0x49;
  dv.setUint16(2, 42, true);
  dv.setUint32(4, ifdOffset, true);
  dv.setUint16(ifdOffset, entries.length, true);
  entries.forEach((e, idx) => {
    const p = ifdOffset + 2 + idx * 12;
    const count = typeof e.values === 'string' ? e.values.length + 1 : e.values.length;
    dv.setUint16(p, e.tag, true);
    dv.setUint16(p + 2, e.type, true);
    dv.setUint32(p + 4, count, true);
    const inline = extraOffsets[idx] < 0;
    const at = inline ? p + 8 : extraStart + extraOffsets[idx];
    if (!inline) dv.setUint32(p + 8, at, true);
    writeValues(dv, out, at, e);
  });
  dv.setUint32(ifdOffset + 2 + entries.length * 12, 0, true);

  // Pixel data, little-endian; rows flipped where the grid runs south-up.
  if (isFloat) {
    const f = data as Float32Array;
    for (let r = 0; r < ny; r++) {
      const srcRow = flip ? ny - 1 - r : r;
      let p = dataStart + r * rowBytes;
      for (let i = 0; i < nx; i++, p += 4) dv.setFloat32(p, f[srcRow * nx + i], true);
    }
  } else {
    for (let r = 0; r < ny; r++) {
      const srcRow = flip ? ny - 1 - r : r;
      out.set((data as Uint8Array).subarray(srcRow * nx, srcRow * nx + nx), dataStart + r * rowBytes);
    }
  }
  return out;
}

function byteSize(e: Entry): number {
  if (typeof e.values === 'string') return e.values.length + 1;
  return e.values.length * (e.type === SHORT ? 2 : e.type === LONG ? 4 : 8);
}

function writeValues(dv: DataView, out: Uint8Array, at: number, e: Entry): void {
  if (typeof e.values === 'string') {
    for (let k = 0; k < e.values.length; k++) { const c = e.values.charCodeAt(k); out[at + k] = c < 128 ? c : 63; }
    out[at + e.values.length] = 0;
    return;
  }
  e.values.forEach((v, k) => {
    if (e.type === SHORT) dv.setUint16(at + 2 * k, v, true);
    else if (e.type === LONG) dv.setUint32(at + 4 * k, v, true);
    else dv.setFloat64(at + 8 * k, v, true);
  });
}

function xml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}
