/**
 * GeoTIFF → Grid (metres, positive down, NaN = no data), through geotiff.js.
 * Works on bytes, so the same code runs in the browser and in Node.
 */

import { fromArrayBuffer } from 'geotiff';
import { crsFromEpsg, resolveCrs, UnknownCrsError, type Crs } from '../crs/registry.js';
import type { GridGeometry, Registration } from '../grid/geometry.js';
import { makeGrid, type Grid } from '../grid/grid.js';
import { toDepthMetres, type Decided, type DepthOptions } from './detect.js';
import { InputError, MAX_CELLS } from './errors.js';
import type { GridReadReport } from './report.js';

export interface GridReadOptions extends DepthOptions {
  /** EPSG code or proj4 string; overrides the file's CRS. */
  crs?: string;
  registration?: Registration;
}

export interface GridReadResult {
  readonly grid: Grid;
  readonly report: GridReadReport;
}

const SAMPLE_TYPES: Record<string, string> = {
  '1:8': 'UInt8', '1:16': 'UInt16', '1:32': 'UInt32', '2:8': 'Int8', '2:16': 'Int16', '2:32': 'Int32',
  '3:32': 'Float32', '3:64': 'Float64',
};

export function toArrayBuffer(bytes: ArrayBuffer | Uint8Array): ArrayBuffer {
  if (bytes instanceof ArrayBuffer) return bytes;
  return bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
}

export async function readGeoTiff(
  bytes: ArrayBuffer | Uint8Array,
  file: string,
  options: GridReadOptions = {},
): Promise<GridReadResult> {
  const buf = toArrayBuffer(bytes);
  if (buf.byteLength < 8) throw new InputError(file, `is ${buf.byteLength} bytes long: not a GeoTIFF`);
  const magic = new Uint8Array(buf, 0, 4);
  const tiffMagic = (magic[0] === 0x49 && magic[1] === 0x49) || (magic[0] === 0x4d && magic[1] === 0x4d);
  if (!tiffMagic) throw new InputError(file, 'is not a TIFF file (it does not start with a TIFF header)');

  let image;
  try {
    const tiff = await fromArrayBuffer(buf);
    image = await tiff.getImage();
  } catch (err) {
    throw new InputError(file, `cannot be read as a GeoTIFF (${(err as Error).message})`);
  }
  const nx = image.getWidth();
  const ny = image.getHeight();
  if (nx * ny > MAX_CELLS) {
    throw new InputError(file, `declares ${nx} × ${ny} cells, beyond the ${MAX_CELLS.toExponential(0)} cells Taperline will allocate`);
  }
  const bands = image.getSamplesPerPixel();
  const sampleType = SAMPLE_TYPES[`${image.getSampleFormat(0)}:${image.getBitsPerSample(0)}`] ?? 'unknown';

  let origin: number[];
  let res: number[];
  try {
    origin = image.getOrigin();
    res = image.getResolution();
  } catch {
    throw new InputError(file, 'has no georeferencing (no tie point and pixel scale): not a GeoTIFF grid');
  }

  const crsDecided = decideCrs(file, image.getGeoKeys(), options.crs);
  const registration: Decided<Registration> = options.registration
    ? { value: options.registration, source: 'option', detail: 'set by the user' }
    : image.pixelIsArea()
      ? { value: 'area', source: 'metadata', detail: 'RasterPixelIsArea' }
      : { value: 'node', source: 'metadata', detail: 'RasterPixelIsPoint' };
  const [dx, dy] = res;
  const half = registration.value === 'area' ? 0.5 : 0;
  const geometry: GridGeometry = {
    nx,
    ny,
    x0: origin[0] + half * dx,
    y0: origin[1] + half * dy,
    dx,
    dy,
    registration: registration.value,
    crs: crsDecided.crs,
  };

  let raw;
  try {
    raw = (await image.readRasters({ interleave: false, samples: [0] })) as unknown as ArrayLike<number>[];
  } catch (err) {
    throw new InputError(file, `pixel data cannot be decoded (${(err as Error).message}): the file is damaged, truncated or uses an unsupported encoding`);
  }
  const band = raw[0];
  if (!band || band.length !== nx * ny) throw new InputError(file, 'pixel data is shorter than the declared size: the file is truncated');

  const perBand = ((await image.getGDALMetadata(0)) ?? {}) as Record<string, unknown>;
  const dataset = ((await image.getGDALMetadata()) ?? {}) as Record<string, unknown>;
  const scale = perBand.SCALE !== undefined ? Number(perBand.SCALE) : 1;
  const offset = perBand.OFFSET !== undefined ? Number(perBand.OFFSET) : 0;
  const descriptions = [perBand.DESCRIPTION, dataset.DESCRIPTION, dataset.TIFFTAG_IMAGEDESCRIPTION]
    .filter((d): d is string => typeof d === 'string');
  const { values, report } = toDepthMetres(
    band,
    { fileName: file, unitTag: typeof perBand.UNITTYPE === 'string' ? perBand.UNITTYPE : undefined, descriptions },
    options,
    image.getGDALNoData(),
    { scale, offset },
  );
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
      sampleType,
    },
  };
}

function decideCrs(
  file: string,
  keys: Record<string, unknown> | null,
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
  const model = keys.GTModelTypeGeoKey as number | undefined;
  const projected = keys.ProjectedCSTypeGeoKey as number | undefined;
  const geographic = keys.GeographicTypeGeoKey as number | undefined;
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
