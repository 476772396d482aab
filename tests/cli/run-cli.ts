/** Running the CLI from tests: in this process through main(), or as a user does, in a new process. */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main.ts';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** `furrow …` in this process; what it printed, as one text. */
export async function cli(args: string[]): Promise<{ code: number; text: string }> {
  const chunks: string[] = [];
  const code = await main(['node', 'furrow', ...args], (s) => void chunks.push(s));
  return { code, text: chunks.join('\n') };
}

/** `furrow …` in a new Node process (worker threads need one of their own); stdout and stderr together. */
export function cliProcess(args: string[], env: Record<string, string> = {}): { code: number; text: string } {
  const r = spawnSync(process.execPath, [join(ROOT, 'src/cli/bin.mjs'), ...args], { cwd: ROOT, env: { ...process.env, ...env }, encoding: 'utf8', timeout: 100_000 });
  return { code: r.status ?? -1, text: (r.stdout + r.stderr).trim() };
}
