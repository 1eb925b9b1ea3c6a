#!/usr/bin/env node
// Entry for package.json "bin": runs the TypeScript command line through tsx.
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
const here = path.dirname(fileURLToPath(import.meta.url));
const main = path.join(here, '..', 'src', 'cli', 'bin.ts');
const tsx = path.join(here, '..', 'node_modules', 'tsx', 'dist', 'cli.mjs');
const r = spawnSync(process.execPath, [tsx, main, ...process.argv.slice(2)], { stdio: 'inherit' });
process.exit(r.status ?? 1);
