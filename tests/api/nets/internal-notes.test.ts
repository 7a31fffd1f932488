import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { and, eq, inArray } from 'drizzle-orm';
import webpush from 'web-push';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { maxMessagePage, unreadEmailAfterMinutes, type MessageView } from '@shared/schemas/conversations';
import { defaultNotificationPreferences } from '@shared/schemas/notifications';
import type { PhotoItem } from '@shared/schemas/photos';
import type { UrgentRequestView } from '@shared/schemas/urgent-requests';
import type { RunningPushService } from '../../../api/dev/push-service';
import { conversations, deliveries } from '../../../api/db/schema/index';
import { findActiveActor } from '../../../api/services/actors';
import { checkUnreadEmail } from '../../../api/services/conversation-notify';
import { sendMessage } from '../../../api/services/conversations';
import { deliverEmailJob, deliverPushJob } from '../../../api/services/deliver';
import { signedIn, type ApiSession } from '../../helpers/api-session';
import { minutes } from '../../helpers/clock';
import { createPerson, createTank, type TestPerson } from '../../helpers/factories';
import { startTestPushService } from '../push/push-test-kit';
import { createNetWorld, registeredRoutes, validRequests, type NetWorld } from './net-world';

/**
 * The internal-notes net: staff write internal notes in a tank's conversation that owners never
 * see, in any answer of any endpoint, notification, e-mail or push (shared/schemas/conversations.ts).
 *
 * Tank A's conversation gets, in order: a staff message with a photo, an internal note with a photo,
 * the owner's urgent request (acknowledged, then assigned, which plans a visit), a second internal
 * note linked to that request with a photo of its own, and a staff message linked to the request.
 * The notes and their photo captions carry one marker. Then every GET route the API mounts is
 * requested as tank A's owner, tank B's owner and an owner of another company, with its path
 * parameters filled from the world (the notes' photos among the photo ids), with query variants,
 * following every `next` cursor to the end; no answer may carry the marker, a note's id or a note
 * photo's id, not even inside an opaque token. The same walk as staff must find them all in the
 * thread, so a walk that stops reaching the content fails too.
 */

/** GET routes the walk leaves out, and why. Every other mounted GET route is walked. */
const skipped: Record<string, string> = {
  'GET /api/events':
    'an endless Server-Sent Events stream whose events name only what to refetch (tank, alert, conversation or request id; LiveEventData in api/services/event-stream.ts); that a note\'s event reaches staff only is tested in tests/api/conversations.test.ts ("publish live events to staff only")',
};

/** More than one request per route, where a query changes what is listed or how it is cut. */
const queryVariants: Record<string, (world: NetWorld, marker: string) => string[]> = {
  'GET /api/tanks': (_world, marker) => ['', `q=${encodeURIComponent(marker)}`],
  'GET /api/species': (_world, marker) => ['', `q=${encodeURIComponent(marker)}`],
  // One line a page walks every cursor of the thread.
  'GET /api/tanks/:tankId/conversation/messages': () => ['', 'limit=1', `limit=${maxMessagePage}`],
  'GET /api/tanks/:tankId/timeline': () => ['', 'limit=1', 'kinds=urgent'],
  'GET /api/tanks/:tankId/readings/list': () => ['', 'limit=1'],
  'GET /api/conversations': () => ['filter=all', 'filter=unanswered', 'filter=unread'],
  'GET /api/urgent-requests': () => ['state=open', 'state=closed'],
  'GET /api/alerts': (world) => ['', 'status=all', `tankId=${world.tankA.id}`],
  'GET /api/care-tips/feed': (world) => ['', `tankId=${world.tankA.id}`],
  'GET /api/visits': (world) => {
    const base = validRequests['GET /api/visits']!(world).query!;
    return [base, `${base}&tankId=${world.tankA.id}`];
  },
};

/** A paged answer is followed this far at most; a thread of a few lines ends long before. */
const maxPages = 200;

const getRoutes = registeredRoutes().filter(
  (route) => route.method === 'GET' && route.path.startsWith('/api/'),
);

interface Seen {
  route: string;
  url: string;
  status: number;
  text: string;
  json: unknown;
}

/** Base64url decodings of every token-like string in an answer: an opaque cursor cannot hide an id. */
function decodedTokens(value: unknown): string[] {
  if (typeof value === 'string') {
    return /^[A-Za-z0-9_-]{16,}$/.test(value) ? [Buffer.from(value, 'base64url').toString('utf8')] : [];
  }
  if (Array.isArray(value)) return value.flatMap(decodedTokens);
  if (value !== null && typeof value === 'object') return Object.values(value).flatMap(decodedTokens);
  return [];
}

function withQuery(url: string, name: string, value: string): string {
  const parsed = new URL(url, 'http://walk.invalid');
  parsed.searchParams.set(name, value);
  return `${parsed.pathname}${parsed.search}`;
}

/** Answers a signed-in walk may give: what was shown, or a refusal (403) or "no such thing" (404). */
const reached = (status: number) => status < 400 || status === 403 || status === 404;

describe('internal notes net: no owner gets a note from any GET route, notification, e-mail or push', () => {
  let world: NetWorld;
  let push: RunningPushService;
  let pushDir: string;
  const marker = `NOTE-MARKER-${randomUUID()}`;
  /** What must never reach an owner, by what it is (for the failure message). */
  const needles: Record<string, string> = { 'the note marker': marker };
  let viewers: Record<'ownerA' | 'ownerB' | 'otherCompanyOwner' | 'technician', ApiSession>;
  const calendarTokens = {} as Record<keyof typeof viewers, string>;
  let otherCompanyOwner: TestPerson;
  let candidates: Record<string, string[]>;
  let notePhotoIds: string[];
  let publicPhotoId: string;
  let before: MessageView;
  let after: MessageView;

  beforeAll(async () => {
    // The real push stand-in without the job queue: each delivery is sent by the test itself.
    push = await startTestPushService();
    pushDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-notes-net-'));
    const caFile = path.join(pushDir, 'push-ca.pem');
    writeFileSync(caFile, push.caCertPem);
    const vapid = webpush.generateVAPIDKeys();
    world = await createNetWorld({
      env: {
        VAPID_PUBLIC_KEY: vapid.publicKey,
        VAPID_PRIVATE_KEY: vapid.privateKey,
        PUSH_TRUSTED_CA_FILE: caFile,
      },
    });
    const { stack, people, tankA } = world;
    const { db } = stack.database;
    otherCompanyOwner = await createPerson(db, {
      companyId: world.otherCompany.id,
      role: 'owner',
      issuer: stack.idp.issuer,
      name: 'Owner elsewhere',
    });
    await createTank(db, {
      companyId: world.otherCompany.id,
      name: 'Reef elsewhere',
      owners: [otherCompanyOwner],
    });
    viewers = {
      ownerA: await signedIn(stack, people.ownerA),
      ownerB: await signedIn(stack, people.ownerB),
      otherCompanyOwner: await signedIn(stack, otherCompanyOwner),
      technician: await signedIn(stack, people.technician),
    };
    const admin = await signedIn(stack, people.admin);
    const { ownerA, technician } = viewers;
    const ok = <T>(answer: { status: number; body: T }, status: number): T => {
      expect(answer.status, JSON.stringify(answer.body)).toBe(status);
      return answer.body;
    };

    // Tank A's owner hears of messages and urgent updates on every channel, at any hour.
    ok(
      await ownerA.put('/api/notifications/preferences', {
        ...defaultNotificationPreferences,
        quietHours: null,
      }),
      200,
    );
    const subscription = await push.createSubscription();
    ok(
      await ownerA.post('/api/push/subscriptions', {
        endpoint: subscription.endpoint,
        keys: subscription.keys,
      }),
      201,
    );

    const conversationPath = `/api/tanks/${tankA.id}/conversation`;
    const photo = async (caption: string) =>
      ok(await technician.upload<PhotoItem>(`${conversationPath}/photos`, world.photoForm({ caption })), 201)
        .id;

    publicPhotoId = await photo('Skimmer cup after cleaning');
    before = ok(
      await technician.post<MessageView>(`${conversationPath}/messages`, {
        body: 'Cleaned the skimmer cup; the foam looks right again.',
        photoIds: [publicPhotoId],
      }),
      201,
    );
    const firstNotePhoto = await photo(`${marker} leak under the sump`);
    const note = ok(
      await technician.post<MessageView>(`${conversationPath}/messages`, {
        body: `${marker} The owner mentioned a loan on the cabinet; do not bring up the quote yet.`,
        photoIds: [firstNotePhoto],
        internal: true,
      }),
      201,
    );

    const request = ok(
      await ownerA.post<UrgentRequestView>(
        `/api/tanks/${tankA.id}/urgent-requests`,
        validRequests['POST /api/tanks/:tankId/urgent-requests']!(world).body,
      ),
      201,
    );
    ok(
      await admin.post(`/api/urgent-requests/${request.id}/moves`, {
        to: 'acknowledged',
        eta: new Date(Date.now() + 30 * 60_000).toISOString(),
      }),
      200,
    );
    const assigned = ok(
      await admin.post<UrgentRequestView>(`/api/urgent-requests/${request.id}/moves`, {
        to: 'assigned',
        technicianId: people.technician.id,
      }),
      200,
    );
    expect(assigned.visitId).not.toBeNull();

    // The message route takes no request link; the urgent request screens' lines come through the service.
    const technicianActor = (await findActiveActor(db, people.technician.id))!;
    const linkedNotePhoto = await photo(`${marker} wet power strip`);
    const linkedNote = await sendMessage(
      stack.deps,
      technicianActor,
      tankA.id,
      {
        body: `${marker} Leak is from the owner's own plumbing change; bill it.`,
        photoIds: [linkedNotePhoto],
        internal: true,
      },
      { urgentRequestId: request.id },
    );
    expect(linkedNote.message).toMatchObject({ kind: 'internal-note', urgentRequestId: request.id });
    after = (
      await sendMessage(
        stack.deps,
        technicianActor,
        tankA.id,
        { body: 'On my way with a spare return pump.', photoIds: [], internal: false },
        { urgentRequestId: request.id },
      )
    ).message;

    notePhotoIds = [firstNotePhoto, linkedNotePhoto];
    for (const id of [note.id, linkedNote.message.id]) needles[`internal note ${id}`] = id;
    for (const id of notePhotoIds) needles[`note photo ${id}`] = id;

    for (const [who, session] of Object.entries(viewers) as [keyof typeof viewers, ApiSession][]) {
      const feed = ok(await session.post<{ url: string }>('/api/me/calendar-feed'), 201);
      calendarTokens[who] = /\/api\/calendar\/([\w-]+)\.ics$/.exec(feed.url)![1]!;
    }
    candidates = {
      photoId: [...notePhotoIds, publicPhotoId, world.shared.photoId],
      requestId: [request.id, world.shared.requestId],
      visitId: [assigned.visitId!, world.shared.visitId],
    };
  });

  afterAll(async () => {
    await world?.close();
    await push?.close();
    if (pushDir) rmSync(pushDir, { recursive: true, force: true });
  });

  const needlesIn = (...texts: string[]) => {
    const haystack = texts.join('\n').toLowerCase();
    return Object.entries(needles)
      .filter(([, needle]) => haystack.includes(needle.toLowerCase()))
      .map(([name]) => name);
  };

  /** The route's path once per combination of candidate values (the world's own objects otherwise). */
  async function pathsFor(routePath: string, who: keyof typeof viewers): Promise<string[]> {
    let paths = [routePath];
    for (const [name, values] of Object.entries({ ...candidates, token: [calendarTokens[who]] })) {
      const param = new RegExp(`:${name}(?!\\w)`);
      if (!param.test(routePath)) continue;
      paths = paths.flatMap((filled) => values.map((value) => filled.replace(param, value)));
    }
    return Promise.all(paths.map((filled) => world.fillPath(filled)));
  }

  /** Every walked GET route as `who`: each path and query variant, each page to the end. */
  async function walk(who: keyof typeof viewers): Promise<{ seen: Seen[]; problems: string[] }> {
    const session = viewers[who];
    const seen: Seen[] = [];
    const problems: string[] = [];
    for (const route of getRoutes) {
      if (route.key in skipped) continue;
      const queries = queryVariants[route.key]?.(world, marker) ?? [
        validRequests[route.key]?.(world).query ?? '',
      ];
      for (const filled of await pathsFor(route.path, who)) {
        for (const query of queries) {
          const first = query ? `${filled}?${query}` : filled;
          const cursors = new Set<string>();
          let url: string | null = first;
          while (url !== null) {
            const answer = await session.get(url);
            const text = answer.bytes.toString('utf8');
            seen.push({ route: route.key, url, status: answer.status, text, json: answer.body });
            if (!reached(answer.status)) {
              problems.push(`${route.key}: GET ${url} answered ${answer.status} ${text.slice(0, 300)}`);
            }
            const next = (answer.body as { next?: unknown } | undefined)?.next;
            if (typeof next !== 'string' || cursors.has(next)) break;
            cursors.add(next);
            if (cursors.size > maxPages) {
              problems.push(`${route.key}: GET ${first} still had a next page after ${maxPages} pages`);
              break;
            }
            url = withQuery(first, 'before', next);
          }
        }
      }
    }
    return { seen, problems };
  }

  const leaksIn = (seen: Seen[]) =>
    seen.flatMap((answer) => {
      const found = needlesIn(answer.text, ...decodedTokens(answer.json));
      return found.length === 0
        ? []
        : [`${answer.route}: GET ${answer.url} answered ${answer.status} with ${found.join(', ')}`];
    });

  it('walks every GET route the API mounts, or says here why not', () => {
    const keys = getRoutes.map((route) => route.key);
    const stale = Object.keys(skipped).filter((key) => !keys.includes(key));
    expect(stale, `skipped routes that are no longer mounted: ${stale.join(', ')}`).toEqual([]);
    const unknownVariants = Object.keys(queryVariants).filter((key) => !keys.includes(key));
    expect(
      unknownVariants,
      `query variants for routes that are not mounted: ${unknownVariants.join(', ')}`,
    ).toEqual([]);
    // Routes under apiRouters and sessionlessRouters, walked from the same lists the app mounts.
    expect(keys).toContain('GET /api/tanks/:tankId/conversation/messages');
    expect(keys).toContain('GET /api/urgent-requests/:requestId');
  });

  it("e-mails and pushes tank A's owner about the messages around the notes, never a note", async () => {
    const { stack, people } = world;
    const { db } = stack.database;
    const owners = [people.ownerA, people.ownerB, otherCompanyOwner];
    const [conversation] = await db
      .select()
      .from(conversations)
      .where(eq(conversations.tankId, world.tankA.id));
    stack.clock.advance(minutes(unreadEmailAfterMinutes + 1));
    const outcomes = [];
    try {
      for (const owner of owners) {
        outcomes.push(
          await checkUnreadEmail(stack.deps, { conversationId: conversation!.id, userId: owner.id }),
        );
      }
    } finally {
      stack.clock.reset();
    }
    expect(outcomes).toEqual([
      expect.objectContaining({ outcome: 'emailed', newestMessageId: after.id }),
      { outcome: 'nothing-unread' },
      { outcome: 'nothing-unread' },
    ]);

    const pending = await db
      .select()
      .from(deliveries)
      .where(
        and(
          inArray(
            deliveries.userId,
            owners.map((owner) => owner.id),
          ),
          eq(deliveries.status, 'pending'),
        ),
      );
    for (const delivery of pending) {
      if (delivery.channel === 'email') await deliverEmailJob(stack.deps, delivery.id);
      else await deliverPushJob(stack.deps, delivery.id);
    }
    const mails = stack.mail
      .messages()
      .filter((mail) => owners.some((owner) => mail.to.includes(owner.email)));
    const pushes = push.received();

    // The net reaches them: the unread e-mail lists both messages the notes sit between, and the
    // message pushes and the urgent request's e-mails and pushes went out.
    expect(mails.some((mail) => mail.text.includes(before.body) && mail.text.includes(after.body))).toBe(
      true,
    );
    expect(mails.some((mail) => mail.headers['x-brinewatch-urgent'] !== undefined)).toBe(true);
    expect(pushes.filter((received) => received.status === 201).length).toBeGreaterThanOrEqual(3);
    expect(pushes.some((received) => JSON.stringify(received.payload).includes(after.body))).toBe(true);

    const leaks = [
      ...mails.flatMap((mail) => {
        const found = needlesIn(mail.subject, mail.text, mail.html ?? '', JSON.stringify(mail.headers));
        return found.length > 0
          ? [`e-mail "${mail.subject}" to ${mail.to.join(', ')} carries ${found.join(', ')}`]
          : [];
      }),
      ...pushes.flatMap((received) => {
        const found = needlesIn(JSON.stringify(received.payload));
        return found.length > 0
          ? [`push ${JSON.stringify(received.payload)} carries ${found.join(', ')}`]
          : [];
      }),
    ];
    expect(leaks, `internal notes reached an owner:\n${leaks.join('\n')}`).toEqual([]);
  });

  it("answers 404 to every owner for a note's photo, while they see the message's photo and staff see both", async () => {
    const statuses = async (session: ApiSession, photoId: string) => [
      (await session.get(`/api/photos/${photoId}`)).status,
      (await session.get(`/api/photos/${photoId}/thumbnail`)).status,
    ];
    for (const photoId of notePhotoIds) {
      for (const who of ['ownerA', 'ownerB', 'otherCompanyOwner'] as const) {
        expect(await statuses(viewers[who], photoId), `${who} opening note photo ${photoId}`).toEqual([
          404, 404,
        ]);
      }
      expect(await statuses(viewers.technician, photoId)).toEqual([200, 200]);
    }
    expect(await statuses(viewers.ownerA, publicPhotoId)).toEqual([200, 200]);
  });

  it("refuses to put a note's photo on a message or an urgent request owners read", async () => {
    const { technician, ownerA } = viewers;
    const { tankA } = world;
    const validRequest = validRequests['POST /api/tanks/:tankId/urgent-requests']!(world).body as object;
    for (const photoId of notePhotoIds) {
      const message = await technician.post(`/api/tanks/${tankA.id}/conversation/messages`, {
        body: 'Here is the photo again.',
        photoIds: [photoId],
      });
      expect(message.status, JSON.stringify(message.body)).toBe(400);
      const request = await technician.post(`/api/tanks/${tankA.id}/urgent-requests`, {
        ...validRequest,
        photoIds: [photoId],
      });
      expect(request.status, JSON.stringify(request.body)).toBe(400);
      expect((await ownerA.get(`/api/photos/${photoId}`)).status).toBe(404);
    }
  });

  for (const who of ['ownerA', 'ownerB', 'otherCompanyOwner'] as const) {
    it(`gives ${who} no note, note id or note photo id from any GET route`, async () => {
      const { seen, problems } = await walk(who);
      expect(problems, `the walk did not reach these answers as ${who}:\n${problems.join('\n')}`).toEqual([]);
      const leaks = leaksIn(seen);
      expect(leaks, `internal notes leaked to ${who}:\n${leaks.join('\n')}`).toEqual([]);
      if (who === 'ownerA') {
        // The owner's walk reached the thread: the messages around the notes are there.
        const thread = seen.filter(
          (answer) => answer.route === 'GET /api/tanks/:tankId/conversation/messages',
        );
        expect(
          thread.some((answer) => answer.text.includes(before.id) && answer.text.includes(after.id)),
        ).toBe(true);
      }
    });
  }

  it('finds every note, its id and its photos when the same walk runs as staff (the net can catch)', async () => {
    const { seen, problems } = await walk('technician');
    expect(problems, `the walk did not reach these answers as staff:\n${problems.join('\n')}`).toEqual([]);
    const inThread = new Set(
      seen
        .filter((answer) => answer.route === 'GET /api/tanks/:tankId/conversation/messages')
        .flatMap((answer) => needlesIn(answer.text)),
    );
    expect([...inThread].sort()).toEqual(Object.keys(needles).sort());
    expect(leaksIn(seen).length).toBeGreaterThan(0);
  });
});
