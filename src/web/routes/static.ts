/**
 * Our stylesheet and htmx, served from the project (no CDN). Both are read once at
 * start; htmx comes from the installed htmx.org package.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Hono } from 'hono';

const here = path.dirname(fileURLToPath(import.meta.url));
const require = createRequire(import.meta.url);

const ASSETS: Record<string, { file: string; type: string }> = {
  'app.css': { file: path.join(here, '..', 'static', 'app.css'), type: 'text/css; charset=utf-8' },
  'htmx.min.js': { file: require.resolve('htmx.org/dist/htmx.min.js'), type: 'text/javascript; charset=utf-8' },
};

export function staticRoutes() {
  const loaded = Object.fromEntries(Object.entries(ASSETS).map(([name, a]) => [name, { body: readFileSync(a.file, 'utf8'), type: a.type }]));
  const app = new Hono();
  app.get('/:name', (c) => {
    const asset = loaded[c.req.param('name')];
    if (!asset) return c.notFound();
    c.header('Content-Type', asset.type);
    c.header('Cache-Control', 'public, max-age=3600');
    return c.body(asset.body);
  });
  return app;
}
