#!/usr/bin/env node
// Entry for package.json "bin": runs the TypeScript command line through tsx, with the
// project's tsconfig (so JSX compiles from any working folder), passing signals on.
import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');
const tsx = path.join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs');
const main = path.join(root, 'src', 'cli', 'bin.ts');
const child = spawn(process.execPath, [tsx, '--tsconfig', path.join(root, 'tsconfig.json'), main, ...process.argv.slice(2)], { stdio: 'inherit' });
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => child.kill(signal));
child.on('exit', (code, signal) => {
  if (signal) process.kill(process.pid, signal);
  else process.exit(code ?? 1);
});
