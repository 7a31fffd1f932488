/*
 * The demo's care tips: advice the company sent its clients over the past months, in its own words,
 * and one seasonal tip set to go out soon. Rows are written as sending left them (each tank reached
 * once, its owners recorded as readers); past tips were announced when they went out, so nothing is
 * sent at seed time, and the scheduled one goes out through the minute sweep once its time comes.
 * Every row is keyed by `demoId`, so a second run updates in place.
 */
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { TipAudience, TipCategory, TipTrigger } from '@shared/schemas/care-tips';
import type { Db } from '../../db/client';
import { careTipHelpful, careTipReaders, careTips, careTipTanks, tanks } from '../../db/schema/index';
import { demoId, demoTankId } from './ids';
import { demoTanks, type DemoTankKey } from './scenario';

const dayMs = 86_400_000;

interface DemoTip {
  key: string;
  title: string;
  category: TipCategory;
  /** Markdown, as staff typed it. */
  body: string;
  audience: TipAudience | { kind: 'tanks'; tanks: DemoTankKey[] };
  suggestWhen?: TipTrigger[];
  /** Identity of who wrote it. */
  by: string;
  /** Days before now it went out (and the tanks it reached then); negative: still scheduled. */
  sentDaysAgo: number;
  reached?: DemoTankKey[];
  /** Owners (by identity) who marked it helpful. */
  helpfulBy?: string[];
}

const marineTanks: DemoTankKey[] = ['ashdown-reef', 'quayside-reef', 'saltfig-lagoon'];
const everyTank = demoTanks.map((tank) => tank.key);

/*
 * Rules of thumb in these tips are common practice in reef and freshwater keeping; they stay out of
 * the words owners read (see the 2026-12-02 decision on sources), so they are marked here.
 */
export const demoTips: readonly DemoTip[] = [
  {
    // Evaporation leaves the salt behind, so topping up with salt water raises salinity: common practice.
    key: 'top-up-fresh',
    title: 'Top up with fresh water, not salt water',
    category: 'maintenance',
    body: [
      'Water leaves the tank as it evaporates, but the salt stays behind. Top up with salt water and you add more salt every time, so the salinity creeps up week by week.',
      '',
      '- Top up with **fresh** water only: the purified water we recommended for your tank.',
      '- Little and often is better than a bucketful at once; the auto top-off does exactly that.',
      '- Salt water is for water changes, after the same amount of tank water has been taken out.',
      '',
      'If the top-off reservoir runs dry, send us a message: the salinity starts to rise within a few days.',
    ].join('\n'),
    audience: { kind: 'tanks', tanks: marineTanks },
    by: 'u-mara',
    sentDaysAgo: 150,
    reached: marineTanks,
    helpfulBy: ['u-helen', 'u-rosa'],
  },
  {
    // Bubble-tip anemones wander until settled and sting neighbouring corals: common practice.
    key: 'anemone-reach',
    title: 'Give your anemone room',
    category: 'livestock',
    body: [
      'An anemone moves about until it finds a spot it likes, and its tentacles sting whatever they touch: corals within reach, and sometimes fish that are not its partners.',
      '',
      '- Leave a hand’s width of bare rock around it, more on the side the current pushes it towards.',
      '- Keep a guard over pump intakes; an anemone that wanders into one is hurt and can foul the water.',
      '- If it settles against a coral, tell us rather than moving it yourself: its foot tears easily.',
      '',
      '::: caution',
      'Anemones sting. Wear gloves if your hands must go near one, and wash your hands afterwards.',
      ':::',
    ].join('\n'),
    audience: { kind: 'species', speciesId: 'bubble-tip-anemone' },
    suggestWhen: [{ on: 'livestock-added', group: 'anemone' }],
    by: 'u-tomas',
    sentDaysAgo: 118,
    reached: ['ashdown-reef'],
  },
  {
    key: 'switch-off-at-the-wall',
    title: 'Switch off at the wall before your hands go in',
    category: 'safety',
    body: [
      'Before you put a hand in the tank, switch the heater, pumps and lights off **at the wall socket**, not only on the controller. Unplug with dry hands.',
      '',
      'When you are done, dry your hands and arms first, then switch everything back on. Wait until the heater is back under water before you switch it on.',
      '',
      '::: caution',
      'Water and electricity do not mix. If a socket, plug or power board is wet, scorched or keeps tripping, do not touch it: switch off at the main switch if you can reach it safely, and call a licensed electrician. Wiring near a tank must follow your local codes, and it is not work we do.',
      ':::',
    ].join('\n'),
    audience: { kind: 'all' },
    by: 'u-mara',
    sentDaysAgo: 95,
    reached: everyTank,
    helpfulBy: ['u-felix'],
  },
  {
    // A drip loop keeps water running down a cable from reaching the plug: common practice.
    key: 'drip-loops',
    title: 'A drip loop below every socket',
    category: 'equipment',
    body: [
      'A drip loop is a dip in a cable below the socket it plugs into. Water running down the cable drips off at the bottom of the loop instead of running into the plug.',
      '',
      '- Every cable from the tank should hang below its socket before rising to it.',
      '- Keep power boards off the floor and away from splashes; fixed to the cabinet wall is best.',
      '- A cable too short to make a loop is one to show us at the next visit, not one to stretch.',
      '',
      '::: caution',
      'Never plug in or unplug anything with wet hands, and never use a power board that has been wet. New sockets or wiring near a tank are a job for a licensed electrician, under your local codes.',
      ':::',
    ].join('\n'),
    audience: { kind: 'equipment', equipmentKind: 'power-board' },
    by: 'u-priya',
    sentDaysAgo: 60,
    reached: everyTank,
  },
  {
    // Handled soft corals release compounds that irritate their neighbours; a partial water change
    // and fresh carbon afterwards are common practice, as are gloves and eye protection.
    key: 'water-change-after-corals',
    title: 'A water change after corals have been handled',
    category: 'livestock',
    body: [
      'Corals defend themselves with chemicals, and moving, cutting or brushing against them puts more than usual into the water. Soft corals such as leathers are known for it.',
      '',
      'After rockwork or coral work we change part of the water and run fresh carbon for a few days. If you ever move a coral yourself:',
      '',
      '1. Wear gloves, and keep your face away from the water.',
      '2. Change about a fifth of the water the same day.',
      '3. Watch the other corals for a day: polyps that stay closed are worth a message to us.',
      '',
      '::: caution',
      'Some soft corals and zoanthids carry toxins. Wear gloves and eye protection, and never cut or scrape them out of the water.',
      ':::',
    ].join('\n'),
    audience: { kind: 'tanks', tanks: ['quayside-reef'] },
    suggestWhen: [{ on: 'visit-task', task: 'aquascape' }],
    by: 'u-priya',
    sentDaysAgo: 28,
    reached: ['quayside-reef'],
    helpfulBy: ['u-felix'],
  },
  {
    // Healthy adult fish go a few days without food more safely than they cope with overfeeding:
    // common practice.
    key: 'feeding-before-a-holiday',
    title: 'Feeding before a holiday',
    category: 'seasonal',
    body: [
      'Going away? Healthy adult fish cope with a few days without food far better than with too much of it.',
      '',
      '- Do not feed extra before you leave: what is not eaten spoils the water while nobody is watching.',
      '- Holiday feeding blocks dissolve unevenly and can cloud the water; ask us about a timed feeder or a visit instead.',
      '- If a neighbour will feed for you, put each day’s food in its own labelled pot, and leave them our number.',
      '- Tell us your dates: we can move a service visit to just before you go.',
    ].join('\n'),
    audience: { kind: 'all' },
    by: 'u-mara',
    sentDaysAgo: -12,
  },
];

export interface SeedTipsOptions {
  companyId: string;
  /** Ids of the demo people by their identity (`u-mara`…). */
  people: ReadonlyMap<string, string>;
  now: Date;
}

function audienceOf(tip: DemoTip): TipAudience {
  const audience = tip.audience;
  return audience.kind === 'tanks' && 'tanks' in audience
    ? { kind: 'tanks', tankIds: audience.tanks.map(demoTankId) }
    : (audience as TipAudience);
}

/** The tips, their reach and a few helpful marks, as sending and reading them left the rows. */
export async function seedDemoCareTips(db: Db, options: SeedTipsOptions): Promise<void> {
  const { companyId, people, now } = options;
  const owned = await db
    .select({ id: tanks.id })
    .from(tanks)
    .where(and(eq(tanks.companyId, companyId), inArray(tanks.id, everyTank.map(demoTankId))));
  if (owned.length === 0) return;
  const moment = (daysAgo: number) => new Date(now.getTime() - daysAgo * dayMs);

  const tipRows = demoTips.map((tip) => {
    const sent = tip.sentDaysAgo >= 0;
    return {
      id: demoId(`care-tip:${tip.key}`),
      companyId,
      title: tip.title,
      body: tip.body,
      category: tip.category,
      photoId: null,
      audience: audienceOf(tip),
      suggestWhen: tip.suggestWhen ?? [],
      status: sent ? ('sent' as const) : ('scheduled' as const),
      sendAt: sent ? null : moment(tip.sentDaysAgo),
      sentAt: sent ? moment(tip.sentDaysAgo) : null,
      withdrawnAt: null,
      createdBy: people.get(tip.by)!,
      // Written a couple of days before it went out (or before today, for the one still to go).
      createdAt: moment(Math.max(tip.sentDaysAgo, 0) + 2),
    };
  });
  const reachRows = demoTips.flatMap((tip) =>
    (tip.reached ?? []).map((tank) => ({
      tipId: demoId(`care-tip:${tip.key}`),
      tankId: demoTankId(tank),
      deliveredAt: moment(tip.sentDaysAgo),
      sentBy: people.get(tip.by)!,
    })),
  );
  const readerRows = demoTips.flatMap((tip) =>
    (tip.reached ?? []).flatMap((tank) =>
      demoTanks
        .find((spec) => spec.key === tank)!
        .owners.map((owner) => ({
          tipId: demoId(`care-tip:${tip.key}`),
          tankId: demoTankId(tank),
          userId: people.get(owner)!,
        })),
    ),
  );
  const helpfulRows = demoTips.flatMap((tip) =>
    (tip.helpfulBy ?? []).map((owner) => ({
      tipId: demoId(`care-tip:${tip.key}`),
      userId: people.get(owner)!,
    })),
  );

  await db.transaction(async (tx) => {
    await tx
      .insert(careTips)
      .values(tipRows)
      .onConflictDoUpdate({
        target: careTips.id,
        set: {
          title: sql`excluded.title`,
          body: sql`excluded.body`,
          category: sql`excluded.category`,
          photoId: sql`excluded.photo_id`,
          audience: sql`excluded.audience`,
          suggestWhen: sql`excluded.suggest_when`,
          status: sql`excluded.status`,
          sendAt: sql`excluded.send_at`,
          sentAt: sql`excluded.sent_at`,
          withdrawnAt: sql`excluded.withdrawn_at`,
          createdBy: sql`excluded.created_by`,
          createdAt: sql`excluded.created_at`,
        },
      });
    await tx
      .insert(careTipTanks)
      .values(reachRows)
      .onConflictDoUpdate({
        target: [careTipTanks.tipId, careTipTanks.tankId],
        set: { deliveredAt: sql`excluded.delivered_at`, sentBy: sql`excluded.sent_by` },
      });
    await tx.insert(careTipReaders).values(readerRows).onConflictDoNothing();
    await tx.insert(careTipHelpful).values(helpfulRows).onConflictDoNothing();
  });
}
