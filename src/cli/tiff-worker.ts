/**
 * Worker thread of the CLI's GeoTIFF pool (tiff-pool.ts): writes one GeoTIFF per message with Node's
 * zlib and sends the bytes back, transferred.
 */

import { parentPort } from 'node:worker_threads';
import { deflateSync } from 'node:zlib';
import { writeGeoTiff } from '../io/geotiff-write.js';
import type { TiffJobMessage } from './tiff-pool.js';

const deflate = (d: Uint8Array, level: number) => deflateSync(d, { level });

parentPort!.on('message', (m: TiffJobMessage) => {
  try {
    const bytes = writeGeoTiff(m.geometry, m.values, { ...m.options, deflate });
    parentPort!.postMessage({ bytes }, [bytes.buffer as ArrayBuffer]);
  } catch (err) {
    parentPort!.postMessage({ error: (err as Error).message });
  }
});
