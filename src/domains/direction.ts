/**
 * The oceanward direction: the user's azimuth, or the down-dip direction of a least-squares plane
 * fitted to water-loaded basement depth (long-wavelength: basement deepens oceanward).
 * Azimuths are degrees clockwise from grid north (+y of the analysis CRS).
 */

import { colToX, rowToY, type GridGeometry } from '../grid/geometry.js';

export interface Oceanward {
  /** Unit vector towards the ocean in map coordinates (east, north). */
  readonly ex: number;
  readonly ey: number;
  readonly azimuth: number;
  readonly source: 'user' | 'plane-fit';
  /** Depth gradient of the fitted plane, m per km (plane fit only). */
  readonly gradient?: number;
}

export function oceanwardFromAzimuth(azimuth: number): Oceanward {
  const r = (azimuth * Math.PI) / 180;
  return { ex: Math.sin(r), ey: Math.cos(r), azimuth: ((azimuth % 360) + 360) % 360, source: 'user' };
}

/** Least-squares plane z = a + b·x + c·y over finite cells (subsampled for speed); null if too few. */
export function planeFit(g: GridGeometry, z: Float32Array): { b: number; c: number } | null {
  const step = Math.max(1, Math.floor(Math.sqrt((g.nx * g.ny) / 250_000)));
  const xc = colToX(g, (g.nx - 1) / 2);
  const yc = rowToY(g, (g.ny - 1) / 2);
  let n = 0, sx = 0, sy = 0, sz = 0, sxx = 0, syy = 0, sxy = 0, sxz = 0, syz = 0;
  for (let j = 0; j < g.ny; j += step) {
    const y = (rowToY(g, j) - yc) / 1000;
    for (let i = 0; i < g.nx; i += step) {
      const v = z[j * g.nx + i];
      if (!Number.isFinite(v)) continue;
      const x = (colToX(g, i) - xc) / 1000;
      n++; sx += x; sy += y; sz += v; sxx += x * x; syy += y * y; sxy += x * y; sxz += x * v; syz += y * v;
    }
  }
  if (n < 3) return null;
  // Normal equations on centred sums.
  const mx = sx / n, my = sy / n, mz = sz / n;
  const cxx = sxx - n * mx * mx, cyy = syy - n * my * my, cxy = sxy - n * mx * my;
  const cxz = sxz - n * mx * mz, cyz = syz - n * my * mz;
  const det = cxx * cyy - cxy * cxy;
  if (Math.abs(det) < 1e-12) return null;
  return { b: (cxz * cyy - cyz * cxy) / det, c: (cyz * cxx - cxz * cxy) / det };
}

export function oceanwardFromDepth(g: GridGeometry, depth: Float32Array): Oceanward | null {
  const p = planeFit(g, depth);
  if (!p) return null;
  const norm = Math.hypot(p.b, p.c);
  if (!(norm > 0)) return null;
  const ex = p.b / norm;
  const ey = p.c / norm;
  const azimuth = ((Math.atan2(ex, ey) * 180) / Math.PI + 360) % 360;
  return { ex, ey, azimuth, source: 'plane-fit', gradient: norm };
}
