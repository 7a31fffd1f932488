/*
 * The demo's service visits: months of published reports written by each tank's technician, and the
 * schedule from today on. The reports carry the scenario's stories on: the living-room reef's doser
 * running dry during a cancelled fortnight, its anemone taken out at the owner's request after it
 * stung the hammer coral, the waiting-room reef's failed heater and its rescape over two visits, the
 * restaurant's weekly Monday service (the one repeating series), and the kids' river tank left past
 * its service interval. Days count back from the seed's "now" like the rest of the scenario, and
 * every row is keyed by `demoId`, so a second run updates in place.
 */
import { and, asc, eq, getTableColumns, gte, inArray, sql } from 'drizzle-orm';
import type { PgTable } from 'drizzle-orm/pg-core';
import { addDays } from '@shared/schemas/equipment';
import { tankStyleWaterType } from '@shared/parameters/limit-templates';
import type { ManualReadingInput } from '@shared/schemas/readings';
import {
  visitReportContent,
  type EquipmentCheckState,
  type PhotoPhase,
  type VisitKind,
  type VisitReportContent,
  type VisitReportInput,
  type VisitTask,
} from '@shared/schemas/visits';
import { occurrenceDays, routineRule, wallTimeOf, zonedWindow } from '@shared/visits/recurrence';
import type { Db } from '../../db/client';
import {
  companies,
  livestock,
  livestockStatusEvents,
  photos,
  readings,
  tanks,
  visitItems,
  visitPhotos,
  visitReportVersions,
  visits,
  visitSeries,
} from '../../db/schema/index';
import { demoId, demoLivestockId, demoTankId } from './ids';
import { demoEquipment, demoTanks, type DemoTankKey } from './scenario';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

const minuteMs = 60_000;
const dayMs = 86_400_000;

/** What the technician wrote; times, readings, ticked items and photos are filled in when seeding. */
type ReportText = Omit<
  VisitReportInput,
  'arrivedAt' | 'departedAt' | 'readings' | 'closedItemIds' | 'photos'
>;

interface PlannedReport {
  /** Unique within the tank; the row's id is made from it. */
  key: string;
  kind: VisitKind;
  /** Calendar days before today, in the tank's zone. */
  daysAgo: number;
  /** The planned window, as wall times in the tank's zone. */
  window: readonly [string, string];
  /** An urgent call: arrived this long before the moment `daysAgo` before now, left this long after. */
  around?: { daysAgo: number; minutesBefore: number; minutesAfter: number };
  /** The visit readings the seed took that day (readings.ts) set the arrival and departure. */
  timedByReadings?: boolean;
  text: ReportText;
  /** Items of earlier reports of the tank this one ticks off, as "<report key>#<index>". */
  closes?: readonly string[];
  /** Demo photos (by their key in photos.ts) the report shows. */
  photos?: readonly { key: string; phase: PhotoPhase }[];
  /** Autosaves before publishing: the report's version. */
  saves: number;
  /** Published first with this text and corrected the next morning. */
  firstText?: ReportText;
}

interface PlannedVisit {
  key: string;
  kind: VisitKind;
  /** Calendar days before today (negative: ahead). */
  daysAgo: number;
  window: readonly [string, string];
  status: 'scheduled' | 'cancelled';
  note: string;
}

interface TankPlan {
  tank: DemoTankKey;
  reports: PlannedReport[];
  visits: PlannedVisit[];
  /** A repeating routine service on one weekday (0 = Sunday), from the next such day on. */
  series?: { weekday: number; window: readonly [string, string]; weeksAhead: number };
}

function tankSpec(key: DemoTankKey) {
  return demoTanks.find((tank) => tank.key === key)!;
}

/** Helpers to write one tank's reports with its own volume and equipment. */
function writerFor(key: DemoTankKey) {
  const spec = tankSpec(key);
  const systemL = spec.displayVolumeL + spec.sumpVolumeL;
  const saltwater = tankStyleWaterType[spec.style] !== 'fresh';
  return {
    change: (percent: number) => ({
      percent,
      litres: Math.round((systemL * percent) / 10) / 10,
      // New saltwater is mixed to the tank's usual salinity (common practice: 35 ppt for reef and marine).
      newSalinityPpt: saltwater ? 35 : null,
    }),
    check: (equipmentKey: string, note?: string, state: EquipmentCheckState = 'ok') => {
      if (!demoEquipment[key].some((item) => item.key === equipmentKey)) {
        throw new Error(`${key} has no equipment "${equipmentKey}" in the scenario`);
      }
      return { equipmentId: demoId(`equipment:${key}:${equipmentKey}`), state, ...(note ? { note } : {}) };
    },
  };
}

/** Markdown lines; `false` leaves a line out, '' keeps a blank one. */
const lines = (...parts: (string | false)[]) =>
  parts.filter((part): part is string => part !== false).join('\n');

function ashdownReef(): TankPlan {
  const { change, check } = writerFor('ashdown-reef');
  const tasks: VisitTask[] = [
    'water-change',
    'skimmer-cup',
    'filter-media',
    'glass',
    'dosing-refill',
    'equipment-check',
  ];
  const alkalinity = { container: 'Alkalinity container (doser channel 1)', amountMl: 1500 };
  const calcium = { container: 'Calcium container (doser channel 2)', amountMl: 1500 };
  const usual = [check('return'), check('skimmer'), check('heater'), check('ato'), check('doser')];
  const routine = (daysAgo: number, notes: string, text: Partial<ReportText> = {}): PlannedReport => ({
    key: `routine-${daysAgo}`,
    kind: 'routine',
    daysAgo,
    window: ['09:30', '11:30'],
    saves: 3 + (daysAgo % 4),
    text: {
      tasksDone: tasks,
      waterChange: change(10),
      dosingRefills: [alkalinity, calcium],
      equipmentChecks: usual,
      notes,
      ...text,
    },
  });
  const basics = '- Skimmer cup emptied, new filter socks in the sump, glass cleaned.';
  return {
    tank: 'ashdown-reef',
    reports: [
      routine(
        117,
        lines(
          'Routine service.',
          '',
          '- Skimmer cup about half full: emptied it and wiped the neck.',
          '- New filter socks in the sump.',
          '- Glass cleaned inside and out. A little green film on the back glass is left for the snails.',
          '',
          'Everyone out and feeding when I gave a small pinch of pellets.',
        ),
      ),
      routine(
        103,
        lines(
          'Routine service.',
          '',
          basics,
          '- Refilled the calcium container. The alkalinity container looked about a third full, so I left it; the level is hard to see with the cabinet door half open.',
        ),
        { dosingRefills: [calcium] },
      ),
      {
        ...routine(
          75,
          lines(
            '## Alkalinity',
            '',
            "Helen's home tests showed alkalinity falling for three weeks. The alkalinity container had run dry: I misread its level at the last visit, and the visit after it was cancelled.",
            '',
            '- Refilled both containers and drew a fill line on the outside of each, so the level can be read without opening the cabinet.',
            '- Dosed part of the shortfall by hand to start bringing alkalinity back up. Raising it in steps is easier on the corals than all at once (common practice).',
            '',
            'Helen: please test alkalinity every other day for the next two weeks.',
            '',
            '## Routine',
            '',
            basics,
          ),
          {
            equipmentChecks: [
              check('return'),
              check('skimmer'),
              check('heater'),
              check('ato'),
              check(
                'doser',
                'Pump fine; the alkalinity container had run dry. Both containers now have a fill line.',
              ),
            ],
            nextItems: ['Check that alkalinity has settled after the hand dose'],
          },
        ),
        key: 'alkalinity',
      },
      {
        ...routine(
          61,
          lines(
            "Alkalinity went a little high after the hand dose and has been coming back down since, going by Helen's tests. Left the doser at its usual rate.",
            '',
            '- Took the return pump apart and cleaned the impeller and housing.',
            basics,
          ),
          {
            equipmentChecks: [
              check('return', 'Impeller and housing cleaned.'),
              check('skimmer'),
              check('heater'),
              check('ato'),
              check('doser'),
            ],
          },
        ),
        closes: ['alkalinity#0'],
      },
      routine(
        47,
        lines(
          '- Took both wavemakers off the glass and brushed the impellers and cages clean.',
          basics,
          '',
          'The montipora is spreading along the upper shelf; it still has room.',
        ),
        {
          equipmentChecks: [
            ...usual,
            check('wave-left', 'Impeller and cage cleaned.'),
            check('wave-right', 'Impeller and cage cleaned.'),
          ],
        },
      ),
      routine(33, lines('- Checked the heater against my thermometer: they agree within 0.2 °C.', basics), {
        equipmentChecks: [
          check('return'),
          check('skimmer'),
          check('heater', 'Agrees with my thermometer.'),
          check('ato'),
          check('doser'),
        ],
      }),
      routine(
        19,
        lines(
          '- Cleaned the top-off float switch: a crust of coralline algae was starting on it and could make it stick.',
          basics,
          '',
          'Pip and Dot spend most of the day in the anemone now.',
        ),
        {
          equipmentChecks: [
            check('return'),
            check('skimmer'),
            check('heater'),
            check('ato', 'Float switch cleaned.'),
            check('doser'),
          ],
        },
      ),
      {
        ...routine(
          5,
          lines(
            '## The anemone',
            '',
            'Helen asked us to take the bubble-tip anemone out after it wandered onto the hammer coral last week. Its foot was wedged in a crack between the centre and right-hand rock, right beside the hammer.',
            '',
            '- Switched the return pump and both wavemakers off at the boards before putting my hands in the water.',
            '- Gloves on: anemones sting.',
            '- Tilted the centre rock a little to reach the foot and eased it free slowly with a fingertip. Pulling can tear an anemone’s foot, so this takes patience.',
            '- It went into a bag of tank water and is now in our holding tank, until a client with a tank that suits it takes it.',
            '',
            'The hammer coral had to be handled to get at the anemone, and corals release slime when handled, so the water change came after the livestock work, and a larger one than usual (common practice). The hammer heads nearest the spot are still pulled in; they should open again over the next days now that nothing stings them.',
            '',
            'Pip and Dot hid for a while and were back out swimming before I left.',
            '',
            '## Routine',
            '',
            basics,
            '- New tubing on both doser channels.',
          ),
          {
            tasksDone: ['livestock', ...tasks],
            waterChange: change(15),
            equipmentChecks: [
              check('return'),
              check('skimmer'),
              check('heater'),
              check('ato'),
              check('doser', 'New tubing on both channels.'),
            ],
            livestockChanges: [
              {
                action: 'remove',
                livestockId: demoLivestockId('ashdown-reef', 'anemone'),
                note: "Taken out at Helen's request after it wandered onto the hammer coral; now in our holding tank.",
              },
            ],
            nextItems: ["Look at the hammer coral's heads nearest where the anemone sat"],
          },
        ),
        key: 'anemone',
        photos: [{ key: 'ashdown-reef:anemone', phase: 'before' }],
      },
    ],
    visits: [
      {
        key: 'cancelled-89',
        kind: 'routine',
        daysAgo: 89,
        window: ['09:30', '11:30'],
        status: 'cancelled',
        note: 'The family was away; Helen cancelled this visit.',
      },
      {
        key: 'hammer-check',
        kind: 'livestock',
        daysAgo: 0,
        window: ['16:30', '17:15'],
        status: 'scheduled',
        note: 'A look at the hammer coral now the anemone is gone; Helen would like a photo of it.',
      },
      {
        key: 'routine-next',
        kind: 'routine',
        daysAgo: -9,
        window: ['09:30', '11:30'],
        status: 'scheduled',
        note: '',
      },
    ],
  };
}

function quaysideReef(): TankPlan {
  const { change, check } = writerFor('quayside-reef');
  const tasks: VisitTask[] = ['water-change', 'skimmer-cup', 'glass', 'equipment-check'];
  const usual = [
    check('return'),
    check('skimmer'),
    check('heater-1'),
    check('heater-2'),
    check('chiller'),
    check('wave'),
    check('ato'),
  ];
  const routine = (
    daysAgo: number,
    notes: string,
    { carbon = false, ...text }: Partial<ReportText> & { carbon?: boolean } = {},
  ): PlannedReport => ({
    key: `routine-${daysAgo}`,
    kind: 'routine',
    daysAgo,
    // The clinic wants visits before 08:30 or after 18:00.
    window: ['07:00', '08:25'],
    saves: 2 + (daysAgo % 5),
    text: {
      tasksDone: carbon ? [...tasks, 'filter-media'] : tasks,
      waterChange: change(10),
      equipmentChecks: carbon ? [...usual, check('reactor', 'Fresh carbon.')] : usual,
      notes,
      ...text,
    },
  });
  const basics = '- Skimmer cup emptied, glass cleaned.';
  return {
    tank: 'quayside-reef',
    reports: [
      routine(
        101,
        lines(
          'Routine service before the clinic opened.',
          '',
          '- Changed the carbon in the reactor.',
          basics,
          '',
          'The leather coral is shedding its waxy skin, as it does every few weeks. Wafted it off with a turkey baster so the skimmer and the filter socks can take it out.',
        ),
        { carbon: true },
      ),
      routine(
        87,
        lines(
          "- Cleaned the chiller's air filter. A box of leaflets was stacked against the vents again; moved it and put a note on the cabinet.",
          basics,
        ),
        {
          equipmentChecks: usual.map((item) =>
            item.equipmentId === check('chiller').equipmentId
              ? check('chiller', 'Air filter cleaned, vents cleared.')
              : item,
          ),
        },
      ),
      routine(
        73,
        lines('- Changed the carbon in the reactor.', basics, '', 'All seven chromis out at feeding time.'),
        { carbon: true },
      ),
      routine(59, lines('- Cleaned the top-off float switch and refilled the reservoir.', basics), {
        equipmentChecks: usual.map((item) =>
          item.equipmentId === check('ato').equipmentId ? check('ato', 'Float switch cleaned.') : item,
        ),
      }),
      routine(
        45,
        lines(
          '- Changed the carbon in the reactor.',
          '- Checked both heaters against my thermometer: both heating, within 0.3 °C of each other.',
          basics,
        ),
        { carbon: true },
      ),
      {
        key: 'heater',
        kind: 'urgent',
        daysAgo: 41,
        window: ['07:00', '08:25'],
        // readings.ts: the heater failed off 41 days ago and the new one went in 20 hours later.
        around: { daysAgo: 41 - 20 / 24, minutesBefore: 50, minutesAfter: 40 },
        saves: 4,
        text: {
          tasksDone: ['equipment-check'],
          equipmentChecks: [
            check('heater-1', 'Failed off overnight. New 300 W heater on the same outlet (A3).', 'replaced'),
            check('heater-2', 'Working, but one heater cannot hold this tank on its own in a cold room.'),
          ],
          notes: lines(
            '## Urgent call: the water was cold',
            '',
            'Felix rang: the fish were sluggish and the water felt cold. The controller showed about 21 °C.',
            '',
            '- The heater on outlet A3 had failed off overnight. Switched it off at board A and unplugged it with dry hands before lifting it out of the sump.',
            '- Fitted a new 300 W heater on the same outlet. The second heater (A4) works, but cannot keep this tank warm on its own in a cold room.',
            '- Did not try to warm the water fast: it comes back up over the next few hours, which is easier on the fish and corals than a quick change (common practice).',
            '',
            'Everyone is accounted for. Felix: the tank will look quiet for a while and should be back to normal within a day.',
          ),
          nextItems: ['Check both heaters now that the new one has settled in'],
        },
      },
      {
        key: 'rescape',
        kind: 'aquascaping',
        daysAgo: 31,
        window: ['18:15', '21:45'],
        saves: 6,
        closes: ['heater#0'],
        text: {
          tasksDone: ['aquascape', 'water-change', 'glass', 'equipment-check'],
          waterChange: change(20),
          equipmentChecks: [
            check('return'),
            check('heater-1', 'New heater holding temperature.'),
            check('heater-2'),
            check('wave'),
          ],
          notes: lines(
            '## Rescape, part one',
            '',
            'Felix asked for more open water at the front, and the right-hand rock had started to lean. Switched the return pump and the wavemakers off at boards A and B before starting.',
            '',
            '- Took the torch and frogspawn corals off the right-hand rock and set them on the sand bed, well apart.',
            '- Rebuilt that rock as two lower, wider arches standing on the glass, not on the sand, so they cannot slip. The base rock is heavy, so it came out and went back in pieces. Joined the pieces with reef-safe epoxy putty.',
            '- The left-hand and centre rock are as they were.',
            '',
            'The putty needs a day or two to cure before corals go on it, so the two corals stay on the sand until the next visit. Gloves and eye protection on throughout: the leather and the mushrooms carry toxins.',
            '',
            'Changed 20 % of the water at the end to take out the detritus the rock work stirred up.',
          ),
          nextItems: ['Finish placing the corals on the new rockwork'],
        },
      },
      {
        key: 'rescape-corals',
        kind: 'aquascaping',
        daysAgo: 28,
        window: ['18:15', '19:45'],
        saves: 3,
        closes: ['rescape#0'],
        text: {
          tasksDone: ['aquascape', 'livestock', 'water-change'],
          waterChange: change(10),
          livestockChanges: [
            {
              action: 'move',
              livestockId: demoLivestockId('quayside-reef', 'torch'),
              placement: 'Right rock, 25 cm above the frogspawn',
            },
            {
              action: 'move',
              livestockId: demoLivestockId('quayside-reef', 'frogspawn'),
              placement: 'Right rock, low',
            },
          ],
          notes: lines(
            '## Rescape, part two',
            '',
            'The putty had cured and the new arches did not move when I pushed on them, so the corals went back on.',
            '',
            '- **Torch coral**: on the upper shelf of the right-hand arch, where it gets plenty of light without sitting right under the fixture, and in the gentler edge of the wavemakers’ flow, so its tentacles sway without being blown flat.',
            '- **Frogspawn coral**: low on the same arch, 25 cm below and to the side of the torch, in steady flow. Both put out long stinging sweeper tentacles at night, so the gap is wider than either reaches.',
            '- Nothing else sits within their reach: the leather stays on the centre rock and the brain coral on the sand at the front.',
            '',
            'Handling corals makes them release slime, so I changed 10 % of the water at the end (common practice). Gloves on again.',
          ),
        },
      },
      routine(
        17,
        lines(
          '- Changed the carbon in the reactor.',
          basics,
          '',
          'The new arches are steady. Torch and frogspawn are both fully open, with a clear gap between them.',
        ),
        { carbon: true },
      ),
      routine(
        3,
        lines(
          basics,
          '- Refilled the top-off reservoir.',
          '',
          'Chiller vents clear. It is due a proper service; booked an early visit for it this week.',
        ),
        { nextItems: ['Service the chiller: clean the coils and the air filter'] },
      ),
    ],
    visits: [
      {
        key: 'chiller',
        kind: 'equipment',
        daysAgo: -4,
        window: ['07:30', '08:25'],
        status: 'scheduled',
        note: 'Chiller service: coils and air filter. Reception has the cabinet key.',
      },
      {
        key: 'routine-next',
        kind: 'routine',
        daysAgo: -11,
        window: ['07:00', '08:25'],
        status: 'scheduled',
        note: '',
      },
    ],
  };
}

function ashdownRiver(): TankPlan {
  const { change, check } = writerFor('ashdown-river');
  const routine = (daysAgo: number, extra: string, text: Partial<ReportText> = {}): PlannedReport => ({
    key: `routine-${daysAgo}`,
    kind: 'routine',
    daysAgo,
    // After school, when the children can watch.
    window: ['15:30', '16:30'],
    saves: 2 + (daysAgo % 3),
    text: {
      tasksDone: ['water-change', 'filter-media', 'glass', 'equipment-check'],
      waterChange: change(25),
      equipmentChecks: [check('filter'), check('heater'), check('light')],
      notes: lines(
        'Switched the heater and filter off at the board before putting my hands in, and back on with dry hands afterwards.',
        '',
        '- Changed 25 % with dechlorinated tap water at the same temperature as the tank.',
        '- Rinsed the filter sponge in the tank water I took out, not under the tap, so the useful bacteria on it survive (common practice).',
        '- Cleaned the glass and the underside of the lid.',
        '',
        extra,
        '',
        'Lid back on: the cat.',
      ),
      ...text,
    },
  });
  return {
    tank: 'ashdown-river',
    reports: [
      routine(109, 'The neons are schooling well.'),
      routine(88, 'Trimmed the old leaves off the java fern and the anubias.'),
      routine(67, 'Captain Whiskers keeps the driftwood spotless.'),
      routine(
        46,
        'The platys are breeding: a few fry are hiding in the java fern. The other fish will eat most of them, which is normal in a community tank.',
      ),
      routine(
        25,
        lines(
          'One platy has clamped fins and stays near the surface; the others look well. Helen will do a small extra water change at the weekend: I left the conditioner and a marked bucket under the cabinet.',
        ),
        { nextItems: ['Check the platy that had clamped fins'] },
      ),
    ],
    visits: [
      {
        key: 'cancelled-4',
        kind: 'routine',
        daysAgo: 4,
        window: ['15:30', '16:30'],
        status: 'cancelled',
        note: 'The family was away; Helen cancelled this visit and took the next free afternoon.',
      },
      {
        key: 'catch-up',
        kind: 'routine',
        daysAgo: -2,
        window: ['15:30', '16:30'],
        status: 'scheduled',
        note: 'Catching up after the cancelled visit.',
      },
    ],
  };
}

/** Weekly on Mondays: the restaurant is closed then. */
function saltfigLagoon(today: string): TankPlan {
  const { change, check } = writerFor('saltfig-lagoon');
  const weekday = new Date(`${today}T00:00:00Z`).getUTCDay();
  const lastMondayAgo = (weekday + 6) % 7 || 7;
  const uvWorn = 'Lamp near the end of its life; a new one is on order.';
  const reports = Array.from({ length: 12 }, (_, index): PlannedReport => {
    const week = index + 1;
    const daysAgo = lastMondayAgo + 7 * index;
    const socks = week % 2 === 0;
    return {
      key: `week-${week}`,
      kind: 'routine',
      daysAgo,
      window: ['09:00', '11:00'],
      saves: 2 + (week % 4),
      closes: week === 3 ? ['week-4#0'] : [],
      text: {
        tasksDone: [
          'water-change',
          'skimmer-cup',
          'glass',
          'equipment-check',
          ...(socks ? (['filter-media'] as const) : []),
        ],
        waterChange: change(10),
        equipmentChecks: [
          check('return'),
          check('skimmer'),
          week <= 3 ? check('uv', uvWorn, 'needs-attention') : check('uv'),
          check('heater'),
          check('chiller'),
          check('wave'),
        ],
        notes: lines(
          'Monday service, restaurant closed.',
          '',
          '- Skimmer cup emptied.',
          socks && '- New filter socks in the plant-room sump.',
          '- Glass cleaned inside and out, keeping my hands well away from Duchess: lionfish spines are venomous.',
          '- Fed frozen food from the labelled box in the bar freezer and watched everyone eat.',
          week === 4 && '- One clip on the sump lid is cracked; bringing a new one next week.',
          week === 3 && '- Fitted a new clip on the sump lid.',
          week === 3 && '- The UV lamp is near the end of its life; ordered a new one.',
          week === 6 &&
            '- Reminded the bar staff: no food from the kitchen, only the frozen food in the labelled box.',
          // The blue tang fell sick 21 days ago and was better 6 days ago (scenario.ts).
          daysAgo >= 7 &&
            daysAgo <= 20 &&
            '\nThe blue tang still has white spots on its fins but is eating. Keeping the water steady and watching it.',
          daysAgo <= 5 &&
            '\nThe blue tang’s spots have gone and it is eating well; still watching for them coming back.',
        ),
        nextItems:
          week === 4
            ? ['Replace the cracked clip on the sump lid']
            : week === 3
              ? ['Fit the new UV lamp when it arrives']
              : [],
      },
    };
  });
  return {
    tank: 'saltfig-lagoon',
    reports,
    visits: [
      {
        key: 'uv-lamp',
        kind: 'equipment',
        // Two days ahead, or three when that is a Monday and the routine service is there anyway.
        daysAgo: (weekday + 2) % 7 === 1 ? -3 : -2,
        window: ['09:00', '09:45'],
        status: 'scheduled',
        note: 'Fit the new UV lamp. Plant room only, before the kitchen starts; the display stays closed.',
      },
    ],
    series: { weekday: 1, window: ['09:00', '11:00'], weeksAhead: 4 },
  };
}

function ferrousPlanted(): TankPlan {
  const { change, check } = writerFor('ferrous-planted');
  const tasks: VisitTask[] = ['water-change', 'aquascape', 'glass', 'dosing-refill', 'equipment-check'];
  const fertiliser = { container: 'Liquid fertiliser bottle beside the tank', amountMl: 500 };
  const usual = [check('filter'), check('heater'), check('light'), check('co2')];
  const trim = '- Trimmed the stem plants and cleared old leaves from the sword.';
  const water =
    '- Changed 30 % of the water: a planted tank with CO₂ and fertiliser does well on large regular changes (common practice).';
  const routine = (daysAgo: number, notes: string, text: Partial<ReportText> = {}): PlannedReport => ({
    key: `routine-${daysAgo}`,
    kind: 'routine',
    daysAgo,
    window: ['10:00', '11:30'],
    timedByReadings: true,
    saves: 3 + (daysAgo % 3),
    text: {
      tasksDone: tasks,
      waterChange: change(30),
      dosingRefills: [fertiliser],
      equipmentChecks: usual,
      notes,
      ...text,
    },
  });
  const corrected = routine(
    17,
    lines(
      trim,
      water,
      '- Refilled the fertiliser bottle.',
      '',
      'The harlequins are colouring up well.',
      '',
      '_Corrected the next morning: I had left out the fertiliser refill._',
    ),
  );
  return {
    tank: 'ferrous-planted',
    reports: [
      routine(101, lines(trim, water, '', 'The harlequins are schooling in the open water at the front.')),
      routine(
        87,
        lines(
          trim,
          '- The moss on the driftwood needed a trim; kept the cuttings out of the filter intake.',
          water,
        ),
      ),
      routine(73, lines(trim, water, '', 'All six Amano shrimp seen.')),
      routine(
        59,
        lines(
          trim,
          water,
          '- Cleaned the canister filter: rinsed the sponges in tank water and put in fresh fine floss.',
        ),
        {
          tasksDone: [...tasks, 'filter-media'],
          equipmentChecks: [
            check('filter', 'Sponges rinsed, fine floss replaced.'),
            check('heater'),
            check('light'),
            check('co2'),
          ],
        },
      ),
      routine(
        45,
        lines(trim, water, '- Scraped green spot algae off the front glass. Light timer still 10:00–18:00.'),
      ),
      routine(31, lines(trim, water, '- Swapped the CO₂ cylinder for the spare; Sam has ordered a refill.'), {
        equipmentChecks: [
          check('filter'),
          check('heater'),
          check('light'),
          check('co2', 'Cylinder swapped.'),
        ],
      }),
      {
        ...corrected,
        firstText: {
          ...corrected.text,
          tasksDone: tasks.filter((task) => task !== 'dosing-refill'),
          dosingRefills: [],
          notes: lines(trim, water, '', 'The harlequins are colouring up well.'),
        },
      },
      routine(
        3,
        lines(
          trim,
          water,
          '',
          'The CO₂ gauge already reads low: the cylinder will run out before its six weeks are up. Booked a visit to swap it.',
        ),
        {
          equipmentChecks: [
            check('filter'),
            check('heater'),
            check('light'),
            check('co2', 'Cylinder nearly empty.', 'needs-attention'),
          ],
          nextItems: ['Swap the CO₂ cylinder (the spare is in the store room)'],
        },
      ),
    ],
    visits: [
      {
        key: 'co2',
        kind: 'equipment',
        daysAgo: 0,
        window: ['10:00', '10:45'],
        status: 'scheduled',
        note: 'Swap the CO₂ cylinder.',
      },
      {
        key: 'routine-next',
        kind: 'routine',
        daysAgo: -11,
        window: ['10:00', '11:30'],
        status: 'scheduled',
        note: '',
      },
    ],
  };
}

/** The whole plan, as of `today` in the company's zone (the lagoon's Mondays depend on the weekday). */
function demoVisitPlans(today: string): TankPlan[] {
  return [ashdownReef(), ashdownRiver(), quaysideReef(), saltfigLagoon(today), ferrousPlanted()];
}

export const demoVisitId = (tank: DemoTankKey, key: string) => demoId(`visit:${tank}:${key}`);
export const demoVisitItemId = (tank: DemoTankKey, reference: string) =>
  demoId(`visit-item:${tank}:${reference}`);
export const demoVisitSeriesId = (tank: DemoTankKey) => demoId(`visit-series:${tank}`);

/** On conflict, every listed column takes the value of the row being inserted. */
function fromInserted(table: PgTable, keys: string[]) {
  const columns = getTableColumns(table) as Record<string, { name: string }>;
  return Object.fromEntries(keys.map((key) => [key, sql.raw(`excluded.${columns[key]!.name}`)]));
}

const roundDown = (at: number, step: number) => Math.floor(at / step) * step;
const roundUp = (at: number, step: number) => Math.ceil(at / step) * step;

export interface SeedVisitsOptions {
  companyId: string;
  /** Ids of the demo people by their identity (`u-tomas`…). */
  people: ReadonlyMap<string, string>;
  now: Date;
}

/**
 * Writes the plan as publishing and scheduling would have left it: published reports with their
 * versions, carried items and photos; the anemone's removal in its status history; each tank's last
 * visit; the repeating service and its next occurrences. Past reports were announced when published,
 * so nothing is sent at seed time. Rows someone changed in the running demo (a report started on a
 * planned visit) are left as they are.
 */
export async function seedDemoVisits(db: Db, options: SeedVisitsOptions): Promise<void> {
  const { companyId, people, now } = options;
  const tankRows = await db
    .select({
      id: tanks.id,
      zone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
    })
    .from(tanks)
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .where(
      and(
        eq(tanks.companyId, companyId),
        inArray(
          tanks.id,
          demoTanks.map((t) => demoTankId(t.key)),
        ),
      ),
    );
  if (tankRows.length === 0) return;
  const zoneOf = new Map(tankRows.map((row) => [row.id, row.zone]));
  const companyZone = tankRows[0]!.zone;
  const today = wallTimeOf(now, companyZone).day;
  const plans = demoVisitPlans(today).filter((plan) => zoneOf.has(demoTankId(plan.tank)));

  const photoKeys = plans.flatMap((plan) => [
    `${plan.tank}:cover`,
    ...plan.reports.flatMap((report) => report.photos?.map((photo) => photo.key) ?? []),
  ]);
  const storedPhotos = new Set(
    (
      await db
        .select({ id: photos.id })
        .from(photos)
        .where(
          inArray(
            photos.id,
            photoKeys.map((key) => demoId(`photo:${key}`)),
          ),
        )
    ).map((row) => row.id),
  );
  const earliest = Math.max(...plans.flatMap((plan) => plan.reports.map((report) => report.daysAgo))) + 2;
  const visitReadings = await db
    .select({
      tankId: readings.tankId,
      parameter: readings.parameter,
      value: readings.enteredValue,
      unit: readings.enteredUnit,
      measuredAt: readings.measuredAt,
      method: readings.method,
      note: readings.note,
    })
    .from(readings)
    .where(
      and(
        inArray(readings.tankId, [...zoneOf.keys()]),
        eq(readings.source, 'visit'),
        gte(readings.measuredAt, new Date(now.getTime() - earliest * dayMs)),
      ),
    )
    .orderBy(asc(readings.measuredAt), asc(readings.parameter));

  const visitRows: (typeof visits.$inferInsert)[] = [];
  const plannedRows: (typeof visits.$inferInsert)[] = [];
  const versionRows: (typeof visitReportVersions.$inferInsert)[] = [];
  const itemRows: (typeof visitItems.$inferInsert)[] = [];
  const photoRows: (typeof visitPhotos.$inferInsert)[] = [];
  const statusRows: (typeof livestockStatusEvents.$inferInsert)[] = [];
  const placements: { livestockId: string; placement: string }[] = [];
  const lastVisit = new Map<string, Date>();
  const seriesWork: {
    series: typeof visitSeries.$inferInsert;
    occurrences: (typeof visits.$inferInsert)[];
  }[] = [];

  for (const plan of plans) {
    const tankId = demoTankId(plan.tank);
    const zone = zoneOf.get(tankId)!;
    const technicianId = people.get(tankSpec(plan.tank).technician)!;
    const tankReadings = visitReadings.filter((reading) => reading.tankId === tankId);
    const published = new Map<string, { id: string; publishedAt: Date; content: VisitReportContent }>();
    const newestFirst = [...plan.reports].sort((a, b) => a.daysAgo - b.daysAgo);
    const newestKey = newestFirst[0]?.key;

    // Oldest first, so an item exists before the report that ticks it off.
    for (const report of [...newestFirst].reverse()) {
      const day = addDays(today, -report.daysAgo);
      let windowStart: Date;
      let windowEnd: Date;
      let arrival: Date;
      let departure: Date;
      const sameDay = report.timedByReadings
        ? tankReadings.filter((reading) => wallTimeOf(reading.measuredAt, zone).day === day)
        : [];
      if (report.around) {
        const moment = now.getTime() - report.around.daysAgo * dayMs;
        arrival = new Date(roundDown(moment - report.around.minutesBefore * minuteMs, minuteMs));
        departure = new Date(roundUp(moment + report.around.minutesAfter * minuteMs, minuteMs));
        [windowStart, windowEnd] = [arrival, departure];
      } else if (sameDay.length > 0) {
        // The water was tested a little after arriving; the water change and the rest came after.
        arrival = new Date(sameDay[0]!.measuredAt.getTime() - 25 * minuteMs);
        departure = new Date(sameDay.at(-1)!.measuredAt.getTime() + 65 * minuteMs);
        windowStart = new Date(roundDown(arrival.getTime() - 5 * minuteMs, 30 * minuteMs));
        windowEnd = new Date(roundUp(departure.getTime(), 30 * minuteMs));
      } else {
        const window = zonedWindow(day, report.window[0], report.window[1], zone);
        [windowStart, windowEnd] = [window.start, window.end];
        arrival = new Date(windowStart.getTime() + 5 * minuteMs);
        departure = new Date(windowEnd.getTime() - 10 * minuteMs);
      }
      const taken: ManualReadingInput[] = tankReadings
        .filter((reading) => reading.measuredAt >= arrival && reading.measuredAt <= departure)
        .map((reading) => ({
          parameter: reading.parameter,
          value: reading.value,
          unit: reading.unit,
          measuredAt: reading.measuredAt.toISOString(),
          ...(reading.method ? { method: reading.method } : {}),
          ...(reading.note ? { note: reading.note } : {}),
        }));
      const shownPhotos = [
        ...(report.photos ?? []),
        ...(report.key === newestKey ? [{ key: `${plan.tank}:cover`, phase: 'after' as const }] : []),
      ]
        .map((photo) => ({ photoId: demoId(`photo:${photo.key}`), phase: photo.phase }))
        .filter((photo) => storedPhotos.has(photo.photoId));
      const write = (text: ReportText) =>
        visitReportContent.parse({
          ...text,
          // A report only says the water was tested when it lists what was measured.
          tasksDone: taken.length > 0 ? ['water-test', ...(text.tasksDone ?? [])] : text.tasksDone,
          arrivedAt: arrival.toISOString(),
          departedAt: departure.toISOString(),
          readings: taken,
          closedItemIds: (report.closes ?? []).map((reference) => demoVisitItemId(plan.tank, reference)),
          photos: shownPhotos,
        });
      const content = write(report.text);
      const id = demoVisitId(plan.tank, report.key);
      const publishedAt = new Date(departure.getTime() + 12 * minuteMs);
      const editedAt = report.firstText ? zonedWindow(addDays(day, 1), '08:40', '08:41', zone).start : null;
      const version = report.saves + (report.firstText ? 1 : 0);
      visitRows.push({
        id,
        companyId,
        tankId,
        seriesId: null,
        occurrenceDay: null,
        technicianId,
        kind: report.kind,
        status: 'published',
        windowStart,
        windowEnd,
        note: null,
        draft: content,
        version,
        published: content,
        publishedVersion: version,
        publishedAt,
        publishedBy: technicianId,
        editedAt,
        // Owners were told when it was first published.
        announcedAt: new Date(publishedAt.getTime() + minuteMs),
        createdBy: technicianId,
      });
      if (report.firstText) {
        versionRows.push({
          id: demoId(`visit-version:${plan.tank}:${report.key}:${report.saves}`),
          visitId: id,
          version: report.saves,
          content: write(report.firstText),
          publishedAt,
          publishedBy: technicianId,
        });
      }
      published.set(report.key, { id, publishedAt, content });
      for (const photo of content.photos) {
        photoRows.push({ visitId: id, photoId: photo.photoId, phase: photo.phase, published: true });
      }
      for (const change of content.livestockChanges) {
        if (change.action === 'remove') {
          statusRows.push({
            id: demoId(`livestock-event:${plan.tank}:visit:${report.key}:${change.livestockId}`),
            livestockId: change.livestockId,
            status: 'removed',
            note: change.note || `Removed at the visit of ${day}.`,
            changedBy: technicianId,
            changedAt: arrival,
          });
        } else if (change.action === 'move') {
          placements.push({ livestockId: change.livestockId, placement: change.placement });
        }
      }
      if (!lastVisit.has(tankId) || lastVisit.get(tankId)! < arrival) lastVisit.set(tankId, arrival);
    }

    for (const report of plan.reports) {
      const from = published.get(report.key)!;
      from.content.nextItems.forEach((text, index) => {
        const id = demoVisitItemId(plan.tank, `${report.key}#${index}`);
        const closer = [...published.values()].find((other) => other.content.closedItemIds.includes(id));
        itemRows.push({
          id,
          companyId,
          tankId,
          fromVisitId: from.id,
          text,
          openedAt: from.publishedAt,
          closedInVisitId: closer?.id ?? null,
          closedAt: closer?.publishedAt ?? null,
        });
      });
    }

    for (const visit of plan.visits) {
      const window = zonedWindow(addDays(today, -visit.daysAgo), visit.window[0], visit.window[1], zone);
      plannedRows.push({
        id: demoVisitId(plan.tank, visit.key),
        companyId,
        tankId,
        seriesId: null,
        occurrenceDay: null,
        technicianId,
        kind: visit.kind,
        status: visit.status,
        windowStart: window.start,
        windowEnd: window.end,
        note: visit.note || null,
        createdBy: technicianId,
      });
    }

    if (plan.series) {
      const weekday = new Date(`${today}T00:00:00Z`).getUTCDay();
      const firstDay = addDays(today, (plan.series.weekday - weekday + 7) % 7);
      const writtenUntil = addDays(today, 7 * plan.series.weeksAhead - 1);
      const seriesId = demoVisitSeriesId(plan.tank);
      const [startTime, endTime] = plan.series.window;
      const rrule = routineRule(tankSpec(plan.tank).serviceIntervalDays);
      seriesWork.push({
        series: {
          id: seriesId,
          companyId,
          tankId,
          technicianId,
          rrule,
          firstDay,
          startTime,
          endTime,
          writtenUntil,
          endedAt: null,
        },
        occurrences: occurrenceDays(rrule, firstDay, firstDay, writtenUntil).map((occurrenceDay, index) => {
          const window = zonedWindow(occurrenceDay, startTime, endTime, zone);
          return {
            id: demoVisitId(plan.tank, `series-${index}`),
            companyId,
            tankId,
            seriesId,
            occurrenceDay,
            technicianId,
            kind: 'routine' as const,
            status: 'scheduled' as const,
            windowStart: window.start,
            windowEnd: window.end,
            createdBy: technicianId,
          };
        }),
      });
    }
  }

  await db.transaction(async (tx) => {
    await writeVisits(tx, { visitRows, plannedRows, seriesWork });
    if (versionRows.length > 0) {
      await tx
        .insert(visitReportVersions)
        .values(versionRows)
        .onConflictDoUpdate({
          target: visitReportVersions.id,
          set: fromInserted(visitReportVersions, [
            'visitId',
            'version',
            'content',
            'publishedAt',
            'publishedBy',
          ]),
        });
    }
    if (itemRows.length > 0) {
      const closed = itemRows.filter((row) => row.closedAt);
      const open = itemRows.filter((row) => !row.closedAt);
      const itemColumns = ['companyId', 'tankId', 'fromVisitId', 'text', 'openedAt'];
      if (closed.length > 0) {
        await tx
          .insert(visitItems)
          .values(closed)
          .onConflictDoUpdate({
            target: visitItems.id,
            set: fromInserted(visitItems, [...itemColumns, 'closedInVisitId', 'closedAt']),
          });
      }
      // An open item someone ticked off in the running demo stays ticked.
      if (open.length > 0) {
        await tx
          .insert(visitItems)
          .values(open)
          .onConflictDoUpdate({ target: visitItems.id, set: fromInserted(visitItems, itemColumns) });
      }
    }
    if (photoRows.length > 0) {
      await tx
        .insert(visitPhotos)
        .values(photoRows)
        .onConflictDoUpdate({
          target: [visitPhotos.visitId, visitPhotos.photoId],
          set: fromInserted(visitPhotos, ['phase', 'published']),
        });
    }
    await applyLivestockChanges(tx, statusRows, placements);
    for (const [tankId, at] of lastVisit) {
      // As publishing does: a later visit recorded in the running demo keeps its place.
      await tx
        .update(tanks)
        .set({ lastVisitAt: sql`greatest(${tanks.lastVisitAt}, ${at.toISOString()}::timestamptz)` })
        .where(eq(tanks.id, tankId));
    }
  });
}

const visitColumns = [
  'companyId',
  'tankId',
  'seriesId',
  'occurrenceDay',
  'technicianId',
  'kind',
  'status',
  'windowStart',
  'windowEnd',
  'note',
  'draft',
  'version',
  'published',
  'publishedVersion',
  'publishedAt',
  'publishedBy',
  'editedAt',
  'announcedAt',
  'createdBy',
];

async function writeVisits(
  tx: Tx,
  work: {
    visitRows: (typeof visits.$inferInsert)[];
    plannedRows: (typeof visits.$inferInsert)[];
    seriesWork: { series: typeof visitSeries.$inferInsert; occurrences: (typeof visits.$inferInsert)[] }[];
  },
) {
  if (work.visitRows.length > 0) {
    await tx
      .insert(visits)
      .values(work.visitRows)
      .onConflictDoUpdate({ target: visits.id, set: fromInserted(visits, visitColumns) });
  }
  // A planned visit someone has started a report on, or moved to a series, is theirs now.
  const untouched = and(inArray(visits.status, ['scheduled', 'cancelled']), eq(visits.version, 0));
  if (work.plannedRows.length > 0) {
    await tx
      .insert(visits)
      .values(work.plannedRows.map((row) => ({ ...row, draft: null, version: 0 })))
      .onConflictDoUpdate({
        target: visits.id,
        set: fromInserted(
          visits,
          visitColumns.filter((column) => column !== 'draft' && column !== 'version'),
        ),
        setWhere: untouched,
      });
  }
  for (const { series, occurrences } of work.seriesWork) {
    await tx
      .insert(visitSeries)
      .values(series)
      .onConflictDoUpdate({
        target: visitSeries.id,
        set: fromInserted(visitSeries, [
          'companyId',
          'tankId',
          'technicianId',
          'rrule',
          'firstDay',
          'startTime',
          'endTime',
          'writtenUntil',
          'endedAt',
        ]),
      });
    // Occurrences nobody has touched are written again from the new first day; any the service wrote
    // further ahead come back when someone looks that far.
    await tx
      .delete(visits)
      .where(and(eq(visits.seriesId, series.id!), eq(visits.status, 'scheduled'), eq(visits.version, 0)));
    if (occurrences.length > 0) await tx.insert(visits).values(occurrences).onConflictDoNothing();
  }
}

/** The report's livestock changes, as publishing applies them: removals into the status history, moves onto the animal. */
async function applyLivestockChanges(
  tx: Tx,
  statusRows: (typeof livestockStatusEvents.$inferInsert)[],
  placements: { livestockId: string; placement: string }[],
) {
  if (statusRows.length > 0) {
    await tx
      .insert(livestockStatusEvents)
      .values(statusRows)
      .onConflictDoUpdate({
        target: livestockStatusEvents.id,
        set: fromInserted(livestockStatusEvents, ['livestockId', 'status', 'note', 'changedBy', 'changedAt']),
      });
    const ids = [...new Set(statusRows.map((row) => row.livestockId))];
    await tx.execute(sql`
      update livestock set status = latest.status
      from (
        select distinct on (livestock_id) livestock_id, status
        from livestock_status_events
        order by livestock_id, changed_at desc, created_at desc
      ) as latest
      where latest.livestock_id = livestock.id
        and livestock.id in (${sql.join(
          ids.map((id) => sql`${id}::uuid`),
          sql`, `,
        )})`);
  }
  for (const { livestockId, placement } of placements) {
    await tx.update(livestock).set({ placement }).where(eq(livestock.id, livestockId));
  }
}
