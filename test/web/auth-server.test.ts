/**
 * The server's side of access: it will not serve other machines (or sit behind a proxy)
 * until someone can sign in, TRUST_PROXY is read strictly, and a client that stalls
 * sending its request is cut off with 408.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { connect } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ConfigError, openConfiguredDatabase, readConfig, startServer, type RunningServer } from '../../src/server.js';
import { closeDatabase } from '../../src/store/database.js';
import { addUser } from '../../src/store/users-repo.js';

let dir: string;
let databaseUrl: string;
let running: RunningServer | undefined;
beforeEach(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-access-'));
  databaseUrl = `file:${path.join(dir, 'test.db')}`;
});
afterEach(async () => {
  await running?.close();
  running = undefined;
  rmSync(dir, { recursive: true, force: true });
});

describe('starting the server', () => {
  it('refuses a HOST other machines reach, and TRUST_PROXY, until a user exists, and says how to add one', async () => {
    for (const config of [
      { port: 0, host: '0.0.0.0', databaseUrl },
      { port: 0, host: '127.0.0.1', databaseUrl, trustProxy: true },
    ]) {
      const start = startServer(config, () => {});
      await expect(start).rejects.toBeInstanceOf(ConfigError);
      await expect(start).rejects.toThrow(/there is no user yet\. Add one first with `compfit user add NAME`/);
    }
  });

  it('with a user, starts with sign-in required; on loopback without a proxy, needs no user', async () => {
    const db = await openConfiguredDatabase({ port: 0, host: '0.0.0.0', databaseUrl });
    await addUser(db, 'Ana Ferreira', 'correct horse battery staple');
    closeDatabase(db);
    const lines: string[] = [];
    running = await startServer({ port: 0, host: '0.0.0.0', databaseUrl }, (l) => lines.push(l));
    expect(lines.at(-1)).toContain('sign-in required');
    const url = running.url.replace('0.0.0.0', '127.0.0.1');
    const res = await fetch(`${url}/markets`, { redirect: 'manual' });
    expect(res.status).toBe(303);
    expect(res.headers.get('Location')).toBe('/sign-in');
    await running.close();

    running = await startServer({ port: 0, host: '127.0.0.1', databaseUrl: `file:${path.join(dir, 'other.db')}` }, (l) => lines.push(l));
    expect(lines.at(-1)).toContain('this computer only, no sign-in');
    expect((await fetch(`${running.url}/markets`)).status).toBe(200);
  });

  it('reads TRUST_PROXY as yes or no, and nothing else', () => {
    expect(readConfig({}).trustProxy).toBeUndefined();
    expect(readConfig({ TRUST_PROXY: '1' }).trustProxy).toBe(true);
    expect(readConfig({ TRUST_PROXY: 'yes' }).trustProxy).toBe(true);
    expect(readConfig({ TRUST_PROXY: 'false' }).trustProxy).toBeUndefined();
    expect(() => readConfig({ TRUST_PROXY: 'maybe' })).toThrow('TRUST_PROXY must be 1/true/yes or 0/false/no, got "maybe"');
  });
});

describe('time limits', () => {
  it('a client that does not finish its request head in time gets 408 and the connection is closed', async () => {
    running = await startServer({ port: 0, host: '127.0.0.1', databaseUrl, timeouts: { headersMs: 300, requestMs: 600, checkEveryMs: 100 } }, () => {});
    const { port } = new URL(running.url);
    const started = Date.now();
    const reply = await new Promise<string>((resolve, reject) => {
      const socket = connect(Number(port), '127.0.0.1', () => socket.write('GET /markets HTTP/1.1\r\nHost: 127.0.0.1\r\n')); // never ends the head
      let text = '';
      socket.on('data', (d) => (text += d.toString()));
      socket.on('close', () => resolve(text));
      socket.on('error', reject);
      setTimeout(() => reject(new Error('the server kept the stalled connection open')), 5000);
    });
    expect(reply).toMatch(/^HTTP\/1\.1 408/);
    expect(Date.now() - started).toBeGreaterThanOrEqual(300);
  });
});
