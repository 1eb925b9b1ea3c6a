/**
 * The app in a real browser for a test file: the server on a free port with a temporary
 * database file (the demo market seeds itself), and headless Debian Chromium driven by
 * playwright-core with the flags this machine needs.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { startServer, type RunningServer } from '../../src/server.js';

export const CHROMIUM = '/usr/bin/chromium';
export const CHROMIUM_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'];

export interface BrowserApp {
  server: RunningServer;
  browser: Browser;
  page: Page;
  close: () => Promise<void>;
}

export async function startBrowserApp(name: string): Promise<BrowserApp> {
  const dir = mkdtempSync(path.join(tmpdir(), `compfit-${name}-`));
  const server = await startServer({ port: 0, host: '127.0.0.1', databaseUrl: `file:${path.join(dir, 'test.db')}` }, () => {});
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  return {
    server,
    browser,
    page,
    close: async () => {
      await browser.close();
      await server.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
