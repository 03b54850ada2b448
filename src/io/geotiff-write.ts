/**
 * Grid → GeoTIFF bytes, written directly so that every tag is under our control (geotiff.js's writer
 * corrupts signed integers and cannot compress; see STACK.md). Float32 for measured grids, UInt8 for
 * class grids. GDAL reads the samples back bit-identically (tests/io/geotiff-write.test.ts).
 *
 * Layout: a cloud-optimized GeoTIFF (the COG layout GDAL's validate_cloud_optimized_geotiff.py checks):
 * classic little-endian TIFF, the main IFD at byte 8 followed by the IFDs of the overviews by
 * decreasing size, then their values, then the tile data from the smallest overview to the full
 * resolution, tiles in row-major order. 256 × 256 tiles, DEFLATE (zlib, fflate) with the floating-point
 * predictor (3, TIFF Technical Note 3) for Float32 and the horizontal predictor (2) for UInt8.
 * Overviews halve the grid until it fits one tile: the mean of the finite samples of each 2 × 2
 * block for Float32 (NaN if none), the nearest (top-left) sample for class grids.
 *
 * GeoTIFF 1.0 keys written: GTModelType, GTRasterType, GTCitation, GeographicType or ProjectedCSType.
 * A CRS without an EPSG code is written as user-defined (32767) with its proj4 string in the
 * citation: GDAL will not recognise it, and the summary says so. Band description and unit go in the
 * GDAL_METADATA tag, no data in GDAL_NODATA, a colour table (class grids) in ColorMap with palette
 * photometric interpretation.
 */

import { zlibSync } from 'fflate';
import type { GridGeometry } from '../grid/geometry.js';

export interface TiffWriteOptions {
  /** Written as GDAL_NODATA; 'nan' for Float32 grids whose no data is NaN. */
  noData?: number | 'nan';
  /** GDAL unit type of band 1, e.g. "m". */
  unit?: string;
  /** Free-text description of band 1 (what the grid holds). */
  description?: string;
  /** More GDAL metadata items of band 1 (name → value). */
  metadata?: Record<string, string>;
  /** TIFF Software tag: the program and version that made the file (provenance). */
  software?: string;
  /** TIFF DateTime tag, "YYYY:MM:DD HH:MM:SS" (the caller supplies the time; the core reads no clock). */
  dateTime?: string;
  /** A colour table for a UInt8 class grid: index → [r, g, b] (0–255); unlisted entries black. */
  colours?: ReadonlyMap<number, readonly [number, number, number]>;
  /** DEFLATE level 1–9 (default 1: fastest, about 3 × smaller than raw for these grids); 0 = none. */
  level?: number;
  /** A faster zlib compressor where the platform has one (the CLI passes Node's); fflate otherwise. */
  deflate?: Deflate;
}

type Sample = Float32Array | Uint8Array;

/** zlib-format DEFLATE of one tile at a level. */
export type Deflate = (data: Uint8Array, level: number) => Uint8Array;
const portableDeflate: Deflate = (d, level) => zlibSync(d, { level: level as 1 });

const SHORT = 3;
const LONG = 4;
const ASCII = 2;
const DOUBLE = 12;
export const TILE = 256;

interface Entry {
  tag: number;
  type: number;
  values: number[] | string;
}

interface Level {
  w: number;
  h: number;
  data: Sample;
  tiles: Uint8Array[];
}

export function writeGeoTiff(geometry: GridGeometry, data: Sample, options: TiffWriteOptions = {}): Uint8Array {
  const { nx, ny } = geometry;
  if (data.length !== nx * ny) throw new Error(`data length ${data.length} does not match ${nx} × ${ny}`);
  const isFloat = data instanceof Float32Array;
  const level = options.level ?? 1;

  // Rows must run north to south in a GeoTIFF with a plain pixel scale; flip grids stored south-up.
  const flip = geometry.dy > 0;
  const north = flip ? flipRows(data, nx, ny) : data;
  const dyAbs = Math.abs(geometry.dy);
  const yTop = flip ? geometry.y0 + (ny - 1) * geometry.dy : geometry.y0;
  const half = geometry.registration === 'area' ? 0.5 : 0;
  const tieX = geometry.x0 - half * geometry.dx;
  const tieY = yTop + half * dyAbs;

  // Full resolution and overviews, each cut into compressed tiles.
  const levels: Level[] = [{ w: nx, h: ny, data: north, tiles: [] }];
  while (levels[levels.length - 1].w > TILE || levels[levels.length - 1].h > TILE) {
    const prev = levels[levels.length - 1];
    levels.push(halve(prev, isFloat));
  }
  const fill = isFloat ? NaN : typeof options.noData === 'number' ? options.noData : 0;
  for (const lv of levels) lv.tiles = tilesOf(lv, isFloat, fill, level, options.deflate ?? portableDeflate);

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
  const palette = !isFloat && options.colours ? colourMap(options.colours) : null;
  const items: string[] = [];
  if (options.unit) items.push(`<Item name="UNITTYPE" sample="0" role="unittype">${xml(options.unit)}</Item>`);
  if (options.description) items.push(`<Item name="DESCRIPTION" sample="0" role="description">${xml(options.description)}</Item>`);
  for (const [k, v] of Object.entries(options.metadata ?? {})) items.push(`<Item name="${xml(k)}" sample="0">${xml(v)}</Item>`);

  const ifds: Entry[][] = levels.map((lv, idx) => {
    const across = Math.ceil(lv.w / TILE);
    const down = Math.ceil(lv.h / TILE);
    const entries: Entry[] = [
      ...(idx > 0 ? [{ tag: 254, type: LONG, values: [1] }] : []), // NewSubfileType: reduced resolution
      { tag: 256, type: LONG, values: [lv.w] },
      { tag: 257, type: LONG, values: [lv.h] },
      { tag: 258, type: SHORT, values: [isFloat ? 32 : 8] },
      { tag: 259, type: SHORT, values: [level > 0 ? 8 : 1] },
      { tag: 262, type: SHORT, values: [palette ? 3 : 1] },
      { tag: 277, type: SHORT, values: [1] },
      { tag: 284, type: SHORT, values: [1] },
      ...(idx === 0 && options.software ? [{ tag: 305, type: ASCII, values: options.software }] : []),
      ...(idx === 0 && options.dateTime ? [{ tag: 306, type: ASCII, values: options.dateTime }] : []),
      ...(level > 0 ? [{ tag: 317, type: SHORT, values: [isFloat ? 3 : 2] }] : []),
      ...(palette ? [{ tag: 320, type: SHORT, values: palette }] : []),
      { tag: 322, type: SHORT, values: [TILE] },
      { tag: 323, type: SHORT, values: [TILE] },
      { tag: 324, type: LONG, values: new Array(across * down).fill(0) },
      { tag: 325, type: LONG, values: lv.tiles.map((t) => t.length) },
      { tag: 339, type: SHORT, values: [isFloat ? 3 : 1] },
    ];
    if (idx === 0) {
      entries.push(
        { tag: 33550, type: DOUBLE, values: [geometry.dx, dyAbs, 0] },
        { tag: 33922, type: DOUBLE, values: [0, 0, 0, tieX, tieY, 0] },
        { tag: 34735, type: SHORT, values: geoKeys },
        { tag: 34737, type: ASCII, values: citation },
      );
      if (items.length) entries.push({ tag: 42112, type: ASCII, values: `<GDALMetadata>${items.join('')}</GDALMetadata>` });
    }
    if (options.noData !== undefined) entries.push({ tag: 42113, type: ASCII, values: String(options.noData) });
    return entries.sort((a, b) => a.tag - b.tag);
  });

  // Offsets: header | IFDs | out-of-line values | tiles (smallest overview first).
  const ifdOffsets: number[] = [];
  let at = 8;
  for (const entries of ifds) {
    ifdOffsets.push(at);
    at += 2 + entries.length * 12 + 4;
  }
  const valueOffsets: number[][] = ifds.map((entries) =>
    entries.map((e) => {
      const size = byteSize(e);
      if (size <= 4) return -1;
      const o = at;
      at += size + (size % 2);
      return o;
    }),
  );
  for (let li = levels.length - 1; li >= 0; li--) {
    const offsets = ifds[li].find((e) => e.tag === 324)!;
    offsets.values = levels[li].tiles.map((t) => {
      const o = at;
      at += t.length;
      return o;
    });
  }
  if (at > 0xffffffff) throw new Error('grid too large for a classic TIFF (over 4 GB)');

  const out = new Uint8Array(at);
  const dv = new DataView(out.buffer);
  out[0] = 0x49;
  out[1] = 0x49;
  dv.setUint16(2, 42, true);
  dv.setUint32(4, ifdOffsets[0], true);
  ifds.forEach((entries, li) => {
    const base = ifdOffsets[li];
    dv.setUint16(base, entries.length, true);
    entries.forEach((e, idx) => {
      const p = base + 2 + idx * 12;
      const count = typeof e.values === 'string' ? e.values.length + 1 : e.values.length;
      dv.setUint16(p, e.tag, true);
      dv.setUint16(p + 2, e.type, true);
      dv.setUint32(p + 4, count, true);
      const inline = valueOffsets[li][idx] < 0;
      const where = inline ? p + 8 : valueOffsets[li][idx];
      if (!inline) dv.setUint32(p + 8, where, true);
      writeValues(dv, out, where, e);
    });
    dv.setUint32(base + 2 + entries.length * 12, li + 1 < ifds.length ? ifdOffsets[li + 1] : 0, true);
  });
  for (let li = 0; li < levels.length; li++) {
    const offsets = ifds[li].find((e) => e.tag === 324)!.values as number[];
    levels[li].tiles.forEach((t, k) => out.set(t, offsets[k]));
  }
  return out;
}

function flipRows<T extends Sample>(data: T, nx: number, ny: number): T {
  const out = new (data.constructor as { new (n: number): T })(data.length);
  for (let r = 0; r < ny; r++) out.set(data.subarray((ny - 1 - r) * nx, (ny - r) * nx), r * nx);
  return out;
}

/** The next overview: half size (rounded up); mean of finite samples, or nearest for classes. */
function halve(lv: Level, isFloat: boolean): Level {
  const w = Math.ceil(lv.w / 2);
  const h = Math.ceil(lv.h / 2);
  const src = lv.data;
  const sw = lv.w;
  if (!isFloat) {
    const out = new Uint8Array(w * h);
    for (let j = 0; j < h; j++) for (let i = 0; i < w; i++) out[j * w + i] = src[2 * j * sw + 2 * i];
    return { w, h, data: out, tiles: [] };
  }
  const out = new Float32Array(w * h);
  for (let j = 0; j < h; j++) {
    const r0 = 2 * j * sw;
    const r1 = 2 * j + 1 < lv.h ? r0 + sw : -1; // the second source row, if any
    for (let i = 0; i < w; i++) {
      const a0 = r0 + 2 * i;
      const two = 2 * i + 1 < sw; // a second source column
      let s = 0;
      let c = 0;
      let v = src[a0];
      if (v - v === 0) (s += v), c++; // finite: Infinity - Infinity and NaN - NaN are NaN
      if (two) {
        v = src[a0 + 1];
        if (v - v === 0) (s += v), c++;
      }
      if (r1 >= 0) {
        v = src[r1 + 2 * i];
        if (v - v === 0) (s += v), c++;
        if (two) {
          v = src[r1 + 2 * i + 1];
          if (v - v === 0) (s += v), c++;
        }
      }
      out[j * w + i] = c ? s / c : NaN;
    }
  }
  return { w, h, data: out, tiles: [] };
}

/** True where typed arrays are little-endian (every platform Node and browsers run on in practice). */
const HOST_LE = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** A Float32 level's samples as little-endian bytes: a view of them, or a copy on a big-endian host. */
function littleEndianBytes(data: Float32Array): Uint8Array {
  if (HOST_LE) return new Uint8Array(data.buffer, data.byteOffset, data.byteLength);
  const out = new Uint8Array(data.length * 4);
  const view = new DataView(out.buffer);
  for (let k = 0; k < data.length; k++) view.setFloat32(4 * k, data[k], true);
  return out;
}

/**
 * The level's tiles, row-major, each padded to TILE × TILE with `fill`, predicted and compressed.
 * Float32 rows go straight from the grid's bytes into the tile (one pass per row).
 */
function tilesOf(lv: Level, isFloat: boolean, fill: number, level: number, deflate: Deflate): Uint8Array[] {
  const across = Math.ceil(lv.w / TILE);
  const down = Math.ceil(lv.h / TILE);
  const tiles: Uint8Array[] = [];
  const raw = new Uint8Array(TILE * TILE * (isFloat ? 4 : 1));
  const src = isFloat ? littleEndianBytes(lv.data as Float32Array) : null;
  const fillBytes = new Uint8Array(new Float32Array([fill]).buffer);
  if (!HOST_LE) fillBytes.reverse();
  for (let tj = 0; tj < down; tj++) {
    for (let ti = 0; ti < across; ti++) {
      for (let r = 0; r < TILE; r++) {
        const j = tj * TILE + r;
        if (src) floatRow(raw, r * TILE * 4, src, j < lv.h ? j * lv.w : -1, ti * TILE, lv.w, fillBytes, level > 0);
        else byteRow(raw, r * TILE, lv, j, ti * TILE, fill, level > 0);
      }
      tiles.push(level > 0 ? deflate(raw, level) : raw.slice());
    }
  }
  return tiles;
}

/**
 * One Float32 tile row from little-endian sample bytes; `rowStart` is the grid index of the row's
 * first cell (-1: below the grid), cells past the grid take `fill` (its little-endian bytes).
 * Predicted: the floating-point predictor (TIFF Technical Note 3): the samples as big-endian bytes
 * split into byte planes (all most significant bytes first), then byte-wise horizontal differencing.
 */
function floatRow(raw: Uint8Array, base: number, src: Uint8Array, rowStart: number, i0: number, w: number, fill: Uint8Array, predict: boolean): void {
  const n = rowStart < 0 ? 0 : Math.max(0, Math.min(TILE, w - i0));
  if (!predict) {
    if (n) raw.set(src.subarray(4 * (rowStart + i0), 4 * (rowStart + i0 + n)), base);
    for (let c = n; c < TILE; c++) raw.set(fill, base + 4 * c);
    return;
  }
  let s = 4 * (rowStart + i0);
  for (let c = 0; c < n; c++, s += 4) {
    // little-endian sample bytes b0..b3 → planes of b3, b2, b1, b0
    raw[base + c] = src[s + 3];
    raw[base + TILE + c] = src[s + 2];
    raw[base + 2 * TILE + c] = src[s + 1];
    raw[base + 3 * TILE + c] = src[s];
  }
  for (let c = n; c < TILE; c++) {
    raw[base + c] = fill[3];
    raw[base + TILE + c] = fill[2];
    raw[base + 2 * TILE + c] = fill[1];
    raw[base + 3 * TILE + c] = fill[0];
  }
  for (let k = base + 4 * TILE - 1; k > base; k--) raw[k] = (raw[k] - raw[k - 1]) & 255;
}

/** One UInt8 tile row, with horizontal differencing (predictor 2) when compressed. */
function byteRow(raw: Uint8Array, base: number, lv: Level, j: number, i0: number, fill: number, predict: boolean): void {
  for (let c = 0; c < TILE; c++) {
    const i = i0 + c;
    raw[base + c] = j < lv.h && i < lv.w ? lv.data[j * lv.w + i] : fill;
  }
  if (predict) for (let c = TILE - 1; c > 0; c--) raw[base + c] = (raw[base + c] - raw[base + c - 1]) & 255;
}

/** TIFF ColorMap: 3 × 256 SHORTs (all reds, then greens, then blues), 16-bit intensities. */
function colourMap(colours: ReadonlyMap<number, readonly [number, number, number]>): number[] {
  const out = new Array(768).fill(0);
  for (const [k, [r, g, b]] of colours) {
    if (k < 0 || k > 255) continue;
    out[k] = r * 257;
    out[256 + k] = g * 257;
    out[512 + k] = b * 257;
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
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}
