/**
 * Local calibration of a proxy threshold to interpreter picks: at each pick the threshold becomes the
 * crustal thickness there, and between picks it is interpolated linearly along strike (the direction
 * perpendicular to oceanward); beyond the outermost picks it stays at the end value. The traced line
 * therefore passes through every pick and follows the proxy's shape between them.
 */

import { colToX, rowToY, xToCol, yToRow, type GridGeometry } from '../grid/geometry.js';
import { sampleBilinear } from '../grid/resample.js';
import type { Oceanward } from '../domains/direction.js';
import { interpolateAlongStrike, strikeOf } from './strike.js';

export interface CalibrationPoint {
  readonly x: number;
  readonly y: number;
  readonly thickness: number;
  readonly strike: number;
  readonly line?: string;
}

export interface Calibration {
  readonly field: Float32Array | number;
  readonly points: CalibrationPoint[];
  readonly skipped: { x: number; y: number; line?: string; reason: string }[];
}

export function calibrateThreshold(
  geometry: GridGeometry,
  thickness: Float32Array,
  picks: { x: number; y: number; line?: string }[],
  oceanward: Oceanward,
  fallback: number,
): Calibration {
  const grid = { geometry, values: thickness };
  const points: CalibrationPoint[] = [];
  const skipped: Calibration['skipped'] = [];
  for (const p of picks) {
    const t = sampleBilinear(grid, xToCol(geometry, p.x), yToRow(geometry, p.y));
    if (!Number.isFinite(t)) {
      skipped.push({ ...p, reason: 'no crustal thickness at the pick (outside the grid, no data or Moho not imaged)' });
      continue;
    }
    points.push({ x: p.x, y: p.y, line: p.line, thickness: t, strike: strikeOf(oceanward, p.x, p.y) });
  }
  if (points.length === 0) return { field: fallback, points, skipped };
  points.sort((a, b) => a.strike - b.strike);
  const { nx, ny } = geometry;
  const field = new Float32Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    const y = rowToY(geometry, j);
    for (let i = 0; i < nx; i++) {
      const s = strikeOf(oceanward, colToX(geometry, i), y);
      field[j * nx + i] = interpolateAlongStrike(points, s, (q) => q.thickness);
    }
  }
  return { field, points, skipped };
}
