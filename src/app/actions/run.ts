/**
 * Runs: the pipeline in the worker whenever the inputs, parameters or excluded picks change
 * (debounced), one at a time (a change during a run queues one more), with progress and cancel.
 */

import { num } from '../text/format.js';
import type { Ctx } from './context.js';
import { takeFit } from './files.js';

let timer: ReturnType<typeof setTimeout> | null = null;
let rerun = false;

export function scheduleRun(ctx: Ctx): void {
  if (timer) clearTimeout(timer);
  timer = setTimeout(() => void run(ctx), 250);
}

export async function run(ctx: Ctx): Promise<void> {
  const { store, engine } = ctx;
  if (timer) clearTimeout(timer);
  timer = null;
  if (store.state.running) {
    rerun = true;
    return;
  }
  const files = store.state.files;
  const ready = files.some((f) => f.role === 'top-basement' && !f.error) && files.some((f) => f.role === 'moho' && !f.error);
  if (!ready) {
    ctx.status('Assign a top-basement grid and a Moho grid under Data to compute.');
    return;
  }
  store.update({ running: true });
  window.__taperline.ready = false; // until this run's result is drawn (or the run ends without one)
  let drawing = false;
  const t0 = performance.now();
  const showProgress = setTimeout(() => store.update({ progress: { stage: 'starting', fraction: 0 } }), 300);
  ctx.status('Computing…');
  try {
    const s = store.state;
    const result = await engine.run(s.params, s.visible.outlines, s.excludePicks, (stage, fraction) => {
      if (store.state.progress) store.update({ progress: { stage, fraction } });
      ctx.status(`Computing: ${stage}…`);
    });
    window.__taperline.runs++;
    window.__taperline.lastMillis = performance.now() - t0;
    window.__taperline.error = null;
    await ctx.view.loaded;
    // fit first: a restored view, applied when the result lands, then wins
    if (takeFit() || !store.state.result) ctx.view.fitTo(result.geometry);
    store.update({ result });
    const n = result.summary.warnings.length;
    store.update({ status: { text: `Done in ${num(performance.now() - t0)} ms (pipeline ${num(result.millis)} ms).`, error: false, warnings: n } });
    // ready (for the browser tests) once the map is idle, the time from the request to the first
    // frame drawn with the new layers is recorded (the tests print it) and, with a licence, its
    // lengths and COT area are in
    drawing = true;
    let drawn = false;
    let idle = false;
    let figured = result.summary.cotAreaKm2 !== null;
    const settle = () => {
      if (drawn && idle && figured) window.__taperline.ready = true;
    };
    requestAnimationFrame(() =>
      requestAnimationFrame(() => {
        window.__taperline.drawnMillis = performance.now() - t0;
        drawn = true;
        settle();
      }),
    );
    ctx.view.map.once('idle', () => {
      idle = true;
      settle();
    });
    ctx.view.map.triggerRepaint();
    if (!figured) {
      // the exact clip to the licence runs after the map has its new layers (the costliest step of a domain change)
      try {
        const f = await engine.figures(result.runKey);
        if (store.state.result === result) store.update({ figures: { ...f, runKey: result.runKey } });
      } catch (err) {
        if (store.state.result === result) ctx.status(`Could not measure the lines and the COT zone inside the licence: ${(err as Error).message}`, true);
      } finally {
        window.__taperline.figuresMillis = performance.now() - t0;
        figured = true;
        settle();
      }
    }
  } catch (err) {
    const msg = (err as Error).message;
    window.__taperline.error = msg;
    ctx.status(msg === 'cancelled' ? 'Cancelled: the previous results stay on the map.' : `Could not compute: ${msg}`, msg !== 'cancelled');
  } finally {
    if (!drawing) window.__taperline.ready = true; // failed or cancelled: nothing new to draw
    clearTimeout(showProgress);
    store.update({ running: false, progress: null });
    if (rerun) {
      rerun = false;
      void run(ctx);
    }
  }
}

export function cancelRun(ctx: Ctx): void {
  rerun = false;
  void ctx.engine.cancel();
}
