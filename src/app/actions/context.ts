/** What every action works with: the store, the worker engine, the map, the status line, dialogs. */

import type { Engine } from '../engine.js';
import type { MapView } from '../map/view.js';
import type { Store } from '../state.js';

export interface Ctx {
  readonly store: Store;
  readonly engine: Engine;
  readonly view: MapView;
  readonly version: string;
  status(text: string, error?: boolean): void;
  newId(): string;
  /** Ask a question with named answers; resolves with the answer's key (or null if dismissed). */
  ask(question: string, answers: { key: string; label: string }[]): Promise<string | null>;
}
