/**
 * The page shell: header, an area for messages that htmx error responses are retargeted
 * to, the page's content and the footer caution. Every full page goes through Layout.
 */
import type { Child } from 'hono/jsx';
import { Caution } from './caution.js';

/** htmx 2 does not swap 4xx/5xx by default; forms answer 422 with their errors, so swap those. */
export const HTMX_CONFIG = JSON.stringify({
  historyRestoreAsHxRequest: false,
  responseHandling: [
    { code: '204', swap: false },
    { code: '[23]..', swap: true },
    { code: '422', swap: true },
    { code: '[45]..', swap: true, error: true },
  ],
});

export function Layout(props: { title: string; children?: Child }) {
  return (
    <html lang="en">
      <head>
        <meta charset="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <meta name="htmx-config" content={HTMX_CONFIG} />
        <title>{`${props.title} · compfit`}</title>
        <link rel="stylesheet" href="/static/app.css" />
        <script src="/static/htmx.min.js" defer></script>
      </head>
      <body>
        <header class="site-header">
          <a class="brand" href="/markets">
            compfit
          </a>
          <span class="tagline">comparable-sales regression</span>
          <nav class="site-nav" aria-label="Site">
            <a href="/markets">Markets</a>
          </nav>
        </header>
        <main>
          <div id="messages" aria-live="polite"></div>
          {props.children}
        </main>
        <footer class="site-footer">
          <Caution />
        </footer>
      </body>
    </html>
  );
}
