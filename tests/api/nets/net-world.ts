import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Router } from 'express';
import { defaultNotificationPreferences } from '@shared/schemas/notifications';
import { visitReportContent } from '@shared/schemas/visits';
import {
  alerts,
  billingSettings,
  careTipReaders,
  careTips,
  careTipTanks,
  conversationMessages,
  conversations,
  devices,
  invitations,
  invoiceLines,
  invoices,
  onCallShifts,
  photos,
  priceItems,
  urgentRequestEvents,
  urgentRequests,
  users,
  visitReportVersions,
  visits,
} from '../../../api/db/schema/index';
import { hashToken } from '../../../api/lib/tokens';
import type { PolicyMarked } from '../../../api/policy/index';
import { authRouter } from '../../../api/routes/auth';
import { apiRouters, sessionlessRouters } from '../../../api/routes/index';
import { issueDeviceToken } from '../../../api/services/devices';
import { storePhotoObjects } from '../../../api/services/photos';
import {
  addEquipmentTo,
  addLivestockTo,
  createCompany,
  createPerson,
  createTank,
  insertReadings,
  type TestPerson,
} from '../../helpers/factories';
import { HttpBrowser } from '../../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../../helpers/stack';
import { makeImage } from '../photos/test-images';

/**
 * The world both permanent nets (authorization sweep, input fuzzer) run in: two companies, tank A
 * and tank B in company 1 with one owner each, staff, another company's admin, a device of tank A
 * and a deactivated admin, plus the objects of tank A that path parameters name. Company 1 bills in
 * GBP (20 % VAT included, no call-out fee, so an urgent request accepts none).
 */

export const principals = [
  'anonymous',
  'ownerA',
  'ownerB',
  'technician',
  'admin',
  'otherAdmin',
  'device',
  'deactivated',
] as const;
export type Principal = (typeof principals)[number];

type SignedInPrincipal = Exclude<Principal, 'anonymous' | 'device'>;

/** "METHOD /full/path", e.g. "GET /api/tanks/:tankId", as route-policies.test.ts lists them. */
export interface RegisteredRoute {
  key: string;
  method: string;
  path: string;
  policy: string | undefined;
}

interface RouteLayer {
  route?: { path: string; methods: Record<string, boolean>; stack: { handle: PolicyMarked }[] };
}

function routesOf(prefix: string, router: Router): RegisteredRoute[] {
  return (router.stack as RouteLayer[]).flatMap((layer) => {
    const route = layer.route;
    if (!route) return [];
    const policy = route.stack.map((step) => step.handle.policy).find(Boolean);
    const path = `${prefix}${route.path === '/' ? '' : route.path}`;
    return Object.keys(route.methods).map((method) => ({
      key: `${method.toUpperCase()} ${path}`,
      method: method.toUpperCase(),
      path,
      policy,
    }));
  });
}

/** Every route the app registers, walked from the same router lists the app mounts. */
export function registeredRoutes(): RegisteredRoute[] {
  return [
    ...[...sessionlessRouters, ...apiRouters].flatMap(([path, router]) => routesOf(`/api${path}`, router)),
    ...routesOf('/auth', authRouter),
  ];
}

export interface CallOptions {
  body?: unknown;
  /** Sent as it is, with content-type application/json (for JSON an object cannot express). */
  rawJson?: string;
  form?: FormData;
  query?: string;
  /** For an endless response (Server-Sent Events): read the status, then hang up. */
  stream?: boolean;
  /** Use a second session of the same person, for a route that ends the session it is called with. */
  throwawaySession?: boolean;
}

export interface Answer {
  status: number;
  contentType: string;
  json: unknown;
  text: string;
}

/** Tables every request may write whatever it is answered: the session store and rate-limit budgets. */
const bookkeepingTables = new Set(['session', 'rate_limits']);

const unique = () => randomBytes(4).toString('hex');

export type NetWorld = Awaited<ReturnType<typeof createNetWorld>>;

/** `stackOptions` go to the test stack, e.g. the internal-notes net turns web push on. */
export async function createNetWorld(stackOptions: Parameters<typeof startTestStack>[0] = {}) {
  const stack: TestStack = await startTestStack(stackOptions);
  const { db } = stack.database;
  const issuer = stack.idp.issuer;
  const company = await createCompany(db);
  const otherCompany = await createCompany(db);
  const person = (companyId: string, role: TestPerson['role'], name: string) =>
    createPerson(db, { companyId, role, issuer, name });
  const people = {
    ownerA: await person(company.id, 'owner', 'Owner of tank A'),
    ownerB: await person(company.id, 'owner', 'Owner of tank B'),
    technician: await person(company.id, 'technician', 'Technician'),
    admin: await person(company.id, 'admin', 'Admin'),
    otherAdmin: await person(otherCompany.id, 'admin', 'Admin elsewhere'),
    deactivated: await person(company.id, 'admin', 'Deactivated admin'),
  } satisfies Record<SignedInPrincipal, TestPerson>;
  const tankA = await createTank(db, {
    companyId: company.id,
    name: 'Tank A',
    owners: [people.ownerA],
    style: 'mixed-reef',
    // Readings may be dated back to when the tank was set up.
    setUpOn: '2020-01-01',
  });
  const tankB = await createTank(db, { companyId: company.id, name: 'Tank B', owners: [people.ownerB] });
  const otherTank = await createTank(db, { companyId: otherCompany.id, name: 'Elsewhere' });
  const png = await makeImage({ width: 64, height: 48, format: 'png' });
  await db.insert(billingSettings).values({
    companyId: company.id,
    currency: 'GBP',
    taxRateBp: 2000,
    taxLabel: 'VAT',
    pricesIncludeTax: true,
    hourlyRateMinor: 6000,
    callOutFeeMinor: null,
  });

  const browsers = {} as Record<SignedInPrincipal, HttpBrowser>;
  for (const who of Object.keys(people) as SignedInPrincipal[]) {
    browsers[who] = new HttpBrowser();
    await signIn(stack, browsers[who], people[who]);
  }
  // The deactivated admin keeps the session they had; the app drops it at their next request, so
  // the same row is put back before each of their calls.
  const deactivatedSession = await stack.database.pool.query<{ sid: string; sess: unknown; expire: Date }>(
    `select sid, sess, expire from session where sess->>'userId' = $1`,
    [people.deactivated.id],
  );
  if (deactivatedSession.rows.length !== 1) throw new Error('the deactivated admin has no session');
  await db
    .update(users)
    .set({ status: 'deactivated', deactivatedAt: new Date() })
    .where(eq(users.id, people.deactivated.id));
  const restoreDeactivatedSession = async () => {
    const row = deactivatedSession.rows[0]!;
    await stack.database.pool.query(
      `insert into session (sid, sess, expire) values ($1, $2, $3)
       on conflict (sid) do update set sess = excluded.sess, expire = excluded.expire`,
      [row.sid, JSON.stringify(row.sess), row.expire],
    );
  };

  /** Rows made directly rather than through the services, whose signatures other work changes. */
  const addDevice = async (name: string) => {
    const { token, tokenHash, tokenHint } = issueDeviceToken();
    const [row] = await db
      .insert(devices)
      .values({
        companyId: company.id,
        tankId: tankA.id,
        name,
        tokenHash,
        tokenHint,
        createdBy: people.admin.id,
      })
      .returning();
    return { id: row!.id, token };
  };
  const addPhoto = async () => {
    const stored = await storePhotoObjects(stack.deps.storage, png, new Date());
    const [row] = await db
      .insert(photos)
      .values({
        companyId: company.id,
        tankId: tankA.id,
        subject: 'tank',
        ...stored,
        uploadedBy: people.admin.id,
      })
      .returning();
    return row!.id;
  };
  let deviceToken = (await addDevice('Sump probe')).token;

  /**
   * An invoice of tank A to its owner for one routine service (95.00, VAT included). Issued ones take
   * their number from the company's counter as the service does, so an issue through the API
   * afterwards gets the next one.
   */
  const addInvoice = async (status: 'draft' | 'issued') => {
    let number: number | null = null;
    if (status === 'issued') {
      const counter = await stack.database.pool.query<{ last_number: number }>(
        `insert into billing_counters (company_id, kind, last_number) values ($1, 'invoice', 1)
         on conflict (company_id, kind) do update set last_number = billing_counters.last_number + 1
         returning last_number`,
        [company.id],
      );
      number = Number(counter.rows[0]!.last_number);
    }
    const issueDate = new Date().toISOString().slice(0, 10);
    const [row] = await db
      .insert(invoices)
      .values({
        companyId: company.id,
        tankId: tankA.id,
        status,
        number,
        billToUserId: people.ownerA.id,
        billToName: people.ownerA.name,
        billToEmail: people.ownerA.email,
        currency: 'GBP',
        taxRateBp: 2000,
        taxLabel: 'VAT',
        pricesIncludeTax: true,
        // 95.00 with 20 % included: net 95.00 / 1.2 = 79.1666… → 79.17, tax 15.83.
        netMinor: 7917,
        taxMinor: 1583,
        totalMinor: 9500,
        ...(status === 'issued' && {
          issueDate,
          dueDate: daysAhead(14),
          issuedAt: new Date(),
          issuedBy: people.admin.id,
          seller: { name: company.name, address: '', taxId: '', footer: '' },
        }),
        createdBy: people.admin.id,
      })
      .returning();
    await db.insert(invoiceLines).values({
      invoiceId: row!.id,
      position: 0,
      kind: 'service',
      description: 'Routine service',
      quantityHundredths: 100,
      unit: 'visit',
      unitPriceMinor: 9500,
      amountMinor: 9500,
    });
    return row!.id;
  };

  /** Objects of tank A that path parameters name; `fresh` makes new ones for a call that may use them up. */
  const freshObject = {
    equipmentId: async () => (await addEquipmentTo(db, tankA)).id,
    livestockId: async () =>
      (await addLivestockTo(db, tankA, { catalogueSpeciesId: 'trochus-snail', status: 'stable' })).id,
    deviceId: async () => (await addDevice(`Probe ${unique()}`)).id,
    alertId: async () => {
      const now = new Date();
      const [row] = await db
        .insert(alerts)
        .values({
          companyId: company.id,
          tankId: tankA.id,
          kind: 'limit',
          ruleKey: `limit:temperature:${unique()}`,
          parameter: 'temperature',
          severity: 'warning',
          title: 'Temperature high',
          body: 'Temperature is above the warning limit.',
          value: 28.5,
          limitValue: 27,
          direction: 'high',
          openedAt: now,
          lastSeenAt: now,
        })
        .returning();
      return row!.id;
    },
    photoId: addPhoto,
    shiftId: async () => {
      const [row] = await db
        .insert(onCallShifts)
        .values({
          companyId: company.id,
          userId: people.technician.id,
          startsAt: new Date(Date.now() + 86_400_000),
          endsAt: new Date(Date.now() + 2 * 86_400_000),
        })
        .returning();
      return row!.id;
    },
    invitationId: async () => {
      const [row] = await db
        .insert(invitations)
        .values({
          companyId: company.id,
          email: `invited-${unique()}@example.test`,
          role: 'technician',
          tokenHash: hashToken(randomBytes(24).toString('base64url')),
          expiresAt: new Date(Date.now() + 7 * 86_400_000),
          invitedBy: people.admin.id,
        })
        .returning();
      return row!.id;
    },
    /** Staff changes (role, deactivation) act on a technician made for the call, never on a principal. */
    userId: async () => (await person(company.id, 'technician', `Target ${unique()}`)).id,
    speciesId: () => Promise.resolve('trochus-snail'),
    token: () => Promise.resolve(randomBytes(24).toString('hex')),
    /**
     * A visit of tank A whose report was published, edited and published again (version 2), and
     * edited once more since (version 3, not yet published).
     */
    visitId: async () => {
      const publishedAt = new Date(Date.now() - 2 * 3_600_000);
      const report = (notes: string) =>
        visitReportContent.parse({ arrivedAt: new Date(Date.now() - 3 * 3_600_000).toISOString(), notes });
      const [row] = await db
        .insert(visits)
        .values({
          companyId: company.id,
          tankId: tankA.id,
          technicianId: people.technician.id,
          kind: 'routine',
          status: 'published',
          windowStart: new Date(Date.now() - 3 * 3_600_000),
          windowEnd: new Date(Date.now() - 2 * 3_600_000),
          draft: report('Cleaned the glass, the overflow and the sump.'),
          version: 3,
          published: report('Cleaned the glass and the overflow.'),
          publishedVersion: 2,
          publishedAt,
          publishedBy: people.technician.id,
          editedAt: new Date(),
          announcedAt: publishedAt,
          createdBy: people.technician.id,
        })
        .returning();
      await db.insert(visitReportVersions).values({
        visitId: row!.id,
        version: 1,
        content: report('Cleaned the glass.'),
        publishedAt,
        publishedBy: people.technician.id,
      });
      return row!.id;
    },
    /** An urgent request of tank A from its owner, still waiting for an acknowledgement. */
    requestId: async () => {
      const [row] = await db
        .insert(urgentRequests)
        .values({
          companyId: company.id,
          tankId: tankA.id,
          requestedBy: people.ownerA.id,
          requestedByName: people.ownerA.name,
          category: 'leak',
          description: 'Water on the floor under the cabinet.',
          someoneOnSite: true,
          phone: '+44 20 7946 0958',
          snapshot: { readings: [], openAlerts: [] },
        })
        .returning();
      await db.insert(urgentRequestEvents).values({
        requestId: row!.id,
        type: 'requested',
        actorId: people.ownerA.id,
        actorName: people.ownerA.name,
        at: row!.createdAt,
        fannedOutAt: row!.createdAt,
      });
      return row!.id;
    },
    /** A consumable on company 1's price list. */
    priceItemId: async () => {
      const [row] = await db
        .insert(priceItems)
        .values({
          companyId: company.id,
          kind: 'consumable',
          name: `Filter floss ${unique()}`,
          unit: 'roll',
          unitPriceMinor: 375,
        })
        .returning();
      return row!.id;
    },
    /** An issued invoice of tank A, awaiting payment (the routes in `draftInvoiceRoutes` get a draft). */
    invoiceId: () => addInvoice('issued'),
    draftInvoiceId: () => addInvoice('draft'),
    /** The earlier published version every visit above keeps. */
    version: () => Promise.resolve('1'),
    /**
     * A care tip to all of company 1's tanks, scheduled for tomorrow and already sent to tank A by
     * one tap (its owner a reader): every tip route has something to do with it.
     */
    tipId: async () => {
      const [tip] = await db
        .insert(careTips)
        .values({
          companyId: company.id,
          title: 'Top up with fresh water',
          body: 'Salt stays behind when water evaporates.',
          category: 'maintenance',
          audience: { kind: 'all' },
          suggestWhen: [{ on: 'livestock-added', group: 'snail' }],
          status: 'scheduled',
          sendAt: new Date(Date.now() + 86_400_000),
          createdBy: people.admin.id,
        })
        .returning();
      await db.insert(careTipTanks).values({
        tipId: tip!.id,
        tankId: tankA.id,
        deliveredAt: new Date(),
        sentBy: people.technician.id,
      });
      await db.insert(careTipReaders).values({ tipId: tip!.id, tankId: tankA.id, userId: people.ownerA.id });
      return tip!.id;
    },
  } satisfies Record<string, () => Promise<string>>;
  type ParamName = keyof typeof freshObject;

  const shared = {} as Record<ParamName, string>;
  for (const name of Object.keys(freshObject) as ParamName[]) shared[name] = await freshObject[name]();
  await insertReadings(db, tankA, [
    { parameter: 'temperature', value: 25.4, measuredAt: new Date(Date.now() - 3_600_000), source: 'visit' },
  ]);
  // Tank A's conversation, with a technician's message its owner can mark read.
  const [conversation] = await db
    .insert(conversations)
    .values({ companyId: company.id, tankId: tankA.id, lastActivityAt: new Date(), lastPublicAt: new Date() })
    .returning();
  const [message] = await db
    .insert(conversationMessages)
    .values({
      conversationId: conversation!.id,
      companyId: company.id,
      tankId: tankA.id,
      kind: 'message',
      side: 'staff',
      authorId: people.technician.id,
      authorName: people.technician.name,
      body: 'Topped up the reservoir; the float switch is fine.',
    })
    .returning();

  /**
   * The route's path with tank A's objects in it. A route that may use its object up (anything
   * but GET) gets new ones, so the callers it is tried with do not depend on one another.
   * `routeKey` picks an object in the state the route acts on (a draft invoice to edit or issue).
   */
  const fillPath = async (path: string, mode: 'shared' | 'fresh' = 'shared', routeKey?: string) => {
    let filled = path;
    for (const [match, param] of path.matchAll(/:(\w+)/g)) {
      const name =
        param === 'invoiceId' && routeKey && draftInvoiceRoutes.has(routeKey) ? 'draftInvoiceId' : param;
      let value: string;
      if (name === 'tankId') value = tankA.id;
      else if (name! in freshObject) {
        value = mode === 'fresh' ? await freshObject[name as ParamName]() : shared[name as ParamName];
      } else {
        throw new Error(
          `No value for ${match} in ${path}: add a maker for it to tests/api/nets/net-world.ts`,
        );
      }
      filled = filled.replace(match, value);
    }
    return filled;
  };

  const headersFor = async (who: Principal, options: CallOptions, url: string): Promise<Headers> => {
    const headers = new Headers(stack.sameOrigin);
    if (options.rawJson !== undefined || (options.body !== undefined && !options.form)) {
      headers.set('content-type', 'application/json');
    }
    if (who === 'device') headers.set('authorization', `Bearer ${deviceToken}`);
    if (who === 'deactivated') await restoreDeactivatedSession();
    if (who !== 'anonymous' && who !== 'device') {
      let browser = browsers[who];
      if (options.throwawaySession && who !== 'deactivated') {
        browser = new HttpBrowser();
        await signIn(stack, browser, people[who]);
      }
      const cookie = browser.cookieHeader(url);
      if (cookie) headers.set('cookie', cookie);
    }
    return headers;
  };

  /** One request as `who`, with the headers the app's pages send on a state change. */
  const call = async (who: Principal, method: string, path: string, options: CallOptions = {}) => {
    const url = `${stack.origin}${path}${options.query ? `?${options.query}` : ''}`;
    const headers = await headersFor(who, options, url);
    const body =
      options.form ??
      options.rawJson ??
      (options.body !== undefined ? JSON.stringify(options.body) : undefined);
    const abort = new AbortController();
    const response = await fetch(url, { method, headers, body, redirect: 'manual', signal: abort.signal });
    const contentType = response.headers.get('content-type') ?? '';
    if (options.stream) {
      abort.abort();
      return { status: response.status, contentType, json: undefined, text: '' } satisfies Answer;
    }
    const text = await response.text();
    let json: unknown;
    if (contentType.includes('application/json')) {
      try {
        json = JSON.parse(text);
      } catch {
        json = undefined;
      }
    }
    return { status: response.status, contentType, json, text } satisfies Answer;
  };

  /** A digest of every row of every table but the bookkeeping ones, per table. */
  const fingerprint = async (): Promise<Record<string, string>> => {
    const tables = await stack.database.pool.query<{ name: string }>(
      `select table_name as name from information_schema.tables
       where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name`,
    );
    const watched = tables.rows.map((t) => t.name).filter((name) => !bookkeepingTables.has(name));
    const query = watched
      .map(
        (name) =>
          `select '${name}' as name, md5(coalesce(string_agg(t::text, '|' order by t::text), '')) as digest from "${name}" t`,
      )
      .join(' union all ');
    const { rows } = await stack.database.pool.query<{ name: string; digest: string }>(query);
    return Object.fromEntries(rows.map((row) => [row.name, row.digest]));
  };

  /** The tables whose rows differ between two fingerprints. */
  const changedTables = (before: Record<string, string>, after: Record<string, string>) =>
    [...new Set([...Object.keys(before), ...Object.keys(after)])].filter(
      (name) => before[name] !== after[name],
    );

  /** A new device token for tank A: ingest allows a device 20 requests a minute. */
  const rotateDeviceToken = async () => {
    deviceToken = (await addDevice(`Probe ${unique()}`)).token;
  };

  const photoForm = (fields: Record<string, string> = {}, bytes: Buffer = png) => {
    const form = new FormData();
    for (const [name, value] of Object.entries(fields)) form.append(name, value);
    form.append('photo', new Blob([new Uint8Array(bytes)], { type: 'image/png' }), 'tank.png');
    return form;
  };

  return {
    stack,
    company,
    otherCompany,
    people,
    tankA,
    tankB,
    otherTank,
    shared,
    /** A message of tank A's conversation, from its technician. */
    messageId: message!.id,
    png,
    fillPath,
    call,
    fingerprint,
    changedTables,
    rotateDeviceToken,
    photoForm,
    close: () => stack.close(),
  };
}

/** Routes that act on a draft invoice: their `:invoiceId` names a draft of tank A instead of an issued invoice. */
const draftInvoiceRoutes = new Set([
  'PUT /api/invoices/:invoiceId',
  'DELETE /api/invoices/:invoiceId',
  'POST /api/invoices/:invoiceId/issue',
]);

const minutesAgo = (n: number) => new Date(Date.now() - n * 60_000).toISOString();
const daysAhead = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

export interface ValidRequest {
  body?: unknown;
  form?: FormData;
  query?: string;
}

/**
 * A small valid request per route that needs one, so an answer reflects authorization, not
 * validation. Functions, because some must be unique per call (names, e-mail addresses).
 */
export const validRequests: Record<string, (world: NetWorld) => ValidRequest> = {
  'GET /api/tanks/:tankId/readings': () => ({
    query: `parameter=temperature&from=${encodeURIComponent(minutesAgo(7 * 24 * 60))}&to=${encodeURIComponent(minutesAgo(0))}`,
  }),
  'POST /api/tanks': () => ({
    body: {
      name: `Lobby reef ${unique()}`,
      style: 'mixed-reef',
      displayVolume: { value: 300, unit: 'litres' },
    },
  }),
  'PATCH /api/tanks/:tankId': () => ({ body: { notes: 'Skimmer cup emptied.' } }),
  'POST /api/tanks/:tankId/equipment': () => ({ body: { kind: 'heater', description: 'Spare heater' } }),
  'PATCH /api/tanks/:tankId/equipment/:equipmentId': () => ({ body: { notes: 'Checked the seal.' } }),
  'POST /api/tanks/:tankId/livestock': () => ({
    body: { speciesId: 'trochus-snail', acknowledgeWarnings: true },
  }),
  'PATCH /api/tanks/:tankId/livestock/:livestockId': () => ({ body: { nickname: 'Slowpoke' } }),
  'POST /api/tanks/:tankId/photos': (world) => ({ form: world.photoForm({ caption: 'Front view' }) }),
  'POST /api/tanks/:tankId/readings': () => ({
    body: { readings: [{ parameter: 'temperature', value: 25.6, unit: '°C', measuredAt: minutesAgo(30) }] },
  }),
  'POST /api/tanks/:tankId/readings/import': () => ({
    body: {
      readings: [
        {
          parameter: 'temperature',
          value: 25.1,
          unit: '°C',
          measuredAt: minutesAgo(90),
          source: 'home-test',
        },
      ],
    },
  }),
  'PUT /api/tanks/:tankId/limits': () => ({ body: {} }),
  'POST /api/tanks/:tankId/devices': () => ({ body: { name: 'Return probe' } }),
  'POST /api/species': () => ({
    body: {
      commonName: `Test snail ${unique()}`,
      scientificName: `Testus ${unique().replace(/\d/g, 'x')}`,
      profile: {
        waterTypes: ['marine'],
        group: 'snail',
        ranges: {},
        behaviour: {},
        careNotes: 'Grazes algae on the glass.',
      },
    },
  }),
  'PATCH /api/staff/:userId': () => ({ body: { role: 'admin' } }),
  'POST /api/invitations': () => ({ body: { role: 'technician', email: `new-${unique()}@example.test` } }),
  'POST /api/alerts/:alertId/acknowledge': () => ({ body: {} }),
  'POST /api/alerts/:alertId/resolve': () => ({ body: { note: 'Replaced the heater.' } }),
  'POST /api/notifications/read': () => ({ body: {} }),
  'PUT /api/notifications/preferences': () => ({ body: defaultNotificationPreferences }),
  'POST /api/push/subscriptions': () => ({
    body: {
      endpoint: `https://push.example.test/send/${unique()}`,
      keys: { p256dh: 'B'.repeat(87), auth: 'a'.repeat(22) },
    },
  }),
  'DELETE /api/push/subscriptions': () => ({ body: { endpoint: 'https://push.example.test/send/none' } }),
  'POST /api/on-call': (world) => ({
    body: {
      userId: world.people.technician.id,
      startsAt: new Date(Date.now() + 3 * 86_400_000).toISOString(),
      endsAt: new Date(Date.now() + 4 * 86_400_000).toISOString(),
    },
  }),
  'GET /api/visits': () => ({ query: `from=${daysAhead(0)}&to=${daysAhead(7)}` }),
  'POST /api/visits': (world) => ({
    body: {
      tankId: world.tankA.id,
      kind: 'urgent',
      date: daysAhead(1),
      startTime: '09:00',
      endTime: '10:00',
    },
  }),
  'PATCH /api/visits/:visitId': () => ({ body: { note: 'Bring the spare heater.' } }),
  'PUT /api/visits/:visitId/report': () => ({
    body: {
      version: 3,
      content: {
        arrivedAt: minutesAgo(180),
        notes: 'Cleaned the glass, the overflow, the sump and the pumps.',
      },
    },
  }),
  'POST /api/visits/:visitId/publish': () => ({ body: { version: 3 } }),
  'POST /api/care-tips': () => ({
    body: {
      title: `Drip loops ${unique()}`,
      body: 'Keep a drip loop below every socket.',
      category: 'safety',
      audience: { kind: 'all' },
    },
  }),
  'POST /api/care-tips/audience-count': () => ({
    body: { audience: { kind: 'style', style: 'mixed-reef' } },
  }),
  'PATCH /api/care-tips/:tipId': () => ({ body: { title: 'Top up with fresh water, never salt water' } }),
  'POST /api/care-tips/:tipId/send': () => ({ body: { at: null } }),
  'POST /api/care-tips/:tipId/send-to-tank': (world) => ({ body: { tankId: world.tankA.id } }),
  'POST /api/tanks/:tankId/conversation/messages': () => ({ body: { body: 'The skimmer is quiet again.' } }),
  'POST /api/tanks/:tankId/conversation/read': (world) => ({ body: { messageId: world.messageId } }),
  'POST /api/tanks/:tankId/conversation/photos': (world) => ({ form: world.photoForm({ caption: 'Leak' }) }),
  'PUT /api/urgent-settings': () => ({ body: { ackTargetMinutes: 30, firstAid: {} } }),
  'POST /api/tanks/:tankId/urgent-requests': () => ({
    body: {
      category: 'leak',
      description: 'Water on the floor under the cabinet.',
      someoneOnSite: true,
      phone: '+44 20 7946 0958',
      acceptedCallOutFeeCents: null,
    },
  }),
  'POST /api/urgent-requests/:requestId/moves': () => ({
    body: { to: 'acknowledged', eta: new Date(Date.now() + 30 * 60_000).toISOString() },
  }),
  'PUT /api/billing/settings': () => ({
    body: {
      currency: 'GBP',
      taxRate: '20',
      taxLabel: 'VAT',
      pricesIncludeTax: true,
      paymentTermsDays: 14,
      hourlyRate: '60.00',
      callOutFee: null,
      sellerName: 'Net World Aquatics',
      sellerAddress: '1 Test Street',
      sellerTaxId: '',
      invoiceFooter: '',
    },
  }),
  'POST /api/billing/price-items': () => ({
    body: { kind: 'consumable', name: `Carbon ${unique()}`, unit: 'bag', unitPrice: '8.99' },
  }),
  'PUT /api/billing/price-items/:priceItemId': () => ({
    body: { kind: 'consumable', name: `Carbon ${unique()}`, unit: 'bag', unitPrice: '9.49' },
  }),
  'GET /api/invoices/export.csv': () => ({ query: `from=${daysAhead(-30)}&to=${daysAhead(0)}` }),
  'GET /api/payments/export.csv': () => ({ query: `from=${daysAhead(-30)}&to=${daysAhead(0)}` }),
  'POST /api/invoices': (world) => ({ body: { tankId: world.tankA.id } }),
  'PUT /api/invoices/:invoiceId': (world) => ({
    body: {
      version: 1,
      billToUserId: world.people.ownerA.id,
      note: 'Thank you.',
      lines: [
        { kind: 'service', description: 'Routine service', quantity: '1', unit: 'visit', unitPrice: '95.00' },
      ],
    },
  }),
  'POST /api/invoices/:invoiceId/issue': () => ({ body: { version: 1 } }),
  'POST /api/invoices/:invoiceId/void': () => ({ body: { reason: 'Billed twice.' } }),
  'POST /api/invoices/:invoiceId/credit-notes': () => ({
    body: {
      reason: 'Goodwill.',
      lines: [{ kind: 'other', description: 'Goodwill', quantity: '1', unit: '', unitPrice: '1.00' }],
    },
  }),
  'POST /api/invoices/:invoiceId/payments': () => ({
    body: { method: 'bank-transfer', amount: '1.00', receivedOn: daysAhead(0), reference: 'BACS 1' },
  }),
  // Unsigned: the provider signs what it sends, so no caller gets further than the signature.
  'POST /api/payments/webhook': () => ({
    body: {
      id: 'evt_unsigned',
      object: 'event',
      type: 'checkout.session.completed',
      data: { object: { id: 'cs_unsigned', object: 'checkout.session', payment_status: 'paid' } },
    },
  }),
  'POST /api/ingest/readings': () => ({
    body: { readings: [{ parameter: 'temperature', value: 25.3, unit: '°C', measuredAt: minutesAgo(5) }] },
  }),
};
