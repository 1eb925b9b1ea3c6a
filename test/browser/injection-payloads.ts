/**
 * Script-injection payloads for the escaping tests: each tries, if it were ever parsed as
 * markup, to set `window.__pwned`, open a dialog, or fetch a URL containing "pwned". Kept
 * free of leading or trailing spaces and line breaks, which the forms trim, and short
 * enough (≤ 120 characters) for a market name.
 */
export const INJECTION_PAYLOADS: string[] = [
  '<script>window.__pwned=1</script>',
  '<img src=x onerror="window.__pwned=2;alert(2)">',
  '<svg onload="window.__pwned=3">',
  '<svg><script>alert(4)</script></svg>',
  '"><script>window.__pwned=5</script>',
  "'><img src=/pwned-6 onerror=alert(6)>",
  '" autofocus onfocus="window.__pwned=7" x="',
  "' autofocus onfocus='window.__pwned=8' x='",
  'javascript:alert(9)',
  '</textarea><script>alert(10)</script>',
  '</title><script>alert(11)</script>',
  '<iframe src="javascript:alert(12)"></iframe>',
  '<a href="javascript:alert(13)">click</a>',
  '<body onload=alert(14)>',
  '<details open ontoggle=alert(15)>',
  '<input autofocus onfocus=alert(16)>',
  '＜script＞alert(17)＜/script＞',
  '\\u003cscript\\u003ealert(18)\\u003c/script\\u003e',
  '<scr<script>ipt>alert(19)</scr</script>ipt>',
  '&lt;script&gt;alert(20)&lt;/script&gt;',
  '=cmd|\' /C calc\'!A0',
  '+SUM(1+1)*cmd|\' /C calc\'!A1',
  '@SUM(1+1)',
  '-2+3+cmd|\' /C notepad\'!A2',
  '{{constructor.constructor(\'alert(25)\')()}}',
  '${alert(26)}',
  '<link rel=stylesheet href=/pwned-27.css>',
  '<meta http-equiv="refresh" content="0;url=/pwned-28">',
  '<div hx-get="/pwned-29" hx-trigger="load">htmx</div>',
  '<noscript><p title="</noscript><img src=x onerror=alert(30)>">',
  'a\u2028b\u2029<script>alert(31)</script>',
  '<math><mtext><table><mglyph><style><img src=x onerror=alert(32)>',
  '<object data="javascript:alert(33)"></object>',
  '<base href="//pwned.invalid/">',
];
