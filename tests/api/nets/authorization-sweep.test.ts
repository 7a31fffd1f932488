import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createNetWorld,
  principals,
  registeredRoutes,
  validRequests,
  type NetWorld,
  type Principal,
} from './net-world';

/**
 * The authorization net (OWASP ASVS 5.0 V8, access control): every registered route, tried by
 * every kind of caller, must answer exactly what this one table says. A route added without a
 * row fails here, so its access rule is decided on purpose, not inherited by accident.
 *
 * Path parameters name tank A's objects (made by factories). A call that may use its object up
 * (anything but GET) gets a new one, so callers do not depend on one another's order. Bodies are
 * small valid ones (`validRequests`), so a status speaks of authorization, not validation. Any
 * write answered 4xx must leave every table as it was.
 *
 * Special routes: `GET /api/events` streams for ever, so only its status is read before hanging
 * up; `POST /auth/logout` ends the session it is called with, so signed-in callers use a second
 * session of the same person (the deactivated admin's session is put back before every call anyway).
 */

type Row = Record<Principal, number>;
type SignedInAnswers = Pick<Row, 'ownerA' | 'ownerB' | 'technician' | 'admin' | 'otherAdmin'>;

/** A session route: nobody without a live session gets past the policy. */
const signedIn = (answers: SignedInAnswers): Row => ({
  anonymous: 401,
  device: 401,
  deactivated: 401,
  ...answers,
});

/** Tank A's objects: its owner and company 1's staff see them; owner B and company 2 get 404. */
const tankARead = signedIn({ ownerA: 200, ownerB: 404, technician: 200, admin: 200, otherAdmin: 404 });
/** A staff-only change to tank A: owners are refused by role (403) before the object is looked up. */
const tankAStaffWrite = (status: number) =>
  signedIn({ ownerA: 403, ownerB: 403, technician: status, admin: status, otherAdmin: 404 });
const everyoneSignedIn = (status: number) =>
  signedIn({ ownerA: status, ownerB: status, technician: status, admin: status, otherAdmin: status });
const staffOnly = (status: number) =>
  signedIn({ ownerA: 403, ownerB: 403, technician: status, admin: status, otherAdmin: status });
const adminsOnly = (status: number) =>
  signedIn({ ownerA: 403, ownerB: 403, technician: 403, admin: status, otherAdmin: status });
const public_ = (status: number): Row => Object.fromEntries(principals.map((who) => [who, status])) as Row;
/** A company-1 object only its admins change: owners and technicians refused by role, company 2 finds nothing. */
const companyAdminWrite = (status: number) =>
  signedIn({ ownerA: 403, ownerB: 403, technician: 403, admin: status, otherAdmin: 404 });

const expected: Record<string, Row> = {
  'GET /api/health': public_(200),
  'POST /api/ingest/readings': { ...public_(401), device: 200 },

  'GET /api/me': everyoneSignedIn(200),
  'GET /api/me/access': public_(200),
  'GET /api/me/calendar-feed': everyoneSignedIn(200),
  'POST /api/me/calendar-feed': everyoneSignedIn(201),
  'DELETE /api/me/calendar-feed': everyoneSignedIn(204),
  // The secret in the address is the credential: a token nobody was given is a 404 to anyone.
  'GET /api/calendar/:token.ics': public_(404),

  'GET /api/tanks': everyoneSignedIn(200),
  'POST /api/tanks': staffOnly(201),
  'GET /api/tanks/overview': staffOnly(200),
  'GET /api/tanks/technicians': staffOnly(200),
  'GET /api/tanks/choices': everyoneSignedIn(200),
  'GET /api/tanks/:tankId': tankARead,
  'PATCH /api/tanks/:tankId': tankAStaffWrite(200),
  'GET /api/tanks/:tankId/comfort-range': tankARead,

  'GET /api/tanks/:tankId/equipment': tankARead,
  'POST /api/tanks/:tankId/equipment': tankAStaffWrite(201),
  'GET /api/tanks/:tankId/equipment/:equipmentId': tankARead,
  'PATCH /api/tanks/:tankId/equipment/:equipmentId': tankAStaffWrite(200),
  'DELETE /api/tanks/:tankId/equipment/:equipmentId': tankAStaffWrite(204),

  'GET /api/tanks/:tankId/livestock': tankARead,
  'POST /api/tanks/:tankId/livestock': tankAStaffWrite(201),
  'GET /api/tanks/:tankId/livestock/:livestockId': tankARead,
  'PATCH /api/tanks/:tankId/livestock/:livestockId': tankAStaffWrite(200),
  'DELETE /api/tanks/:tankId/livestock/:livestockId': tankAStaffWrite(204),

  'GET /api/tanks/:tankId/photos': tankARead,
  'POST /api/tanks/:tankId/photos': tankAStaffWrite(201),

  'GET /api/tanks/:tankId/readings': tankARead,
  // Owners record home tests on their own tanks.
  'POST /api/tanks/:tankId/readings': signedIn({
    ownerA: 201,
    ownerB: 404,
    technician: 201,
    admin: 201,
    otherAdmin: 404,
  }),
  'GET /api/tanks/:tankId/readings/latest': tankARead,
  'GET /api/tanks/:tankId/readings/list': tankARead,
  'GET /api/tanks/:tankId/readings/export': tankARead,
  'POST /api/tanks/:tankId/readings/import': signedIn({
    ownerA: 201,
    ownerB: 404,
    technician: 201,
    admin: 201,
    otherAdmin: 404,
  }),

  'GET /api/tanks/:tankId/limits': tankARead,
  'PUT /api/tanks/:tankId/limits': tankAStaffWrite(200),

  'GET /api/tanks/:tankId/devices': tankAStaffWrite(200),
  'POST /api/tanks/:tankId/devices': tankAStaffWrite(201),
  'DELETE /api/tanks/:tankId/devices/:deviceId': tankAStaffWrite(200),

  'GET /api/tanks/:tankId/visits': tankARead,
  'GET /api/tanks/:tankId/timeline': tankARead,
  // Staff plan and write visits; another company's admin sees an empty schedule of their own.
  'GET /api/visits': staffOnly(200),
  'POST /api/visits': tankAStaffWrite(201),
  'GET /api/visits/:visitId': tankARead,
  'PATCH /api/visits/:visitId': tankAStaffWrite(200),
  'PUT /api/visits/:visitId/report': tankAStaffWrite(200),
  'POST /api/visits/:visitId/publish': tankAStaffWrite(200),
  'GET /api/visits/:visitId/versions/:version': tankARead,

  // Staff write and send tips; another company's admin works on their own (an empty list, their
  // own drafts) and gets 404 for ours. Owners read tips in the feed and mark those their tank got.
  'GET /api/care-tips': staffOnly(200),
  'POST /api/care-tips': staffOnly(201),
  'GET /api/care-tips/feed': everyoneSignedIn(200),
  'POST /api/care-tips/audience-count': staffOnly(200),
  'GET /api/care-tips/:tipId': tankAStaffWrite(200),
  'PATCH /api/care-tips/:tipId': tankAStaffWrite(200),
  'POST /api/care-tips/:tipId/send': tankAStaffWrite(200),
  'POST /api/care-tips/:tipId/withdraw': tankAStaffWrite(200),
  'GET /api/care-tips/:tipId/reach': tankAStaffWrite(200),
  'POST /api/care-tips/:tipId/send-to-tank': tankAStaffWrite(200),
  'PUT /api/care-tips/:tipId/helpful': signedIn({
    ownerA: 204,
    ownerB: 404,
    technician: 403,
    admin: 403,
    otherAdmin: 404,
  }),
  'DELETE /api/care-tips/:tipId/helpful': signedIn({
    ownerA: 204,
    ownerB: 404,
    technician: 403,
    admin: 403,
    otherAdmin: 404,
  }),
  'GET /api/tanks/:tankId/tip-suggestions': tankAStaffWrite(200),

  // A tank's conversation is its owners' and its company's staff's; the inbox is the staff's.
  'GET /api/tanks/:tankId/conversation': tankARead,
  'GET /api/tanks/:tankId/conversation/messages': tankARead,
  'POST /api/tanks/:tankId/conversation/messages': signedIn({
    ownerA: 201,
    ownerB: 404,
    technician: 201,
    admin: 201,
    otherAdmin: 404,
  }),
  'POST /api/tanks/:tankId/conversation/read': signedIn({
    ownerA: 204,
    ownerB: 404,
    technician: 204,
    admin: 204,
    otherAdmin: 404,
  }),
  // Owners may upload photos here (for a message or an urgent request), though not to the tank's photos.
  'POST /api/tanks/:tankId/conversation/photos': signedIn({
    ownerA: 201,
    ownerB: 404,
    technician: 201,
    admin: 201,
    otherAdmin: 404,
  }),
  'GET /api/conversations': staffOnly(200),
  'GET /api/conversations/unread': everyoneSignedIn(200),

  'GET /api/photos/:photoId': tankARead,
  'GET /api/photos/:photoId/thumbnail': tankARead,
  'DELETE /api/photos/:photoId': tankAStaffWrite(204),

  'GET /api/species': everyoneSignedIn(200),
  'POST /api/species': staffOnly(201),
  'GET /api/species/:speciesId': everyoneSignedIn(200),

  'GET /api/staff': adminsOnly(200),
  'PATCH /api/staff/:userId': signedIn({
    ownerA: 403,
    ownerB: 403,
    technician: 403,
    admin: 200,
    otherAdmin: 404,
  }),
  'GET /api/clients': staffOnly(200),
  'POST /api/users/:userId/deactivate': signedIn({
    ownerA: 403,
    ownerB: 403,
    technician: 403,
    admin: 200,
    otherAdmin: 404,
  }),
  'POST /api/users/:userId/reactivate': signedIn({
    ownerA: 403,
    ownerB: 403,
    technician: 403,
    admin: 200,
    otherAdmin: 404,
  }),

  'GET /api/invitations': adminsOnly(200),
  'POST /api/invitations': adminsOnly(201),
  'DELETE /api/invitations/:invitationId': signedIn({
    ownerA: 403,
    ownerB: 403,
    technician: 403,
    admin: 204,
    otherAdmin: 404,
  }),

  'GET /api/alerts': everyoneSignedIn(200),
  'GET /api/alerts/:alertId': tankARead,
  'POST /api/alerts/:alertId/acknowledge': tankAStaffWrite(200),
  'POST /api/alerts/:alertId/resolve': tankAStaffWrite(200),

  'GET /api/notifications': everyoneSignedIn(200),
  'POST /api/notifications/read': everyoneSignedIn(204),
  'GET /api/notifications/preferences': everyoneSignedIn(200),
  'PUT /api/notifications/preferences': everyoneSignedIn(200),

  'GET /api/push/public-key': everyoneSignedIn(200),
  'POST /api/push/subscriptions': everyoneSignedIn(201),
  'DELETE /api/push/subscriptions': everyoneSignedIn(204),

  'GET /api/events': everyoneSignedIn(200),

  'GET /api/on-call': staffOnly(200),
  // Company 1's technician is, to another company's admin, a field naming nobody: the same 400 as
  // an id that does not exist, so it tells them nothing.
  'POST /api/on-call': signedIn({ ownerA: 403, ownerB: 403, technician: 403, admin: 201, otherAdmin: 400 }),
  'DELETE /api/on-call/:shiftId': signedIn({
    ownerA: 403,
    ownerB: 403,
    technician: 403,
    admin: 204,
    otherAdmin: 404,
  }),
  'GET /api/deliveries/failed': staffOnly(200),

  // Owners ask for urgent visits to their own tanks (staff for any of theirs) and follow them;
  // staff work the board and move requests on; admins set the fee, target and first aid.
  'GET /api/urgent-settings': everyoneSignedIn(200),
  'PUT /api/urgent-settings': adminsOnly(200),
  'GET /api/tanks/:tankId/urgent-requests': tankARead,
  'POST /api/tanks/:tankId/urgent-requests': signedIn({
    ownerA: 201,
    ownerB: 404,
    technician: 201,
    admin: 201,
    otherAdmin: 404,
  }),
  'GET /api/urgent-requests': staffOnly(200),
  'GET /api/urgent-requests/:requestId': tankARead,
  'POST /api/urgent-requests/:requestId/moves': tankAStaffWrite(200),

  // Staff read the price list (consumables on a report); admins set it, each company its own.
  'GET /api/billing/price-list': staffOnly(200),
  'PUT /api/billing/settings': adminsOnly(200),
  'POST /api/billing/price-items': adminsOnly(201),
  'PUT /api/billing/price-items/:priceItemId': companyAdminWrite(200),
  'DELETE /api/billing/price-items/:priceItemId': companyAdminWrite(204),

  // Everyone lists invoices (owners their own tanks' issued ones); admins draft, issue, cancel,
  // credit and record payments; only an owner pays online, and only their own.
  'GET /api/invoices': everyoneSignedIn(200),
  'GET /api/invoices/export.csv': adminsOnly(200),
  'POST /api/invoices': companyAdminWrite(201),
  'GET /api/invoices/:invoiceId': tankARead,
  'GET /api/invoices/:invoiceId/pdf': tankARead,
  'PUT /api/invoices/:invoiceId': companyAdminWrite(200),
  'DELETE /api/invoices/:invoiceId': companyAdminWrite(204),
  'POST /api/invoices/:invoiceId/issue': companyAdminWrite(200),
  'POST /api/invoices/:invoiceId/void': companyAdminWrite(200),
  'POST /api/invoices/:invoiceId/credit-notes': companyAdminWrite(201),
  'POST /api/invoices/:invoiceId/payments': companyAdminWrite(200),
  'POST /api/invoices/:invoiceId/checkout': signedIn({
    ownerA: 200,
    ownerB: 404,
    technician: 403,
    admin: 403,
    otherAdmin: 403,
  }),
  'GET /api/payments/export.csv': adminsOnly(200),
  // The provider's webhook is public, and its signature is the credential: an unsigned event is a 400 to anyone.
  'POST /api/payments/webhook': public_(400),

  'GET /api/audit': adminsOnly(200),
  'GET /api/audit/export': adminsOnly(200),

  // Sign-in is a chain of redirects whoever starts it; a callback without a pending sign-in is refused.
  'GET /auth/login': public_(303),
  'GET /auth/callback': public_(303),
  'POST /auth/logout': public_(200),
  'GET /auth/invitation/:token': public_(303),
};

const streamingRoutes = new Set(['GET /api/events']);
const sessionEndingRoutes = new Set(['POST /auth/logout']);

const routes = registeredRoutes();

describe('authorization sweep: every route × every caller', () => {
  let world: NetWorld;

  beforeAll(async () => {
    world = await createNetWorld();
  });
  afterAll(() => world.close());

  it('has a row in the expected-status table for every registered route, and none for a route that is gone', () => {
    const registered = routes.map((route) => route.key);
    const missing = registered.filter((key) => !(key in expected));
    const stale = Object.keys(expected).filter((key) => !registered.includes(key));
    expect(
      missing,
      `Routes registered without a row in the expected-status table of tests/api/nets/authorization-sweep.test.ts — add one (and a body in validRequests of net-world.ts if the route takes one): ${missing.join(', ')}`,
    ).toEqual([]);
    expect(stale, `Rows for routes no longer registered: ${stale.join(', ')}`).toEqual([]);
  });

  for (const route of routes) {
    it(`${route.key} answers each caller as the table says; a refused write changes nothing`, async () => {
      const row = expected[route.key];
      if (!row) {
        expect.fail(
          `${route.key} is registered but has no row in the expected-status table of tests/api/nets/authorization-sweep.test.ts`,
        );
      }
      const actual = {} as Row;
      const serverErrors: string[] = [];
      const writesOnRefusal: string[] = [];
      const isWrite = route.method !== 'GET';
      for (const who of principals) {
        const path = await world.fillPath(route.path, isWrite ? 'fresh' : 'shared', route.key);
        const request = validRequests[route.key]?.(world) ?? {};
        const before = isWrite ? await world.fingerprint() : null;
        const answer = await world.call(who, route.method, path, {
          ...request,
          stream: streamingRoutes.has(route.key),
          throwawaySession: sessionEndingRoutes.has(route.key),
        });
        actual[who] = answer.status;
        if (answer.status >= 500) serverErrors.push(`${who}: ${answer.status} ${answer.text.slice(0, 300)}`);
        if (before && answer.status >= 400 && answer.status < 500) {
          const changed = world.changedTables(before, await world.fingerprint());
          if (changed.length > 0)
            writesOnRefusal.push(`${who} (${answer.status}) changed ${changed.join(', ')}`);
        }
      }
      expect(actual, serverErrors.join('\n')).toEqual(row);
      expect(writesOnRefusal, 'a refused write must leave every table as it was').toEqual([]);
    });
  }
});
