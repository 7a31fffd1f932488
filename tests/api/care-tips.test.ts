import { and, eq } from 'drizzle-orm';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import {
  tipFeedCursorOf,
  type AudienceCount,
  type CareTip,
  type CareTipInput,
  type TipFeedItem,
  type TipReach,
  type TipSuggestion,
} from '@shared/schemas/care-tips';
import { visitReportContent } from '@shared/schemas/visits';
import {
  careTipReaders,
  careTipTanks,
  deliveries,
  livestock,
  notifications,
  photos,
  pushSubscriptions,
  type tanks,
  visits,
} from '../../api/db/schema/index';
import { deliverTip, sendDueTips } from '../../api/services/care-tips';
import { deliverEmail, fanOutCareTip } from '../../api/services/notify';
import { storePhotoObjects } from '../../api/services/photos';
import { hours, minutes } from '../helpers/clock';
import { issuePaths, signedIn, type ApiSession } from '../helpers/api-session';
import {
  addEquipmentTo,
  addLivestockTo,
  createCompany,
  createPerson,
  createTank,
  type TestPerson,
} from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';
import { makeImage } from './photos/test-images';

type Tank = typeof tanks.$inferSelect;
type ErrorBody = { error: { code: string; message: string; issues?: { path: string; message: string }[] } };
type Inbox = { items: { title: string; body: string; link: string; severity: string }[] };

const dayMs = 86_400_000;
const anemone = 'bubble-tip-anemone';
const london = 'Europe/London';

describe('care tips', () => {
  let stack: TestStack;
  let companyId: string;
  let otherCompanyId: string;
  let admin: ApiSession;
  let technician: ApiSession;
  let otherAdmin: ApiSession;
  /** Owns two tanks that keep an anemone. */
  let olive: ApiSession;
  /** Owns one tank with an anemone, shared with Petra. */
  let nadia: ApiSession;
  let petra: ApiSession;
  /** Owns a tank without an anemone. */
  let bruno: ApiSession;
  let lobby: Tank;
  let den: Tank;
  let clinic: Tank;
  let plain: Tank;
  let formerAnemone: Tank;
  let foreignTank: Tank;

  const owner = async (name: string) =>
    createPerson(stack.database.db, { companyId, role: 'owner', issuer: stack.idp.issuer, name });

  beforeAll(async () => {
    stack = await startTestStack();
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    companyId = (await createCompany(db, { timeZone: london })).id;
    otherCompanyId = (await createCompany(db)).id;
    admin = await signedIn(
      stack,
      await createPerson(db, { companyId, role: 'admin', issuer, name: 'Ada Admin' }),
    );
    technician = await signedIn(stack, await createPerson(db, { companyId, role: 'technician', issuer }));
    otherAdmin = await signedIn(
      stack,
      await createPerson(db, { companyId: otherCompanyId, role: 'admin', issuer }),
    );
    const people: Record<string, TestPerson> = {
      olive: await owner('Olive Owner'),
      nadia: await owner('Nadia Owner'),
      petra: await owner('Petra Partner'),
      bruno: await owner('Bruno Owner'),
    };
    olive = await signedIn(stack, people.olive!);
    nadia = await signedIn(stack, people.nadia!);
    petra = await signedIn(stack, people.petra!);
    bruno = await signedIn(stack, people.bruno!);
    // Preferences with no quiet hours, so what is planned does not depend on the time of day.
    for (const who of [olive, nadia, petra, bruno]) {
      const saved = await who.put('/api/notifications/preferences', {
        push: ['critical'],
        email: ['critical'],
        inApp: ['notice', 'warning', 'critical'],
        quietHours: null,
        timeZone: london,
      });
      expect(saved.status).toBe(200);
    }
    const keeping = async (
      name: string,
      owners: TestPerson[],
      columns: Partial<typeof tanks.$inferInsert> = {},
    ) => {
      const tank = await createTank(db, { companyId, name, owners, ...columns });
      await addLivestockTo(db, tank, { catalogueSpeciesId: anemone, status: 'stable' });
      return tank;
    };
    lobby = await keeping('A lobby reef', [people.olive!]);
    den = await keeping('B den reef', [people.olive!]);
    clinic = await keeping('C clinic reef', [people.nadia!, people.petra!], { style: 'soft-lps-reef' });
    plain = await createTank(db, { companyId, name: 'D plain reef', owners: [people.bruno!] });
    formerAnemone = await createTank(db, {
      companyId,
      name: 'E former anemone reef',
      owners: [people.bruno!],
    });
    await addLivestockTo(db, formerAnemone, { catalogueSpeciesId: anemone, status: 'removed' });
    foreignTank = await createTank(db, { companyId: otherCompanyId, name: 'Elsewhere' });
    await addLivestockTo(db, foreignTank, { catalogueSpeciesId: anemone, status: 'stable' });
  });
  afterAll(() => stack.close());
  afterEach(() => stack.clock.reset());

  const tipBody = (fields: Partial<CareTipInput> = {}): CareTipInput => ({
    title: 'Give your anemone room',
    body: 'Anemones wander and sting.\n\n::: caution\nAnemones sting. Wear gloves.\n:::',
    category: 'livestock',
    audience: { kind: 'species', speciesId: anemone },
    ...fields,
  });

  async function draft(fields: Partial<CareTipInput> = {}, who: ApiSession = admin) {
    const res = await who.post<CareTip & ErrorBody>('/api/care-tips', tipBody(fields));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body;
  }

  async function sentNow(fields: Partial<CareTipInput> = {}) {
    const tip = await draft(fields);
    const res = await admin.post<CareTip & ErrorBody>(`/api/care-tips/${tip.id}/send`, { at: null });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body;
  }

  const db = () => stack.database.db;
  const tipTanksOf = async (tipId: string) =>
    (await db().select().from(careTipTanks).where(eq(careTipTanks.tipId, tipId))).map((r) => r.tankId).sort();
  const readersOf = async (tipId: string) =>
    (await db().select().from(careTipReaders).where(eq(careTipReaders.tipId, tipId)))
      .map((r) => `${r.tankId}:${r.userId}`)
      .sort();
  const notificationsOf = (tipId: string) =>
    db().select().from(notifications).where(eq(notifications.tipId, tipId));
  const feedOf = (who: ApiSession, query = '') =>
    who.get<TipFeedItem[] & ErrorBody>(`/api/care-tips/feed${query}`);

  describe('POST /api/care-tips', () => {
    it('saves a draft that has reached nobody yet', async () => {
      const tip = await draft({ suggestWhen: [{ on: 'livestock-added', group: 'anemone' }] });

      expect(tip).toMatchObject({
        title: 'Give your anemone room',
        category: 'livestock',
        status: 'draft',
        photoId: null,
        sendAt: null,
        sentAt: null,
        audience: { kind: 'species', speciesId: anemone },
        suggestWhen: [{ on: 'livestock-added', group: 'anemone' }],
        reached: { tanks: 0, owners: 0 },
        helpfulCount: 0,
        createdBy: { id: admin.person.id, name: 'Ada Admin' },
      });
    });

    it('refuses a body over 20,000 characters, and names the field', async () => {
      const res = await admin.post<ErrorBody>('/api/care-tips', tipBody({ body: 'x'.repeat(20_001) }));

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.body']);
    });

    it("refuses another company's photo, an unknown species and another company's tank, each on its field", async () => {
      const stored = await storePhotoObjects(
        stack.deps.storage,
        await makeImage({ width: 32, height: 24, format: 'png' }),
        new Date(),
      );
      const [foreignPhoto] = await db()
        .insert(photos)
        .values({ companyId: otherCompanyId, tankId: foreignTank.id, subject: 'tank', ...stored })
        .returning();

      const photo = await admin.post<ErrorBody>('/api/care-tips', tipBody({ photoId: foreignPhoto!.id }));
      const species = await admin.post<ErrorBody>(
        '/api/care-tips',
        tipBody({ audience: { kind: 'species', speciesId: 'no-such-animal' } }),
      );
      const chosen = await admin.post<ErrorBody>(
        '/api/care-tips',
        tipBody({ audience: { kind: 'tanks', tankIds: [lobby.id, foreignTank.id] } }),
      );

      expect([photo.status, species.status, chosen.status]).toEqual([400, 400, 400]);
      expect(issuePaths(photo.body)).toEqual(['body.photoId']);
      expect(issuePaths(species.body)).toEqual(['body.audience.speciesId']);
      expect(issuePaths(chosen.body)).toEqual(['body.audience.tankIds']);
    });

    it('accepts a photo of one of our tanks', async () => {
      const stored = await storePhotoObjects(
        stack.deps.storage,
        await makeImage({ width: 32, height: 24, format: 'png' }),
        new Date(),
      );
      const [ours] = await db()
        .insert(photos)
        .values({ companyId, tankId: lobby.id, subject: 'tank', ...stored })
        .returning();

      const tip = await draft({ photoId: ours!.id });

      expect(tip.photoId).toBe(ours!.id);
    });

    it("refuses a visit report's photo, which only that tank's owners may see", async () => {
      const stored = await storePhotoObjects(
        stack.deps.storage,
        await makeImage({ width: 32, height: 24, format: 'png' }),
        new Date(),
      );
      const [fromVisit] = await db()
        .insert(photos)
        .values({ companyId, tankId: lobby.id, subject: 'visit', ...stored })
        .returning();

      const refused = await admin.post<ErrorBody>('/api/care-tips', tipBody({ photoId: fromVisit!.id }));

      expect(refused.status).toBe(400);
      expect(issuePaths(refused.body)).toEqual(['body.photoId']);
    });

    it('refuses owners (403)', async () => {
      expect((await olive.post('/api/care-tips', tipBody())).status).toBe(403);
    });
  });

  describe('GET /api/care-tips and GET /api/care-tips/:tipId', () => {
    it("lists the company's tips newest first, and shows another company none of them", async () => {
      const first = await draft({ title: 'First of two' });
      stack.clock.advance(minutes(1));
      const second = await draft({ title: 'Second of two' });

      const ours = await technician.get<CareTip[]>('/api/care-tips');
      const theirs = await otherAdmin.get<CareTip[]>('/api/care-tips');

      expect(ours.status).toBe(200);
      const ids = ours.body.map((tip) => tip.id);
      expect(ids.indexOf(second.id)).toBeLessThan(ids.indexOf(first.id));
      expect(theirs.body.map((tip) => tip.id)).not.toContain(first.id);
      expect((await technician.get<CareTip>(`/api/care-tips/${first.id}`)).body.title).toBe('First of two');
    });

    it('answers 404 to another company and 403 to owners', async () => {
      const tip = await draft();

      expect((await otherAdmin.get(`/api/care-tips/${tip.id}`)).status).toBe(404);
      expect((await olive.get(`/api/care-tips/${tip.id}`)).status).toBe(403);
      expect((await olive.get('/api/care-tips')).status).toBe(403);
    });
  });

  describe('PATCH /api/care-tips/:tipId', () => {
    it('changes a draft and leaves alone what the change does not name', async () => {
      const tip = await draft({ suggestWhen: [{ on: 'visit-task', task: 'aquascape' }] });

      const res = await admin.patch<CareTip>(`/api/care-tips/${tip.id}`, { title: 'Room for your anemone' });

      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        title: 'Room for your anemone',
        body: tip.body,
        suggestWhen: [{ on: 'visit-task', task: 'aquascape' }],
        status: 'draft',
      });
    });

    it('refuses a change once the tip is sent (409), and another company (404) and owners (403) always', async () => {
      const tip = await draft();
      expect((await otherAdmin.patch(`/api/care-tips/${tip.id}`, { title: 'Mine now' })).status).toBe(404);
      expect((await olive.patch(`/api/care-tips/${tip.id}`, { title: 'Mine now' })).status).toBe(403);
      await admin.post(`/api/care-tips/${tip.id}/send`, { at: null });

      const res = await admin.patch<ErrorBody>(`/api/care-tips/${tip.id}`, { title: 'Too late' });

      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('tip_not_pending');
      expect((await admin.get<CareTip>(`/api/care-tips/${tip.id}`)).body.title).toBe(
        'Give your anemone room',
      );
    });
  });

  describe('POST /api/care-tips/audience-count', () => {
    const count = (audience: unknown, who: ApiSession = admin) =>
      who.post<AudienceCount & ErrorBody>('/api/care-tips/audience-count', { audience });

    it('counts the tanks keeping a species now and their owners, not a tank whose animal was removed', async () => {
      const res = await count({ kind: 'species', speciesId: anemone });

      expect(res.status).toBe(200);
      // Lobby and den (Olive), the clinic (Nadia and Petra); not the former anemone reef or elsewhere.
      expect(res.body).toEqual({ tanks: 3, owners: 3 });
    });

    it('counts a style, a kind of equipment and chosen tanks within the company', async () => {
      await addEquipmentTo(db(), plain, { kind: 'chiller' });
      await addEquipmentTo(db(), foreignTank, { kind: 'chiller' });

      expect((await count({ kind: 'style', style: 'soft-lps-reef' })).body).toEqual({ tanks: 1, owners: 2 });
      expect((await count({ kind: 'equipment', equipmentKind: 'chiller' })).body).toEqual({
        tanks: 1,
        owners: 1,
      });
      expect((await count({ kind: 'tanks', tankIds: [lobby.id, den.id, foreignTank.id] })).body).toEqual({
        tanks: 2,
        owners: 1,
      });
    });

    it("counts tanks keeping one of the company's own species", async () => {
      const created = await admin.post<{ id: string }>('/api/species', {
        commonName: 'Harbour anemone',
        scientificName: 'Testactis portus',
        profile: {
          waterTypes: ['marine'],
          group: 'anemone',
          ranges: {},
          behaviour: {},
          careNotes: 'A local anemone.',
        },
      });
      expect(created.status).toBe(201);
      const tank = await createTank(db(), { companyId, name: 'F harbour reef' });
      await db()
        .insert(livestock)
        .values({ companyId, tankId: tank.id, companySpeciesId: created.body.id.slice('company-'.length) });

      expect((await count({ kind: 'species', speciesId: created.body.id })).body).toEqual({
        tanks: 1,
        owners: 0,
      });
    });

    it('answers an audience that matches no tank with zero', async () => {
      expect((await count({ kind: 'style', style: 'planted-freshwater' })).body).toEqual({
        tanks: 0,
        owners: 0,
      });
    });

    it('refuses owners (403)', async () => {
      expect((await count({ kind: 'all' }, olive)).status).toBe(403);
    });
  });

  describe('POST /api/care-tips/:tipId/send', () => {
    it('reaches exactly the tanks keeping the species and their owners: one notification per person, a reader per tank', async () => {
      const tip = await sentNow({ title: 'Anemones sting' });

      expect(tip).toMatchObject({ status: 'sent', reached: { tanks: 3, owners: 3 } });
      expect(await tipTanksOf(tip.id)).toEqual([lobby.id, den.id, clinic.id].sort());
      expect(await readersOf(tip.id)).toEqual(
        [
          `${lobby.id}:${olive.person.id}`,
          `${den.id}:${olive.person.id}`,
          `${clinic.id}:${nadia.person.id}`,
          `${clinic.id}:${petra.person.id}`,
        ].sort(),
      );
      const told = await notificationsOf(tip.id);
      expect(told.map((n) => n.userId).sort()).toEqual(
        [olive.person.id, nadia.person.id, petra.person.id].sort(),
      );
      const oliveInbox = await olive.get<Inbox>('/api/notifications');
      expect(oliveInbox.body.items).toContainEqual(
        expect.objectContaining({
          severity: 'notice',
          title: 'Care tip: Anemones sting',
          // Her first tank, by name when both got it at once.
          link: `/tanks/${lobby.id}?section=timeline&tip=${tip.id}`,
        }),
      );
      const words = oliveInbox.body.items.find((n) => n.title === 'Care tip: Anemones sting')!.body;
      expect(words).toContain('Anemones wander and sting.');
      expect(words).toContain('Caution: Anemones sting.');
      expect(words).not.toContain(':::');
      // E-mail is on by default for care tips; push is not.
      const planned = await db().select().from(deliveries).where(eq(deliveries.tipId, tip.id));
      expect(planned.map((d) => `${d.channel}:${d.userId}`).sort()).toEqual(
        [olive.person.id, nadia.person.id, petra.person.id].map((id) => `email:${id}`).sort(),
      );
      expect(await notificationsOf(tip.id)).toHaveLength(3);
      // Telling them again (a retried job) tells nobody twice.
      await fanOutCareTip(stack.deps, tip.id);
      expect(await notificationsOf(tip.id)).toHaveLength(3);
      expect(await db().select().from(deliveries).where(eq(deliveries.tipId, tip.id))).toHaveLength(3);
    });

    it('e-mails the whole tip with its caution, and holds the push until quiet hours end', async () => {
      const sleeper = await signedIn(stack, await owner('Sam Sleeper'));
      const clock = (offsetMin: number) =>
        new Intl.DateTimeFormat('en-GB', {
          timeZone: london,
          hour: '2-digit',
          minute: '2-digit',
          hour12: false,
        }).format(new Date(Date.now() + offsetMin * 60_000));
      const saved = await sleeper.put('/api/notifications/preferences', {
        push: ['critical'],
        email: ['critical'],
        inApp: ['notice', 'warning', 'critical'],
        quietHours: { start: clock(-60), end: clock(60) },
        timeZone: london,
        careTips: ['in-app', 'email', 'push'],
      });
      expect(saved.status).toBe(200);
      await db()
        .insert(pushSubscriptions)
        .values({
          userId: sleeper.person.id,
          endpoint: `https://push.example.test/${sleeper.person.id}`,
          p256dh: 'B'.repeat(87),
          auth: 'A'.repeat(22),
        });
      const tank = await createTank(db(), { companyId, name: 'Night reef', owners: [sleeper.person] });

      const tip = await sentNow({ title: 'Night-time tip', audience: { kind: 'tanks', tankIds: [tank.id] } });
      const planned = await db().select().from(deliveries).where(eq(deliveries.tipId, tip.id));
      expect(planned.map((d) => d.channel).sort()).toEqual(['email', 'push']);

      await deliverEmail(stack.deps, planned.find((d) => d.channel === 'email')!.id);
      const mail = await stack.mail.waitFor((m) => m.to.includes(sleeper.person.email), 30_000);
      expect(mail.subject).toBe('Care tip: Night-time tip');
      expect(mail.text).toContain('Anemones wander and sting.');
      expect(mail.text).toContain('Caution: Anemones sting. Wear gloves.');
      expect(mail.text).toContain(`${stack.origin}/tanks/${tank.id}?section=timeline&tip=${tip.id}`);
      expect(mail.html).toContain('aria-label="Caution"');
      const [sent] = await db()
        .select()
        .from(deliveries)
        .where(and(eq(deliveries.tipId, tip.id), eq(deliveries.channel, 'email')));
      expect(sent!.status).toBe('sent');
    });

    it('refuses an audience that matches no tank, and leaves the tip a draft', async () => {
      const tip = await draft({ audience: { kind: 'style', style: 'planted-freshwater' } });

      const now = await admin.post<ErrorBody>(`/api/care-tips/${tip.id}/send`, { at: null });
      const later = await admin.post<ErrorBody>(`/api/care-tips/${tip.id}/send`, {
        at: new Date(Date.now() + hours(2)).toISOString(),
      });

      expect([now.status, later.status]).toEqual([400, 400]);
      expect(now.body.error.code).toBe('empty_audience');
      expect(now.body.error.message).toMatch(/matches no tank/);
      expect((await admin.get<CareTip>(`/api/care-tips/${tip.id}`)).body.status).toBe('draft');
      expect(await tipTanksOf(tip.id)).toEqual([]);
    });

    it('refuses a time in the past by the server clock on body.at', async () => {
      const tip = await draft();
      // The server's clock is ahead of the caller's: what the caller thinks is soon has passed.
      stack.clock.advance(hours(3));

      const res = await admin.post<ErrorBody>(`/api/care-tips/${tip.id}/send`, {
        at: new Date(Date.now() + hours(1)).toISOString(),
      });

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['body.at']);
    });

    it('refuses a second send (409), another company (404) and owners (403)', async () => {
      const tip = await draft();
      expect((await otherAdmin.post(`/api/care-tips/${tip.id}/send`, { at: null })).status).toBe(404);
      expect((await olive.post(`/api/care-tips/${tip.id}/send`, { at: null })).status).toBe(403);
      expect((await admin.post(`/api/care-tips/${tip.id}/send`, { at: null })).status).toBe(200);

      const again = await admin.post<ErrorBody>(`/api/care-tips/${tip.id}/send`, { at: null });

      expect(again.status).toBe(409);
      expect(await notificationsOf(tip.id)).toHaveLength(3);
    });
  });

  describe('a scheduled tip', () => {
    it('goes out once at its time, even when the job and the sweep run at the same moment', async () => {
      const tip = await draft({ title: 'Scheduled anemone tip' });
      const at = new Date(Date.now() + hours(1));

      const scheduled = await admin.post<CareTip>(`/api/care-tips/${tip.id}/send`, { at: at.toISOString() });
      expect(scheduled.status).toBe(200);
      expect(scheduled.body).toMatchObject({ status: 'scheduled', sendAt: at.toISOString(), sentAt: null });

      // Before its time, neither the job nor the sweep sends it.
      expect(await deliverTip(stack.deps, tip.id, undefined, { dueOnly: true })).toBeNull();
      expect(await sendDueTips(stack.deps)).toBe(0);
      expect(await tipTanksOf(tip.id)).toEqual([]);

      stack.clock.advance(hours(1) + minutes(1));
      const [byJob, bySweep] = await Promise.all([
        deliverTip(stack.deps, tip.id, undefined, { dueOnly: true }),
        sendDueTips(stack.deps),
      ]);
      await Promise.all([
        deliverTip(stack.deps, tip.id, undefined, { dueOnly: true }),
        sendDueTips(stack.deps),
      ]);

      // Exactly one of the two claimed it.
      expect([byJob === null ? 0 : 1, bySweep].sort()).toEqual([0, 1]);
      expect(await tipTanksOf(tip.id)).toEqual([lobby.id, den.id, clinic.id].sort());
      expect(await readersOf(tip.id)).toHaveLength(4);
      const told = await notificationsOf(tip.id);
      expect(told.map((n) => n.userId).sort()).toEqual(
        [olive.person.id, nadia.person.id, petra.person.id].sort(),
      );
      const after = await admin.get<CareTip>(`/api/care-tips/${tip.id}`);
      expect(after.body).toMatchObject({ status: 'sent', reached: { tanks: 3, owners: 3 } });
      expect(Date.parse(after.body.sentAt!)).toBeGreaterThanOrEqual(at.getTime());
    });

    it('can still be changed, or sent at once, before its time', async () => {
      const tip = await draft();
      await admin.post(`/api/care-tips/${tip.id}/send`, {
        at: new Date(Date.now() + hours(5)).toISOString(),
      });

      const changed = await admin.patch<CareTip>(`/api/care-tips/${tip.id}`, {
        title: 'Changed while waiting',
      });
      const now = await admin.post<CareTip>(`/api/care-tips/${tip.id}/send`, { at: null });

      expect(changed.body).toMatchObject({ status: 'scheduled', title: 'Changed while waiting' });
      expect(now.body).toMatchObject({ status: 'sent', sendAt: null, reached: { tanks: 3 } });
      stack.clock.advance(hours(6));
      expect(await deliverTip(stack.deps, tip.id, undefined, { dueOnly: true })).toBeNull();
    });
  });

  describe('POST /api/care-tips/:tipId/withdraw', () => {
    it('takes a sent tip out of the feeds; what was delivered stays recorded and pending e-mails are not sent', async () => {
      const tip = await sentNow({ title: 'Soon withdrawn' });
      expect((await feedOf(olive)).body.map((item) => item.tipId)).toContain(tip.id);
      const pending = await db().select().from(deliveries).where(eq(deliveries.tipId, tip.id));

      const res = await admin.post<CareTip>(`/api/care-tips/${tip.id}/withdraw`);

      expect(res.status).toBe(200);
      expect(res.body.status).toBe('withdrawn');
      expect(res.body.withdrawnAt).not.toBeNull();
      expect((await feedOf(olive)).body.map((item) => item.tipId)).not.toContain(tip.id);
      expect((await feedOf(admin)).body.map((item) => item.tipId)).not.toContain(tip.id);
      expect(await tipTanksOf(tip.id)).toHaveLength(3);
      expect((await admin.get<TipReach>(`/api/care-tips/${tip.id}/reach`)).body.tanks).toHaveLength(3);
      expect(pending.length).toBeGreaterThan(0);
      await deliverEmail(stack.deps, pending[0]!.id);
      const after = await db().select().from(deliveries).where(eq(deliveries.tipId, tip.id));
      expect(after.every((d) => d.status === 'gone')).toBe(true);
      expect(stack.mail.messages().filter((m) => m.subject === 'Care tip: Soon withdrawn')).toEqual([]);
      // Withdrawing again changes nothing; sending it again is refused.
      expect((await admin.post<CareTip>(`/api/care-tips/${tip.id}/withdraw`)).body.withdrawnAt).toBe(
        res.body.withdrawnAt,
      );
      expect((await admin.post(`/api/care-tips/${tip.id}/send`, { at: null })).status).toBe(409);
    });

    it('cancels a scheduled tip: its time comes and nothing goes out', async () => {
      const tip = await draft();
      await admin.post(`/api/care-tips/${tip.id}/send`, {
        at: new Date(Date.now() + hours(1)).toISOString(),
      });

      await admin.post(`/api/care-tips/${tip.id}/withdraw`);
      stack.clock.advance(hours(2));
      await sendDueTips(stack.deps);

      expect(await tipTanksOf(tip.id)).toEqual([]);
    });

    it('answers 404 to another company and 403 to owners', async () => {
      const tip = await draft();

      expect((await otherAdmin.post(`/api/care-tips/${tip.id}/withdraw`)).status).toBe(404);
      expect((await olive.post(`/api/care-tips/${tip.id}/withdraw`)).status).toBe(403);
      expect((await admin.get<CareTip>(`/api/care-tips/${tip.id}`)).body.status).toBe('draft');
    });
  });

  describe('POST /api/care-tips/:tipId/send-to-tank', () => {
    it('sends a sent tip to one more tank, and a second send is a no-op with the same answer', async () => {
      const tip = await sentNow();
      const sendToPlain = () =>
        technician.post<CareTip>(`/api/care-tips/${tip.id}/send-to-tank`, { tankId: plain.id });

      const rowsOf = async () =>
        (await db().select().from(careTipTanks).where(eq(careTipTanks.tipId, tip.id))).sort((a, b) =>
          a.tankId.localeCompare(b.tankId),
        );
      const first = await sendToPlain();
      const rows = await rowsOf();
      const second = await sendToPlain();

      expect(first.status).toBe(200);
      expect(second.status).toBe(200);
      expect(second.body).toEqual(first.body);
      expect(first.body.reached).toEqual({ tanks: 4, owners: 4 });
      expect(await rowsOf()).toEqual(rows);
      expect((await notificationsOf(tip.id)).filter((n) => n.userId === bruno.person.id)).toHaveLength(1);
      expect((await feedOf(bruno)).body.map((item) => [item.tipId, item.tankId])).toContainEqual([
        tip.id,
        plain.id,
      ]);
    });

    it('refuses a draft (409), a tank of another company (404), another company (404) and owners (403)', async () => {
      const tip = await draft();
      const sent = await sentNow();

      const ofDraft = await admin.post<ErrorBody>(`/api/care-tips/${tip.id}/send-to-tank`, {
        tankId: plain.id,
      });
      const foreign = await admin.post(`/api/care-tips/${sent.id}/send-to-tank`, { tankId: foreignTank.id });
      const stranger = await otherAdmin.post(`/api/care-tips/${sent.id}/send-to-tank`, {
        tankId: foreignTank.id,
      });
      const byOwner = await bruno.post(`/api/care-tips/${sent.id}/send-to-tank`, { tankId: plain.id });

      expect([ofDraft.status, foreign.status, stranger.status, byOwner.status]).toEqual([409, 404, 404, 403]);
      expect(ofDraft.body.error.code).toBe('tip_not_sent');
      expect(await tipTanksOf(tip.id)).toEqual([]);
      expect(await tipTanksOf(sent.id)).not.toContain(plain.id);
    });
  });

  describe('helpful marks and GET /api/care-tips/:tipId/reach', () => {
    it('lets an owner mark and unmark a tip their tank received; staff see the count and who found it helpful', async () => {
      const tip = await sentNow();

      expect((await olive.put(`/api/care-tips/${tip.id}/helpful`, {})).status).toBe(204);
      expect((await olive.put(`/api/care-tips/${tip.id}/helpful`, {})).status).toBe(204);
      expect((await nadia.put(`/api/care-tips/${tip.id}/helpful`, {})).status).toBe(204);
      expect((await admin.get<CareTip>(`/api/care-tips/${tip.id}`)).body.helpfulCount).toBe(2);
      const reach = await admin.get<TipReach>(`/api/care-tips/${tip.id}/reach`);
      expect(reach.body.tanks.map((t) => t.name)).toEqual(['A lobby reef', 'B den reef', 'C clinic reef']);
      expect(reach.body.owners).toEqual([
        { id: nadia.person.id, name: 'Nadia Owner', tankName: 'C clinic reef', helpful: true },
        { id: olive.person.id, name: 'Olive Owner', tankName: 'A lobby reef', helpful: true },
        { id: olive.person.id, name: 'Olive Owner', tankName: 'B den reef', helpful: true },
        { id: petra.person.id, name: 'Petra Partner', tankName: 'C clinic reef', helpful: false },
      ]);
      const oliveItems = (await feedOf(olive)).body.filter((item) => item.tipId === tip.id);
      expect(oliveItems.map((item) => item.helpful)).toEqual([true, true]);

      expect((await olive.delete(`/api/care-tips/${tip.id}/helpful`)).status).toBe(204);
      expect((await admin.get<CareTip>(`/api/care-tips/${tip.id}`)).body.helpfulCount).toBe(1);
    });

    it('answers 404 to an owner it did not reach, to another company and for a withdrawn tip; 403 to our staff', async () => {
      const tip = await sentNow();

      expect((await bruno.put(`/api/care-tips/${tip.id}/helpful`, {})).status).toBe(404);
      expect((await otherAdmin.put(`/api/care-tips/${tip.id}/helpful`, {})).status).toBe(404);
      expect((await technician.put(`/api/care-tips/${tip.id}/helpful`, {})).status).toBe(403);
      expect((await otherAdmin.get(`/api/care-tips/${tip.id}/reach`)).status).toBe(404);
      expect((await olive.get(`/api/care-tips/${tip.id}/reach`)).status).toBe(403);
      await admin.post(`/api/care-tips/${tip.id}/withdraw`);
      expect((await olive.put(`/api/care-tips/${tip.id}/helpful`, {})).status).toBe(404);
      expect((await olive.delete(`/api/care-tips/${tip.id}/helpful`)).status).toBe(404);
      expect((await admin.get<CareTip>(`/api/care-tips/${tip.id}`)).body.helpfulCount).toBe(0);
    });
  });

  describe('GET /api/care-tips/feed', () => {
    it("shows an owner only their own tanks' tips, one item per tank, and refuses another owner's tank", async () => {
      const tip = await sentNow({ title: 'For the feed' });

      const oliveFeed = await feedOf(olive);
      const brunoFeed = await feedOf(bruno);
      const oneTank = await feedOf(olive, `?tankId=${den.id}`);
      const notHers = await feedOf(olive, `?tankId=${clinic.id}`);

      expect(oliveFeed.status).toBe(200);
      expect(
        oliveFeed.body
          .filter((item) => item.tipId === tip.id)
          .map((item) => item.tankName)
          .sort(),
      ).toEqual(['A lobby reef', 'B den reef']);
      expect(oliveFeed.body.every((item) => [lobby.id, den.id].includes(item.tankId))).toBe(true);
      expect(brunoFeed.body.map((item) => item.tipId)).not.toContain(tip.id);
      expect(oneTank.body.filter((item) => item.tipId === tip.id)).toEqual([
        expect.objectContaining({
          tankId: den.id,
          title: 'For the feed',
          category: 'livestock',
          helpful: false,
        }),
      ]);
      expect(notHers.status).toBe(404);
      expect((await feedOf(otherAdmin)).body.map((item) => item.tipId)).not.toContain(tip.id);
    });

    it('pages newest first by cursor, without repeats or gaps when tips arrive between pages', async () => {
      const reader = await signedIn(stack, await owner('Paula Pager'));
      const tank = await createTank(db(), { companyId, name: 'Paged reef', owners: [reader.person] });
      const sendOne = async (title: string) => {
        stack.clock.advance(minutes(1));
        return sentNow({ title, audience: { kind: 'tanks', tankIds: [tank.id] } });
      };
      for (const title of ['one', 'two', 'three', 'four', 'five']) await sendOne(title);
      const path = (cursor?: string) =>
        `?tankId=${tank.id}&limit=2${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`;

      const first = await feedOf(reader, path());
      await sendOne('six, between pages');
      const second = await feedOf(reader, path(tipFeedCursorOf(first.body.at(-1)!)));
      const third = await feedOf(reader, path(tipFeedCursorOf(second.body.at(-1)!)));
      const fresh = await feedOf(reader, path());

      expect(first.body.map((item) => item.title)).toEqual(['five', 'four']);
      expect(second.body.map((item) => item.title)).toEqual(['three', 'two']);
      expect(third.body.map((item) => item.title)).toEqual(['one']);
      expect(fresh.body.map((item) => item.title)).toEqual(['six, between pages', 'five']);
    });

    it("shows a tip's photo, taken at another tank, to the owners it reached and to nobody else", async () => {
      const stored = await storePhotoObjects(
        stack.deps.storage,
        await makeImage({ width: 32, height: 24, format: 'png' }),
        new Date(),
      );
      const [photo] = await db()
        .insert(photos)
        .values({ companyId, tankId: lobby.id, subject: 'tank', ...stored })
        .returning();
      const tip = await sentNow({ photoId: photo!.id, audience: { kind: 'tanks', tankIds: [clinic.id] } });

      expect((await nadia.get(`/api/photos/${photo!.id}`)).status).toBe(200);
      expect((await bruno.get(`/api/photos/${photo!.id}`)).status).toBe(404);
      await admin.post(`/api/care-tips/${tip.id}/withdraw`);
      expect((await nadia.get(`/api/photos/${photo!.id}`)).status).toBe(404);
      expect((await olive.get(`/api/photos/${photo!.id}`)).status).toBe(200);
    });

    it('refuses a cursor it did not write', async () => {
      const res = await feedOf(olive, '?cursor=yesterday');

      expect(res.status).toBe(400);
      expect(issuePaths(res.body)).toEqual(['query.cursor']);
    });
  });

  describe('GET /api/tanks/:tankId/tip-suggestions', () => {
    it('offers a sent tip whose trigger matches an animal added in the last two weeks, until the tank has it', async () => {
      const tank = await createTank(db(), { companyId, name: 'New anemone reef' });
      const tip = await sentNow({
        title: 'Anemone arrivals',
        audience: { kind: 'tanks', tankIds: [lobby.id] },
        suggestWhen: [{ on: 'livestock-added', group: 'anemone' }],
      });
      const unsent = await draft({ suggestWhen: [{ on: 'livestock-added', group: 'anemone' }] });
      const before = await technician.get<TipSuggestion[]>(`/api/tanks/${tank.id}/tip-suggestions`);
      await addLivestockTo(db(), tank, { catalogueSpeciesId: anemone, changedAt: new Date() });

      const offered = await technician.get<TipSuggestion[]>(`/api/tanks/${tank.id}/tip-suggestions`);
      await technician.post(`/api/care-tips/${tip.id}/send-to-tank`, { tankId: tank.id });
      const afterSending = await technician.get<TipSuggestion[]>(`/api/tanks/${tank.id}/tip-suggestions`);

      expect(before.body.map((s) => s.tip.id)).not.toContain(tip.id);
      expect(offered.body).toContainEqual({
        tip: { id: tip.id, title: 'Anemone arrivals', category: 'livestock' },
        reason: 'An anemone was added',
      });
      expect(offered.body.map((s) => s.tip.id)).not.toContain(unsent.id);
      expect(afterSending.body.map((s) => s.tip.id)).not.toContain(tip.id);
    });

    it('offers a tip whose task a visit published in the last two weeks recorded, and not for an older animal', async () => {
      const tank = await createTank(db(), { companyId, name: 'Rescaped reef' });
      await addLivestockTo(db(), tank, {
        catalogueSpeciesId: anemone,
        changedAt: new Date(Date.now() - 20 * dayMs),
      });
      const tip = await sentNow({
        title: 'After coral work',
        audience: { kind: 'tanks', tankIds: [lobby.id] },
        suggestWhen: [{ on: 'visit-task', task: 'aquascape' }],
      });
      const anemoneTip = await sentNow({
        title: 'Old anemone news',
        audience: { kind: 'tanks', tankIds: [lobby.id] },
        suggestWhen: [{ on: 'livestock-added', group: 'anemone' }],
      });
      const now = new Date();
      await db()
        .insert(visits)
        .values({
          companyId,
          tankId: tank.id,
          kind: 'routine',
          status: 'published',
          windowStart: new Date(now.getTime() - hours(3)),
          windowEnd: new Date(now.getTime() - hours(2)),
          published: visitReportContent.parse({ tasksDone: ['aquascape', 'water-change'] }),
          publishedVersion: 1,
          version: 1,
          publishedAt: new Date(now.getTime() - hours(1)),
          announcedAt: new Date(now.getTime() - hours(1)),
        });

      const offered = await admin.get<TipSuggestion[]>(`/api/tanks/${tank.id}/tip-suggestions`);

      expect(offered.body).toContainEqual({
        tip: { id: tip.id, title: 'After coral work', category: 'livestock' },
        reason: 'A visit recorded “Rockwork and aquascape”',
      });
      expect(offered.body.map((s) => s.tip.id)).not.toContain(anemoneTip.id);
    });

    it('refuses owners (403) and answers 404 for a tank of another company', async () => {
      expect((await olive.get(`/api/tanks/${lobby.id}/tip-suggestions`)).status).toBe(403);
      expect((await otherAdmin.get(`/api/tanks/${lobby.id}/tip-suggestions`)).status).toBe(404);
    });
  });
});

describe('care tips in the background (job queue and workers)', () => {
  let stack: TestStack;
  let admin: ApiSession;
  let reader: TestPerson;
  let tank: Tank;

  beforeAll(async () => {
    stack = await startTestStack({ background: true });
    const { db } = stack.database;
    const issuer = stack.idp.issuer;
    const companyId = (await createCompany(db)).id;
    admin = await signedIn(stack, await createPerson(db, { companyId, role: 'admin', issuer }));
    reader = await createPerson(db, { companyId, role: 'owner', issuer, name: 'Rhea Reader' });
    tank = await createTank(db, { companyId, name: 'Queued reef', owners: [reader] });
  });
  afterAll(() => stack.close());

  const tipTo = async (title: string) => {
    const res = await admin.post<CareTip>('/api/care-tips', {
      title,
      body: 'Switch off at the wall first.',
      category: 'safety',
      audience: { kind: 'tanks', tankIds: [tank.id] },
    });
    expect(res.status).toBe(201);
    return res.body;
  };
  const emailed = (subject: string) => stack.mail.waitFor((m) => m.subject === subject, 60_000);

  it('queues the fan-out with the delivery, and the workers notify and e-mail the owner', async () => {
    const tip = await tipTo('Queued now');

    expect((await admin.post(`/api/care-tips/${tip.id}/send`, { at: null })).status).toBe(200);

    const mail = await emailed('Care tip: Queued now');
    expect(mail.to).toContain(reader.email);
    const told = await stack.database.db.select().from(notifications).where(eq(notifications.tipId, tip.id));
    expect(told.map((n) => n.userId)).toEqual([reader.id]);
  }, 120_000);

  it('sends a scheduled tip through its job when its time comes', async () => {
    const tip = await tipTo('Queued for later');
    const at = new Date(Date.now() + 3_000);

    const scheduled = await admin.post<CareTip>(`/api/care-tips/${tip.id}/send`, { at: at.toISOString() });
    expect(scheduled.body.status).toBe('scheduled');

    await emailed('Care tip: Queued for later');
    const sent = await admin.get<CareTip>(`/api/care-tips/${tip.id}`);
    expect(sent.body).toMatchObject({ status: 'sent', reached: { tanks: 1, owners: 1 } });
    expect(Date.parse(sent.body.sentAt!)).toBeGreaterThanOrEqual(at.getTime());
    // The job was queued with the schedule, to start at its time.
    const jobs = await stack.database.pool.query<{ start_after: Date }>(
      `select start_after from pgboss.job where name = 'tip-send' and data->>'tipId' = $1`,
      [tip.id],
    );
    expect(jobs.rows.map((job) => job.start_after.getTime())).toEqual([at.getTime()]);
  }, 120_000);
});
