// Entry of the GeoTIFF worker thread: the CLI runs from TypeScript sources through tsx, whose loader
// a worker thread does not inherit on Node 20; register it here, then load the worker itself.
import { register } from 'tsx/esm/api';

register();
await import('./tiff-worker.ts');
