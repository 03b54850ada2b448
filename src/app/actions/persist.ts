/**
 * Keeping the work: autosave (settings at once, files when they change), restore, project files
 * (open validated and staged so a failure changes nothing; save with or without the data), and
 * clearing everything this browser keeps.
 */

import { DERIVED } from '../../derive/grids.js';
import { fromBase64, parseProject, PROJECT_FORMAT, PROJECT_VERSION, toBase64, type Project, type ProjectUncertainty } from '../../io/project.js';
import { resolveSpec, SPEC_DOCS } from '../../uncertainty/spec.js';
import { specOf } from './sweep.js';
import { SWEEP_LAYERS } from '../text/labels.js';
import type { AppState } from '../state.js';
import { PARAM_SPECS, resolveParams } from '../../params.js';
import { PLAN_SPECS, resolvePlan } from '../../survey/params.js';
import { clearAll, saveProject, saveState, type StoredProject } from '../autosave-db.js';
import { download } from '../dom.js';
import type { LoadedFile } from '../engine.js';
import type { Ctx } from './context.js';
import { addFile } from './files.js';

/** What a project file may name: the parameter and planning keys, the map layers. */
export const PROJECT_SCHEMA = {
  paramKeys: PARAM_SPECS.map((sp) => sp.key as string),
  planKeys: PLAN_SPECS.map((sp) => sp.key as string),
  layers: ['domains', ...DERIVED.map((d) => d.name as string), ...Object.keys(SWEEP_LAYERS)],
  uncertaintyKeys: SPEC_DOCS.map((d) => d.key),
};

/** The uncertainty settings and the last sweep without its grids (lines and figures are small). */
function uncertaintyOf(s: AppState): ProjectUncertainty {
  const w = s.sweep;
  return {
    settings: { ...(s.uncertainty as Record<string, number | null>) },
    sweep: w ? { runKey: w.runKey, realisations: w.realisations, seed: w.seed, lines: w.lines, summary: w.summary, millis: w.millis } : null,
  };
}

/** A saved sweep as the page holds it: no grids (run again for the probability layers). */
function sweepFrom(u: ProjectUncertainty | undefined): AppState['sweep'] {
  return u?.sweep ? { ...u.sweep, grids: {} } : null;
}

function viewState(ctx: Ctx) {
  const c = ctx.view.map.getCenter();
  const s = ctx.store.state;
  return { center: [c.lng, c.lat] as [number, number], zoom: ctx.view.map.getZoom(), layer: s.layer, opacity: s.opacity, visible: { ...s.visible } };
}

export function snapshot(ctx: Ctx): StoredProject {
  const s = ctx.store.state;
  return {
    files: s.files.filter((f) => !f.error).map((f) => ({ id: f.id, name: f.name, kind: f.kind, role: f.role, options: { ...f.options } as Record<string, unknown>, bytes: f.bytes, demo: f.demo })),
    params: { ...s.params },
    view: viewState(ctx),
    demo: s.files.some((f) => f.demo),
    plan: { ...s.plan },
    excludePicks: [...s.excludePicks],
    uncertainty: uncertaintyOf(s),
  };
}

/** What the files record holds; it is rewritten only when this changes. */
let savedFiles = '';

/**
 * Save at once, on every change, so a reload right after it loses nothing: parameters, view and
 * planning always (small); the files' bytes only when the set of files, their roles or options changed.
 */
export function autosave(ctx: Ctx): void {
  const failed = (e: unknown) => ctx.status(`Autosave failed: ${(e as Error).message}`, true);
  const snap = snapshot(ctx);
  const sig = JSON.stringify(snap.files.map((f) => [f.id, f.name, f.role, f.options]));
  if (sig !== savedFiles) {
    savedFiles = sig;
    void saveProject(snap).catch((e) => ((savedFiles = ''), failed(e)));
  } else void saveState(snap).catch(failed);
}

export async function restore(ctx: Ctx, p: StoredProject): Promise<void> {
  ctx.status('Restoring your last session…');
  for (const f of p.files) await addFile(ctx, f.name, f.bytes, { role: f.role, options: f.options as LoadedFile['options'], demo: f.demo ?? p.demo });
  const patch: Parameters<typeof ctx.store.update>[0] = {
    params: p.params ?? {}, plan: { ...(p.plan ?? {}) }, excludePicks: [...(p.excludePicks ?? [])],
    uncertainty: { ...(p.uncertainty?.settings ?? {}) }, sweep: sweepFrom(p.uncertainty),
  };
  // a view saved by another version may name a layer this one lacks: keep the default then
  if (p.view && PROJECT_SCHEMA.layers.includes(p.view.layer)) Object.assign(patch, { layer: p.view.layer, opacity: p.view.opacity, visible: { ...ctx.store.state.visible, ...p.view.visible } });
  ctx.store.update(patch);
  if (p.view) {
    const v = p.view;
    await ctx.view.loaded;
    // after the first result (which would fit the grid), go back to where the user was
    const off = ctx.store.subscribe(['result'], () => (off(), ctx.view.map.jumpTo({ center: v.center, zoom: v.zoom })));
  }
}

async function sha256(bytes: ArrayBuffer): Promise<string> {
  const d = await crypto.subtle.digest('SHA-256', bytes);
  return [...new Uint8Array(d)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

/**
 * Open a project file. Everything is checked — the file's fields, the parameters, and every input
 * loaded under a new id — before the current files, settings or autosave are touched; a failure
 * anywhere leaves them exactly as they were.
 */
export async function openProjectFile(ctx: Ctx, file: File): Promise<void> {
  const { store, engine } = ctx;
  const keep = `${file.name} was not opened; your current files and settings are unchanged.`;
  let p: Project;
  try {
    p = parseProject(await file.text(), file.name, PROJECT_SCHEMA);
    resolveParams(p.params);
    resolvePlan(p.plan);
    if (p.uncertainty) resolveSpec(specOf(p.uncertainty.settings));
  } catch (err) {
    ctx.status(`${(err as Error).message}. ${keep}`, true);
    return;
  }
  const byHash = new Map<string, LoadedFile>();
  for (const f of store.state.files) byHash.set(await sha256(f.bytes), f);
  const missing: string[] = [];
  const staged: LoadedFile[] = [];
  for (const i of p.inputs) {
    const bytes = i.data ? (fromBase64(i.data).slice().buffer as ArrayBuffer) : byHash.get(i.sha256)?.bytes;
    if (!bytes) {
      missing.push(`${i.name} (${i.bytes} bytes)`);
      continue;
    }
    if (i.data && (await sha256(bytes)) !== i.sha256) {
      missing.push(`${i.name} (its bundled bytes do not match its checksum)`);
      continue;
    }
    staged.push({ id: ctx.newId(), name: i.name, kind: i.kind, role: i.role as LoadedFile['role'], bytes, options: { ...i.options } as LoadedFile['options'], report: null, error: null });
  }
  if (missing.length) {
    ctx.status(`${file.name}: load these inputs first, then open the project again: ${missing.join(', ')}. ${keep}`, true);
    return;
  }
  const failures: string[] = [];
  for (const f of staged) {
    try {
      Object.assign(f, await engine.load(f));
    } catch (err) {
      failures.push((err as Error).message);
    }
  }
  if (failures.length) {
    for (const f of staged) engine.remove(f.id);
    ctx.status(`${failures.join('; ')}. ${keep}`, true);
    return;
  }
  for (const f of store.state.files) engine.remove(f.id);
  const view = p.view;
  store.update({
    files: staged, params: { ...p.params }, paramErrors: {}, plan: { ...p.plan }, planResult: null, excludePicks: [...p.excludePicks], result: null,
    uncertainty: { ...(p.uncertainty?.settings ?? {}) }, sweep: sweepFrom(p.uncertainty),
    ...(view ? { layer: view.layer, opacity: view.opacity, visible: { ...store.state.visible, ...view.visible } } : {}),
  });
  if (view) {
    const off = store.subscribe(['result'], () => (off(), ctx.view.map.jumpTo({ center: view.center, zoom: view.zoom })));
  }
  ctx.status(`Opened ${file.name}`);
}

export async function saveProjectFile(ctx: Ctx, bundle: boolean): Promise<void> {
  const s = ctx.store.state;
  const inputs = [];
  for (const f of s.files.filter((x) => !x.error)) {
    inputs.push({ name: f.name, kind: f.kind, role: f.role, bytes: f.bytes.byteLength, sha256: await sha256(f.bytes), options: f.options, ...(bundle ? { data: toBase64(new Uint8Array(f.bytes)) } : {}) });
  }
  const project: Project = { format: PROJECT_FORMAT, version: PROJECT_VERSION, saved: new Date().toISOString(), tool: `taperline ${ctx.version}`, params: resolveParams(s.params) as unknown as Record<string, unknown>, inputs, view: viewState(ctx), plan: { ...s.plan }, excludePicks: [...s.excludePicks], uncertainty: uncertaintyOf(s) };
  download(bundle ? 'project-with-data.taperline.json' : 'project.taperline.json', JSON.stringify(project, null, 1), 'application/json');
}

export async function clearLocal(): Promise<void> {
  if (!confirm('Remove every file and setting Taperline keeps in this browser, and start again on the invented demo?')) return;
  await clearAll();
  location.reload();
}

