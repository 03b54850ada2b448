// Entry of a sweep worker thread: registers tsx's loader (a worker thread on Node 20 does not inherit
// it), then loads the worker itself.
import { register } from 'tsx/esm/api';

register();
await import('./sweep-worker.ts');
