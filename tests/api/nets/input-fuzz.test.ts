import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createNetWorld,
  registeredRoutes,
  validRequests,
  type Answer,
  type CallOptions,
  type NetWorld,
  type Principal,
} from './net-world';

/**
 * The input net: every route that changes something (POST, PUT, PATCH, DELETE) and every GET
 * route's query string gets hostile input — NUL bytes, lone surrogates, 100 kB strings, extreme
 * numbers, extreme and impossible dates, prototype keys, wrong types, nested junk — mostly as a
 * valid request with one leaf poisoned, which gets further into the code than pure junk.
 *
 * Whatever comes in, the answer is never a 5xx; a 4xx is JSON with `error.code`; and a request
 * answered 4xx leaves every table as it was (OWASP ASVS 5.0 V2 validation, V16 error handling).
 *
 * Bounded and repeatable: a fixed seed per route, a fixed number of runs per route and caller.
 * Left out: `POST /auth/logout` (it would end the caller's session; the sweep covers it) and
 * `GET /api/events` (an endless stream that reads no input).
 */

const baseSeed = 20_261_201;
const runs: Record<'write' | 'read', Partial<Record<Principal, number>>> = {
  write: { admin: 20, ownerA: 10 },
  read: { admin: 16, ownerA: 5 },
};
const deviceRuns = 20;
/** Ingest allows a device 20 requests a minute; a new device every 15 keeps the fuzzer under it. */
const requestsPerDeviceToken = 15;

const notFuzzed = new Set(['POST /auth/logout', 'GET /api/events']);

/**
 * Budgets the fuzzer would spend within a few calls, by route and rate-limit name: refilled before
 * each call so every case reaches the route's own checks (the limits have tests of their own).
 */
const refilledBudgets: Record<string, string> = {
  'POST /api/tanks/:tankId/urgent-requests': 'urgent-request',
};

/** A JSON literal `JSON.stringify` cannot write (1e999 parses to Infinity on the server). */
class RawLiteral {
  constructor(readonly text: string) {}
}

const nul = 'tank\u0000name';
const hugeString = 'x'.repeat(100_000);
const deeplyNested = (depth: number): unknown => (depth === 0 ? 'bottom' : { a: deeplyNested(depth - 1) });
const withOwnKey = (key: string, value: unknown) => {
  const object: Record<string, unknown> = {};
  Object.defineProperty(object, key, { value, enumerable: true, writable: true, configurable: true });
  return object;
};

const poisonStrings = [
  '\u0000',
  nul,
  '\ud800',
  'reef\udfff',
  '\udfff\ud800',
  hugeString,
  '',
  ' ',
  '1e308',
  '-1e308',
  'NaN',
  'Infinity',
  '-0',
  '0001-01-01',
  '9999-12-31',
  '0001-01-01T00:00:00Z',
  '9999-12-31T23:59:59.999Z',
  '+275760-09-13T00:00:00.000Z',
  '2026-02-30T10:00:00Z',
  '2026-13-45',
  'not a date',
  '00000000-0000-0000-0000-000000000000',
  'ffffffff-ffff-ffff-ffff-ffffffffffff',
  '__proto__',
  'constructor',
  "'; drop table tanks; --",
  '<script>alert(1)</script>',
  '../../etc/passwd',
  '\u202e\u200b\ufeff',
  '🐠'.repeat(500),
  '2026-01-01T00:00:00Z_99999999999999999999999999',
];
const poisonNumbers = [1e308, -1e308, -0, 5e-324, Number.MAX_SAFE_INTEGER + 2, -1, 0, 0.5, 2_147_483_648];
const rawLiterals = ['1e999', '-1e999', '-0', '1e-400', '123456789012345678901234567890'].map(
  (text) => new RawLiteral(text),
);
const wrongTypes = [
  null,
  true,
  false,
  [],
  {},
  [null],
  [[[[]]]],
  { value: 1 },
  Array.from({ length: 5000 }, (_, i) => i),
  deeplyNested(500),
  withOwnKey('__proto__', { polluted: true, role: 'admin' }),
  { constructor: { prototype: { polluted: true } } },
];

const poison: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...poisonStrings) },
  { weight: 2, arbitrary: fc.constantFrom(...poisonNumbers) },
  { weight: 1, arbitrary: fc.constantFrom(...rawLiterals) },
  { weight: 2, arbitrary: fc.constantFrom(...wrongTypes) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
);

/** Already percent-encoded: what a hostile URL carries (invalid UTF-8, NUL, bad escapes, long values). */
const urlPoison = [
  '%00',
  'tank%00name',
  '%ED%A0%80',
  '%FF%FE',
  '%',
  '%zz',
  'x'.repeat(6000),
  '9'.repeat(400),
  '1e308',
  '-1e308',
  'NaN',
  'Infinity',
  '-0',
  '-1',
  '0001-01-01',
  '9999-12-31',
  '0001-01-01T00%3A00%3A00Z',
  '9999-12-31T23%3A59%3A59Z',
  '%2B275760-09-13T00%3A00%3A00.000Z',
  '2026-02-30T00%3A00%3A00Z',
  'not-a-date',
  '__proto__',
  'constructor',
  '..%2F..%2Fetc%2Fpasswd',
  '%F0%9F%90%A0',
  '2026-01-01T00%3A00%3A00Z_99999999999999999999999999',
  '0000-00-00T00%3A00%3A00.000Z_1',
  '99999-12-31T00%3A00%3A00Z_1',
];
/** Query keys the API's schemas read, and a few no schema knows. */
const queryKeys = [
  'q',
  'technicianId',
  'status',
  'severity',
  'tankId',
  'limit',
  'waterType',
  'group',
  'parameter',
  'from',
  'to',
  'points',
  'source',
  'before',
  'dryRun',
  'returnTo',
  'action',
  'actor',
  'targetKind',
  'code',
  'state',
  '__proto__',
  'constructor',
];

/** The keys each GET route's query schema reads, so most poisoned keys are ones the route parses. */
const routeQueryKeys: Record<string, string[]> = {
  'GET /api/tanks': ['q', 'technicianId'],
  'GET /api/tanks/overview': ['q', 'technicianId', 'status', 'style', 'after'],
  'GET /api/alerts': ['status', 'severity', 'tankId', 'limit'],
  'GET /api/species': ['q', 'waterType', 'group', 'limit'],
  'GET /api/tanks/:tankId/readings': ['parameter', 'from', 'to', 'points'],
  'GET /api/tanks/:tankId/readings/list': ['parameter', 'source', 'from', 'to', 'before', 'limit'],
  'GET /api/tanks/:tankId/readings/export': ['parameter', 'source', 'from', 'to'],
  'GET /api/audit': ['action', 'actor', 'targetKind', 'from', 'to', 'before', 'limit'],
  'GET /api/audit/export': ['action', 'actor', 'targetKind', 'from', 'to'],
  'GET /api/visits': ['from', 'to', 'technicianId', 'tankId'],
  'GET /api/care-tips/feed': ['tankId', 'cursor', 'limit'],
  'GET /api/urgent-requests': ['state'],
  'GET /api/tanks/:tankId/conversation/messages': ['before', 'limit'],
  'GET /api/conversations': ['filter', 'limit', 'offset'],
  'GET /api/invoices': ['status', 'kind', 'tankId', 'clientId', 'month', 'after'],
  'GET /api/invoices/export.csv': ['from', 'to'],
  'GET /api/payments/export.csv': ['from', 'to'],
  'GET /auth/login': ['returnTo'],
  'POST /api/tanks/:tankId/livestock': ['dryRun'],
};

/** Date windows at and past the ends of what PostgreSQL and JavaScript dates hold. */
const extremeRanges: [string, string][] = [
  ['0001-01-01T00:00:00Z', '9999-12-31T23:59:59Z'],
  ['9999-12-31T00:00:00Z', '0001-01-01T00:00:00Z'],
  ['0000-01-01T00:00:00Z', '0000-01-02T00:00:00Z'],
  ['9999-12-30T00:00:00Z', '9999-12-31T23:59:59.999Z'],
  ['2026-01-01T00:00:00+14:00', '2026-01-01T00:00:00-12:00'],
  ['1970-01-01T00:00:00Z', '1970-01-01T00:00:00Z'],
];

/** The valid query with `replaced` keys taken out and `extra` (already encoded) added. */
function withQuery(valid: string | undefined, extra: string, replaced: string[]) {
  const kept = (valid ?? '')
    .split('&')
    .filter((pair) => pair !== '' && !replaced.includes(pair.split('=')[0]!));
  return [...kept, extra].join('&');
}

interface FuzzCase {
  label: string;
  options: CallOptions;
  /** Replace this path parameter with a poisoned segment. */
  param?: { name: string; value: string };
}

type Path = (string | number)[];

function leafPaths(value: unknown, prefix: Path = []): Path[] {
  if (value !== null && typeof value === 'object') {
    const entries = Array.isArray(value) ? value.map((v, i) => [i, v] as const) : Object.entries(value);
    const inner = entries.flatMap(([key, child]) => leafPaths(child, [...prefix, key]));
    return [prefix, ...inner];
  }
  return [prefix];
}

function setAt(value: unknown, path: Path, replacement: unknown): unknown {
  if (path.length === 0) return replacement;
  const [head, ...rest] = path;
  const copy = (Array.isArray(value) ? [...value] : { ...(value as object) }) as Record<
    string | number,
    unknown
  >;
  copy[head!] = setAt(copy[head!], rest, replacement);
  return copy;
}

function describeValue(value: unknown): string {
  if (value instanceof RawLiteral) return value.text;
  if (typeof value === 'string') {
    if (value.length > 60) return `"${value.slice(0, 12)}…" (${value.length} chars)`;
    return JSON.stringify(value);
  }
  if (Object.is(value, -0)) return '-0';
  const text = JSON.stringify(value) ?? String(value);
  return text.length > 60 ? `${text.slice(0, 40)}… (${text.length} chars)` : text;
}

/** JSON text with the raw literals written in where `JSON.stringify` would have strings. */
function serialize(value: unknown): string {
  const raws: string[] = [];
  const text = JSON.stringify(value, (_key, v: unknown) => {
    if (v instanceof RawLiteral) {
      raws.push(v.text);
      return `@@raw:${raws.length - 1}@@`;
    }
    return v;
  });
  return text.replace(/"@@raw:(\d+)@@"/g, (_match, index: string) => raws[Number(index)]!);
}

const junkBodies = [
  '{"readings": [',
  '{"name": "Reef",}',
  'null',
  '"just a string"',
  '42',
  '[]',
  '\u0000',
  `{"name": "${'a'.repeat(100_000)}"}`,
  '{"__proto__": {"polluted": true}, "name": "Reef"}',
  '{"constructor": {"prototype": {"polluted": true}}}',
  '{"a":'.repeat(2000) + '1' + '}'.repeat(2000),
];

function caseArbitrary(key: string, method: string, path: string, valid: { body?: unknown; query?: string }) {
  const params = [...path.matchAll(/:(\w+)/g)].map((m) => m[1]!);
  const variants: { weight: number; arbitrary: fc.Arbitrary<FuzzCase> }[] = [];
  const ownKeys = routeQueryKeys[key] ?? [];
  const keyArbitrary =
    ownKeys.length > 0
      ? fc.oneof(
          { weight: 3, arbitrary: fc.constantFrom(...ownKeys) },
          { weight: 1, arbitrary: fc.constantFrom(...queryKeys) },
        )
      : fc.constantFrom(...queryKeys);
  if (ownKeys.includes('from') && ownKeys.includes('to')) {
    variants.push({
      weight: 2,
      arbitrary: fc.constantFrom(...extremeRanges).map(([from, to]) => ({
        label: `query from=${from} to=${to}`,
        options: {
          query: withQuery(valid.query, `from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`, [
            'from',
            'to',
          ]),
        },
      })),
    });
  }
  const queryCase = fc
    .tuple(keyArbitrary, fc.constantFrom(...urlPoison), fc.boolean())
    .map(([key, value, twice]): FuzzCase => {
      const extra = twice ? `${key}=${value}&${key}=${value}` : `${key}=${value}`;
      return {
        label: `query ${twice ? 'twice ' : ''}${key}=${value.length > 60 ? `${value.slice(0, 12)}… (${value.length})` : value}`,
        options: { body: valid.body, query: withQuery(valid.query, extra, [key]) },
      };
    });
  variants.push({ weight: method === 'GET' ? 4 : 1, arbitrary: queryCase });
  if (params.length > 0) {
    variants.push({
      weight: 1,
      arbitrary: fc.tuple(fc.constantFrom(...params), fc.constantFrom(...urlPoison)).map(([name, value]) => ({
        label: `param :${name}=${value.length > 60 ? `${value.slice(0, 12)}… (${value.length})` : value}`,
        options: { body: valid.body, query: valid.query },
        param: { name, value },
      })),
    });
  }
  if (method !== 'GET') {
    if (valid.body !== undefined) {
      const leaves = leafPaths(valid.body);
      variants.push({
        weight: 5,
        arbitrary: fc.tuple(fc.constantFrom(...leaves), poison).map(([leaf, value]) => {
          const body = setAt(valid.body, leaf, value);
          return {
            label: `body.${leaf.join('.') || '(whole)'} = ${describeValue(value)}`,
            options: { rawJson: serialize(body), query: valid.query },
          };
        }),
      });
      variants.push({
        weight: 1,
        arbitrary: fc
          .tuple(fc.constantFrom('__proto__', 'constructor', 'prototype', 'extra'), poison)
          .map(([key, value]) => {
            const body =
              valid.body !== null && typeof valid.body === 'object' && !Array.isArray(valid.body)
                ? Object.assign(withOwnKey(key, value), valid.body)
                : withOwnKey(key, value);
            return {
              label: `body + own key ${key} = ${describeValue(value)}`,
              options: { rawJson: serialize(body), query: valid.query },
            };
          }),
      });
    }
    variants.push({
      weight: 1,
      arbitrary: poison.map((value) => ({
        label: `whole body = ${describeValue(value)}`,
        options: { rawJson: serialize(value), query: valid.query },
      })),
    });
    variants.push({
      weight: 1,
      arbitrary: fc.constantFrom(...junkBodies).map((text) => ({
        label: `raw body ${describeValue(text)}`,
        options: { rawJson: text, query: valid.query },
      })),
    });
  }
  return fc.oneof(...variants);
}

/** The photo upload is a multipart form: poison one text field, or send a file that is no image. */
function photoCaseArbitrary(world: NetWorld): fc.Arbitrary<() => FuzzCase> {
  const stringPoison = fc.constantFrom(...poisonStrings.filter((s) => s.length <= 16 * 1024));
  const fieldCase = fc
    .tuple(fc.constantFrom('caption', 'livestockId', 'cover', 'photo', '__proto__'), stringPoison)
    .map(([field, value]) => () => {
      const fields: Record<string, string> = { caption: 'Front view', [field]: value };
      return {
        label: `form field ${field} = ${describeValue(value)}`,
        options: { form: world.photoForm(fields) },
      };
    });
  const fileCase = fc
    .constantFrom(
      Buffer.alloc(0),
      Buffer.from('\u0000\u0000\u0000'),
      Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>'),
      world.png.subarray(0, 40),
    )
    .map((bytes) => () => ({
      label: `photo file of ${bytes.length} bytes that is no whole image`,
      options: { form: world.photoForm({}, bytes) },
    }));
  const jsonCase = poison.map((value) => () => ({
    label: `JSON body instead of a form: ${describeValue(value)}`,
    options: { rawJson: serialize({ caption: value }) },
  }));
  return fc.oneof(fieldCase, fieldCase, fileCase, jsonCase);
}

/** What is wrong with an answer, or null when it is one the API may give. */
function problemWith(answer: Answer): string | null {
  if (answer.status >= 500) return `answered ${answer.status}: ${answer.text.slice(0, 200)}`;
  if (answer.status >= 400) {
    if (!answer.contentType.includes('application/json')) {
      return `answered ${answer.status} as ${answer.contentType || 'no content type'}, not JSON`;
    }
    const code = (answer.json as { error?: { code?: unknown } } | undefined)?.error?.code;
    if (typeof code !== 'string' || code === '') return `answered ${answer.status} without error.code`;
  }
  return null;
}

function seedOf(key: string) {
  let hash = baseSeed;
  for (const char of key) hash = (Math.imul(hash, 31) + char.charCodeAt(0)) | 0;
  return hash;
}

const routes = registeredRoutes().filter((route) => !notFuzzed.has(route.key));
let requestCount = 0;
const statusTally: Record<number, number> = {};
const startedAt = Date.now();

describe('input fuzz: hostile input never breaks a route', () => {
  let world: NetWorld;

  beforeAll(async () => {
    world = await createNetWorld();
  });
  afterAll(async () => {
    console.log(
      `input fuzz: ${requestCount} requests over ${routes.length} routes in ${Math.round((Date.now() - startedAt) / 1000)} s (seed ${baseSeed}); answers by status: ${JSON.stringify(statusTally)}`,
    );
    await world?.close();
  });

  for (const route of routes) {
    it(`${route.key} answers hostile input with a JSON 4xx or a 2xx, and a refusal writes nothing`, async () => {
      const isWrite = route.method !== 'GET';
      const callers: [Principal, number][] =
        route.policy === 'device'
          ? [['device', deviceRuns]]
          : (Object.entries(runs[isWrite ? 'write' : 'read']) as [Principal, number][]);
      const findings: string[] = [];
      const valid = validRequests[route.key]?.(world) ?? {};
      const isUpload = valid.form !== undefined;
      for (const [who, numRuns] of callers) {
        const seed = seedOf(`${route.key} ${who}`);
        const cases: (() => FuzzCase)[] = isUpload
          ? fc.sample(photoCaseArbitrary(world), { seed, numRuns })
          : fc
              .sample(caseArbitrary(route.key, route.method, route.path, valid), { seed, numRuns })
              .map((fuzzCase) => () => fuzzCase);
        for (const [index, makeCase] of cases.entries()) {
          if (who === 'device' && index % requestsPerDeviceToken === 0) await world.rotateDeviceToken();
          const fuzzCase = makeCase();
          let path = route.path;
          if (fuzzCase.param) path = path.replace(`:${fuzzCase.param.name}`, fuzzCase.param.value);
          path = await world.fillPath(path, isWrite ? 'fresh' : 'shared', route.key);
          const budget = refilledBudgets[route.key];
          if (budget) {
            await world.stack.database.pool.query('delete from rate_limits where key like $1', [
              `${budget}:%`,
            ]);
          }
          const before = await world.fingerprint();
          let answer: Answer;
          try {
            answer = await world.call(who, route.method, path, fuzzCase.options);
          } catch (error) {
            // A streamed answer that breaks off after its status line is a server failure too.
            requestCount += 1;
            findings.push(`${who} · ${fuzzCase.label} → the connection failed: ${String(error)}`);
            continue;
          }
          requestCount += 1;
          statusTally[answer.status] = (statusTally[answer.status] ?? 0) + 1;
          const problem = problemWith(answer);
          if (problem) findings.push(`${who} · ${fuzzCase.label} → ${problem}`);
          if (answer.status >= 400 && answer.status < 500) {
            const changed = world.changedTables(before, await world.fingerprint());
            if (changed.length > 0) {
              findings.push(
                `${who} · ${fuzzCase.label} → ${answer.status} but wrote to ${changed.join(', ')}`,
              );
            }
          }
        }
      }
      expect(findings, `${route.key}:\n${findings.join('\n')}`).toEqual([]);
    });
  }
});
