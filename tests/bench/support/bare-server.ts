import { readFileSync } from 'node:fs';
import { createServer } from 'node:http';
import pg from 'pg';
import type { CapturedStatement } from './capture';

/*
 * The owner-tanks baseline: a bare node:http server with plain pg that runs the statements
 * captured from one real GET /api/tanks, one after another, and sends the same JSON (serialised
 * per request). No sessions, validation, logging or ORM. Started by the bench as
 * `node --import tsx tests/bench/support/bare-server.ts <plan.json> <port> <databaseUrl>`.
 */
const [planFile, port, databaseUrl] = process.argv.slice(2);
const plan = JSON.parse(readFileSync(planFile!, 'utf8')) as {
  statements: CapturedStatement[];
  body: unknown;
};
const pool = new pg.Pool({ connectionString: databaseUrl, max: 10 });

const server = createServer((req, res) => {
  void (async () => {
    const client = await pool.connect();
    try {
      for (const statement of plan.statements) await client.query(statement.text, statement.values);
    } finally {
      client.release();
    }
    const json = JSON.stringify(plan.body);
    res.writeHead(200, {
      'content-type': 'application/json; charset=utf-8',
      'content-length': Buffer.byteLength(json),
    });
    res.end(json);
  })().catch((error: unknown) => {
    res.writeHead(500).end(String(error));
  });
});
server.listen(Number(port), '127.0.0.1', () => console.log('ready'));
process.on('SIGTERM', () => {
  server.close();
  void pool.end().then(() => process.exit(0));
});
