/**
 * Optional external tools (GDAL, Chromium). Without them the tests that need them skip with a visible
 * note; .ci/run sets TAPERLINE_REQUIRE_TOOLS=1 so that in CI a missing tool is a failure, never a skip.
 */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';

export const REQUIRE_TOOLS = process.env.TAPERLINE_REQUIRE_TOOLS === '1';

function probe(cmd: string, args: string[]): boolean {
  try {
    execFileSync(cmd, args, { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export function haveGdal(): boolean {
  return probe('gdalinfo', ['--version']);
}

/** Debian's python3 with GDAL's bindings, for GDAL's validate_gpkg.py and validate_cloud_optimized_geotiff.py. */
export const GDAL_PYTHON = '/usr/bin/python3';
export const GDAL_SAMPLES = '/usr/lib/python3/dist-packages/osgeo_utils/samples';
export function haveGdalPython(): boolean {
  return probe(GDAL_PYTHON, ['-c', 'from osgeo import gdal']) && existsSync(`${GDAL_SAMPLES}/validate_cloud_optimized_geotiff.py`);
}

export function haveChromium(): boolean {
  return existsSync(CHROMIUM);
}

/** Returns true when the tool is there; otherwise prints how to enable the tests, or throws in CI. */
export function toolOrSkip(name: 'gdal' | 'chromium' | 'gdal-python'): boolean {
  const ok = name === 'gdal' ? haveGdal() : name === 'gdal-python' ? haveGdalPython() : haveChromium();
  if (ok) return true;
  const how = name === 'gdal' ? 'apt-get install gdal-bin' : name === 'gdal-python' ? 'apt-get install python3-gdal' : 'apt-get install chromium fonts-dejavu-core';
  if (REQUIRE_TOOLS) throw new Error(`${name} is required here (TAPERLINE_REQUIRE_TOOLS=1) but not found: ${how}`);
  console.warn(`\n  NOTE: ${name} not found; tests that need it are SKIPPED. Enable them with: ${how}\n`);
  return false;
}
