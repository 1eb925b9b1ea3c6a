/**
 * The page shell: header, an area for messages that htmx error responses are retargeted
 * to, the page's content and the footer caution. Every full page goes through Layout.
 */
import type { Child } from 'hono/jsx';
import { Caution } from './caution.js';
import { CSRF_HEADER, CsrfField } from './csrf-field.js';
import { requestState } from './request-state.js';

/**
 * htmx 2 does not swap 4xx/5xx by default; forms answer 422 with their errors, so swap those.
 * The content security policy allows no inline style or eval: htmx's own indicator style,
 * eval and script tags in swapped content are switched off.
 */
export const HTMX_CONFIG = JSON.stringify({
  historyRestoreAsHxRequest: false,
  includeIndicatorStyles: false,
  allowEval: false,
  allowScriptTags: false,
  selfRequestsOnly: true,
  // htmx settles `style` by default, which writes inline styles our CSP forbids.
  attributesToSettle: ['class', 'width', 'height'],
  responseHandling: [
    { code: '204', swap: false },
    { code: '[23]..', swap: true },
    { code: '422', swap: true },
    { code: '[45]..', swap: true, error: true },
  ],
});

function SignedIn() {
  const { user } = requestState();
  if (!user) return null;
  return (
    <form class="signed-in" method="post" action="/sign-out">
      <CsrfField />
      <span>Signed in as {user.name}</span>{' '}
      <button type="submit" class="link">
        Sign out
      </button>
    </form>
  );
}

export function Layout(props: { title: string; children?: Child }) {
  const { csrfToken } = requestState();
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
      <body hx-headers={csrfToken ? JSON.stringify({ [CSRF_HEADER]: csrfToken }) : undefined}>
        <header class="site-header">
          <a class="brand" href="/markets">
            compfit
          </a>
          <span class="tagline">comparable-sales regression</span>
          <nav class="site-nav" aria-label="Site">
            <a href="/markets">Markets</a>
          </nav>
          <SignedIn />
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
