/** Runs `cutline` (bin/cutline.cjs) as a user would, from the repository root. */
import { spawnSync } from 'child_process';
import * as path from 'path';

export const root = path.resolve(__dirname, '..', '..');

export function runCli(args: string[], env: NodeJS.ProcessEnv = {}): { code: number | null; out: string; err: string } {
  const r = spawnSync(process.execPath, [path.join(root, 'bin/cutline.cjs'), ...args], { encoding: 'utf8', cwd: root, env: { ...process.env, ...env } });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

/** Whether a program is on the PATH. */
export function hasProgram(name: string): boolean {
  return spawnSync('sh', ['-c', `command -v ${name}`]).status === 0;
}

/**
 * A test that needs an outside program: skipped with a loud message when the program is absent
 * on a developer's machine, but a failure under CI (where .ci/run installs it).
 */
export function needsProgram(name: string, install: string): boolean {
  if (hasProgram(name)) return true;
  if (process.env.CI) throw new Error(`${name} is missing: .ci/run must install it (${install})`);
  // eslint-disable-next-line no-console
  console.warn(`\n\n*** SKIPPED: ${name} is not installed; install it with: ${install} ***\n\n`);
  return false;
}
