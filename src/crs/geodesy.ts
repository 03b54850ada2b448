/**
 * Geodesic lengths and areas on the WGS84 ellipsoid (Karney 2013, J. Geodesy 87, through
 * geographiclib-geodesic). Every reported length or area goes through here: never planar in
 * Web Mercator, never spherical.
 */

import geographiclib from 'geographiclib-geodesic';

const geod = geographiclib.Geodesic.WGS84;

/** Geodesic distance in metres between two lon/lat points (degrees). */
export function geodesicDistance(lon1: number, lat1: number, lon2: number, lat2: number): number {
  return geod.Inverse(lat1, lon1, lat2, lon2).s12 as number;
}

/** Length in metres of a lon/lat polyline given as flat [lon, lat, lon, lat, ...]. */
export function geodesicLength(lonlat: ArrayLike<number>, start = 0, end = lonlat.length / 2): number {
  let s = 0;
  for (let k = start + 1; k < end; k++) {
    s += geodesicDistance(lonlat[2 * k - 2], lonlat[2 * k - 1], lonlat[2 * k], lonlat[2 * k + 1]);
  }
  return s;
}

/**
 * Area in m² of a lon/lat ring (flat array, closing vertex optional), edges taken as geodesics.
 * Returns the unsigned area; use ringSignedArea for orientation.
 */
export function geodesicRingArea(lonlat: ArrayLike<number>): number {
  return Math.abs(ringSignedArea(lonlat));
}

/** Signed geodesic area: positive for counter-clockwise rings (GeographicLib's convention). */
export function ringSignedArea(lonlat: ArrayLike<number>): number {
  const n = lonlat.length / 2;
  if (n < 3) return 0;
  const p = geod.Polygon(false);
  let last = n;
  if (lonlat[0] === lonlat[2 * n - 2] && lonlat[1] === lonlat[2 * n - 1]) last = n - 1;
  for (let k = 0; k < last; k++) p.AddPoint(lonlat[2 * k + 1], lonlat[2 * k]);
  const r = p.Compute(false, true);
  return r.area as number;
}

