#!/usr/bin/env node
/** The `taperline` command: a thin shell over the core pipeline. */

import { readFileSync } from 'node:fs';

const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };

export const HELP = `taperline ${pkg.version} — map-view synthesis of rifted-margin depth grids

Usage:
  taperline --help        this text
  taperline --version     the version

Results are interpretations of the input grids and parameters; they do not replace the judgement of
qualified professionals, nor the local rules that govern licences, surveys and drilling.
`;

export function main(argv: string[]): number {
  if (argv.includes('--version') || argv.includes('-V')) {
    process.stdout.write(`${pkg.version}\n`);
    return 0;
  }
  if (argv.length === 0 || argv.includes('--help') || argv.includes('-h')) {
    process.stdout.write(HELP);
    return 0;
  }
  process.stderr.write(`taperline: unknown command "${argv[0]}" (see taperline --help)\n`);
  return 2;
}

process.exitCode = main(process.argv.slice(2));
