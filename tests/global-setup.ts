// Builds the invented demo scenario once before the suite (deterministic; skipped when present).
import { execFileSync } from 'node:child_process';

export default function setup(): void {
  execFileSync(process.execPath, ['--import', 'tsx', 'fixtures/generate.ts', '--if-missing'], { stdio: 'inherit' });
}
