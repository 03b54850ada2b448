/**
 * Files: add (guessing the role, never silently taking one from another file), reload with new
 * options, change role, remove, the demo, and a new project.
 */

import { guessRole } from '../../io/detect.js';
import type { LoadedFile } from '../engine.js';
import type { GridRole, VectorRole } from '../messages.js';
import { ROLE_LABELS } from '../text/labels.js';
import type { Ctx } from './context.js';

export const DEMO_PARAMS = { riftAge: 110 };
const DEMO_ROLES: Record<string, string> = { 'top-basement.tif': 'top-basement', 'moho.tif': 'moho', 'seabed.tif': 'seabed', 'licence.geojson': 'licence', 'seismic-lines.geojson': 'lines', 'picks.geojson': 'picks', 'isochrons.geojson': 'isochrons' };

export function kindOf(name: string): 'grid' | 'vector' | null {
  if (/\.(tif|tiff|gtiff|xyz|txt|csv|dat)$/i.test(name)) return 'grid';
  if (/\.(geojson|json)$/i.test(name)) return 'vector';
  return null;
}

function guessVectorRole(name: string): VectorRole | 'none' {
  const n = name.toLowerCase();
  if (/licen[cs]e|block|permit|concession/.test(n)) return 'licence';
  if (/pick/.test(n)) return 'picks';
  if (/isochron|chron|magnetic/.test(n)) return 'isochrons';
  if (/crust/.test(n)) return 'crust';
  if (/line|seismic|survey/.test(n)) return 'lines';
  return 'none';
}

/** Latest load request per file: an older reply that arrives later is ignored. */
const loadSeq = new Map<string, number>();

/** Load (or reload) a file into the worker with its current options; records the report or the error. */
export async function reload(ctx: Ctx, f: LoadedFile): Promise<void> {
  const files = ctx.store.state.files;
  if (f.kind === 'grid') {
    const basement = files.find((x) => x.role === 'top-basement' && x.report);
    f.options = { ...f.options, role: f.role === 'none' ? undefined : (f.role as GridRole) } as LoadedFile['options'];
    if (basement && basement !== f) (f.options as { assumeCrs?: string }).assumeCrs = basement.report!.crs.value;
  }
  const seq = (loadSeq.get(f.id) ?? 0) + 1;
  loadSeq.set(f.id, seq);
  try {
    const res = await ctx.engine.load(f);
    if (loadSeq.get(f.id) !== seq) return;
    Object.assign(f, { report: res.report, features: res.features, warnings: res.warnings, display: res.display, error: null });
  } catch (err) {
    if (loadSeq.get(f.id) !== seq) return;
    f.error = (err as Error).message.replace(`${f.name}: `, '');
    f.report = null;
    f.role = 'none';
    ctx.status(`${f.name}: ${f.error}`, true);
  }
}

/** Give a file a role; the file that held it is set to "not used", and the status line says so. */
function takeRole(ctx: Ctx, f: LoadedFile): string | null {
  if (f.error || f.role === 'none') return null;
  const moved = ctx.store.state.files.filter((o) => o !== f && o.role === f.role);
  for (const o of moved) o.role = 'none';
  return moved.length ? `${f.name} is now the ${ROLE_LABELS[f.role].toLowerCase()}; ${moved.map((o) => o.name).join(', ')} no longer used (change it under Data)` : null;
}

export async function addFile(ctx: Ctx, name: string, bytes: ArrayBuffer, opts: { role?: string; options?: LoadedFile['options']; demo?: boolean; id?: string } = {}): Promise<LoadedFile | null> {
  const { store } = ctx;
  const kind = kindOf(name);
  if (!kind) {
    const f: LoadedFile = { id: ctx.newId(), name, kind: 'vector', role: 'none', bytes, options: {}, report: null, error: 'not a file Taperline reads (GeoTIFF .tif, XYZ text .xyz/.txt/.csv, GeoJSON .geojson)' };
    store.update({ files: [...store.state.files, f] });
    ctx.status(`${name}: not a file Taperline reads (GeoTIFF, XYZ text or GeoJSON)`, true);
    return null;
  }
  let r = opts.role;
  if (!r) {
    if (kind === 'grid') {
      const g = guessRole(name);
      r = g === 'other' ? (store.state.files.some((x) => x.role === 'top-basement') ? 'none' : 'top-basement') : g;
    } else r = guessVectorRole(name);
  }
  const f: LoadedFile = { id: opts.id ?? ctx.newId(), name, kind, role: r as LoadedFile['role'], bytes, options: { ...(opts.options ?? {}) }, report: null, error: null, demo: opts.demo };
  store.state.files.push(f);
  await reload(ctx, f);
  // values decide a role the name did not give: a surface deeper than 15 km on average is a Moho
  if (!opts.role && kind === 'grid' && guessRole(name) === 'other' && f.report && (f.report.min + f.report.max) / 2 > 15_000 && !store.state.files.some((o) => o !== f && o.role === 'moho')) {
    f.role = 'moho';
  }
  const moved = takeRole(ctx, f);
  store.update({ files: [...store.state.files], filesNote: moved });
  if (moved) ctx.status(moved);
  return f;
}

export async function addFiles(ctx: Ctx, list: File[]): Promise<void> {
  const { store } = ctx;
  if (!list.length) return;
  if (store.state.files.some((f) => f.demo)) {
    const a = await ctx.ask(`The invented demo is shown. Add ${list.length === 1 ? list[0].name : `these ${list.length} files`} to it, or start a new project with ${list.length === 1 ? 'it' : 'them'}?`, [
      { key: 'new', label: 'Start a new project' },
      { key: 'add', label: 'Add to the demo' },
    ]);
    if (a === null) return;
    if (a === 'new') clearProject(ctx);
  }
  for (const file of list) await addFile(ctx, file.name, await file.arrayBuffer());
  // zoom to the data once the run shows it
  fitNext = true;
}

/** Set by loading files: the next run's result zooms the map to the grid. */
export let fitNext = false;
export function takeFit(): boolean {
  const f = fitNext;
  fitNext = false;
  return f;
}

export function setRole(ctx: Ctx, id: string, role: string): void {
  const f = ctx.store.state.files.find((x) => x.id === id);
  if (!f) return;
  f.role = role as LoadedFile['role'];
  void reload(ctx, f).then(() => {
    const moved = takeRole(ctx, f);
    ctx.store.update({ files: [...ctx.store.state.files], filesNote: moved });
    if (moved) ctx.status(moved);
  });
}

export function override(ctx: Ctx, id: string, key: 'units' | 'sign' | 'crs', value: string): void {
  const f = ctx.store.state.files.find((x) => x.id === id);
  if (!f) return;
  if (value === 'auto') delete (f.options as Record<string, unknown>)[key];
  else (f.options as Record<string, unknown>)[key] = value;
  void reload(ctx, f).then(() => {
    // a file that now loads may take its role back, if no other file holds it
    if (!f.error && f.role === 'none' && f.kind === 'grid') {
      const g = guessRole(f.name);
      if (g !== 'other' && !ctx.store.state.files.some((o) => o !== f && o.role === g && !o.error)) f.role = g;
    }
    ctx.store.update({ files: [...ctx.store.state.files] });
  });
}

export function removeFile(ctx: Ctx, id: string): void {
  ctx.engine.remove(id);
  ctx.store.update({ files: ctx.store.state.files.filter((x) => x.id !== id) });
}

/** Remove every file and reset the settings to their defaults (the map keeps its view). */
export function clearProject(ctx: Ctx): void {
  for (const f of ctx.store.state.files) ctx.engine.remove(f.id);
  ctx.store.update({ files: [], params: {}, paramErrors: {}, excludePicks: [], plan: {}, planResult: null, result: null, section: null, filesNote: null });
}

export function newProject(ctx: Ctx): void {
  const demo = ctx.store.state.files.some((f) => f.demo);
  if (!confirm(`Start a new project? This removes ${demo ? 'the demo’s files' : 'every loaded file'} and resets the parameters (your files on disk are not touched).`)) return;
  clearProject(ctx);
  ctx.status('New project: add a top-basement grid and a Moho grid (GeoTIFF or XYZ) to start.');
}

export async function loadDemo(ctx: Ctx, reset: boolean): Promise<void> {
  ctx.status('Building the invented demo scenario…');
  if (reset) clearProject(ctx);
  const files = await ctx.engine.makeDemo();
  for (const name of Object.keys(DEMO_ROLES)) {
    const f = files.find((x) => x.name === name)!;
    await addFile(ctx, name, f.bytes, { role: DEMO_ROLES[name], demo: true });
  }
  ctx.store.update({ params: { ...DEMO_PARAMS }, excludePicks: [] });
  fitNext = true;
}
