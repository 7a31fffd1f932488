import { escapeHtml } from '../lib/html';
import { randomUUID } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { simpleParser, type ParsedMail } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';

/**
 * Stand-in for the hosted e-mail provider: an SMTP server on loopback that keeps every message
 * in memory, and an optional mailbox page to read them in a browser.
 */

export interface CapturedAttachment {
  /** As the sender named it, or "attachment-<n>" when it had no name. */
  filename: string;
  contentType: string;
  /** Bytes of the decoded content. */
  size: number;
  content: Buffer;
}

export interface CapturedMail {
  id: string;
  /** ISO 8601 time the message was accepted. */
  receivedAt: string;
  /** The From header as written (display name and address). */
  from: string;
  /** Envelope recipients: everyone the message was delivered to, Bcc included. */
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** Header names in lower case; values unfolded but otherwise as sent; repeats joined by ", ". */
  headers: Record<string, string>;
  /** In the order the message carries them; the mailbox page links each for download. */
  attachments: CapturedAttachment[];
}

export interface MailServerOptions {
  host?: string;
  /** 0 picks a free port. */
  smtpPort: number;
  /** Mailbox page; 0 picks a free port; omitted means no page. */
  httpPort?: number;
}

export interface RunningMailServer {
  smtpPort: number;
  httpPort: number | null;
  /** In arrival order. */
  messages(): CapturedMail[];
  /** Resolves with the first message, already received or still to come, that matches. */
  waitFor(predicate: (mail: CapturedMail) => boolean, timeoutMs?: number): Promise<CapturedMail>;
  clear(): void;
  /** Stops accepting SMTP connections (senders get "connection refused"), as if the provider were down. */
  pause(): Promise<void>;
  resume(): Promise<void>;
  close(): Promise<void>;
}

const loopbackHosts = new Set(['127.0.0.1', '::1', 'localhost']);
const maxMessageBytes = 10 * 1024 * 1024;

class Inbox {
  readonly #mail: CapturedMail[] = [];
  readonly #waiters = new Set<(mail: CapturedMail) => void>();

  add(mail: CapturedMail): void {
    this.#mail.push(mail);
    for (const waiter of this.#waiters) waiter(mail);
  }

  all(): CapturedMail[] {
    return [...this.#mail];
  }

  find(id: string): CapturedMail | undefined {
    return this.#mail.find((mail) => mail.id === id);
  }

  clear(): void {
    this.#mail.length = 0;
  }

  waitFor(predicate: (mail: CapturedMail) => boolean, timeoutMs: number): Promise<CapturedMail> {
    const already = this.#mail.find(predicate);
    if (already) return Promise.resolve(already);
    return new Promise((resolve, reject) => {
      const waiter = (mail: CapturedMail) => {
        if (!predicate(mail)) return;
        clearTimeout(timer);
        this.#waiters.delete(waiter);
        resolve(mail);
      };
      const timer = setTimeout(() => {
        this.#waiters.delete(waiter);
        const seen = this.#mail.map((mail) => `"${mail.subject}" to ${mail.to.join(', ')}`);
        reject(
          new Error(
            `No matching mail within ${timeoutMs} ms. Received: ${seen.length ? seen.join('; ') : 'nothing'}.`,
          ),
        );
      }, timeoutMs);
      this.#waiters.add(waiter);
    });
  }
}

function headerRecord(parsed: ParsedMail): Record<string, string> {
  const values = new Map<string, string>();
  for (const { key, line } of parsed.headerLines) {
    const value = line
      .slice(line.indexOf(':') + 1)
      .replace(/\r?\n[ \t]+/g, ' ')
      .trim();
    const earlier = values.get(key);
    values.set(key, earlier === undefined ? value : `${earlier}, ${value}`);
  }
  // fromEntries defines own properties, so a header called __proto__ stays a plain key.
  return Object.fromEntries(values);
}

function capture(parsed: ParsedMail, session: SMTPServerSession): CapturedMail {
  const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
  return {
    id: randomUUID(),
    receivedAt: new Date().toISOString(),
    from: parsed.from?.text ?? envelopeFrom,
    to: session.envelope.rcptTo.map((recipient) => recipient.address),
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : null,
    headers: headerRecord(parsed),
    attachments: parsed.attachments.map((attachment, index) => ({
      filename: attachment.filename ?? `attachment-${index + 1}`,
      contentType: attachment.contentType,
      size: attachment.content.length,
      content: attachment.content,
    })),
  };
}

function createSmtpServer(inbox: Inbox): SMTPServer {
  const server = new SMTPServer({
    name: 'localhost',
    banner: 'Brinewatch mail stand-in',
    authOptional: true,
    // The app may be configured with credentials; any are accepted, none are needed.
    allowInsecureAuth: true,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? 'anonymous' }),
    disabledCommands: ['STARTTLS'],
    size: maxMessageBytes,
    rejectOversized: true,
    disableReverseLookup: true,
    logger: false,
    // pause() and close() drop idle pooled connections quickly instead of after 30 s.
    closeTimeout: 200,
    onData(stream: SMTPServerDataStream, session: SMTPServerSession, callback) {
      simpleParser(stream).then(
        (parsed) => {
          if (stream.sizeExceeded) return callback(new Error('Message is larger than 10 MB'));
          inbox.add(capture(parsed, session));
          callback();
        },
        (error: Error) => callback(error),
      );
    },
  });
  server.on('error', (error) => console.error('Brinewatch mail stand-in: SMTP error', error));
  return server;
}

function listenSmtp(server: SMTPServer, port: number, host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve((server.server.address() as AddressInfo).port);
    });
  });
}

const closeSmtp = (server: SMTPServer) => new Promise<void>((resolve) => server.close(() => resolve()));

function listenHttp(server: Server, port: number, host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve((server.address() as AddressInfo).port);
    });
  });
}

export async function startMailServer(options: MailServerOptions): Promise<RunningMailServer> {
  const host = options.host ?? '127.0.0.1';
  if (!loopbackHosts.has(host)) {
    throw new Error(`The mail stand-in listens on loopback only, not on ${host}.`);
  }
  const inbox = new Inbox();
  let smtp: SMTPServer | null = createSmtpServer(inbox);
  const smtpPort = await listenSmtp(smtp, options.smtpPort, host);

  let http: Server | null = null;
  let httpPort: number | null = null;
  if (options.httpPort !== undefined) {
    http = createServer((req, res) => {
      try {
        serveMailbox(inbox, req, res);
      } catch (error) {
        console.error('Brinewatch mail stand-in: mailbox page failed', error);
        if (!res.headersSent) res.writeHead(500, mailboxHeaders);
        res.end();
      }
    });
    try {
      httpPort = await listenHttp(http, options.httpPort, host);
    } catch (error) {
      await closeSmtp(smtp);
      throw error;
    }
  }

  // pause, resume and close run one after another, so a listener is never opened twice.
  let queue: Promise<void> = Promise.resolve();
  const serially = (step: () => Promise<void>) => {
    const run = queue.then(step);
    queue = run.catch(() => undefined);
    return run;
  };

  const stopSmtp = async () => {
    if (!smtp) return;
    const closing = smtp;
    smtp = null;
    await closeSmtp(closing);
  };

  return {
    smtpPort,
    httpPort,
    messages: () => inbox.all(),
    waitFor: (predicate, timeoutMs = 5000) => inbox.waitFor(predicate, timeoutMs),
    clear: () => inbox.clear(),
    pause: () => serially(stopSmtp),
    resume: () =>
      serially(async () => {
        if (smtp) return;
        const reopened = createSmtpServer(inbox);
        await listenSmtp(reopened, smtpPort, host);
        smtp = reopened;
      }),
    close: () =>
      serially(async () => {
        await stopSmtp();
        if (!http) return;
        const closing = http;
        http = null;
        await new Promise<void>((resolve, reject) => {
          closing.close((error) => (error ? reject(error) : resolve()));
          closing.closeAllConnections();
        });
      }),
  };
}

// ---------------------------------------------------------------------------------------------
// Mailbox page. Every value shown comes from a sender, so everything is escaped.

const urlPattern = /https?:\/\/[^\s<>"']+/g;

/** Escapes plain text and turns its http(s) URLs into links. */
function linkify(text: string): string {
  let html = '';
  let last = 0;
  for (const match of text.matchAll(urlPattern)) {
    // Sentence punctuation right after a URL is not part of it.
    const url = match[0].replace(/[.,;:!?)\]]+$/, '');
    const start = match.index;
    html += escapeHtml(text.slice(last, start));
    html += `<a href="${escapeHtml(url)}">${escapeHtml(url)}</a>`;
    last = start + url.length;
  }
  return html + escapeHtml(text.slice(last));
}

// Scripts are off for the page and, through inheritance, for the srcdoc frame holding the
// message's HTML; images and inline styles stay on so the message looks as it would in a mail app.
const mailboxHeaders = {
  'Content-Security-Policy': "script-src 'none'; object-src 'none'; frame-ancestors 'none'",
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'Cache-Control': 'no-store',
};

const mailboxStyles = `
*,*::before,*::after{box-sizing:border-box}
body{margin:0;padding:1rem;background:#f5f7f7;color:#16282c;
  font:1rem/1.5 system-ui,-apple-system,"Segoe UI",Roboto,"Helvetica Neue",Arial,sans-serif}
header,main,footer{max-width:60rem;margin:0 auto}
h1{font-size:1.5rem;margin:0 0 .25rem}
h2{font-size:1.125rem;margin:1.5rem 0 .5rem}
.note{margin:0 0 1rem;color:#465a5e}
a{color:#0a5a63}
a:focus-visible,[tabindex]:focus-visible,summary:focus-visible{outline:3px solid #0a5a63;outline-offset:2px}
.scroll{overflow-x:auto;background:#fff;border:1px solid #c9d3d4;border-radius:.5rem}
table{border-collapse:collapse;width:100%}
th,td{text-align:left;vertical-align:top;padding:.5rem .75rem;border-top:1px solid #dde4e5;overflow-wrap:anywhere}
th{font-weight:600;background:#eef2f2}
th[scope=row]{white-space:nowrap;overflow-wrap:normal}
dl{display:grid;grid-template-columns:max-content 1fr;gap:.25rem 1rem;margin:0 0 1rem}
dt{font-weight:600}dd{margin:0;overflow-wrap:anywhere}
pre{white-space:pre-wrap;overflow-wrap:anywhere;background:#fff;border:1px solid #c9d3d4;border-radius:.5rem;
  padding:.75rem;margin:0;font:.9375rem/1.5 ui-monospace,SFMono-Regular,Menlo,Consolas,monospace}
.messages{list-style:none;margin:0;padding:0;background:#fff;border:1px solid #c9d3d4;border-radius:.5rem}
.messages li{padding:.75rem;border-top:1px solid #dde4e5;overflow-wrap:anywhere}
.messages li:first-child{border-top:0}
.subject{font-weight:600}
.meta-inline{font-size:.875rem;color:#465a5e}
.meta{margin:.25rem 0 0;font-size:.875rem;color:#465a5e;display:flex;flex-wrap:wrap;gap:.25rem 1rem}
iframe{width:100%;min-height:28rem;border:1px solid #c9d3d4;border-radius:.5rem;background:#fff}
footer{margin-top:2rem;font-size:.875rem;color:#465a5e}
`;

function mailboxPage(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>${mailboxStyles}</style>
</head>
<body>
${body}
<footer>A local stand-in for the e-mail provider: messages stay in this process and nothing is delivered.</footer>
</body>
</html>`;
}

const timeElement = (iso: string) =>
  `<time datetime="${escapeHtml(iso)}">${escapeHtml(iso.replace('T', ' ').replace(/\.\d+Z$/, ' UTC'))}</time>`;

const subjectOrPlaceholder = (subject: string) => (subject.trim() === '' ? '(no subject)' : subject);

const attachmentPath = (m: CapturedMail, index: number) =>
  `/messages/${encodeURIComponent(m.id)}/attachments/${index}`;

function attachmentCount(m: CapturedMail): string {
  const count = m.attachments.length;
  if (count === 0) return '';
  return ` <span>${count === 1 ? '1 attachment' : `${count} attachments`}</span>`;
}

function byteSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

function attachmentsSection(m: CapturedMail): string {
  if (m.attachments.length === 0) return '';
  const items = m.attachments
    .map(
      (attachment, index) =>
        `<li><a href="${escapeHtml(attachmentPath(m, index))}" download>${escapeHtml(attachment.filename)}</a> <span class="meta-inline">${escapeHtml(attachment.contentType)}, ${byteSize(attachment.size)}</span></li>`,
    )
    .join('\n');
  return `<h2>Attachments</h2>
<ul class="messages">
${items}
</ul>`;
}

function listPage(mail: CapturedMail[]): string {
  const items = [...mail]
    .reverse()
    .map(
      (m) => `<li>
<a class="subject" href="/messages/${encodeURIComponent(m.id)}">${escapeHtml(subjectOrPlaceholder(m.subject))}</a>
<p class="meta"><span>From ${escapeHtml(m.from)}</span> <span>To ${escapeHtml(m.to.join(', '))}</span> ${timeElement(m.receivedAt)}${attachmentCount(m)}</p>
</li>`,
    )
    .join('\n');
  const content =
    mail.length === 0
      ? '<p>No mail yet. Messages the app sends appear here; reload the page to check again.</p>'
      : `<h2>${mail.length === 1 ? '1 message' : `${mail.length} messages`}, newest first</h2>
<ol class="messages">
${items}
</ol>`;
  return mailboxPage(
    'Brinewatch demo mailbox',
    `<header><h1>Brinewatch demo mailbox</h1>
<p class="note">Everything the app sends by e-mail lands here instead of a real inbox. This is a local stand-in for development and tests.</p></header>
<main>
${content}
</main>`,
  );
}

function messagePage(m: CapturedMail): string {
  const subject = subjectOrPlaceholder(m.subject);
  // Links in the message open in a new tab: inside the frame most pages refuse to be shown.
  const htmlSection =
    m.html === null
      ? ''
      : `<h2>HTML version</h2>
<iframe title="HTML version of the message" sandbox="allow-popups allow-popups-to-escape-sandbox" srcdoc="${escapeHtml(`<base target="_blank">${m.html}`)}"></iframe>`;
  const headerRows = Object.entries(m.headers)
    .map(([name, value]) => `<tr><th scope="row">${escapeHtml(name)}</th><td>${escapeHtml(value)}</td></tr>`)
    .join('\n');
  return mailboxPage(
    `${subject} – Brinewatch demo mailbox`,
    `<header><p><a href="/">Back to the mailbox</a></p></header>
<main>
<h1>${escapeHtml(subject)}</h1>
<dl>
<dt>From</dt><dd>${escapeHtml(m.from)}</dd>
<dt>To</dt><dd>${escapeHtml(m.to.join(', '))}</dd>
<dt>Received</dt><dd>${timeElement(m.receivedAt)}</dd>
</dl>
${attachmentsSection(m)}
<h2>Plain text version</h2>
<pre>${linkify(m.text)}</pre>
${htmlSection}
<h2>Headers</h2>
<div class="scroll" role="region" aria-label="Headers" tabindex="0"><table>
<tbody>
${headerRows}
</tbody>
</table></div>
</main>`,
  );
}

function notFoundPage(): string {
  return mailboxPage(
    'Not found – Brinewatch demo mailbox',
    `<main><h1>No such message</h1><p>It may have been cleared. <a href="/">Back to the mailbox</a></p></main>`,
  );
}

function send(res: ServerResponse, status: number, type: string, body: string): void {
  res.writeHead(status, { ...mailboxHeaders, 'Content-Type': type });
  res.end(body);
}

const sendHtml = (res: ServerResponse, status: number, html: string) =>
  send(res, status, 'text/html; charset=utf-8', html);
const sendJson = (res: ServerResponse, status: number, value: unknown) =>
  send(res, status, 'application/json; charset=utf-8', JSON.stringify(value));

/** A message as JSON: attachments are described and linked, their bytes served by their own route. */
function mailJson(m: CapturedMail) {
  return {
    ...m,
    attachments: m.attachments.map((attachment, index) => ({
      filename: attachment.filename,
      contentType: attachment.contentType,
      size: attachment.size,
      url: attachmentPath(m, index),
    })),
  };
}

// A sender's name and type go into response headers: anything unusual is replaced, never echoed.
const mediaType = /^[a-z0-9!#$&^_.+-]+\/[a-z0-9!#$&^_.+-]+$/i;

function contentDisposition(filename: string): string {
  const fallback = filename.replace(/[^\x20-\x7e]|["\\]/g, '_');
  const encoded = encodeURIComponent(filename).replace(
    /['()*]/g,
    (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`,
  );
  return `attachment; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}

function sendAttachment(res: ServerResponse, attachment: CapturedAttachment): void {
  res.writeHead(200, {
    ...mailboxHeaders,
    // Whatever the file holds, it never runs as a page of this origin.
    'Content-Security-Policy': "sandbox; default-src 'none'",
    'Content-Type': mediaType.test(attachment.contentType)
      ? attachment.contentType
      : 'application/octet-stream',
    'Content-Disposition': contentDisposition(attachment.filename),
    'Content-Length': String(attachment.content.length),
  });
  res.end(attachment.content);
}

function safeDecode(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    return segment;
  }
}

function serveMailbox(inbox: Inbox, req: IncomingMessage, res: ServerResponse): void {
  const { pathname } = new URL(req.url ?? '/', 'http://mailbox.invalid');
  const method = req.method ?? 'GET';
  const reading = method === 'GET' || method === 'HEAD';
  const messageId = /^\/messages\/([^/]+)$/.exec(pathname)?.[1];
  const apiMessageId = /^\/api\/messages\/([^/]+)$/.exec(pathname)?.[1];
  const attachmentRoute = /^\/messages\/([^/]+)\/attachments\/(\d{1,4})$/.exec(pathname);

  if (pathname === '/api/messages' && method === 'DELETE') {
    inbox.clear();
    res.writeHead(204, mailboxHeaders).end();
    return;
  }
  if (!reading) {
    res.writeHead(405, { ...mailboxHeaders, Allow: 'GET, HEAD' }).end();
    return;
  }
  if (pathname === '/') return sendHtml(res, 200, listPage(inbox.all()));
  if (pathname === '/api/messages') return sendJson(res, 200, inbox.all().reverse().map(mailJson));
  if (attachmentRoute) {
    const [, id = '', index = ''] = attachmentRoute;
    const attachment = inbox.find(safeDecode(id))?.attachments[Number(index)];
    return attachment ? sendAttachment(res, attachment) : sendHtml(res, 404, notFoundPage());
  }
  if (messageId !== undefined || apiMessageId !== undefined) {
    const mail = inbox.find(safeDecode(messageId ?? apiMessageId ?? ''));
    if (apiMessageId !== undefined) {
      return mail
        ? sendJson(res, 200, mailJson(mail))
        : sendJson(res, 404, { error: { code: 'not_found', message: 'No such message.' } });
    }
    return mail ? sendHtml(res, 200, messagePage(mail)) : sendHtml(res, 404, notFoundPage());
  }
  sendHtml(res, 404, notFoundPage());
}
