/**
 * Grid geometry: where each sample of a row-major grid sits in its CRS.
 *
 * Samples are addressed by column i (0..nx-1, along x) and row j (0..ny-1). Sample (i, j) lies at
 *   x = x0 + i·dx,  y = y0 + j·dy
 * whatever the registration: x0/y0 always locate the first sample itself (a cell centre for
 * cell-area registration, a node for grid-node registration). dx > 0; dy is signed (negative when
 * row 0 is the northern row, as in GeoTIFF). Registration only changes the footprint: a cell-area
 * sample covers ±dx/2, ±dy/2 around its position; a node-registered grid ends at its outer nodes.
 */

import type { Crs } from '../crs/registry.js';

export type Registration = 'area' | 'node';

export interface GridGeometry {
  readonly nx: number;
  readonly ny: number;
  readonly x0: number;
  readonly y0: number;
  readonly dx: number;
  readonly dy: number;
  readonly registration: Registration;
  readonly crs: Crs;
}

export interface Extent {
  readonly xmin: number;
  readonly ymin: number;
  readonly xmax: number;
  readonly ymax: number;
}

export function validateGeometry(g: GridGeometry): void {
  if (!Number.isInteger(g.nx) || !Number.isInteger(g.ny) || g.nx < 1 || g.ny < 1) {
    throw new Error(`grid size must be positive integers, got ${g.nx} × ${g.ny}`);
  }
  if (!(g.dx > 0) || !Number.isFinite(g.dx)) throw new Error(`cell width must be positive, got ${g.dx}`);
  if (!(g.dy !== 0) || !Number.isFinite(g.dy)) throw new Error(`cell height must be non-zero, got ${g.dy}`);
  if (!Number.isFinite(g.x0) || !Number.isFinite(g.y0)) throw new Error('grid origin must be finite');
}

export function cellCount(g: GridGeometry): number {
  return g.nx * g.ny;
}

/** World x of column i (fractional allowed). */
export function colToX(g: GridGeometry, i: number): number {
  return g.x0 + i * g.dx;
}

/** World y of row j (fractional allowed). */
export function rowToY(g: GridGeometry, j: number): number {
  return g.y0 + j * g.dy;
}

/** Fractional column of world x. */
export function xToCol(g: GridGeometry, x: number): number {
  return (x - g.x0) / g.dx;
}

/** Fractional row of world y. */
export function yToRow(g: GridGeometry, y: number): number {
  return (y - g.y0) / g.dy;
}

/** Footprint of the grid in its CRS (cell edges for area registration, outer nodes for node). */
export function extentOf(g: GridGeometry): Extent {
  const half = g.registration === 'area' ? 0.5 : 0;
  const xa = colToX(g, -half);
  const xb = colToX(g, g.nx - 1 + half);
  const ya = rowToY(g, -half);
  const yb = rowToY(g, g.ny - 1 + half);
  return { xmin: Math.min(xa, xb), xmax: Math.max(xa, xb), ymin: Math.min(ya, yb), ymax: Math.max(ya, yb) };
}

/** Area of one cell in CRS units squared (planar; geodesic areas live in crs/geodesy). */
export function cellArea(g: GridGeometry): number {
  return Math.abs(g.dx * g.dy);
}

export function sameGeometry(a: GridGeometry, b: GridGeometry, relTol = 1e-9): boolean {
  const close = (p: number, q: number, scale: number) => Math.abs(p - q) <= relTol * Math.max(1, scale);
  return (
    a.nx === b.nx &&
    a.ny === b.ny &&
    a.registration === b.registration &&
    a.crs.proj4 === b.crs.proj4 &&
    close(a.dx, b.dx, Math.abs(a.dx)) &&
    close(a.dy, b.dy, Math.abs(a.dy)) &&
    close(a.x0, b.x0, Math.abs(a.dx) * 1e3) &&
    close(a.y0, b.y0, Math.abs(a.dy) * 1e3)
  );
}
