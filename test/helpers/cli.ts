/** Runs the command line in-process and captures what it prints. */
import { runCli } from '../../src/cli/main.js';

export async function cli(args: string[], options: { cwd?: string; env?: Record<string, string>; stdin?: string } = {}) {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, {
    stdout: (t) => (stdout += t),
    stderr: (t) => (stderr += t),
    readStdin: async () => options.stdin ?? '',
    env: { ...options.env },
    cwd: options.cwd ?? process.cwd(),
  });
  return { code, stdout, stderr };
}
