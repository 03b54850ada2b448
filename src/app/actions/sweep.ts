/**
 * Uncertainty runs: the user's settings (flat spec keys such as "moho.sigmaFar", checked as they are
 * typed), a sweep of the last run on the worker's sub-workers with progress and cancel, and whether
 * the sweep on the map still varies the run on the map.
 */

import { ParamError } from '../../params.js';
import { resolveSpec } from '../../uncertainty/spec.js';
import { num } from '../text/format.js';
import type { Ctx } from './context.js';

/** Flat settings ("params.tc0": 1500) as a spec object ({ params: { tc0: 1500 } }). */
export function specOf(flat: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, Record<string, unknown> | unknown> = {};
  for (const [k, v] of Object.entries(flat)) {
    if (v === null || v === undefined || v === '') continue;
    const [a, b] = k.split('.');
    if (b) ((out[a] ??= {}) as Record<string, unknown>)[b] = v;
    else out[a] = v;
  }
  return out;
}

export function setUncertainty(ctx: Ctx, key: string, raw: string): string | null {
  const v = raw.trim() === '' ? null : Number(raw);
  if (v !== null && !Number.isFinite(v)) return `${key}: a number, please`;
  const next = { ...ctx.store.state.uncertainty, [key]: v };
  try {
    resolveSpec(specOf(next));
  } catch (err) {
    if (err instanceof ParamError) return err.message.replace(/^uncertainty spec: /, '');
    throw err;
  }
  ctx.store.update({ uncertainty: next });
  return null;
}

export async function runSweep(ctx: Ctx): Promise<void> {
  const { store, engine } = ctx;
  if (!store.state.result) return ctx.status('Compute the grids first (assign a top-basement and a Moho grid).', true);
  if (store.state.sweepProgress !== null) return;
  const spec = specOf(store.state.uncertainty);
  const n = resolveSpec(spec).realisations;
  store.update({ sweepProgress: 0 });
  ctx.status(`Running ${n} realisations on the worker threads…`);
  try {
    const sweep = await engine.sweep(spec, (fraction) => {
      store.update({ sweepProgress: fraction });
      ctx.status(`Realisations: ${Math.round(fraction * n)} of ${n}…`);
    });
    store.update({ sweep, layer: store.state.layer });
    ctx.status(`${n} realisations in ${num(sweep.millis / 1000, 1)} s. The envelope lines and probability layers are on the map (Layers).`);
    window.__taperline.sweeps = (window.__taperline.sweeps ?? 0) + 1;
    window.__taperline.sweepMillis = sweep.millis;
  } catch (err) {
    const msg = (err as Error).message;
    ctx.status(msg === 'cancelled' ? 'Uncertainty run cancelled: the previous envelope, if any, stays.' : `Uncertainty run: ${msg}`, msg !== 'cancelled');
  } finally {
    store.update({ sweepProgress: null });
  }
}

export function cancelSweep(ctx: Ctx): void {
  ctx.engine.cancelSweep();
}
