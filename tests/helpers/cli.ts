import { spawnSync } from 'node:child_process';

/** Run the taperline CLI as a user would (through tsx), returning status and output. */
export function taperline(args: string[]): { status: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...args], { encoding: 'utf8', timeout: 120_000 });
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}
