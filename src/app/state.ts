/**
 * The app's one typed store: the state, `update` (shallow patch, in place, so the object stays the
 * one tests and the console see) and `subscribe` to named slices. No framework: panels subscribe to
 * the keys they show and re-render from them; actions change state only through `update`.
 */

import type { DisplayResult, LicenceFigures, PlanData, SectionData, SweepDisplay } from './messages.js';
import type { LoadedFile } from './engine.js';

/** What the browser tests (and a curious user's console) can read of the running app. */
declare global {
  interface Window {
    __taperline: { ready: boolean; runs: number; lastMillis: number; drawnMillis: number; figuresMillis: number; error: string | null; colourings: () => number; state: AppState; map: import('maplibre-gl').Map; planned?: number; sweeps?: number; sweepMillis?: number };
  }
}

export interface AppState {
  files: LoadedFile[];
  params: Record<string, unknown>;
  paramErrors: Record<string, string>;
  result: DisplayResult | null;
  /** The licence's lengths and COT area for the run with this key, measured after its map is drawn. */
  figures: (LicenceFigures & { runKey: string }) | null;
  layer: string;
  opacity: number;
  visible: Record<string, boolean>;
  demo: boolean;
  running: boolean;
  progress: { stage: string; fraction: number } | null;
  /** Survey-planning values the user set; saved with the project. */
  plan: Record<string, unknown>;
  planResult: PlanData | null;
  /** Picks the user excluded (ids); saved with the project. */
  excludePicks: string[];
  /** Where the cursor is on the map (lon, lat), for the readout. */
  cursor: [number, number] | null;
  status: { text: string; error: boolean; warnings: number };
  /** What the last file action moved (a role taken from another file), shown under Data until the next. */
  filesNote: string | null;
  section: SectionData | null;
  /** Uncertainty settings the user set (spec keys, uncertainty/spec.ts); saved with the project. */
  uncertainty: Record<string, unknown>;
  /** The last sweep (its grids only until a reload; lines and figures are saved with the project). */
  sweep: SweepDisplay | null;
  /** Share of the realisations done while a sweep runs. */
  sweepProgress: number | null;
}

export type Key = keyof AppState;

/** Whether the sweep on the map varies the run on the map (same inputs, parameters and excluded picks). */
export function sweepCurrent(s: AppState): boolean {
  return Boolean(s.sweep && s.result && s.sweep.runKey === s.result.runKey);
}

export function initialState(): AppState {
  return {
    files: [],
    params: {},
    paramErrors: {},
    result: null,
    figures: null,
    layer: 'crustal-thickness',
    opacity: 0.85,
    visible: { boundaries: true, cot: true, licence: true, seismic: true, picks: true, isochrons: true, graticule: true, outlines: false, envelope: true },
    demo: false,
    running: false,
    progress: null,
    plan: {},
    planResult: null,
    excludePicks: [],
    cursor: null,
    status: { text: 'Starting…', error: false, warnings: 0 },
    filesNote: null,
    section: null,
    uncertainty: {},
    sweep: null,
    sweepProgress: null,
  };
}

type Listener = (s: AppState, changed: ReadonlySet<Key>) => void;

export class Store {
  readonly state: AppState;
  private listeners: { keys: ReadonlySet<Key>; fn: Listener }[] = [];

  constructor(initial: AppState = initialState()) {
    this.state = initial;
  }

  /** Apply a patch and tell every subscriber whose slice it touched. */
  update(patch: Partial<AppState>): void {
    Object.assign(this.state, patch);
    this.notify(Object.keys(patch) as Key[]);
  }

  subscribe(keys: readonly Key[], fn: Listener): () => void {
    const entry = { keys: new Set(keys), fn };
    this.listeners.push(entry);
    return () => (this.listeners = this.listeners.filter((l) => l !== entry));
  }

  private notify(keys: Key[]): void {
    const changed = new Set(keys);
    for (const l of [...this.listeners]) if (keys.some((k) => l.keys.has(k))) l.fn(this.state, changed);
  }
}

/** What panels may ask for; implemented by the actions and handed to each panel when mounted. */
export interface Actions {
  addFiles(files: File[]): Promise<void>;
  removeFile(id: string): void;
  setRole(id: string, role: string): void;
  override(id: string, key: 'units' | 'sign' | 'crs', value: string): void;
  loadDemo(): Promise<void>;
  newProject(): void;
  setParam(key: string, raw: string): void;
  resetParams(): void;
  setPlan(key: string, value: unknown): void;
  propose(): Promise<void>;
  startDrawing(): void;
  openSection(lonlat: [number, number][], title: string): Promise<void>;
  closeSection(): void;
  exportFile(path: string, type: string): Promise<void>;
  exportImage(): Promise<void>;
  fitToData(): void;
  cancelRun(): void;
  togglePick(id: string): void;
  showWarnings(): void;
  /** Set one uncertainty setting; returns the problem in words, or null when it is accepted. */
  setUncertainty(key: string, raw: string): string | null;
  runSweep(): Promise<void>;
  cancelSweep(): void;
}
