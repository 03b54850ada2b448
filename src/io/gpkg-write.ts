/**
 * Vector layers → GeoPackage bytes (OGC 12-128r18, version 1.3), with SQLite compiled to WebAssembly
 * (sql.js), so the same code runs in Node and in the browser. The caller passes the initialised sql.js
 * module (the core loads no files). Written: the three required tables (gpkg_spatial_ref_sys with -1,
 * 0, 4326 and each layer's CRS; gpkg_contents; gpkg_geometry_columns), application_id "GPKG" and
 * user_version 10300, one feature table per layer (fid, geom and one column per field), geometries as
 * the GeoPackage binary header (magic "GP", version 0, flags: little-endian, xy envelope; srs_id;
 * envelope) followed by little-endian WKB (ISO 13249-3 / OGC simple features).
 */

import type { SqlJsStatic } from 'sql.js';

export type Position = [number, number];

export interface GpkgGeometry {
  readonly type: 'LineString' | 'MultiLineString' | 'Polygon' | 'MultiPolygon';
  readonly coordinates: Position[] | Position[][] | Position[][][];
}

export interface GpkgSrs {
  readonly id: number;
  readonly name: string;
  readonly organization: string;
  readonly code: number;
  /** OGC WKT (version 1). */
  readonly wkt: string;
}

export interface GpkgLayer {
  readonly name: string;
  readonly description: string;
  readonly srs: GpkgSrs;
  readonly geometryType: 'LINESTRING' | 'MULTILINESTRING' | 'POLYGON' | 'MULTIPOLYGON' | 'GEOMETRY';
  readonly features: { geometry: GpkgGeometry; properties: Record<string, unknown> }[];
}

export const WGS84_SRS: GpkgSrs = {
  id: 4326,
  name: 'WGS 84 geodetic',
  organization: 'EPSG',
  code: 4326,
  wkt: 'GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563,AUTHORITY["EPSG","7030"]],AUTHORITY["EPSG","6326"]],PRIMEM["Greenwich",0,AUTHORITY["EPSG","8901"]],UNIT["degree",0.0174532925199433,AUTHORITY["EPSG","9122"]],AXIS["Latitude",NORTH],AXIS["Longitude",EAST],AUTHORITY["EPSG","4326"]]',
};

/** WKT of WGS 84 / UTM zone (EPSG:326zz north, 327zz south), or null for other codes. */
export function utmSrs(epsg: number): GpkgSrs | null {
  const south = epsg >= 32701 && epsg <= 32760;
  if (!(south || (epsg >= 32601 && epsg <= 32660))) return null;
  const zone = epsg - (south ? 32700 : 32600);
  const name = `WGS 84 / UTM zone ${zone}${south ? 'S' : 'N'}`;
  const geog = WGS84_SRS.wkt.replace(',AXIS["Latitude",NORTH],AXIS["Longitude",EAST]', '');
  const wkt =
    `PROJCS["${name}",${geog},PROJECTION["Transverse_Mercator"],PARAMETER["latitude_of_origin",0],` +
    `PARAMETER["central_meridian",${-183 + 6 * zone}],PARAMETER["scale_factor",0.9996],PARAMETER["false_easting",500000],` +
    `PARAMETER["false_northing",${south ? 10000000 : 0}],UNIT["metre",1,AUTHORITY["EPSG","9001"]],AXIS["Easting",EAST],AXIS["Northing",NORTH],AUTHORITY["EPSG","${epsg}"]]`;
  return { id: epsg, name, organization: 'EPSG', code: epsg, wkt };
}

type Column = 'TEXT' | 'REAL' | 'INTEGER' | 'BOOLEAN';

function columnType(values: unknown[]): Column {
  const present = values.filter((v) => v !== null && v !== undefined);
  if (present.length && present.every((v) => typeof v === 'boolean')) return 'BOOLEAN';
  if (present.length && present.every((v) => typeof v === 'number' && Number.isInteger(v))) return 'INTEGER';
  if (present.length && present.every((v) => typeof v === 'number')) return 'REAL';
  return 'TEXT';
}

export function writeGeoPackage(SQL: SqlJsStatic, layers: GpkgLayer[], time: string): Uint8Array {
  const db = new SQL.Database();
  try {
    db.run('PRAGMA application_id = 1196444487; PRAGMA user_version = 10300;');
    db.run(`CREATE TABLE gpkg_spatial_ref_sys (srs_name TEXT NOT NULL, srs_id INTEGER NOT NULL PRIMARY KEY, organization TEXT NOT NULL,
      organization_coordsys_id INTEGER NOT NULL, definition TEXT NOT NULL, description TEXT)`);
    db.run(`CREATE TABLE gpkg_contents (table_name TEXT NOT NULL PRIMARY KEY, data_type TEXT NOT NULL, identifier TEXT UNIQUE, description TEXT DEFAULT '',
      last_change DATETIME NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')), min_x DOUBLE, min_y DOUBLE, max_x DOUBLE, max_y DOUBLE, srs_id INTEGER,
      CONSTRAINT fk_gc_r_srs_id FOREIGN KEY (srs_id) REFERENCES gpkg_spatial_ref_sys(srs_id))`);
    db.run(`CREATE TABLE gpkg_geometry_columns (table_name TEXT NOT NULL, column_name TEXT NOT NULL, geometry_type_name TEXT NOT NULL, srs_id INTEGER NOT NULL,
      z TINYINT NOT NULL, m TINYINT NOT NULL, CONSTRAINT pk_geom_cols PRIMARY KEY (table_name, column_name), CONSTRAINT uk_gc_table_name UNIQUE (table_name),
      CONSTRAINT fk_gc_tn FOREIGN KEY (table_name) REFERENCES gpkg_contents(table_name), CONSTRAINT fk_gc_srs FOREIGN KEY (srs_id) REFERENCES gpkg_spatial_ref_sys (srs_id))`);
    const srs = db.prepare('INSERT INTO gpkg_spatial_ref_sys VALUES (?, ?, ?, ?, ?, ?)');
    srs.run(['Undefined cartesian SRS', -1, 'NONE', -1, 'undefined', 'undefined cartesian coordinate reference system']);
    srs.run(['Undefined geographic SRS', 0, 'NONE', 0, 'undefined', 'undefined geographic coordinate reference system']);
    const seen = new Set<number>([-1, 0]);
    for (const s of [WGS84_SRS, ...layers.map((l) => l.srs)]) {
      if (seen.has(s.id)) continue;
      seen.add(s.id);
      srs.run([s.name, s.id, s.organization, s.code, s.wkt, s.name]);
    }
    srs.free();
    const stamp = /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d/.test(time) ? `${time.slice(0, 19)}.000Z` : '1970-01-01T00:00:00.000Z';
    for (const layer of layers) writeLayer(db, layer, stamp);
    return db.export();
  } finally {
    db.close();
  }
}

function writeLayer(db: InstanceType<SqlJsStatic['Database']>, layer: GpkgLayer, stamp: string): void {
  const keys = [...new Set(layer.features.flatMap((f) => Object.keys(f.properties)))];
  const types = keys.map((k) => columnType(layer.features.map((f) => f.properties[k])));
  const q = (s: string) => `"${s.replace(/"/g, '""')}"`;
  db.run(`CREATE TABLE ${q(layer.name)} (fid INTEGER PRIMARY KEY AUTOINCREMENT NOT NULL, geom ${layer.geometryType}${keys.map((k, i) => `, ${q(k)} ${types[i]}`).join('')})`);
  const ins = db.prepare(`INSERT INTO ${q(layer.name)} (geom${keys.map((k) => `, ${q(k)}`).join('')}) VALUES (?${keys.map(() => ', ?').join('')})`);
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const f of layer.features) {
    const env = envelope(f.geometry);
    minX = Math.min(minX, env[0]); maxX = Math.max(maxX, env[1]); minY = Math.min(minY, env[2]); maxY = Math.max(maxY, env[3]);
    const values = keys.map((k, i) => {
      const v = f.properties[k];
      if (v === null || v === undefined) return null;
      if (types[i] === 'BOOLEAN') return v ? 1 : 0;
      if (types[i] === 'TEXT') return typeof v === 'string' ? v : JSON.stringify(v);
      return v as number;
    });
    ins.run([gpkgBlob(f.geometry, layer.srs.id, env), ...values]);
  }
  ins.free();
  const has = layer.features.length > 0;
  db.run('INSERT INTO gpkg_contents (table_name, data_type, identifier, description, last_change, min_x, min_y, max_x, max_y, srs_id) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)', [
    layer.name, 'features', layer.name, layer.description, stamp, has ? minX : null, has ? minY : null, has ? maxX : null, has ? maxY : null, layer.srs.id,
  ]);
  db.run('INSERT INTO gpkg_geometry_columns VALUES (?, ?, ?, ?, 0, 0)', [layer.name, 'geom', layer.geometryType, layer.srs.id]);
}

/** [minx, maxx, miny, maxy] of every position. */
function envelope(g: GpkgGeometry): [number, number, number, number] {
  const e: [number, number, number, number] = [Infinity, -Infinity, Infinity, -Infinity];
  const walk = (c: unknown): void => {
    if (typeof (c as number[])[0] === 'number') {
      const [x, y] = c as Position;
      e[0] = Math.min(e[0], x); e[1] = Math.max(e[1], x); e[2] = Math.min(e[2], y); e[3] = Math.max(e[3], y);
    } else for (const q of c as unknown[]) walk(q);
  };
  walk(g.coordinates);
  return e;
}

/** GeoPackage binary: header with an xy envelope, then little-endian WKB. */
function gpkgBlob(g: GpkgGeometry, srsId: number, env: [number, number, number, number]): Uint8Array {
  const wkb = wkbOf(g);
  const out = new Uint8Array(8 + 32 + wkb.length);
  const dv = new DataView(out.buffer);
  out[0] = 0x47; // 'G'
  out[1] = 0x50; // 'P'
  out[2] = 0; // version 1
  out[3] = 0b0000_0011; // little-endian, envelope [minx, maxx, miny, maxy]
  dv.setInt32(4, srsId, true);
  env.forEach((v, k) => dv.setFloat64(8 + 8 * k, v, true));
  out.set(wkb, 40);
  return out;
}

function wkbOf(g: GpkgGeometry): Uint8Array {
  const bytes: Uint8Array[] = [];
  const head = (type: number) => {
    const b = new Uint8Array(5);
    b[0] = 1;
    new DataView(b.buffer).setUint32(1, type, true);
    bytes.push(b);
  };
  const u32 = (n: number) => {
    const b = new Uint8Array(4);
    new DataView(b.buffer).setUint32(0, n, true);
    bytes.push(b);
  };
  const points = (ps: Position[]) => {
    u32(ps.length);
    const b = new Uint8Array(16 * ps.length);
    const dv = new DataView(b.buffer);
    ps.forEach(([x, y], k) => (dv.setFloat64(16 * k, x, true), dv.setFloat64(16 * k + 8, y, true)));
    bytes.push(b);
  };
  const polygon = (rings: Position[][]) => {
    head(3);
    u32(rings.length);
    for (const r of rings) points(r);
  };
  if (g.type === 'LineString') (head(2), points(g.coordinates as Position[]));
  else if (g.type === 'MultiLineString') {
    head(5);
    u32((g.coordinates as Position[][]).length);
    for (const l of g.coordinates as Position[][]) (head(2), points(l));
  } else if (g.type === 'Polygon') polygon(g.coordinates as Position[][]);
  else {
    head(6);
    u32((g.coordinates as Position[][][]).length);
    for (const p of g.coordinates as Position[][][]) polygon(p);
  }
  const n = bytes.reduce((a, b) => a + b.length, 0);
  const out = new Uint8Array(n);
  let at = 0;
  for (const b of bytes) (out.set(b, at), (at += b.length));
  return out;
}
