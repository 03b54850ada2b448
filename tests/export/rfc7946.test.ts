// GeoJSON output against RFC 7946 rules, and the outputs opened by GDAL (an independent reader).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { demoBytes } from '../helpers/demo-run.js';
import { afterAll, describe, expect, it } from 'vitest';
import { geodesicLength, geodesicRingArea } from '../../src/crs/geodesy.js';
import { lonLatSignedArea, rfcPolygons, splitLine } from '../../src/export/rfc7946.js';
import { taperline } from '../helpers/cli.js';
import { GDAL_PYTHON, GDAL_SAMPLES, toolOrSkip } from '../helpers/tools.js';
import { rfc7946Violations } from '../helpers/rfc7946.js';

describe('RFC 7946 helpers', () => {
  it('split a line at the antimeridian, keeping both parts on their own side', () => {
    const parts = splitLine([[179, 10], [-179, 12]]);
    expect(parts).toEqual([[[179, 10], [180, 11]], [[-180, 11], [-179, 12]]]);
  });
  it('split a polygon spanning the antimeridian into two right-hand-wound parts', () => {
    const polys = rfcPolygons([[[178, -10], [-178, -10], [-178, -8], [178, -8], [178, -10]]]);
    expect(polys.length).toBe(2);
    for (const p of polys) expect(lonLatSignedArea(p[0])).toBeGreaterThan(0);
    const lons = polys.map((p) => p[0].map((q) => q[0]));
    expect(lons.some((l) => l.every((x) => x >= 178))).toBe(true);
    expect(lons.some((l) => l.every((x) => x <= -178))).toBe(true);
  });
  it('winds a clockwise exterior counter-clockwise', () => {
    const [poly] = rfcPolygons([[[0, 0], [0, 1], [1, 1], [1, 0], [0, 0]]]);
    expect(lonLatSignedArea(poly[0])).toBeGreaterThan(0);
  });
});

/** Every line and ring: no repeated consecutive position; `closed` exactly when first = last. */
function geometryFaults(fc: { features: { properties: Record<string, unknown>; geometry: { type: string; coordinates: unknown } }[] }): string[] {
  const out: string[] = [];
  const eq = (a: number[], b: number[]) => a[0] === b[0] && a[1] === b[1];
  fc.features.forEach((f, i) => {
    const parts = (f.geometry.type === 'LineString' ? [f.geometry.coordinates] : f.geometry.type === 'MultiLineString' || f.geometry.type === 'Polygon' ? f.geometry.coordinates : (f.geometry.coordinates as unknown[]).flat()) as number[][][];
    for (const p of parts) {
      for (let k = 1; k < p.length; k++) if (eq(p[k], p[k - 1])) out.push(`feature ${i}: repeated position ${p[k]}`);
      if (p.length < 2) out.push(`feature ${i}: a part of ${p.length} position`);
    }
    if (f.geometry.type === 'LineString' && typeof f.properties.closed === 'boolean') {
      const c = f.geometry.coordinates as number[][];
      if (f.properties.closed !== eq(c[0], c[c.length - 1])) out.push(`feature ${i}: closed = ${f.properties.closed} but first ${eq(c[0], c[c.length - 1]) ? '=' : '≠'} last`);
    }
  });
  return out;
}

describe('taperline demo outputs', () => {
  const out = mkdtempSync(join(tmpdir(), 'taperline-demo-'));
  afterAll(() => rmSync(out, { recursive: true, force: true }));
  const run = taperline(['demo', '--out', out]);

  it('the demo command succeeds on a fresh checkout and writes the documented files', () => {
    expect(run.stderr).not.toMatch(/internal error/);
    expect(run.status).toBe(0);
    const names = readdirSync(out).sort();
    expect(names).toEqual(['.taperline-outputs', 'boundaries-whole-grid.geojson', 'boundaries.geojson', 'boundaries.gpkg', 'boundary-lines-whole-grid.geojson', 'boundary-lines.geojson', 'domains-whole-grid.geojson', 'domains.geojson', 'grids', 'summary.json']);
    expect(readdirSync(join(out, 'grids'))).toContain('crustal-thickness.tif');
    const grids = readdirSync(join(out, 'grids'));
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    // every derived grid that holds a value, domains and the unbounded-β mask, with their category side-cars
    const empty = (summary.grids_not_written as { name: string }[]).map((q) => q.name);
    expect(empty).toEqual(['oceanic-depth-anomaly']); // the demo's oceanic depths all fit GDH1 before the rift
    expect(grids.filter((f) => f.endsWith('.tif'))).toHaveLength(15 - empty.length + 2);
    expect(grids.filter((f) => f.endsWith('.aux.xml')).sort()).toEqual(['domains.tif.aux.xml', 'unbounded-beta.tif.aux.xml']);
  });

  it('every vector output follows RFC 7946, with no repeated positions and closed exactly when it closes', () => {
    for (const f of readdirSync(out).filter((q) => q.endsWith('.geojson'))) {
      const fc = JSON.parse(readFileSync(join(out, f), 'utf8'));
      expect(fc.features.length).toBeGreaterThan(0);
      expect(rfc7946Violations(fc), f).toEqual([]);
      expect(geometryFaults(fc), f).toEqual([]);
    }
  });

  it('boundary-lines.geojson holds one feature per continuous line, with evidence as shares of its length', () => {
    const lines = JSON.parse(readFileSync(join(out, 'boundary-lines-whole-grid.geojson'), 'utf8'));
    const pieces = JSON.parse(readFileSync(join(out, 'boundaries-whole-grid.geojson'), 'utf8'));
    const total = (fc: { features: { properties: { kind: string; length_km?: number } }[] }, kind: string) => fc.features.filter((f) => f.properties.kind === kind).reduce((a, f) => a + (f.properties.length_km ?? 0), 0);
    for (const kind of ['crustal-taper-limit', 'oceanic-limit', 'necking-line', 'coupling-line']) {
      expect(lines.features.filter((f: { properties: { kind: string } }) => f.properties.kind === kind).length).toBeLessThan(pieces.features.filter((f: { properties: { kind: string } }) => f.properties.kind === kind).length);
      expect(total(lines, kind)).toBeCloseTo(total(pieces, kind), 0);
    }
    for (const f of lines.features) {
      expect(f.properties.evidence_picks_fraction).toBeGreaterThanOrEqual(0);
      expect(f.properties.evidence_picks_fraction).toBeLessThanOrEqual(1);
      expect(['picks', 'mixed', 'proxy']).toContain(f.properties.evidence);
    }
  });

  it('every boundary piece says what placed it, how far control is, and its geodesic length or area', () => {
    const fc = JSON.parse(readFileSync(join(out, 'boundaries-whole-grid.geojson'), 'utf8'));
    const kinds = new Set(fc.features.map((f: { properties: { kind: string } }) => f.properties.kind));
    expect([...kinds].sort()).toEqual(['cot-zone', 'coupling-line', 'crustal-taper-limit', 'necking-line', 'oceanic-limit', 'oldest-onlapped-crust']);
    for (const f of fc.features) {
      expect(['picks', 'proxy', 'mixed']).toContain(f.properties.evidence);
      if (f.geometry.type === 'LineString') {
        expect(f.properties.length_km).toBeCloseTo(geodesicLength(f.geometry.coordinates.flat()) / 1000, 2);
        expect(typeof f.properties.control_distance_km).toBe('number');
      } else {
        expect(f.properties.area_km2).toBeCloseTo(geodesicRingArea(f.geometry.coordinates[0].flat()) / 1e6 - f.geometry.coordinates.slice(1).reduce((s: number, r: number[][]) => s + geodesicRingArea(r.flat()) / 1e6, 0), 1);
      }
    }
    const onlap = fc.features.find((f: { properties: { kind: string } }) => f.properties.kind === 'oldest-onlapped-crust');
    expect(onlap.properties.age_min_ma).toBe(108);
    // depth-derived ages are never older than the rift (110 Myr in the demo parameters)
    for (const f of fc.features.filter((q: { properties: { kind: string } }) => q.properties.kind === 'oldest-onlapped-crust')) {
      if (typeof f.properties.depth_age_max_ma === 'number') expect(f.properties.depth_age_max_ma).toBeLessThanOrEqual(110);
      if (typeof f.properties.depth_age_min_ma === 'number') expect(f.properties.depth_age_min_ma).toBeLessThanOrEqual(110);
    }
  });

  it('the summary records parameters with defaults, inputs with sha256 and detections, areas and warnings', () => {
    const s = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(s.parameters.riftAge).toBe(110);
    expect(s.parameter_defaults.tc0).toBe(35000);
    const basement = s.inputs.find((i: { role: string }) => i.role === 'basement');
    expect(basement.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(basement.detected.units.value).toBe('m');
    expect(s.areas_km2.inside_licence).not.toBeNull();
    expect(s.time).toMatch(/^\d{4}-\d\d-\d\dT/);
    expect(s.caution).toMatch(/interpretations/i);
    // inside the licence: exact clipped areas; they add up to the licence's geodesic area (it lies in the grid)
    // (no-data cells make no polygon: their area comes from the cells whose centre lies inside)
    const inside = Object.values(s.areas_km2.inside_licence as Record<string, { code: number; km2: number }>).reduce((a, b) => a + b.km2, 0);
    const licence = JSON.parse(new TextDecoder().decode(demoBytes()['licence.geojson'])).features[0].geometry.coordinates[0];
    expect(Math.abs(inside - geodesicRingArea(licence.flat()) / 1e6)).toBeLessThan(1); // km²; the licence lies inside the grid
    // domain areas in the licence add up to the licence area covered by the grid (± one cell row)
    const total = Object.values(s.areas_km2.whole_grid as Record<string, { km2: number }>).reduce((a, b) => a + b.km2, 0);
    expect(total).toBeGreaterThan(59_000);
    expect(total).toBeLessThan(61_000); // 300 × 200 km at UTM scale
  });

  const gdal = toolOrSkip('gdal');
  const gdalPython = toolOrSkip('gdal-python');
  it.skipIf(!gdal)('the COT zone inside the licence has the geodesic area of the exact polygon intersection (GDAL/SpatiaLite ST_Intersection, ST_Area on the ellipsoid)', () => {
    const whole = JSON.parse(readFileSync(join(out, 'boundaries-whole-grid.geojson'), 'utf8'));
    const licence = JSON.parse(new TextDecoder().decode(demoBytes()['licence.geojson']));
    const both = {
      type: 'FeatureCollection',
      features: [
        ...whole.features.filter((f: { properties: { kind: string } }) => f.properties.kind === 'cot-zone').map((f: { geometry: unknown }) => ({ type: 'Feature', properties: { kind: 'cot-zone' }, geometry: f.geometry })),
        { ...licence.features[0], properties: { kind: 'licence' } },
      ],
    };
    const path = join(out, 'both.geojson');
    writeFileSync(path, JSON.stringify(both));
    const text = execFileSync('ogrinfo', ['-q', '-dialect', 'SQLite', '-sql', "SELECT SUM(ST_Area(ST_Intersection(a.geometry, b.geometry), 1)) / 1e6 AS km2 FROM both a, both b WHERE a.kind = 'cot-zone' AND b.kind = 'licence'", path], { encoding: 'utf8' });
    rmSync(path);
    const gdalKm2 = Number(/km2 \(Real\) = ([\d.]+)/.exec(text)?.[1]);
    const ours = JSON.parse(readFileSync(join(out, 'boundaries.geojson'), 'utf8')).features
      .filter((f: { properties: { kind: string } }) => f.properties.kind === 'cot-zone')
      .reduce((a: number, f: { properties: { area_km2: number } }) => a + f.properties.area_km2, 0);
    expect(gdalKm2).toBeGreaterThan(1000);
    expect(Math.abs(ours - gdalKm2) / gdalKm2).toBeLessThan(1e-4); // clipping in UTM vs lon/lat: the licence edges are densified every 1 km
  });

  it.skipIf(!gdalPython)("the GeoPackage passes GDAL's validate_gpkg.py; every layer in WGS 84 and in the analysis CRS, valid and simple, as the GeoJSON", () => {
    const gpkg = join(out, 'boundaries.gpkg');
    const v = execFileSync(GDAL_PYTHON, [`${GDAL_SAMPLES}/validate_gpkg.py`, gpkg], { encoding: 'utf8' });
    expect(v.trim()).toBe(''); // silent when valid
    const layers = execFileSync('ogrinfo', ['-q', gpkg], { encoding: 'utf8' }).trim().split('\n').map((l) => /^\d+: (\S+)/.exec(l)![1]);
    const bases = ['boundary_pieces', 'cot_zone', 'boundary_lines', 'boundary_pieces_whole_grid', 'cot_zone_whole_grid', 'boundary_lines_whole_grid', 'domains', 'domains_whole_grid'];
    expect(layers.sort()).toEqual(bases.flatMap((b) => [`${b}_wgs84`, `${b}_epsg32709`]).sort());
    const count = (file: string, pred: (f: { properties: { kind?: string } }) => boolean) => JSON.parse(readFileSync(join(out, file), 'utf8')).features.filter(pred).length;
    const want: Record<string, number> = {
      boundary_pieces: count('boundaries.geojson', (f) => f.properties.kind !== 'cot-zone'),
      cot_zone: count('boundaries.geojson', (f) => f.properties.kind === 'cot-zone'),
      boundary_lines: count('boundary-lines.geojson', () => true),
      domains: count('domains.geojson', () => true),
    };
    for (const layer of layers) {
      const sql = `SELECT COUNT(*) AS n, SUM(ST_IsValid(geom)) AS valid, SUM(CASE WHEN ST_GeometryType(geom) LIKE '%LINESTRING%' THEN ST_IsSimple(geom) ELSE 1 END) AS simple FROM "${layer}"`;
      const text = execFileSync('ogrinfo', ['-q', '-sql', sql, gpkg], { encoding: 'utf8' });
      const n = Number(/n \(Integer\) = (\d+)/.exec(text)?.[1]);
      expect(Number(/valid \(Integer\) = (\d+)/.exec(text)?.[1]), layer).toBe(n);
      expect(Number(/simple \(Integer\) = (\d+)/.exec(text)?.[1]), layer).toBe(n);
      const base = layer.replace(/_(wgs84|epsg32709)$/, '');
      if (want[base] !== undefined) expect(n, layer).toBe(want[base]);
      const so = execFileSync('ogrinfo', ['-so', gpkg, layer], { encoding: 'utf8' });
      expect(so, layer).toMatch(layer.endsWith('wgs84') ? /ID\["EPSG",4326\]\]\s*$/m : /UTM zone 9S/);
    }
  });

  it.skipIf(!gdalPython)("every grid passes GDAL's validate_cloud_optimized_geotiff.py and has finite statistics", () => {
    for (const f of readdirSync(join(out, 'grids')).filter((q) => q.endsWith('.tif'))) {
      const path = join(out, 'grids', f);
      const text = execFileSync(GDAL_PYTHON, [`${GDAL_SAMPLES}/validate_cloud_optimized_geotiff.py`, '--full-check=yes', path], { encoding: 'utf8' });
      expect(text, f).toMatch(/is a valid cloud optimized GeoTIFF/);
      expect(text, f).not.toMatch(/warning/i);
      const info = JSON.parse(execFileSync('gdalinfo', ['-json', '-stats', path], { encoding: 'utf8' }));
      const b = info.bands[0];
      for (const k of ['minimum', 'maximum', 'mean', 'stdDev']) expect(Number.isFinite(b[k]), `${f} ${k} = ${b[k]}`).toBe(true);
    }
  });
  it.skipIf(!gdal)('GDAL opens every output: grids with CRS, extent and NoData; vectors valid', () => {
    for (const f of readdirSync(join(out, 'grids')).filter((q) => q.endsWith('.tif'))) {
      const info = JSON.parse(execFileSync('gdalinfo', ['-json', join(out, 'grids', f)], { encoding: 'utf8' }));
      expect(info.geoTransform).toEqual([350_000, 500, 0, 6_225_000, 0, -500]);
      expect(info.coordinateSystem.wkt).toMatch(/ID\["EPSG",32709\]\]$/);
      expect(info.size).toEqual([600, 400]);
      expect(info.metadata[''].TIFFTAG_SOFTWARE).toMatch(/^taperline /); // provenance
      // cloud-optimized layout: 256 × 256 tiles, DEFLATE, internal overviews
      expect(info.bands[0].block).toEqual([256, 256]);
      expect(info.metadata.IMAGE_STRUCTURE.COMPRESSION).toBe('DEFLATE');
      expect(info.bands[0].overviews.map((o: { size: number[] }) => o.size)).toEqual([[300, 200], [150, 100]]);
      if (f === 'domains.tif') {
        expect(info.bands[0].type).toBe('Byte');
        expect(info.bands[0].noDataValue).toBe(0);
        expect(info.bands[0].colorInterpretation).toBe('Palette');
        expect(info.bands[0].colorTable.entries[5].slice(0, 3)).toEqual([52, 110, 170]);
        expect(info.bands[0].categories.slice(0, 7)).toEqual(['no data', 'proximal continental', 'necking', 'hyperextended continental', 'transition (exhumed mantle or unresolved)', 'oceanic', 'Moho not imaged']);
      } else if (f === 'unbounded-beta.tif') {
        expect(info.bands[0].type).toBe('Byte');
        expect(info.bands[0].categories[1]).toMatch(/zero crust/);
      } else {
        expect(info.bands[0].description).toBeTruthy();
        expect(info.bands[0].type).toBe('Float32');
        expect(String(info.bands[0].noDataValue)).toBe('NaN');
      }
    }
    for (const f of readdirSync(out).filter((q) => q.endsWith('.geojson'))) {
      const layer = JSON.parse(readFileSync(join(out, f), 'utf8')).name;
      // every geometry valid (GEOS, through GDAL's SQLite dialect), and every line simple
      const sql = `SELECT SUM(ST_IsValid(geometry)) AS valid, SUM(CASE WHEN ST_GeometryType(geometry) LIKE '%LINESTRING%' THEN ST_IsSimple(geometry) ELSE 1 END) AS simple, COUNT(*) AS n FROM "${layer}"`;
      const text = execFileSync('ogrinfo', ['-q', '-dialect', 'SQLite', '-sql', sql, join(out, f)], { encoding: 'utf8' });
      const valid = Number(/valid \(Integer\) = (\d+)/.exec(text)?.[1]);
      const simple = Number(/simple \(Integer\) = (\d+)/.exec(text)?.[1]);
      const n = Number(/n \(Integer\) = (\d+)/.exec(text)?.[1]);
      expect(n, f).toBeGreaterThan(0);
      expect(valid, f).toBe(n);
      expect(simple, f).toBe(n);
      const so = execFileSync('ogrinfo', ['-so', '-al', join(out, f)], { encoding: 'utf8' });
      expect(so).toMatch(/WGS 84/);
      expect(so).toMatch(/Extent: \(-1[23]\d\.\d+, -3\d\.\d+\) - \(-12\d\.\d+, -3\d\.\d+\)/);
    }
  });
});
