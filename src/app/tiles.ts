/**
 * Display tiles: the grid cut into blocks of BLOCK × BLOCK cells, each drawn as its own quad whose
 * four corners are projected exactly to lon/lat. A projected (e.g. UTM) grid is curved in Web
 * Mercator; one quad for a margin-sized grid misplaces cells by about a cell, but the error falls
 * with the square of the block size, so 64-cell blocks stay far below a screen pixel at any zoom.
 */

import { WGS84 } from '../crs/registry.js';
import { transformer } from '../crs/transform.js';
import { colToX, rowToY, type GridGeometry } from '../grid/geometry.js';

export const BLOCK = 64;

export interface Tile {
  readonly i0: number;
  readonly j0: number;
  readonly w: number;
  readonly h: number;
  /** Corners in lon/lat: bottom-left, top-left, top-right, bottom-right (deck.gl BitmapLayer order). */
  readonly bounds: [[number, number], [number, number], [number, number], [number, number]];
}

/** Tiles covering the grid; corners at cell edges (cell-area footprint of each sample). */
export function tilesFor(g: GridGeometry, block = BLOCK): Tile[] {
  const t = transformer(g.crs, WGS84);
  const corner = (i: number, j: number) => t.forward([colToX(g, i - 0.5), rowToY(g, j - 0.5)]) as [number, number];
  const tiles: Tile[] = [];
  for (let j0 = 0; j0 < g.ny; j0 += block) {
    for (let i0 = 0; i0 < g.nx; i0 += block) {
      const w = Math.min(block, g.nx - i0);
      const h = Math.min(block, g.ny - j0);
      // Row j0 is the image's top row. With dy < 0 that is the north edge.
      const top = j0;
      const bottom = j0 + h;
      tiles.push({ i0, j0, w, h, bounds: [corner(i0, bottom), corner(i0, top), corner(i0 + w, top), corner(i0 + w, bottom)] });
    }
  }
  return tiles;
}
