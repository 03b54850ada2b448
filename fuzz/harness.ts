/**
 * The fuzz harness: every case read in a worker process under a time limit and a memory cap
 * (its resident memory watched through /proc), so a hang, a runaway allocation or an abort is
 * counted against its case and the run goes on. Cases are numbered and rebuilt from (reader,
 * seed, k), so any failure can be replayed and saved as a regression fixture.
 */

import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { createInterface } from 'node:readline';
import type { Reader } from './cases.js';
import type { Outcome } from './read-case.js';

export type Verdict = Outcome | 'hang' | 'abort' | 'memory';

export interface Failure {
  readonly k: number;
  readonly verdict: Verdict;
  readonly message: string;
}

export interface ReaderReport {
  readonly reader: Reader;
  readonly cases: number;
  readonly counts: Record<Verdict, number>;
  /** Clean refusals grouped by message (file name dropped, numbers as N). */
  readonly refusals: Map<string, number>;
  readonly failures: Failure[];
  readonly peakMB: number;
  readonly seconds: number;
}

export interface FuzzOptions {
  readonly readers: readonly Reader[];
  readonly cases: number;
  readonly seed: number;
  readonly timeoutMs?: number;
  readonly memoryCapMB?: number;
  readonly workers?: number;
  readonly onProgress?: (reader: Reader, done: number) => void;
}

const CHILD = fileURLToPath(new URL('./child.ts', import.meta.url));

/** Resident and peak resident memory of a process, MB (Linux /proc). */
function memoryOf(pid: number): { rss: number; hwm: number } {
  try {
    const s = readFileSync(`/proc/${pid}/status`, 'utf8');
    const kb = (key: string) => Number(new RegExp(`${key}:\\s+(\\d+)`).exec(s)?.[1] ?? 0);
    return { rss: kb('VmRSS') / 1024, hwm: kb('VmHWM') / 1024 };
  } catch {
    return { rss: 0, hwm: 0 };
  }
}

export function normalise(message: string): string {
  return message
    .replace(/^[^:]*: /, '')
    .replace(/"[^"]*"/g, '"…"')
    .replace(/-?\d+(\.\d+)?(e[-+]?\d+)?/gi, 'N')
    .slice(0, 90);
}

class Worker {
  child!: ChildProcessWithoutNullStreams;
  private ready!: Promise<void>;
  private pending: ((line: string | null) => void) | null = null;
  peakMB = 0;

  constructor() {
    this.start();
  }

  private start(): void {
    this.child = spawn(process.execPath, ['--import', 'tsx', '--max-old-space-size=4096', CHILD], { stdio: ['pipe', 'pipe', 'pipe'] });
    this.child.stderr.resume();
    const lines = createInterface({ input: this.child.stdout });
    let first = true;
    this.ready = new Promise((resolve) => {
      lines.on('line', (line) => {
        if (first) {
          first = false;
          resolve();
          return;
        }
        const p = this.pending;
        this.pending = null;
        p?.(line);
      });
    });
    this.child.on('exit', () => {
      const p = this.pending;
      this.pending = null;
      p?.(null);
    });
  }

  /** Run one case; null line = the process died. */
  async run(reader: Reader, seed: number, k: number, timeoutMs: number, capMB: number): Promise<{ verdict: Verdict; message: string }> {
    await this.ready;
    const pid = this.child.pid!;
    return new Promise((resolve) => {
      let killedFor: Verdict | null = null;
      const timer = setTimeout(() => ((killedFor = 'hang'), this.child.kill('SIGKILL')), timeoutMs);
      const watch = setInterval(() => {
        const m = memoryOf(pid);
        this.peakMB = Math.max(this.peakMB, m.hwm);
        if (m.rss > capMB) (killedFor = 'memory'), this.child.kill('SIGKILL');
      }, 50);
      this.pending = (line) => {
        clearTimeout(timer);
        clearInterval(watch);
        this.peakMB = Math.max(this.peakMB, memoryOf(pid).hwm);
        if (line === null) {
          this.start();
          resolve({ verdict: killedFor ?? 'abort', message: killedFor === 'hang' ? `over ${timeoutMs} ms` : killedFor === 'memory' ? `over ${capMB} MB` : 'process died' });
          return;
        }
        const r = JSON.parse(line) as { outcome: Outcome; message?: string };
        resolve({ verdict: r.outcome, message: r.message ?? '' });
      };
      this.child.stdin.write(`${reader} ${seed} ${k}\n`);
    });
  }

  close(): void {
    this.child.stdin.end();
    this.child.kill();
  }
}

export async function runFuzz(o: FuzzOptions): Promise<ReaderReport[]> {
  const timeoutMs = o.timeoutMs ?? 5000;
  const capMB = o.memoryCapMB ?? 1536;
  const reports: ReaderReport[] = [];
  for (const reader of o.readers) {
    const t0 = Date.now();
    const workers = Array.from({ length: o.workers ?? 2 }, () => new Worker());
    const counts = { refused: 0, read: 0, uncaught: 0, unclear: 0, unsound: 0, hang: 0, abort: 0, memory: 0 } as Record<Verdict, number>;
    const refusals = new Map<string, number>();
    const failures: Failure[] = [];
    let nextK = 0;
    let done = 0;
    await Promise.all(
      workers.map(async (w) => {
        while (nextK < o.cases) {
          const k = nextK++;
          const r = await w.run(reader, o.seed, k, timeoutMs, capMB);
          counts[r.verdict]++;
          if (r.verdict === 'refused') refusals.set(normalise(r.message), (refusals.get(normalise(r.message)) ?? 0) + 1);
          else if (r.verdict !== 'read') failures.push({ k, verdict: r.verdict, message: r.message });
          if (++done % 500 === 0) o.onProgress?.(reader, done);
        }
      }),
    );
    const peakMB = Math.max(...workers.map((w) => w.peakMB));
    for (const w of workers) w.close();
    reports.push({ reader, cases: o.cases, counts, refusals, failures: failures.sort((a, b) => a.k - b.k), peakMB, seconds: (Date.now() - t0) / 1000 });
  }
  return reports;
}

/** The table the issue asks for, plus the commonest refusals and the failures. */
export function formatReports(reports: readonly ReaderReport[]): string {
  const head = '| reader | cases | clean refusal | read | uncaught error | unclear message | unsound read | over time | process aborted | over memory | peak MB | s |';
  const rule = '| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |';
  const rows = reports.map((r) => {
    const c = r.counts;
    return `| ${r.reader} | ${r.cases} | ${c.refused} | ${c.read} | ${c.uncaught} | ${c.unclear} | ${c.unsound} | ${c.hang} | ${c.abort} | ${c.memory} | ${r.peakMB.toFixed(0)} | ${r.seconds.toFixed(0)} |`;
  });
  const out = [head, rule, ...rows, ''];
  for (const r of reports) {
    out.push(`${r.reader}: commonest refusals`);
    for (const [m, n] of [...r.refusals].sort((a, b) => b[1] - a[1]).slice(0, 8)) out.push(`  ${String(n).padStart(6)}  ${m}`);
    if (r.failures.length) {
      out.push(`${r.reader}: failures (case number, kind, message)`);
      for (const f of r.failures.slice(0, 15)) out.push(`  #${f.k} ${f.verdict}: ${f.message.slice(0, 160)}`);
    }
  }
  return out.join('\n');
}
