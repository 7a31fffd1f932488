import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import http, { type IncomingHttpHeaders } from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { brotliCompressSync, brotliDecompressSync, gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCompany, createPerson, createTank } from '../helpers/factories';
import { HttpBrowser } from '../helpers/http-browser';
import { serveBuild, signIn, startTestStack, type TestStack } from '../helpers/stack';

interface RawAnswer {
  status: number;
  headers: IncomingHttpHeaders;
  body: Buffer;
}

/** A request as it goes over the wire: no client-side decoding, so the encoding the app chose shows. */
function rawGet(url: string, headers: Record<string, string>): Promise<RawAnswer> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () =>
          resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }),
        );
        res.on('error', reject);
      })
      .on('error', reject);
  });
}

describe('compression', () => {
  let stack: TestStack;
  let served: Awaited<ReturnType<typeof serveBuild>> | undefined;
  let base: string;
  let cookie: string;
  let webDist: string;
  const script = `export const tanks = ${JSON.stringify(
    Array.from({ length: 120 }, (_, i) => ({ name: `Tank ${i}`, litres: 100 + i })),
  )};\n`;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const company = await createCompany(db);
    const owner = await createPerson(db, { companyId: company.id, role: 'owner', issuer: stack.idp.issuer });
    for (let i = 0; i < 8; i += 1) {
      await createTank(db, {
        companyId: company.id,
        name: `Reef display tank number ${i} in the east wing lobby`,
        owners: [owner],
      });
    }
    const browser = new HttpBrowser();
    await signIn(stack, browser, owner);
    cookie = browser.cookieHeader(stack.origin);

    // A build as vite.config.ts leaves it: each file with its .br and .gz beside it.
    webDist = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-web-'));
    mkdirSync(path.join(webDist, 'assets'));
    const files = {
      'index.html': '<!doctype html><div id="root"></div>',
      'assets/index-Ab12Cd34.js': script,
    };
    for (const [name, text] of Object.entries(files)) writeFileSync(path.join(webDist, name), text);
    writeFileSync(path.join(webDist, 'assets/index-Ab12Cd34.js.br'), brotliCompressSync(script));
    writeFileSync(path.join(webDist, 'assets/index-Ab12Cd34.js.gz'), gzipSync(script, { level: 9 }));
    writeFileSync(path.join(webDist, 'sw.js'), script);
    writeFileSync(path.join(webDist, 'sw.js.br'), brotliCompressSync(script));

    // The same app, with the same database and sessions, serving that build.

    served = await serveBuild(stack, webDist);

    base = served.base;
  });

  afterAll(async () => {
    served?.close();
    if (webDist) rmSync(webDist, { recursive: true, force: true });
    await stack?.close();
  });

  it('sends JSON over 1 kB as brotli when the browser takes it, and says the answer varies by encoding', async () => {
    const plain = await rawGet(`${base}/api/tanks`, { cookie });
    const res = await rawGet(`${base}/api/tanks`, { cookie, 'accept-encoding': 'gzip, deflate, br' });

    expect(plain.body.length).toBeGreaterThan(1024);
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers.vary).toMatch(/accept-encoding/i);
    expect(res.body.length).toBeLessThan(plain.body.length);
    expect(JSON.parse(brotliDecompressSync(res.body).toString('utf8'))).toEqual(
      JSON.parse(plain.body.toString('utf8')),
    );
  });

  it('sends the body as it is to a client that names no encoding', async () => {
    const res = await rawGet(`${base}/api/tanks`, { cookie });

    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBeUndefined();
    const tanks = JSON.parse(res.body.toString('utf8')) as { name: string }[];
    expect(tanks).toHaveLength(8);
  });

  it('never compresses the live event stream, which delivers its first event at once', async () => {
    const first = await new Promise<{ headers: IncomingHttpHeaders; text: string }>((resolve, reject) => {
      const req = http.get(
        `${base}/api/events`,
        { headers: { cookie, 'accept-encoding': 'gzip, deflate, br' } },
        (res) => {
          let text = '';
          res.on('data', (chunk: Buffer) => {
            text += chunk.toString('utf8');
            // The stream stays open: the first event is read and the connection let go.
            if (text.includes('event: ready')) {
              resolve({ headers: res.headers, text });
              req.destroy();
            }
          });
          res.on('error', () => {});
        },
      );
      req.on('error', (error) => {
        if (!req.destroyed) reject(error);
      });
      req.setTimeout(10_000, () => reject(new Error('no event within 10 s: the stream is held back')));
    });

    expect(first.headers['content-type']).toMatch(/^text\/event-stream/);
    expect(first.headers['content-encoding']).toBeUndefined();
    expect(first.text).toContain('event: ready\ndata: {}\n\n');
  });

  it('serves a built script from its .br, with its own type and the immutable cache header', async () => {
    const res = await rawGet(`${base}/assets/index-Ab12Cd34.js`, { 'accept-encoding': 'gzip, deflate, br' });

    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/^(text|application)\/javascript/);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers.vary).toMatch(/accept-encoding/i);
    expect(brotliDecompressSync(res.body).toString('utf8')).toBe(script);
  });

  it('serves the .gz to a browser without brotli, and the file itself to one that takes neither', async () => {
    const gz = await rawGet(`${base}/assets/index-Ab12Cd34.js`, { 'accept-encoding': 'gzip' });
    const plain = await rawGet(`${base}/assets/index-Ab12Cd34.js`, {});

    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.toString('utf8')).toBe(script);
  });

  it('keeps the service worker uncached when it is sent from its .br', async () => {
    const res = await rawGet(`${base}/sw.js`, { 'accept-encoding': 'br' });

    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['cache-control']).toBe('no-cache');
  });
});
