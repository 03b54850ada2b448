/**
 * CRS registry: EPSG codes we can resolve without a network, and user-supplied proj4 definitions.
 *
 * Definitions follow the EPSG dataset's parameters as expressed in proj4 syntax. ETRS89 is treated as
 * coincident with WGS84 (towgs84 zero), which is the usual proj4 convention and good to < 1 m.
 */

export interface Crs {
  /** 'EPSG:32709' for registry codes, 'PROJ4' for a user definition. */
  readonly id: string;
  readonly name: string;
  readonly proj4: string;
  readonly epsg?: number;
  /** Linear unit of the axes: metres for projected CRSs, degrees for geographic. */
  readonly units: 'm' | 'degree';
}

export class UnknownCrsError extends Error {
  constructor(readonly code: string) {
    super(
      `CRS ${code} is not in Taperline's built-in list (WGS84 4326, WGS84 UTM 32601–32660/32701–32760, ` +
        `ETRS89 UTM 25828–25838, Web Mercator 3857). Supply its proj4 definition instead ` +
        `(for example "+proj=tmerc +lat_0=0 +lon_0=3 +k=0.9996 +x_0=500000 +y_0=0 +ellps=GRS80 +units=m").`,
    );
    this.name = 'UnknownCrsError';
  }
}

export const WGS84: Crs = {
  id: 'EPSG:4326',
  name: 'WGS 84',
  proj4: '+proj=longlat +datum=WGS84 +no_defs',
  epsg: 4326,
  units: 'degree',
};

export const WEB_MERCATOR: Crs = {
  id: 'EPSG:3857',
  name: 'WGS 84 / Pseudo-Mercator',
  proj4: '+proj=merc +a=6378137 +b=6378137 +lat_ts=0 +lon_0=0 +x_0=0 +y_0=0 +k=1 +units=m +nadgrids=@null +wktext +no_defs',
  epsg: 3857,
  units: 'm',
};

/** Resolve an EPSG code (number, "4326" or "EPSG:4326"). Throws UnknownCrsError for anything else. */
export function crsFromEpsg(code: number | string): Crs {
  const text = String(code).trim();
  const m = /^(?:EPSG:)?(\d+)$/i.exec(text);
  if (!m) throw new UnknownCrsError(text);
  const n = Number(m[1]);
  if (n === 4326) return WGS84;
  if (n === 3857) return WEB_MERCATOR;
  if (n >= 32601 && n <= 32660) return utm(n, n - 32600, false, 'WGS 84', '+datum=WGS84');
  if (n >= 32701 && n <= 32760) return utm(n, n - 32700, true, 'WGS 84', '+datum=WGS84');
  if (n >= 25828 && n <= 25838) return utm(n, n - 25800, false, 'ETRS89', '+ellps=GRS80 +towgs84=0,0,0,0,0,0,0');
  // 32767 is GeoTIFF's "user-defined": the file carries no code we could look up.
  throw new UnknownCrsError(n === 32767 ? 'user-defined (32767)' : `EPSG:${n}`);
}

function utm(epsg: number, zone: number, south: boolean, datumName: string, datum: string): Crs {
  return {
    id: `EPSG:${epsg}`,
    name: `${datumName} / UTM zone ${zone}${south ? 'S' : 'N'}`,
    proj4: `+proj=utm +zone=${zone}${south ? ' +south' : ''} ${datum} +units=m +no_defs`,
    epsg,
    units: 'm',
  };
}

/** A CRS from a user's proj4 string; the string is checked by proj4 when first used. */
export function crsFromProj4(def: string, name = 'user-defined (proj4)'): Crs {
  const text = def.trim();
  if (!text.startsWith('+proj=')) {
    throw new Error(`not a proj4 definition (it must start with "+proj="): ${text.slice(0, 60)}`);
  }
  const units = /\+proj=(longlat|latlong|lonlat|latlon)\b/.test(text) ? 'degree' : 'm';
  return { id: 'PROJ4', name, proj4: text, units };
}

/** Resolve what a user typed: an EPSG code or a proj4 string. */
export function resolveCrs(spec: string | number): Crs {
  const text = String(spec).trim();
  if (text.startsWith('+proj=')) return crsFromProj4(text);
  return crsFromEpsg(text);
}
