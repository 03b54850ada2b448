/**
 * Plain XYZ text → Grid. One "x y z" per line; spaces, tabs, commas or semicolons; header and
 * comment lines skipped; rows in either order; nodes may be missing (they become no data).
 * XYZ points are grid nodes, so the grid is node-registered. Irregular spacing is refused with the
 * number of the first line that does not sit on the lattice.
 */

import { resolveCrs } from '../crs/registry.js';
import type { GridGeometry } from '../grid/geometry.js';
import { makeGrid } from '../grid/grid.js';
import { toDepthMetres, type Decided } from './detect.js';
import { InputError, MAX_CELLS } from './errors.js';
import type { GridReadOptions, GridReadResult } from './geotiff-read.js';

export interface XyzReadOptions extends GridReadOptions {
  /** CRS to assume when the user gave none (the pipeline passes the analysis CRS), with a warning. */
  assumeCrs?: string;
}

const REL_TOL = 1e-4;

export function readXyz(text: string, file: string, options: XyzReadOptions = {}): GridReadResult {
  const xs: number[] = [];
  const ys: number[] = [];
  const zs: number[] = [];
  const lineNo: number[] = [];
  let headerLines = 0;
  let started = false;
  let lineIndex = 0;
  let pos = 0;
  while (pos <= text.length) {
    let end = text.indexOf('\n', pos);
    if (end < 0) end = text.length;
    const line = text.slice(pos, end).trim();
    pos = end + 1;
    lineIndex++;
    if (line === '' || line.startsWith('#')) continue;
    const parts = line.split(/[\s,;]+/);
    const x = Number(parts[0]);
    const y = Number(parts[1]);
    const z = parts[2] === undefined ? NaN : parts[2].toLowerCase() === 'nan' ? NaN : Number(parts[2]);
    const numeric = parts.length >= 3 && Number.isFinite(x) && Number.isFinite(y) && (Number.isFinite(z) || parts[2].toLowerCase() === 'nan');
    if (!numeric) {
      if (!started) {
        headerLines++;
        if (headerLines > 20) throw new InputError(file, 'no numeric "x y z" lines in its first 20 lines: not an XYZ grid');
        continue;
      }
      throw new InputError(file, `line ${lineIndex} is not "x y z" numbers: "${line.slice(0, 60)}"`);
    }
    started = true;
    xs.push(x);
    ys.push(y);
    zs.push(z);
    lineNo.push(lineIndex);
  }
  if (xs.length < 4) throw new InputError(file, `holds ${xs.length} numeric points: too few for a grid`);

  const ux = uniqueSorted(xs);
  const uy = uniqueSorted(ys);
  if (ux.length < 2 || uy.length < 2) throw new InputError(file, 'all points share one x or one y: not a grid');
  const dx = smallestGap(ux);
  const dy = smallestGap(uy);
  const xmin = ux[0];
  const ymax = uy[uy.length - 1];
  const nx = Math.round((ux[ux.length - 1] - xmin) / dx) + 1;
  const ny = Math.round((ymax - uy[0]) / dy) + 1;
  if (nx * ny > MAX_CELLS) throw new InputError(file, `spacing implies ${nx} × ${ny} cells, beyond what Taperline will allocate`);

  // Rows run north to south (dy < 0), as in GeoTIFF, whatever order the file used.
  const raw = new Float64Array(nx * ny).fill(NaN);
  const seen = new Uint8Array(nx * ny);
  for (let k = 0; k < xs.length; k++) {
    const fi = (xs[k] - xmin) / dx;
    const fj = (ymax - ys[k]) / dy;
    const i = Math.round(fi);
    const j = Math.round(fj);
    if (Math.abs(fi - i) > REL_TOL || Math.abs(fj - j) > REL_TOL) {
      throw new InputError(
        file,
        `irregular spacing: line ${lineNo[k]} (${xs[k]}, ${ys[k]}) is off the ${dx} × ${dy} lattice; XYZ grids must be regularly spaced`,
      );
    }
    const idx = j * nx + i;
    if (seen[idx] && !(raw[idx] === zs[k] || (Number.isNaN(raw[idx]) && Number.isNaN(zs[k])))) {
      throw new InputError(file, `line ${lineNo[k]} repeats the node (${xs[k]}, ${ys[k]}) with a different value`);
    }
    seen[idx] = 1;
    raw[idx] = zs[k];
  }

  let crsSpec = options.crs;
  let crsSource: Decided<string>['source'] = 'option';
  const warnings: string[] = [];
  if (!crsSpec && options.assumeCrs) {
    crsSpec = options.assumeCrs;
    crsSource = 'default';
    warnings.push(`XYZ text carries no CRS: assumed ${options.assumeCrs}, please confirm`);
  }
  if (!crsSpec) throw new InputError(file, 'XYZ text carries no CRS: give one (EPSG code or proj4 string)');
  let crs;
  try {
    crs = resolveCrs(crsSpec);
  } catch (err) {
    throw new InputError(file, (err as Error).message);
  }
  const geometry: GridGeometry = { nx, ny, x0: xmin, y0: ymax, dx, dy: -dy, registration: 'node', crs };
  const { values, report } = toDepthMetres(raw, { fileName: file }, options);
  const missing = nx * ny - xs.length;
  if (missing > 0) warnings.push(`${missing} lattice nodes absent from the file: no data there`);
  return {
    grid: makeGrid(geometry, values),
    report: {
      ...report,
      warnings: [...report.warnings, ...warnings],
      file,
      format: 'xyz',
      nx,
      ny,
      dx,
      dy: -dy,
      registration: { value: 'node', source: 'default', detail: 'XYZ points are grid nodes' },
      crs: { value: crs.id === 'PROJ4' ? crs.proj4 : crs.id, source: crsSource, detail: crs.name },
      sampleType: 'text',
    },
  };
}

function uniqueSorted(v: number[]): Float64Array {
  const s = Float64Array.from(v).sort();
  let m = 0;
  for (let k = 0; k < s.length; k++) if (k === 0 || s[k] !== s[m - 1]) s[m++] = s[k];
  return s.subarray(0, m);
}

/**
 * The lattice step: the most common gap between neighbouring distinct values (rounded to 1e-6 of the
 * span), so one stray point cannot shrink the step; that point is then reported as off the lattice.
 */
function smallestGap(s: Float64Array): number {
  const span = s[s.length - 1] - s[0];
  const q = span * 1e-6;
  const counts = new Map<number, { n: number; sum: number }>();
  for (let k = 1; k < s.length; k++) {
    const d = s[k] - s[k - 1];
    const key = Math.round(d / q);
    const c = counts.get(key) ?? { n: 0, sum: 0 };
    c.n++;
    c.sum += d;
    counts.set(key, c);
  }
  let best = { n: 0, sum: 0 };
  let bestKey = Infinity;
  for (const [key, c] of counts) if (c.n > best.n || (c.n === best.n && key < bestKey)) (best = c), (bestKey = key);
  return best.sum / best.n;
}
