/**
 * One fuzz worker process: builds the corpus once, then reads "reader seed k" requests from stdin,
 * one per line, reads each case and answers with one JSON line. The parent kills and replaces it
 * when a case runs too long or takes too much memory; an abort ends it by itself.
 */

import { createInterface } from 'node:readline';
import { corpus, makeCase, type Reader } from './cases.js';
import { readCase } from './read-case.js';

const seeds = corpus();
const rl = createInterface({ input: process.stdin });
process.stdout.write('ready\n');
const queue: string[] = [];
let busy = false;

async function next(): Promise<void> {
  if (busy) return;
  busy = true;
  while (queue.length) {
    const [reader, seed, k] = queue.shift()!.split(' ');
    const c = makeCase(seeds[reader as Reader], reader as Reader, Number(seed), Number(k));
    const t0 = performance.now();
    const r = await readCase(reader as Reader, c);
    process.stdout.write(JSON.stringify({ k: Number(k), ...r, ms: performance.now() - t0 }) + '\n');
  }
  busy = false;
}

rl.on('line', (line) => {
  queue.push(line);
  void next();
});
rl.on('close', () => process.exit(0));
