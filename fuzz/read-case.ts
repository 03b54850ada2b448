/**
 * Read one fuzz case as the tool would, and say how it ended: refused with a clear message,
 * read (and whether what was read is sound), or failed with an error that is not the project's own.
 */

import { createHash } from 'node:crypto';
import { InputError } from '../src/io/errors.js';
import { expectKinds, readGeoJson } from '../src/io/geojson-read.js';
import { readGeoTiff } from '../src/io/geotiff-read.js';
import { fromBase64, parseProject } from '../src/io/project.js';
import { readXyz } from '../src/io/xyz-read.js';
import { PARAM_SPECS, resolveParams } from '../src/params.js';
import { DERIVED } from '../src/derive/grids.js';
import { PLAN_SPECS, resolvePlan } from '../src/survey/params.js';
import type { Case, Reader } from './cases.js';

export type Outcome = 'refused' | 'read' | 'uncaught' | 'unclear' | 'unsound';

export interface CaseResult {
  readonly outcome: Outcome;
  readonly message?: string;
}

const SCHEMA = { paramKeys: PARAM_SPECS.map((s) => s.key as string), planKeys: PLAN_SPECS.map((s) => s.key as string), layers: ['domains', ...DERIVED.map((d) => d.name as string)] };

/** A refusal a user can act on: the file named first, no library internals, no "undefined". */
export function clearMessage(file: string, message: string): boolean {
  return message.startsWith(`${file}: `) && !/undefined|\[object |TypeError|RangeError|is not a function|Cannot read properties/.test(message);
}

export async function readCase(reader: Reader, c: Case): Promise<CaseResult> {
  try {
    if (reader === 'geotiff' || reader === 'xyz') {
      const { grid } = reader === 'geotiff' ? await readGeoTiff(c.bytes, c.name, { role: 'top-basement' }) : readXyz(new TextDecoder().decode(c.bytes), c.name, { crs: 'EPSG:32709', role: 'top-basement' });
      const g = grid.geometry;
      for (const v of grid.values) if (v === Infinity || v === -Infinity) return { outcome: 'unsound', message: 'grid holds ±∞' };
      if (![g.x0, g.y0, g.dx, g.dy].every(Number.isFinite) || !(g.dx > 0) || g.dy === 0) return { outcome: 'unsound', message: 'geometry not finite' };
      return { outcome: 'read' };
    }
    if (reader === 'geojson') {
      const set = readGeoJson(new TextDecoder().decode(c.bytes), c.name);
      expectKinds(set, c.role!);
      for (const f of set.features) for (const part of f.parts) for (const p of part) if (!Number.isFinite(p[0]) || !Number.isFinite(p[1])) return { outcome: 'unsound', message: 'non-finite position' };
      return { outcome: 'read' };
    }
    const p = parseProject(new TextDecoder().decode(c.bytes), c.name, SCHEMA);
    try {
      resolveParams(p.params);
      resolvePlan(p.plan);
    } catch (err) {
      throw new InputError(c.name, (err as Error).message);
    }
    for (const i of p.inputs) {
      if (!i.data) continue;
      const bytes = fromBase64(i.data);
      if (createHash('sha256').update(bytes).digest('hex') !== i.sha256) throw new InputError(c.name, `bundled ${i.name} does not match its checksum`);
      if (i.kind === 'grid') await readGeoTiff(bytes, i.name, i.options);
      else readGeoJson(new TextDecoder().decode(bytes), i.name);
    }
    return { outcome: 'read' };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    if (!(err instanceof InputError)) return { outcome: 'uncaught', message: `${err instanceof Error ? err.name : typeof err}: ${message}` };
    // bundled inputs are named by their own file
    const file = reader === 'project' && !message.startsWith(`${c.name}: `) ? message.split(': ')[0] : c.name;
    return clearMessage(file, message) ? { outcome: 'refused', message } : { outcome: 'unclear', message };
  }
}
