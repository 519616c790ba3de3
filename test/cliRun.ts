import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The command line run as a user runs it: fourfold.mjs in a child process (not a test file). */

export const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '..');

export interface Run {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** `node fourfold.mjs ARGS...` from the repository folder. */
export function fourfold(...args: string[]): Run {
  const result = spawnSync(process.execPath, ['fourfold.mjs', ...args], {
    cwd: repoRoot,
    encoding: 'utf8',
  });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}
