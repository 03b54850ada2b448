/**
 * Autosave in the browser (IndexedDB): the whole project including the input files' bytes, so a
 * reload restores everything. Nothing leaves the machine. clearAll() removes every stored byte.
 */

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
}

function open(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    const req = indexedDB.open(DB, 1);
    req.onupgradeneeded = () => req.result.createObjectStore(STORE);
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error);
  });
}

export async function saveProject(p: StoredProject): Promise<void> {
  const db = await open();
  await new Promise<void>((resolve, reject) => {
    const tx = db.transaction(STORE, 'readwrite');
    tx.objectStore(STORE).put(p, KEY);
    tx.oncomplete = () => resolve();
    tx.onerror = () => reject(tx.error);
  });
  db.close();
}

export async function loadProject(): Promise<StoredProject | null> {
  const db = await open();
  const p = await new Promise<StoredProject | null>((resolve, reject) => {
    const req = db.transaction(STORE, 'readonly').objectStore(STORE).get(KEY);
    req.onsuccess = () => resolve((req.result as StoredProject | undefined) ?? null);
    req.onerror = () => reject(req.error);
  });
  db.close();
  return p;
}

export async function clearAll(): Promise<void> {
  await new Promise<void>((resolve) => {
    const req = indexedDB.deleteDatabase(DB);
    req.onsuccess = req.onerror = req.onblocked = () => resolve();
  });
}
