/** Process entry of the command line; everything else is in main.ts so tests can call it. */
import { runCli } from './main.js';
import { readSecretFromTerminal } from './read-secret.js';

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString('utf8');
}

runCli(process.argv.slice(2), {
  stdout: (t) => process.stdout.write(t),
  stderr: (t) => process.stderr.write(t),
  readStdin,
  ...(process.stdin.isTTY ? { readSecret: readSecretFromTerminal } : {}),
  env: process.env,
  cwd: process.cwd(),
}).then((code) => {
  process.exitCode = code;
});
