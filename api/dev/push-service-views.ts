import { escapeHtml } from '../lib/html';
import type { ReceivedPush } from './push-service';

/**
 * The push stand-in's viewer. Everything shown comes from a sender, so everything is escaped;
 * the page has no scripts and allows only its own inline style.
 */

export const pageHeaders: Readonly<Record<string, string>> = {
  'Content-Security-Policy':
    "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; frame-ancestors 'none'",
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'Cache-Control': 'no-store',
};

const styles = `
*,*::before,*::after{box-sizing:border-box}
body{margin:0;padding:1rem;background:#f5f7f7;color:#16282c;
  font:1rem/1.5 system-ui,-apple-system,"Segoe UI",Roboto,"Helvetica Neue",Arial,sans-serif}
header,main,footer{max-width:72rem;margin:0 auto}
h1{font-size:1.5rem;margin:0 0 .25rem}
.note{margin:0 0 1rem;color:#465a5e}
.scroll{overflow-x:auto;background:#fff;border:1px solid #c9d3d4;border-radius:.5rem}
.scroll:focus-visible{outline:3px solid #0a5a63;outline-offset:2px}
table{border-collapse:collapse;width:100%}
caption{text-align:left;padding:.5rem .75rem;font-weight:600}
th,td{text-align:left;vertical-align:top;padding:.5rem .75rem;border-top:1px solid #dde4e5;overflow-wrap:anywhere}
th{font-weight:600;background:#eef2f2}
.refused{color:#8a1c1c;font-weight:600}
pre{white-space:pre-wrap;overflow-wrap:anywhere;margin:0;font:.875rem/1.45 ui-monospace,SFMono-Regular,Menlo,Consolas,monospace}
footer{margin-top:2rem;font-size:.875rem;color:#465a5e}
`;

const timeElement = (iso: string) =>
  `<time datetime="${escapeHtml(iso)}">${escapeHtml(iso.replace('T', ' ').replace(/\.\d+Z$/, ' UTC'))}</time>`;

function outcome(push: ReceivedPush): string {
  if (push.status === 201) return 'Delivered';
  return `<span class="refused">Refused ${push.status}</span><br>${escapeHtml(push.problem ?? '')}`;
}

function vapidCell(push: ReceivedPush): string {
  const subject = push.vapid.subject === '' ? '(no sub)' : push.vapid.subject;
  return push.vapid.valid ? `Valid<br>${escapeHtml(subject)}` : `Invalid<br>${escapeHtml(subject)}`;
}

function payloadCell(payload: unknown): string {
  if (payload === null) return '—';
  const text = typeof payload === 'string' ? payload : JSON.stringify(payload, null, 2);
  return `<pre>${escapeHtml(text)}</pre>`;
}

export function receivedPage(pushes: ReceivedPush[]): string {
  const rows = [...pushes]
    .reverse()
    .map(
      (push) => `<tr>
<td>${timeElement(push.receivedAt)}</td>
<td>${escapeHtml(push.subscriptionId)}</td>
<td>${outcome(push)}</td>
<td>${push.ttl} s<br>${escapeHtml(push.urgency ?? 'normal (unset)')}<br>${escapeHtml(push.topic ?? 'no topic')}</td>
<td>${vapidCell(push)}</td>
<td>${payloadCell(push.payload)}</td>
</tr>`,
    )
    .join('\n');
  const content =
    pushes.length === 0
      ? '<p>No pushes yet. Messages the app pushes to a browser appear here; reload the page to check again.</p>'
      : `<div class="scroll" role="region" aria-label="Received pushes" tabindex="0"><table>
<caption>${pushes.length === 1 ? '1 push' : `${pushes.length} pushes`}, newest first</caption>
<thead><tr><th scope="col">Received</th><th scope="col">Subscription</th><th scope="col">Outcome</th><th scope="col">TTL, urgency, topic</th><th scope="col">VAPID</th><th scope="col">Payload</th></tr></thead>
<tbody>
${rows}
</tbody>
</table></div>`;
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Brinewatch demo push service</title>
<style>${styles}</style>
</head>
<body>
<header><h1>Brinewatch demo push service</h1>
<p class="note">Web push messages the app sends land here, decrypted, instead of on a phone. This is a local stand-in for development and tests; the same list is at <a href="/api/received">/api/received</a> as JSON.</p></header>
<main>
${content}
</main>
<footer>Nothing here leaves this process.</footer>
</body>
</html>`;
}
