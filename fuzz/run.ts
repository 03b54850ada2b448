/**
 * npm run fuzz -- [--cases N] [--seed S] [--readers geotiff,xyz,geojson,project] [--save DIR]
 *
 * Mutated copies of valid files, each read in a worker process with a 5 s limit and a 1.5 GB cap;
 * prints per reader the cases, clean refusals by message, reads, uncaught errors, hangs, aborts and
 * peak memory. --save writes every failing case (bytes + how it was made) for a regression fixture.
 */

import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { corpus, makeCase, READERS, type Reader } from './cases.js';
import { formatReports, runFuzz } from './harness.js';

const args = process.argv.slice(2);
const flag = (name: string, fallback: string) => {
  const k = args.indexOf(`--${name}`);
  return k >= 0 && args[k + 1] ? args[k + 1] : fallback;
};
const cases = Number(flag('cases', '10000'));
const seed = Number(flag('seed', '1'));
const readers = flag('readers', READERS.join(',')).split(',') as Reader[];
const save = args.includes('--save') ? flag('save', '.tmp/fuzz-failures') : null;
for (const r of readers) if (!READERS.includes(r)) throw new Error(`unknown reader ${r}; one of ${READERS.join(', ')}`);

console.log(`fuzz: ${cases} cases per reader, seed ${seed}, readers ${readers.join(', ')}`);
const reports = await runFuzz({ readers, cases, seed, onProgress: (r, n) => process.stderr.write(`  ${r}: ${n}\n`) });
console.log(formatReports(reports));
if (save) {
  const seeds = corpus();
  for (const r of reports) {
    for (const f of r.failures) {
      const c = makeCase(seeds[r.reader], r.reader, seed, f.k);
      const dir = join(save, r.reader);
      mkdirSync(dir, { recursive: true });
      writeFileSync(join(dir, `${f.k}-${c.name}`), c.bytes);
      writeFileSync(join(dir, `${f.k}-${c.name}.txt`), `${f.verdict}: ${f.message}\nfrom ${c.seedName}: ${c.how}\n`);
    }
  }
  console.log(`failing cases saved under ${save}`);
}
const bad = reports.reduce((n, r) => n + r.failures.length, 0);
process.exitCode = bad ? 1 : 0;
