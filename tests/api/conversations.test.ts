import { and, eq, inArray } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type {
  ConversationSummary,
  MessagePage,
  MessageView,
  UnreadCounts,
} from '@shared/schemas/conversations';
import type { PhotoItem } from '@shared/schemas/photos';
import {
  conversationMessages,
  conversations,
  deliveries,
  messagePhotos,
  notifications,
  pushSubscriptions,
  urgentRequestPhotos,
  urgentRequests,
  users,
  type tanks,
} from '../../api/db/schema/index';
import type { AppEvent } from '../../api/lib/event-bus';
import { findActiveActor, type Actor } from '../../api/services/actors';
import { checkUnreadEmail } from '../../api/services/conversation-notify';
import { sendMessage } from '../../api/services/conversations';
import { deliverEmailJob } from '../../api/services/deliver';
import { minutes } from '../helpers/clock';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { HttpBrowser } from '../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';
import { makeImage } from './photos/test-images';

type Tank = typeof tanks.$inferSelect;
type ErrorBody = { error: { code: string; message: string; issues?: { path: string; message: string }[] } };

const london = 'Europe/London';

describe('conversations', () => {
  let stack: TestStack;
  let companyId: string;
  let otherCompanyId: string;
  let ada: ApiSession;
  let alan: ApiSession;
  let theo: ApiSession;
  let olive: ApiSession;
  let oscar: ApiSession;
  let bruno: ApiSession;
  let otherAdmin: ApiSession;
  let otherTechnician: ApiSession;
  let retiredAdmin: TestPerson;
  let png: Buffer;
  let events: AppEvent[];
  let listener: pg.Client;
  /** Olive's own browser, for requests with headers of their own. */
  let oliveBrowser: HttpBrowser;

  const db = () => stack.database.db;
  const actorOf = async (who: ApiSession | TestPerson) => {
    const actor = await findActiveActor(db(), 'person' in who ? who.person.id : who.id);
    if (!actor) throw new Error('no such active person');
    return actor;
  };

  /** A tank of olive (and oscar), looked after by theo: each test gets its own conversation. */
  const oliveTank = (name = 'Lobby reef') =>
    createTank(db(), {
      companyId,
      name,
      owners: [olive.person, oscar.person],
      assignedTechnicianId: theo.person.id,
    });

  const post = (who: ApiSession, tank: { id: string }, body: unknown) =>
    who.post<MessageView & ErrorBody>(`/api/tanks/${tank.id}/conversation/messages`, body);
  const postAsOliveWithKey = (tank: { id: string }, key: string, body: unknown) =>
    oliveBrowser.visit(`${stack.origin}/api/tanks/${tank.id}/conversation/messages`, {
      method: 'POST',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json', 'idempotency-key': key },
      body: JSON.stringify(body),
    });

  async function sent(who: ApiSession, tank: { id: string }, body: string, internal = false) {
    const res = await post(who, tank, { body, internal });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  }

  const page = (who: ApiSession, tank: { id: string }, query = '') =>
    who.get<MessagePage & ErrorBody>(`/api/tanks/${tank.id}/conversation/messages${query}`);
  const summary = (who: ApiSession, tank: { id: string }) =>
    who.get<ConversationSummary & ErrorBody>(`/api/tanks/${tank.id}/conversation`);
  const unread = async (who: ApiSession) => {
    const res = await who.get<UnreadCounts>('/api/conversations/unread');
    expect(res.status).toBe(200);
    return res.body;
  };
  const markRead = (who: ApiSession, tank: { id: string }, messageId: string) =>
    who.post<ErrorBody>(`/api/tanks/${tank.id}/conversation/read`, { messageId });

  const photoForm = (bytes: Buffer = png) => {
    const form = new FormData();
    form.append('photo', new Blob([new Uint8Array(bytes)], { type: 'image/png' }), 'leak.png');
    return form;
  };
  async function messagePhoto(who: ApiSession, tank: { id: string }) {
    const res = await who.upload<PhotoItem & ErrorBody>(
      `/api/tanks/${tank.id}/conversation/photos`,
      photoForm(),
    );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  }

  const conversationOf = async (tank: { id: string }) => {
    const [row] = await db().select().from(conversations).where(eq(conversations.tankId, tank.id));
    return row!;
  };
  const notificationsOf = async (conversationId: string) =>
    db().select().from(notifications).where(eq(notifications.conversationId, conversationId));
  const deliveriesOf = async (messageIds: string[]) =>
    messageIds.length === 0
      ? []
      : db().select().from(deliveries).where(inArray(deliveries.messageId, messageIds));

  beforeAll(async () => {
    stack = await startTestStack();
    const issuer = stack.idp.issuer;
    companyId = (await createCompany(db(), { timeZone: london })).id;
    otherCompanyId = (await createCompany(db())).id;
    const person = (company: string, role: TestPerson['role'], name: string) =>
      createPerson(db(), { companyId: company, role, issuer, name });
    ada = await signedIn(stack, await person(companyId, 'admin', 'Ada Admin'));
    alan = await signedIn(stack, await person(companyId, 'admin', 'Alan Admin'));
    theo = await signedIn(stack, await person(companyId, 'technician', 'Theo Technician'));
    olive = await signedIn(stack, await person(companyId, 'owner', 'Olive Owner'));
    oscar = await signedIn(stack, await person(companyId, 'owner', 'Oscar Owner'));
    bruno = await signedIn(stack, await person(companyId, 'owner', 'Bruno Owner'));
    otherAdmin = await signedIn(stack, await person(otherCompanyId, 'admin', 'Admin elsewhere'));
    otherTechnician = await signedIn(
      stack,
      await person(otherCompanyId, 'technician', 'Technician elsewhere'),
    );
    retiredAdmin = await person(companyId, 'admin', 'Retired Admin');
    await db().update(users).set({ status: 'deactivated' }).where(eq(users.id, retiredAdmin.id));
    // Every channel for messages and no quiet hours, so what is planned does not depend on the hour.
    for (const who of [ada, alan, theo, olive, oscar, bruno]) {
      const saved = await who.put('/api/notifications/preferences', {
        push: ['critical'],
        email: ['critical'],
        inApp: ['notice', 'warning', 'critical'],
        quietHours: null,
        timeZone: london,
        messages: ['in-app', 'email', 'push'],
      });
      expect(saved.status).toBe(200);
      await db()
        .insert(pushSubscriptions)
        .values({
          userId: who.person.id,
          endpoint: `https://push.example.test/${who.person.id}`,
          p256dh: 'B'.repeat(87),
          auth: 'A'.repeat(22),
        });
    }
    oliveBrowser = new HttpBrowser();
    await signIn(stack, oliveBrowser, olive.person);
    png = await makeImage({ width: 48, height: 32, format: 'png' });
    events = [];
    listener = new pg.Client({ connectionString: stack.database.url });
    await listener.connect();
    listener.on('notification', (message) => {
      if (message.payload) events.push(JSON.parse(message.payload) as AppEvent);
    });
    await listener.query('listen brinewatch_events');
  });
  afterAll(async () => {
    await listener?.end();
    await stack?.close();
  });
  afterEach(() => stack.clock.reset());

  describe('POST /api/tanks/:tankId/conversation/messages', () => {
    it('lets an owner and the technician write to each other, making the conversation with the first message', async () => {
      const tank = await oliveTank();

      const question = await sent(olive, tank, '  The skimmer is gurgling since this morning.  ');
      const answer = await sent(theo, tank, 'Empty the cup and lower the water level by a notch.');

      expect(question).toMatchObject({
        tankId: tank.id,
        kind: 'message',
        body: 'The skimmer is gurgling since this morning.',
        photos: [],
        author: { id: olive.person.id, name: 'Olive Owner', side: 'owner' },
        urgentRequestId: null,
      });
      expect(answer.author).toEqual({ id: theo.person.id, name: 'Theo Technician', side: 'staff' });
      expect(answer.conversationId).toBe(question.conversationId);
      expect(Date.parse(answer.createdAt)).toBeGreaterThan(Date.parse(question.createdAt));
      for (const who of [olive, oscar, theo, ada]) {
        const thread = await page(who, tank);
        expect(thread.status).toBe(200);
        expect(thread.body.messages.map((m) => m.id)).toEqual([question.id, answer.id]);
        expect(thread.body.next).toBeNull();
      }
      const rows = await db().select().from(conversations).where(eq(conversations.tankId, tank.id));
      expect(rows).toHaveLength(1);
    });

    it('stores the words as typed: markup stays text', async () => {
      const tank = await oliveTank();
      const words = '<b>Salt</b> & <script>alert(1)</script> *not bold* [link](javascript:x)';

      const message = await sent(olive, tank, words);

      expect(message.body).toBe(words);
      expect((await page(theo, tank)).body.messages[0]!.body).toBe(words);
    });

    it('refuses an empty, a blank and a too-long message, naming the field, and stores nothing', async () => {
      const tank = await oliveTank();
      for (const body of ['', '   \n\t ', 'x'.repeat(4001)]) {
        const res = await post(olive, tank, { body });
        expect(res.status).toBe(400);
        expect(issuePaths(res.body)).toEqual(['body.body']);
      }
      expect(await db().select().from(conversations).where(eq(conversations.tankId, tank.id))).toEqual([]);
      // Unknown fields are ignored; 4000 characters is the most.
      expect((await post(olive, tank, { body: 'y'.repeat(4000), colour: 'blue' })).status).toBe(201);
    });

    it('refuses an internal note from an owner with 403 and a code saying why', async () => {
      const tank = await oliveTank();

      const res = await post(olive, tank, { body: 'Note to self', internal: true });

      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('internal_notes_staff_only');
      expect(
        await db().select().from(conversationMessages).where(eq(conversationMessages.tankId, tank.id)),
      ).toEqual([]);
    });

    it('stores a retried send with the same Idempotency-Key once, answering the retry with 200 and the same message', async () => {
      const tank = await oliveTank();
      const send = () => postAsOliveWithKey(tank, 'draft-7f3c2a', { body: 'Is the heater on?' });

      const first = await send();
      const retry = await send();

      expect(first.status).toBe(201);
      expect(retry.status).toBe(200);
      const [a, b] = [(await first.json()) as MessageView, (await retry.json()) as MessageView];
      expect(b).toEqual(a);
      const stored = await db()
        .select()
        .from(conversationMessages)
        .where(eq(conversationMessages.tankId, tank.id));
      expect(stored.map((m) => m.clientKey)).toEqual(['draft-7f3c2a']);
    });

    it('refuses an Idempotency-Key with spaces or control characters', async () => {
      const tank = await oliveTank();
      const res = await postAsOliveWithKey(tank, 'two words', { body: 'Hello' });
      expect(res.status).toBe(400);
      expect(issuePaths(await res.json())).toEqual(['headers.idempotency-key']);
    });

    it("answers 404 for another owner's tank, another company's tank and another company's staff, on every tank route", async () => {
      const tank = await oliveTank();
      const message = await sent(theo, tank, 'Visit on Tuesday.');
      const foreign = await createTank(db(), { companyId: otherCompanyId, name: 'Elsewhere' });
      for (const who of [bruno, otherAdmin, otherTechnician]) {
        expect((await post(who, tank, { body: 'Hello?' })).status).toBe(404);
        expect((await page(who, tank)).status).toBe(404);
        expect((await summary(who, tank)).status).toBe(404);
        expect((await markRead(who, tank, message.id)).status).toBe(404);
        expect((await who.upload(`/api/tanks/${tank.id}/conversation/photos`, photoForm())).status).toBe(404);
      }
      expect((await post(olive, foreign, { body: 'Hello?' })).status).toBe(404);
      expect((await post(ada, foreign, { body: 'Hello?' })).status).toBe(404);
      const stored = await db()
        .select()
        .from(conversationMessages)
        .where(eq(conversationMessages.tankId, tank.id));
      expect(stored.map((m) => m.id)).toEqual([message.id]);
    });

    it('refuses the 61st message in a minute with 429 rate_limited', async () => {
      const busy = await signedIn(
        stack,
        await createPerson(db(), { companyId, role: 'owner', issuer: stack.idp.issuer, name: 'Busy Owner' }),
      );
      const tank = await createTank(db(), { companyId, name: 'Busy reef', owners: [busy.person] });
      for (let n = 1; n <= 60; n++) {
        expect((await post(busy, tank, { body: `Message ${n}` })).status).toBe(201);
      }

      const refused = await post(busy, tank, { body: 'Message 61' });

      expect(refused.status).toBe(429);
      expect(refused.body.error.code).toBe('rate_limited');
      expect(refused.body.error.message).toContain('60 messages in a minute');
      expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
      const stored = await db()
        .select()
        .from(conversationMessages)
        .where(eq(conversationMessages.tankId, tank.id));
      expect(stored).toHaveLength(60);
    });
  });

  describe('internal notes', () => {
    it('are shown to staff and hidden from owners in the thread, the summary, the counts and notifications', async () => {
      const tank = await oliveTank();
      const question = await sent(olive, tank, 'Why is the water cloudy?');
      const reply = await sent(theo, tank, 'A bacterial bloom; it clears in a few days.');
      const note = await sent(theo, tank, 'Client overfeeds; bring a smaller feeder.', true);
      expect(note.kind).toBe('internal-note');

      for (const owner of [olive, oscar]) {
        const thread = await page(owner, tank);
        expect(thread.body.messages.map((m) => m.id)).toEqual([question.id, reply.id]);
        const glance = await summary(owner, tank);
        expect(glance.body.lastMessage).toMatchObject({ body: reply.body, kind: 'message' });
        expect(glance.body.awaitingReplySince).toBeNull();
        expect((await markRead(owner, tank, note.id)).status).toBe(404);
      }
      expect((await page(ada, tank)).body.messages.map((m) => m.id)).toEqual([
        question.id,
        reply.id,
        note.id,
      ]);
      expect((await summary(ada, tank)).body.lastMessage).toMatchObject({
        body: note.body,
        kind: 'internal-note',
      });
      // Oscar has read nothing: the reply counts, the note does not.
      expect((await unread(oscar)).byTank[tank.id]).toBe(1);
      expect((await summary(oscar, tank)).body.unread).toBe(1);
      // Another staff member counts the note too.
      expect((await summary(ada, tank)).body.unread).toBe(3);
      expect(await deliveriesOf([note.id])).toEqual([]);
      const told = await notificationsOf(note.conversationId);
      expect(told.every((n) => !n.body.includes('smaller feeder'))).toBe(true);
    });

    it('publish live events to staff only, while a message reaches the owners as well', async () => {
      const tank = await oliveTank();
      const message = await sent(theo, tank, 'On my way.');
      const note = await sent(theo, tank, 'Gate code is in the client file.', true);

      const eventFor = (conversationId: string, userId: string) =>
        events.filter(
          (e) =>
            e.type === 'conversation' && e.conversationId === conversationId && e.userIds.includes(userId),
        );
      await vi.waitFor(() => expect(eventFor(message.conversationId, theo.person.id)).toHaveLength(2), {
        timeout: 10_000,
      });
      const staffIds = [ada.person.id, alan.person.id, theo.person.id];
      const [forMessage, forNote] = eventFor(message.conversationId, theo.person.id);
      expect(forMessage!.userIds.sort()).toEqual([...staffIds, olive.person.id, oscar.person.id].sort());
      expect(forMessage!.tankId).toBe(tank.id);
      expect(forNote!.userIds.sort()).toEqual([...staffIds].sort());
      expect(note.conversationId).toBe(message.conversationId);
    });
  });

  describe('GET /api/tanks/:tankId/conversation/messages', () => {
    it('pages through 65 messages, newest page first, with no gaps or repeats even where times are equal', async () => {
      const tank = await oliveTank('Busy lobby reef');
      const [owner, technician] = [await actorOf(olive), await actorOf(theo)];
      for (let n = 0; n < 62; n++) {
        await sendMessage(stack.deps, n % 2 === 0 ? owner : technician, tank.id, {
          body: `Line ${n}`,
          photoIds: [],
          internal: false,
        });
      }
      // Three lines stored in the same instant, as a bulk import could.
      const conversation = await conversationOf(tank);
      const sameInstant = new Date(Date.now() + 60_000);
      await db()
        .insert(conversationMessages)
        .values(
          [62, 63, 64].map((n) => ({
            conversationId: conversation.id,
            companyId,
            tankId: tank.id,
            kind: 'message' as const,
            side: 'staff' as const,
            authorId: theo.person.id,
            authorName: 'Theo Technician',
            body: `Line ${n}`,
            createdAt: sameInstant,
          })),
        );
      const expected = (
        await db().select().from(conversationMessages).where(eq(conversationMessages.tankId, tank.id))
      )
        .sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime() || (a.id < b.id ? -1 : 1))
        .map((m) => m.id);

      const pages: MessageView[][] = [];
      let before: string | null = null;
      do {
        const res = await page(olive, tank, `?limit=10${before ? `&before=${before}` : ''}`);
        expect(res.status).toBe(200);
        pages.push(res.body.messages);
        before = res.body.next;
      } while (before);

      expect(pages.map((p) => p.length)).toEqual([10, 10, 10, 10, 10, 10, 5]);
      // The newest page first; within a page, oldest first.
      expect(pages[0]!.map((m) => m.id)).toEqual(expected.slice(-10));
      expect(pages[6]!.map((m) => m.body)).toEqual(['Line 0', 'Line 1', 'Line 2', 'Line 3', 'Line 4']);
      const seen = pages
        .reverse()
        .flat()
        .map((m) => m.id);
      expect(seen).toEqual(expected);
      expect(new Set(seen).size).toBe(65);
    });

    it('refuses a cursor it did not give', async () => {
      const tank = await oliveTank();
      await sent(olive, tank, 'Hello');
      for (const before of ['bm90LWEtY3Vyc29y', '!!!']) {
        const res = await page(olive, tank, `?before=${before}`);
        expect(res.status).toBe(400);
        expect(issuePaths(res.body)).toEqual(['query.before']);
      }
    });

    it('answers an empty page for a tank with no conversation yet', async () => {
      const tank = await oliveTank();
      expect((await page(olive, tank)).body).toEqual({ messages: [], next: null, readThrough: null });
    });
  });

  describe('unread counts and POST /api/tanks/:tankId/conversation/read', () => {
    it("counts the other side's messages, never one's own, and moves the read position only forward", async () => {
      const tank = await oliveTank();
      const first = await sent(olive, tank, 'The return pump is loud.');
      const second = await sent(olive, tank, 'Now it stopped.');
      const before = await unread(theo);

      expect(before.byTank[tank.id]).toBe(2);
      expect((await unread(olive)).byTank[tank.id]).toBeUndefined();
      expect((await summary(theo, tank)).body.unread).toBe(2);
      expect((await summary(olive, tank)).body.unread).toBe(0);

      expect((await markRead(theo, tank, first.id)).status).toBe(204);
      expect((await unread(theo)).byTank[tank.id]).toBe(1);
      expect((await unread(theo)).total).toBe(before.total - 1);
      expect((await markRead(theo, tank, first.id)).status).toBe(204);
      expect((await unread(theo)).byTank[tank.id]).toBe(1);

      expect((await markRead(theo, tank, second.id)).status).toBe(204);
      expect((await markRead(theo, tank, first.id)).status).toBe(204);
      expect((await unread(theo)).byTank[tank.id]).toBeUndefined();
      const page2 = await page(theo, tank);
      expect(page2.body.readThrough).toBe(second.createdAt);
      // Read to the end, the conversation's notification is read too.
      const [notice] = (await notificationsOf(first.conversationId)).filter(
        (n) => n.userId === theo.person.id,
      );
      expect(notice!.readAt).not.toBeNull();
      // Ada, who read nothing, still counts both.
      expect((await unread(ada)).byTank[tank.id]).toBe(2);
    });

    it('tells only the reader, live, so their other screens update', async () => {
      const tank = await oliveTank();
      const message = await sent(olive, tank, 'Thanks!');
      expect((await markRead(ada, tank, message.id)).status).toBe(204);
      await vi.waitFor(
        () =>
          expect(
            events.some(
              (e) =>
                e.type === 'conversation' &&
                e.conversationId === message.conversationId &&
                e.userIds.length === 1 &&
                e.userIds[0] === ada.person.id,
            ),
          ).toBe(true),
        { timeout: 10_000 },
      );
    });

    it('refuses a message of another tank with 404', async () => {
      const tank = await oliveTank();
      const elsewhere = await oliveTank('Den reef');
      const message = await sent(olive, elsewhere, 'Hi');
      expect((await markRead(olive, tank, message.id)).status).toBe(404);
    });
  });

  describe('GET /api/conversations (staff inbox)', () => {
    it('lists unanswered conversations first, longest waiting first, then by latest activity, with open urgent requests', async () => {
      const inboxCompany = (await createCompany(db(), { timeZone: london })).id;
      const issuer = stack.idp.issuer;
      const boss = await signedIn(
        stack,
        await createPerson(db(), { companyId: inboxCompany, role: 'admin', issuer }),
      );
      const staff = await actorOf(boss);
      const tankOf = async (name: string) => {
        const owner = await createPerson(db(), {
          companyId: inboxCompany,
          role: 'owner',
          issuer,
          name: `${name} owner`,
        });
        const tank = await createTank(db(), { companyId: inboxCompany, name, owners: [owner] });
        return { tank, owner: await actorOf(owner) };
      };
      const say = (who: Actor, tank: Tank, body: string, internal = false) =>
        sendMessage(stack.deps, who, tank.id, { body, photoIds: [], internal });
      const start = Date.now();
      const at = (minute: number) => stack.clock.set(new Date(start + minutes(minute)));
      const answeredEarly = await tankOf('Answered early');
      const waitingLong = await tankOf('Waiting long');
      const waitingShort = await tankOf('Waiting short');
      const answeredLate = await tankOf('Answered late');
      const quiet = await tankOf('Quiet');

      at(0);
      await say(answeredEarly.owner, answeredEarly.tank, 'Question');
      at(1);
      await say(staff, answeredEarly.tank, 'Answer');
      at(2);
      const firstQuestion = await say(waitingLong.owner, waitingLong.tank, 'First question');
      at(3);
      await say(answeredLate.owner, answeredLate.tank, 'Question');
      at(4);
      await say(waitingLong.owner, waitingLong.tank, 'Still waiting');
      // A note is no answer (though its writer has read what came before it).
      await say(staff, waitingLong.tank, 'Will call them', true);
      at(5);
      const unansweredQuestion = await say(waitingShort.owner, waitingShort.tank, 'Question');
      at(6);
      await say(staff, answeredLate.tank, 'Answer');
      await db()
        .insert(urgentRequests)
        .values([
          urgentRequest(inboxCompany, waitingShort.tank.id, 'requested'),
          urgentRequest(inboxCompany, answeredLate.tank.id, 'resolved'),
        ]);
      const [open] = await db()
        .select()
        .from(urgentRequests)
        .where(eq(urgentRequests.tankId, waitingShort.tank.id));

      const all = await boss.get<ConversationSummary[]>('/api/conversations');
      const unanswered = await boss.get<ConversationSummary[]>('/api/conversations?filter=unanswered');

      expect(all.status).toBe(200);
      expect(all.body.map((c) => c.tankName)).toEqual([
        'Waiting long',
        'Waiting short',
        'Answered late',
        'Answered early',
      ]);
      expect(all.body.some((c) => c.tankId === quiet.tank.id)).toBe(false);
      expect(all.body[0]).toMatchObject({
        ownerNames: ['Waiting long owner'],
        awaitingReplySince: firstQuestion.message.createdAt,
        lastMessage: { body: 'Will call them', kind: 'internal-note', authorName: staff.name },
        unread: 0,
        openUrgentRequestId: null,
      });
      expect(all.body[1]).toMatchObject({
        awaitingReplySince: unansweredQuestion.message.createdAt,
        unread: 1,
        openUrgentRequestId: open!.id,
      });
      expect(all.body[2]).toMatchObject({ awaitingReplySince: null, openUrgentRequestId: null });
      expect(unanswered.body.map((c) => c.tankName)).toEqual(['Waiting long', 'Waiting short']);
      expect(
        (await boss.get<ConversationSummary[]>('/api/conversations?filter=unread')).body.map(
          (c) => c.tankName,
        ),
      ).toEqual(['Waiting short']);
      expect(
        (await boss.get<ConversationSummary[]>('/api/conversations?limit=2&offset=2')).body.map(
          (c) => c.tankName,
        ),
      ).toEqual(['Answered late', 'Answered early']);

      at(7);
      await say(staff, waitingLong.tank, 'Answered now');
      expect((await markRead(boss, waitingShort.tank, unansweredQuestion.message.id)).status).toBe(204);

      const after = await boss.get<ConversationSummary[]>('/api/conversations?filter=unanswered');
      expect(after.body.map((c) => c.tankName)).toEqual(['Waiting short']);
      expect((await boss.get<ConversationSummary[]>('/api/conversations?filter=unread')).body).toEqual([]);
      expect(
        (await boss.get<ConversationSummary[]>('/api/conversations')).body.map((c) => c.tankName),
      ).toEqual(['Waiting short', 'Waiting long', 'Answered late', 'Answered early']);
    });

    it('is for staff only', async () => {
      expect((await olive.get<ErrorBody>('/api/conversations')).status).toBe(403);
    });
  });

  describe('photos', () => {
    it('lets an owner upload a message photo here but still not to the tank photos', async () => {
      const tank = await oliveTank();
      const photo = await messagePhoto(olive, tank);
      expect(photo).toMatchObject({ tankId: tank.id, subject: 'message', livestockId: null });
      expect((await olive.upload(`/api/tanks/${tank.id}/photos`, photoForm())).status).toBe(403);
    });

    it('attaches photos the sender uploaded to this conversation, and refuses any other with 400 naming it', async () => {
      const tank = await oliveTank();
      const other = await oliveTank('Den reef');
      const mine = await messagePhoto(olive, tank);
      const oscars = await messagePhoto(oscar, tank);
      const otherTank = await messagePhoto(olive, other);
      const tankPhoto = await theo.upload<PhotoItem>(`/api/tanks/${tank.id}/photos`, photoForm());
      expect(tankPhoto.status).toBe(201);

      const refused = await post(olive, tank, {
        body: 'See the photos',
        photoIds: [oscars.id, otherTank.id, tankPhoto.body.id, mine.id, mine.id],
      });
      expect(refused.status).toBe(400);
      expect(issuePaths(refused.body)).toEqual([
        'body.photoIds.0',
        'body.photoIds.1',
        'body.photoIds.2',
        'body.photoIds.4',
      ]);

      const message = await post(olive, tank, { body: 'See the photo', photoIds: [mine.id] });
      expect(message.status).toBe(201);
      expect(message.body.photos).toEqual([{ id: mine.id, url: mine.url, thumbnailUrl: mine.thumbnailUrl }]);
      const again = await post(olive, tank, { body: 'Once more', photoIds: [mine.id] });
      expect(again.status).toBe(400);
      expect(issuePaths(again.body)).toEqual(['body.photoIds.0']);
      const tooMany = await post(olive, tank, { body: 'Six', photoIds: Array(6).fill(mine.id) });
      expect(tooMany.status).toBe(400);
    });

    it('shows owners a message photo in a message or an urgent request, or their own; a note photo is a 404', async () => {
      const tank = await oliveTank();
      const inNote = await messagePhoto(theo, tank);
      const inMessage = await messagePhoto(theo, tank);
      const loose = await messagePhoto(theo, tank);
      const inRequest = await messagePhoto(theo, tank);
      const oscarsOwn = await messagePhoto(oscar, tank);
      expect((await post(theo, tank, { body: 'Wiring', internal: true, photoIds: [inNote.id] })).status).toBe(
        201,
      );
      expect((await post(theo, tank, { body: 'Your new light', photoIds: [inMessage.id] })).status).toBe(201);
      await db()
        .insert(urgentRequests)
        .values(urgentRequest(companyId, tank.id, 'requested'));
      const [request] = await db().select().from(urgentRequests).where(eq(urgentRequests.tankId, tank.id));
      await db()
        .insert(urgentRequestPhotos)
        .values({ requestId: request!.id, photoId: inRequest.id, position: 0 });
      const status = async (who: ApiSession, photo: PhotoItem) => (await who.get(photo.thumbnailUrl)).status;

      expect(await status(olive, inNote)).toBe(404);
      expect(await status(olive, loose)).toBe(404);
      expect(await status(olive, oscarsOwn)).toBe(404);
      expect(await status(oscar, oscarsOwn)).toBe(200);
      expect(await status(olive, inMessage)).toBe(200);
      expect(await status(olive, inRequest)).toBe(200);
      for (const photo of [inNote, loose, oscarsOwn, inMessage, inRequest]) {
        expect(await status(theo, photo)).toBe(200);
      }
      expect((await page(olive, tank)).body.messages.flatMap((m) => m.photos.map((p) => p.id))).toEqual([
        inMessage.id,
      ]);
      const attached = await db().select().from(messagePhotos).where(eq(messagePhotos.photoId, inNote.id));
      expect(attached).toHaveLength(1);
    });
  });

  describe('notifications', () => {
    it("tells the tank's technician of an owner's messages: one in-app notification per conversation, a push per message, no e-mail yet", async () => {
      const tank = await oliveTank();
      const first = await sent(olive, tank, 'The heater light is off.');
      const second = await sent(olive, tank, 'And the water feels cold.');

      const told = await notificationsOf(first.conversationId);
      expect(told.map((n) => n.userId)).toEqual([theo.person.id]);
      expect(told[0]).toMatchObject({
        title: '2 new messages: Lobby reef',
        body: 'Olive Owner: And the water feels cold.',
        link: `/tanks/${tank.id}/messages`,
        readAt: null,
      });
      const planned = await deliveriesOf([first.id, second.id]);
      expect(planned.map((d) => `${d.channel}:${d.userId}:${d.messageId}`).sort()).toEqual(
        [`push:${theo.person.id}:${first.id}`, `push:${theo.person.id}:${second.id}`].sort(),
      );
    });

    it("tells the company's active admins when the tank has no technician", async () => {
      const tank = await createTank(db(), { companyId, name: 'Unassigned reef', owners: [bruno.person] });
      const message = await sent(bruno, tank, 'Who looks after my tank?');
      const told = await notificationsOf(message.conversationId);
      expect(told.map((n) => n.userId).sort()).toEqual([ada.person.id, alan.person.id].sort());
      expect(told.some((n) => n.userId === retiredAdmin.id)).toBe(false);
    });

    it('tells every owner of the tank of a staff message, and nobody of their own message', async () => {
      const tank = await oliveTank();
      const message = await sent(ada, tank, 'Your visit moved to Friday.');
      const told = await notificationsOf(message.conversationId);
      expect(told.map((n) => n.userId).sort()).toEqual([olive.person.id, oscar.person.id].sort());
      expect(told[0]!.title).toBe('New message: Lobby reef');
      const planned = await deliveriesOf([message.id]);
      expect(planned.map((d) => d.userId).sort()).toEqual([olive.person.id, oscar.person.id].sort());
    });

    it('e-mails once, after ten minutes unread, covering every unread message as escaped text', async () => {
      const tank = await oliveTank('Escaped reef');
      const conversation = async () => (await conversationOf(tank)).id;
      const bodies = [
        'First: the pump <stopped>',
        'Second & *still* off',
        'Third, see https://example.test/a_b',
      ];
      await sent(olive, tank, bodies[0]!);
      stack.clock.advance(minutes(1));
      await sent(olive, tank, bodies[1]!);
      stack.clock.advance(minutes(1));
      const last = await sent(olive, tank, bodies[2]!);
      const check = { conversationId: await conversation(), userId: theo.person.id };

      stack.clock.advance(minutes(5));
      const early = await checkUnreadEmail(stack.deps, check);
      expect(early.outcome).toBe('waiting');
      expect(early.outcome === 'waiting' && early.retryInS).toBeGreaterThan(150);
      expect(early.outcome === 'waiting' && early.retryInS).toBeLessThanOrEqual(180);

      stack.clock.advance(minutes(3));
      const due = await checkUnreadEmail(stack.deps, check);
      const repeat = await checkUnreadEmail(stack.deps, check);

      expect(due).toMatchObject({ outcome: 'emailed', newestMessageId: last.id });
      expect(repeat).toEqual({ outcome: 'nothing-unread' });
      const emails = (
        await db().select().from(deliveries).where(eq(deliveries.userId, theo.person.id))
      ).filter((d) => d.channel === 'email');
      const forThis = emails.filter((d) => d.messageId === last.id);
      expect(forThis).toHaveLength(1);
      expect(forThis[0]!.destination).toBe(theo.person.email);

      await deliverEmailJob(stack.deps, forThis[0]!.id);
      const mail = await stack.mail.waitFor((m) => m.subject === '3 new messages: Escaped reef', 30_000);
      expect(mail.to).toContain(theo.person.email);
      for (const body of bodies) expect(mail.text).toContain(body);
      expect(mail.text).toContain(`${stack.origin}/tanks/${tank.id}/messages`);
      expect(mail.html).toContain('First: the pump &lt;stopped&gt;');
      expect(mail.html).toContain('Second &amp; *still* off');
      expect(mail.html).not.toContain('<stopped>');
      expect(mail.html).not.toContain('<em>');
      expect(mail.html).toContain('href="https://example.test/a_b"');
      const [delivered] = await db().select().from(deliveries).where(eq(deliveries.id, forThis[0]!.id));
      expect(delivered!.status).toBe('sent');
    });

    it('sends no e-mail when the message was read in time', async () => {
      const tank = await oliveTank();
      const message = await sent(olive, tank, 'Never mind, it was unplugged.');
      stack.clock.advance(minutes(5));
      expect((await markRead(theo, tank, message.id)).status).toBe(204);
      stack.clock.advance(minutes(6));

      expect(
        await checkUnreadEmail(stack.deps, {
          conversationId: message.conversationId,
          userId: theo.person.id,
        }),
      ).toEqual({
        outcome: 'nothing-unread',
      });
      const planned = await deliveriesOf([message.id]);
      expect(planned.filter((d) => d.channel === 'email')).toEqual([]);
    });

    it('never tells owners of an internal note, not even by e-mail', async () => {
      const tank = await oliveTank();
      const note = await sent(theo, tank, 'Owner is away until May.', true);
      stack.clock.advance(minutes(11));

      expect(
        await checkUnreadEmail(stack.deps, { conversationId: note.conversationId, userId: olive.person.id }),
      ).toEqual({
        outcome: 'nothing-unread',
      });
      expect(await notificationsOf(note.conversationId)).toEqual([]);
      expect(await deliveriesOf([note.id])).toEqual([]);
    });
  });
});

function urgentRequest(companyId: string, tankId: string, status: 'requested' | 'resolved') {
  return {
    companyId,
    tankId,
    requestedByName: 'Test owner',
    category: 'leak' as const,
    description: 'Water under the cabinet.',
    someoneOnSite: true,
    phone: '+44 20 7946 0000',
    status,
    snapshot: { readings: [], openAlerts: [] },
  };
}

describe('conversations in the background (job queue)', () => {
  let stack: TestStack;

  beforeAll(async () => {
    stack = await startTestStack({ background: true });
  });
  afterAll(() => stack.close());

  it('queues one unread check per conversation and person, ten minutes after the first message', async () => {
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const companyId = (await createCompany(db)).id;
    const owner = await createPerson(db, { companyId, role: 'owner', issuer });
    const technician = await createPerson(db, { companyId, role: 'technician', issuer });
    const tank = await createTank(db, { companyId, owners: [owner], assignedTechnicianId: technician.id });
    const actor = (await findActiveActor(db, owner.id))!;
    const before = Date.now();

    const first = await sendMessage(stack.deps, actor, tank.id, {
      body: 'One',
      photoIds: [],
      internal: false,
    });
    await sendMessage(stack.deps, actor, tank.id, { body: 'Two', photoIds: [], internal: false });

    const jobs = await stack.database.pool.query<{ start_after: Date; singleton_key: string }>(
      `select start_after, singleton_key from pgboss.job where name = 'conversation-unread-email'`,
    );
    expect(jobs.rows.map((job) => job.singleton_key)).toEqual([
      `${first.message.conversationId}:${technician.id}`,
    ]);
    expect(jobs.rows[0]!.start_after.getTime()).toBeGreaterThanOrEqual(before + minutes(10) - 1000);
    const told = await db
      .select()
      .from(notifications)
      .where(
        and(
          eq(notifications.userId, technician.id),
          eq(notifications.conversationId, first.message.conversationId),
        ),
      );
    expect(told).toHaveLength(1);
  }, 120_000);
});
