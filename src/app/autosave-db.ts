/**
 * Autosave in the browser (IndexedDB): the whole project including the input files' bytes, so a
 * reload restores everything. Nothing leaves the machine. clearAll() removes every stored byte.
 */

import type { ProjectUncertainty } from '../io/project.js';

const DB = 'taperline';
const STORE = 'project';
const KEY = 'current';

export interface StoredFile {
  id: string;
  name: string;
  kind: 'grid' | 'vector';
  role: string;
  options: Record<string, unknown>;
  bytes: ArrayBuffer;
  /** Part of the built-in invented demo. */
  demo?: boolean;
}

export interface StoredProject {
  files: StoredFile[];
  params: Record<string, unknown>;
  view: { center: [number, number]; zoom: number; layer: string; opacity: number; visible: Record<string, boolean> } | null;
  demo: boolean;
  /** Survey-planning values the user set (absent keys take their defaults). */
  plan?: Record<string, unknown>;
  /** Ids of picks the user excluded. */
  excludePicks?: string[];
  /** Uncertainty settings and the last sweep's lines and figures (its grids are not kept). */
  uncertainty?: ProjectUncertainty;
}

/** The files (large, saved when they change) and the rest (small, saved at once on every change). */
const FILES_KEY = 'files';
const STATE_KEY = 'state';

export type StoredState = Omit<StoredProject, 'files'> & { fileIds: string[]; savedAt: number };

/**
 * The small record is also kept in localStorage, written synchronously: a page reloaded in the
 * same moment as a change aborts an IndexedDB transaction still in flight, never this.
 */
const MIRROR = 'taperline-state';
let saves = 0;

let connection: Promise<IDBDatabase> | null = null;

/**
 * One connection kept open, so a save issued in an event handler starts its transaction in the
 * same turn (a reload straight after a change still commits it).
 */
function open(): Promise<IDBDatabase> {
  connection ??= new Promise<IDBDatabase>((resolve, reject) => {
    const req = indexedDB.open(DB, 1);
    req.onupgradeneeded = () => req.result.createObjectStore(STORE);
    req.onsuccess = () => {
      req.result.onversionchange = () => (req.result.close(), (connection = null));
      resolve(req.result);
    };
    req.onerror = () => ((connection = null), reject(req.error));
  });
  return connection;
}

function put(entries: [string, unknown][]): Promise<void> {
  return open().then(
    (db) =>
      new Promise<void>((resolve, reject) => {
        const tx = db.transaction(STORE, 'readwrite');
        for (const [key, value] of entries) value === undefined ? tx.objectStore(STORE).delete(key) : tx.objectStore(STORE).put(value, key);
        tx.commit?.();
        tx.oncomplete = () => resolve();
        tx.onerror = () => reject(tx.error);
      }),
  );
}

function stateOf(p: StoredProject): StoredState {
  const { files, ...rest } = p;
  const state = { ...rest, fileIds: files.map((f) => f.id), savedAt: Date.now() + (saves++ % 1000) / 1000 };
  try {
    localStorage.setItem(MIRROR, JSON.stringify(state));
  } catch {
    // storage full or disabled: IndexedDB still holds it
  }
  return state;
}

/** Save everything, files included (call when the set of files or their options change). */
export async function saveProject(p: StoredProject): Promise<void> {
  await put([[FILES_KEY, p.files], [STATE_KEY, stateOf(p)], [KEY, undefined]]);
}

/** Save parameters, view and planning only: cheap, so it runs on every change, before a reload can lose it. */
export async function saveState(p: StoredProject): Promise<void> {
  await put([[STATE_KEY, stateOf(p)]]);
}

export async function loadProject(): Promise<StoredProject | null> {
  const db = await open();
  const get = (key: string) =>
    new Promise<unknown>((resolve, reject) => {
      const req = db.transaction(STORE, 'readonly').objectStore(STORE).get(key);
      req.onsuccess = () => resolve(req.result);
      req.onerror = () => reject(req.error);
    });
  const [files, state, legacy] = [await get(FILES_KEY), await get(STATE_KEY), await get(KEY)];
  if (legacy && !files) return legacy as StoredProject; // saved by an earlier version in one record
  if (!Array.isArray(files) || !state) return null;
  let newest = state as StoredState;
  try {
    const mirror = JSON.parse(localStorage.getItem(MIRROR) ?? 'null') as StoredState | null;
    if (mirror && typeof mirror.savedAt === 'number' && !(mirror.savedAt < (newest.savedAt ?? 0))) newest = mirror;
  } catch {
    // a damaged mirror is ignored
  }
  const { fileIds: _ids, savedAt: _at, ...rest } = newest;
  return { ...(rest as Omit<StoredProject, 'files'>), files: files as StoredFile[] };
}

export async function clearAll(): Promise<void> {
  if (connection) (await connection.catch(() => null))?.close();
  localStorage.removeItem(MIRROR);
  connection = null;
  await new Promise<void>((resolve) => {
    const req = indexedDB.deleteDatabase(DB);
    req.onsuccess = req.onerror = req.onblocked = () => resolve();
  });
}
