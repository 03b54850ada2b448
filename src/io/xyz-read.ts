/**
 * Plain XYZ text → Grid. One "x y z" per line; spaces, tabs, commas or semicolons; header and
 * comment lines skipped; rows in either order; nodes may be missing (they become no data).
 * XYZ points are grid nodes, so the grid is node-registered. Irregular spacing is refused with the
 * number of the first line that does not sit on the lattice. The CRS, the regularity and the share
 * of the lattice the points fill are all checked before the grid is allocated.
 */

import { resolveCrs, type Crs } from '../crs/registry.js';
import type { GridGeometry } from '../grid/geometry.js';
import { makeGrid } from '../grid/grid.js';
import { toDepthMetres, type Decided } from './detect.js';
import { InputError, MAX_CELLS } from './errors.js';
import type { GridReadOptions, GridReadResult } from './geotiff-read.js';
import { DEFAULT_READ_BUDGET_MB } from './tiff/layout.js';

export interface XyzReadOptions extends GridReadOptions {
  /** CRS to assume when the user gave none (the pipeline passes the analysis CRS), with a warning. */
  assumeCrs?: string;
}

const REL_TOL = 1e-4;

/**
 * Smallest share of the lattice the points must fill (a choice): a regional grid clipped to a
 * coastline or a survey outline keeps well over a tenth of its lattice, while a few stray points
 * far apart, or a typo in one coordinate, imply a huge, nearly empty lattice.
 */
export const MIN_LATTICE_FILL = 0.1;

/** A plain decimal number as XYZ writers print it (no hex, no "Infinity", no empty field). */
const DECIMAL = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;
const num = (t: string | undefined): number => (t !== undefined && DECIMAL.test(t) ? Number(t) : NaN);

/** A Float64 list that grows by doubling (a plain array of numbers would cost far more memory). */
class Column {
  data = new Float64Array(1024);
  length = 0;
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  get values(): Float64Array {
    return this.data.subarray(0, this.length);
  }
}

export function readXyz(text: string, file: string, options: XyzReadOptions = {}): GridReadResult {
  const budget = (options.readBudgetMB ?? DEFAULT_READ_BUDGET_MB) * 1024 * 1024;
  const crs = decideCrs(file, options);
  const { xs, ys, zs, lineNo } = readPoints(text, file, budget);
  const n = xs.length;
  if (n < 4) throw new InputError(file, `holds ${n} numeric points: too few for a grid`);

  const lattice = findLattice(file, xs, ys, budget);
  const { nx, ny, dx, dy, xmin, ymax } = lattice;
  // Every point on the lattice before the grid is built.
  const index = new Int32Array(n);
  for (let k = 0; k < n; k++) {
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
    index[k] = j * nx + i;
  }

  // Rows run north to south (dy < 0), as in GeoTIFF, whatever order the file used.
  const raw = new Float32Array(nx * ny).fill(NaN);
  const seen = new Uint8Array(nx * ny);
  for (let k = 0; k < n; k++) {
    const idx = index[k];
    const z = Math.fround(zs[k]);
    if (seen[idx] && !(raw[idx] === z || (Number.isNaN(raw[idx]) && Number.isNaN(z)))) {
      throw new InputError(file, `line ${lineNo[k]} repeats the node (${xs[k]}, ${ys[k]}) with a different value`);
    }
    seen[idx] = 1;
    raw[idx] = z;
  }

  const geometry: GridGeometry = { nx, ny, x0: xmin, y0: ymax, dx, dy: -dy, registration: 'node', crs: crs.crs };
  const { values, report } = toDepthMetres(raw, { fileName: file }, options);
  const warnings = [...crs.warnings];
  const missing = nx * ny - n;
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
      crs: { value: crs.crs.id === 'PROJ4' ? crs.crs.proj4 : crs.crs.id, source: crs.source, detail: crs.crs.name },
      sampleType: 'text',
    },
  };
}

/** The CRS, decided before any point is read: XYZ text carries none of its own. */
function decideCrs(file: string, options: XyzReadOptions): { crs: Crs; source: Decided<string>['source']; warnings: string[] } {
  let spec = options.crs;
  let source: Decided<string>['source'] = 'option';
  const warnings: string[] = [];
  if (!spec && options.assumeCrs) {
    spec = options.assumeCrs;
    source = 'default';
    warnings.push(`XYZ text carries no CRS: assumed ${options.assumeCrs}, please confirm`);
  }
  if (!spec) throw new InputError(file, 'XYZ text carries no CRS: give one (EPSG code or proj4 string)');
  try {
    return { crs: resolveCrs(spec), source, warnings };
  } catch (err) {
    throw new InputError(file, (err as Error).message);
  }
}

/** The numeric "x y z" lines (header and comment lines skipped), within the read budget. */
function readPoints(text: string, file: string, budget: number) {
  const xs = new Column();
  const ys = new Column();
  const zs = new Column();
  const lineNo = new Column();
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
    const x = num(parts[0]);
    const y = num(parts[1]);
    const zNan = parts[2] !== undefined && parts[2].toLowerCase() === 'nan';
    const z = zNan ? NaN : num(parts[2]);
    const numeric = parts.length >= 3 && Number.isFinite(x) && Number.isFinite(y) && (Number.isFinite(z) || zNan);
    if (!numeric) {
      if (!started) {
        headerLines++;
        if (headerLines > 20) throw new InputError(file, 'no numeric "x y z" lines in its first 20 lines: not an XYZ grid');
        continue;
      }
      throw new InputError(file, `line ${lineIndex} is not "x y z" numbers: "${line.slice(0, 60)}"`);
    }
    started = true;
    if (xs.length % 65536 === 0 && (xs.length + 65536) * 36 > budget) {
      throw new InputError(file, `holds more points than the read budget of ${(budget / 2 ** 20).toFixed(0)} MB allows`);
    }
    xs.push(x);
    ys.push(y);
    zs.push(z);
    lineNo.push(lineIndex);
  }
  return { xs: xs.values, ys: ys.values, zs: zs.values, lineNo: lineNo.values };
}

/**
 * The lattice the points sit on: the most common step in x and y, and the size it implies,
 * refused when it would not fit the budget or the points fill too little of it.
 */
function findLattice(file: string, xs: Float64Array, ys: Float64Array, budget: number) {
  const ux = uniqueSorted(xs);
  const uy = uniqueSorted(ys);
  if (ux.length < 2 || uy.length < 2) throw new InputError(file, 'all points share one x or one y: not a grid');
  const dx = smallestGap(ux);
  const dy = smallestGap(uy);
  const xmin = ux[0];
  const ymax = uy[uy.length - 1];
  const nx = Math.round((ux[ux.length - 1] - xmin) / dx) + 1;
  const ny = Math.round((ymax - uy[0]) / dy) + 1;
  const cells = nx * ny;
  const fill = xs.length / cells;
  if (!(fill >= MIN_LATTICE_FILL)) {
    throw new InputError(
      file,
      `its ${xs.length} points fill ${(fill * 100).toPrecision(2)} % of the ${nx} × ${ny} lattice their spacing (${dx} × ${dy}) implies; ` +
        `an XYZ grid must be regular and at least ${MIN_LATTICE_FILL * 100} % complete (a stray point or a typo in a coordinate?)`,
    );
  }
  if (cells > MAX_CELLS || cells * 9 > budget) {
    throw new InputError(file, `spacing implies ${nx} × ${ny} cells, beyond the ${(budget / 2 ** 20).toFixed(0)} MB read budget`);
  }
  return { nx, ny, dx, dy, xmin, ymax };
}

function uniqueSorted(v: Float64Array): Float64Array {
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
