// Dependency direction (STYLE.md): the core never imports app/ or cli/, and never touches files, the
// DOM or the network outside io/ — it must run the same in Node, in a worker and in a test.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const SRC = new URL('../src/', import.meta.url).pathname;

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? files(p) : p.endsWith('.ts') ? [p] : [];
  });
}

const core = files(SRC).filter((f) => !/\/src\/(app|cli)\//.test(f));
const importsOf = (f: string) => [...readFileSync(f, 'utf8').matchAll(/(?:import|export)[^'"]*?from\s+['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g)].map((m) => m[1] ?? m[2]);

describe('architecture', () => {
  it('finds the core modules', () => {
    expect(core.length).toBeGreaterThan(10);
  });
  for (const f of core) {
    const rel = relative(SRC, f);
    it(`${rel} imports neither app/ nor cli/, nor Node built-ins`, () => {
      for (const spec of importsOf(f)) {
        expect(spec, `${rel} imports ${spec}`).not.toMatch(/(^|\/)(app|cli)\//);
        expect(spec, `${rel} imports ${spec}`).not.toMatch(/^node:|^(fs|path|os|child_process|http|https|net)$/);
      }
      if (!rel.startsWith('io/')) {
        const text = readFileSync(f, 'utf8');
        expect(text, `${rel} uses the DOM or network`).not.toMatch(/\b(document|window|localStorage|fetch|XMLHttpRequest)\s*[.(]/);
      }
    });
  }
});
