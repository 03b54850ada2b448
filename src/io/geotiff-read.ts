/**
 * GeoTIFF → Grid (metres, positive down, NaN = no data). Our own reader (src/io/tiff/), so that
 * every size and offset is checked against the file and a memory budget before anything is
 * allocated, and every failure is an InputError naming the file. Works on bytes, so the same code
 * runs in the browser and in Node.
 */

import { crsFromEpsg, resolveCrs, UnknownCrsError, type Crs } from '../crs/registry.js';
import type { GridGeometry, Registration } from '../grid/geometry.js';
import { makeGrid, type Grid } from '../grid/grid.js';
import { toDepthMetres, type Decided, type DepthOptions } from './detect.js';
import { InputError, MAX_CELLS } from './errors.js';
import { decodeBand, type Inflate } from './tiff/decode.js';
import { GEOKEY, geoKeyNumber, readGdalMetadata, readGdalNoData, readGeoKeys, readGeoreference, type GeoKeys } from './tiff/geo.js';
import { readFirstIfd, text } from './tiff/ifd.js';
import { readLayout } from './tiff/layout.js';
import type { GridReadReport } from './report.js';

export interface GridReadOptions extends DepthOptions {
  /** EPSG code or proj4 string; overrides the file's CRS. */
  crs?: string;
  registration?: Registration;
  /** Memory one grid file may take while read, MB (default DEFAULT_READ_BUDGET_MB). */
  readBudgetMB?: number;
  /** A faster DEFLATE block decoder where the platform has one (Node's zlib, from the CLI). */
  inflate?: Inflate;
}

export interface GridReadResult {
  readonly grid: Grid;
  readonly report: GridReadReport;
}

const SAMPLE_TYPES: Record<string, string> = {
  'uint:8': 'UInt8', 'uint:16': 'UInt16', 'uint:32': 'UInt32', 'int:8': 'Int8', 'int:16': 'Int16', 'int:32': 'Int32',
  'float:32': 'Float32', 'float:64': 'Float64',
};

export async function readGeoTiff(
  bytes: ArrayBuffer | Uint8Array,
  file: string,
  options: GridReadOptions = {},
): Promise<GridReadResult> {
  const u8 = bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes);
  // Structure, georeferencing and size are checked before any pixel buffer exists.
  const ifd = readFirstIfd(u8, file);
  const layout = readLayout(ifd, options.readBudgetMB);
  const { width: nx, height: ny } = layout;
  if (nx * ny > MAX_CELLS) {
    throw new InputError(file, `declares ${nx} × ${ny} cells, beyond the ${MAX_CELLS.toExponential(0)} cells Taperline will allocate`);
  }
  const georef = readGeoreference(ifd);
  const keys = readGeoKeys(ifd);
  const crsDecided = decideCrs(file, keys, options.crs);
  const rasterType = keys ? geoKeyNumber(keys, GEOKEY.raster, file) : undefined;
  const registration: Decided<Registration> = options.registration
    ? { value: options.registration, source: 'option', detail: 'set by the user' }
    : rasterType === 2
      ? { value: 'node', source: 'metadata', detail: 'RasterPixelIsPoint' }
      : { value: 'area', source: rasterType === 1 ? 'metadata' : 'default', detail: rasterType === 1 ? 'RasterPixelIsArea' : 'no raster type key: RasterPixelIsArea assumed' };
  const { dx, dy } = georef;
  const half = registration.value === 'area' ? 0.5 : 0;
  const geometry: GridGeometry = {
    nx,
    ny,
    x0: georef.x + half * dx,
    y0: georef.y + half * dy,
    dx,
    dy,
    registration: registration.value,
    crs: crsDecided.crs,
  };
  if (!Number.isFinite(geometry.x0 + nx * dx) || !Number.isFinite(geometry.y0 + ny * dy)) {
    throw new InputError(file, 'declares a grid whose far edge is not a finite number: damaged georeferencing');
  }

  const meta = readGdalMetadata(ifd);
  const scale = metaNumber(file, meta.band.SCALE, 'scale', 1);
  const offset = metaNumber(file, meta.band.OFFSET, 'offset', 0);
  if (scale === 0) throw new InputError(file, 'declares a scale of 0: every value would be the offset (damaged metadata)');
  const noData = readGdalNoData(ifd);
  const band = await decodeBand(ifd, layout, noData !== null && Number.isFinite(noData) ? noData : 0, options.inflate);

  const descriptions = [meta.band.DESCRIPTION, meta.dataset.DESCRIPTION, meta.dataset.TIFFTAG_IMAGEDESCRIPTION, text(ifd, 270)]
    .filter((d): d is string => typeof d === 'string');
  const { values, report } = toDepthMetres(
    band,
    { fileName: file, unitTag: meta.band.UNITTYPE, descriptions },
    options,
    noData,
    { scale, offset },
    true, // the decoded band is ours: converted where it lies
  );
  const bands = layout.samplesPerPixel;
  if (bands > 1) report.warnings.push(`has ${bands} bands: only band 1 is used`);
  if (scale !== 1 || offset !== 0) report.warnings.push(`scale ${scale} and offset ${offset} applied from the file`);
  if (crsDecided.warning) report.warnings.push(crsDecided.warning);

  return {
    grid: makeGrid(geometry, values),
    report: {
      ...report,
      file,
      format: 'geotiff',
      nx,
      ny,
      dx,
      dy,
      registration,
      crs: { value: crsDecided.crs.id === 'PROJ4' ? crsDecided.crs.proj4 : crsDecided.crs.id, source: crsDecided.source, detail: crsDecided.crs.name },
      sampleType: SAMPLE_TYPES[`${layout.kind}:${layout.bitsPerSample}`] ?? 'unknown',
    },
  };
}

function metaNumber(file: string, raw: string | undefined, what: string, fallback: number): number {
  if (raw === undefined) return fallback;
  const v = Number(raw.trim());
  if (raw.trim() === '' || !Number.isFinite(v) || /^0x/i.test(raw.trim())) throw new InputError(file, `declares a ${what} of "${raw.slice(0, 40)}", not a number: damaged metadata`);
  return v;
}

function decideCrs(
  file: string,
  keys: GeoKeys | null,
  override: string | undefined,
): { crs: Crs; source: 'option' | 'metadata'; warning?: string } {
  if (override) {
    try {
      return { crs: resolveCrs(override), source: 'option' };
    } catch (err) {
      throw new InputError(file, (err as Error).message);
    }
  }
  if (!keys) throw new InputError(file, 'carries no CRS (no GeoKeys); give one with the CRS option (EPSG code or proj4 string)');
  const model = geoKeyNumber(keys, GEOKEY.model, file);
  const projected = geoKeyNumber(keys, GEOKEY.projected, file);
  const geographic = geoKeyNumber(keys, GEOKEY.geographic, file);
  const code = model === 2 ? geographic : (projected ?? geographic);
  if (code === undefined) {
    throw new InputError(file, 'carries no EPSG code in its GeoKeys; give a CRS with the CRS option (EPSG code or proj4 string)');
  }
  try {
    return { crs: crsFromEpsg(code), source: 'metadata' };
  } catch (err) {
    if (err instanceof UnknownCrsError) throw new InputError(file, err.message);
    throw err;
  }
}
