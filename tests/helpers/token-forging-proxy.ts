import { once } from 'node:events';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { decodeJwt, decodeProtectedHeader, generateKeyPair, importJWK, SignJWT, type JWK } from 'jose';

export type IdTokenTamper = (claims: Record<string, unknown>) => Record<string, unknown>;

/**
 * Sits in front of the real identity provider and, when told to, re-signs the ID token of the
 * next token response with changed claims — using the provider's own key, so only the claim
 * checks (iss, aud, exp, nonce) can catch it; or with a stranger's key, to test the signature.
 */
export async function startTokenForgingProxy(options: { upstream: string; port: number; signingJwk: JWK }) {
  let pending: { tamper: IdTokenTamper; key: 'provider' | 'stranger' } | null = null;
  const stranger = await generateKeyPair('RS256');

  const upstream = new URL(options.upstream);
  const server = http.createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const chunk of req) chunks.push(chunk as Buffer);
    // The Host header goes through unchanged: the provider builds its URLs from it.
    const answer = await new Promise<http.IncomingMessage>((resolve, reject) => {
      const forward = http.request(
        {
          host: upstream.hostname,
          port: upstream.port,
          method: req.method,
          path: req.url,
          headers: req.headers,
        },
        resolve,
      );
      forward.on('error', reject);
      forward.end(Buffer.concat(chunks));
    });
    const parts: Buffer[] = [];
    for await (const chunk of answer) parts.push(chunk as Buffer);
    let body = Buffer.concat(parts);
    const status = answer.statusCode ?? 502;
    if (req.method === 'POST' && req.url?.startsWith('/token') && status === 200 && pending) {
      const { tamper, key } = pending;
      pending = null;
      const tokens = JSON.parse(body.toString('utf8')) as { id_token: string };
      const header = decodeProtectedHeader(tokens.id_token);
      const claims = tamper(decodeJwt(tokens.id_token) as Record<string, unknown>);
      const signingKey =
        key === 'provider' ? await importJWK(options.signingJwk, 'RS256') : stranger.privateKey;
      tokens.id_token = await new SignJWT(claims)
        .setProtectedHeader({ alg: 'RS256', kid: header.kid, typ: header.typ })
        .sign(signingKey);
      body = Buffer.from(JSON.stringify(tokens));
    }
    const headers = { ...answer.headers };
    delete headers['content-length'];
    delete headers['transfer-encoding'];
    res.writeHead(status, { ...headers, 'content-length': String(body.length) });
    res.end(body);
  });
  server.listen(options.port, '127.0.0.1');
  await once(server, 'listening');
  return {
    port: (server.address() as AddressInfo).port,
    /** The next ID token the provider issues is changed by `tamper` and re-signed. */
    forgeNext(tamper: IdTokenTamper, key: 'provider' | 'stranger' = 'provider') {
      pending = { tamper, key };
    },
    async close() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
