/**
 * The reference figures, when GDAL is on the PATH: its reader (Python osgeo ReadAsArray), its
 * in-memory contour generator (ContourGenerateEx into a Memory layer, the call timed alone), and
 * the "GDAL subset" of a whole run — gdal_calc.py for the thickness, then gdal_contour at the same
 * levels into a GeoPackage — timed as whole processes. Null when the tool is missing.
 */

import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, rmSync } from 'node:fs';

const PY = '/usr/bin/python3';

export function haveGdal(): boolean {
  return spawnSync('gdalinfo', ['--version']).status === 0 && spawnSync(PY, ['-c', 'from osgeo import gdal']).status === 0;
}

/** Milliseconds GDAL takes to read each file into an array (median of `reps`). */
export function gdalRead(paths: string[], reps: number): number[] | null {
  if (!haveGdal()) return null;
  const script = [
    'import sys, time', 'from osgeo import gdal', 'reps = int(sys.argv[1])', 'out = []',
    'for p in sys.argv[2:]:', '    ts = []',
    '    for k in range(reps):', '        t = time.perf_counter(); ds = gdal.Open(p); ds.GetRasterBand(1).ReadAsArray(); ts.append((time.perf_counter() - t) * 1000)',
    '    out.append(sorted(ts)[len(ts) // 2])', 'print(" ".join(str(v) for v in out))',
  ].join('\n');
  return execFileSync(PY, ['-c', script, String(reps), ...paths], { encoding: 'utf8' }).trim().split(' ').map(Number);
}

/** Milliseconds of GDAL's contour generator on (moho − basement) at the levels, in memory (median). */
export function gdalContour(basement: string, moho: string, levels: number[], reps: number): number | null {
  if (!haveGdal()) return null;
  const script = [
    'import sys, time', 'from osgeo import gdal, ogr', 'gdal.UseExceptions()',
    'b = gdal.Open(sys.argv[1]); m = gdal.Open(sys.argv[2])',
    't = m.GetRasterBand(1).ReadAsArray() - b.GetRasterBand(1).ReadAsArray()',
    'mem = gdal.GetDriverByName("MEM").Create("", b.RasterXSize, b.RasterYSize, 1, gdal.GDT_Float32)',
    'mem.SetGeoTransform(b.GetGeoTransform()); band = mem.GetRasterBand(1); band.WriteArray(t); band.SetNoDataValue(float("nan"))',
    'levels = sys.argv[4]', 'ts = []',
    'for k in range(int(sys.argv[3])):',
    '    ds = ogr.GetDriverByName("Memory").CreateDataSource("m"); lyr = ds.CreateLayer("c"); lyr.CreateField(ogr.FieldDefn("v", ogr.OFTReal))',
    '    s = time.perf_counter(); gdal.ContourGenerateEx(band, lyr, options=["FIXED_LEVELS=" + levels, "ELEV_FIELD=v"]); ts.append((time.perf_counter() - s) * 1000)',
    'print(sorted(ts)[len(ts) // 2])',
  ].join('\n');
  return Number(execFileSync(PY, ['-c', script, basement, moho, String(reps), levels.join(',')], { encoding: 'utf8' }).trim());
}

/** Whole-process milliseconds of the GDAL subset: thickness by gdal_calc.py, contours by gdal_contour to GPKG. */
export function gdalSubset(basement: string, moho: string, levels: number[], dir: string): number | null {
  if (!haveGdal()) return null;
  const thick = `${dir}/thickness.tif`;
  const gpkg = `${dir}/contours.gpkg`;
  for (const f of [thick, gpkg]) if (existsSync(f)) rmSync(f);
  const t0 = performance.now();
  execFileSync('gdal_calc.py', ['--quiet', '-A', basement, '-B', moho, '--outfile', thick, '--calc', 'B-A', '--type', 'Float32', '--NoDataValue', 'nan'], { stdio: 'ignore' });
  execFileSync('gdal_contour', ['-q', '-a', 'v', '-fl', ...levels.map(String), '-f', 'GPKG', thick, gpkg], { stdio: 'ignore' });
  return performance.now() - t0;
}
