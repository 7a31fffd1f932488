/*
 * The invented demo scenario: Driftglass Aquatic Care's clients, their tanks and what lives and
 * runs in them. Every person, place and business is made up; species are named the trade's way.
 * Dates are counted back from the day the seed runs, so the story always reads as recent.
 */
import type { EquipmentKind } from '@shared/schemas/equipment';
import type { LivestockStatus } from '@shared/schemas/livestock-status';
import type { TankStyle } from '@shared/parameters/limit-templates';

export interface DemoTank {
  key: string;
  name: string;
  siteLabel: string;
  owners: readonly string[];
  style: TankStyle;
  displayVolumeL: number;
  sumpVolumeL: number;
  dimensionsCm: { length: number; width: number; height: number };
  setUpDaysAgo: number;
  technician: 'u-tomas' | 'u-priya';
  serviceIntervalDays: number;
  notes: string;
}

export const demoTanks = [
  {
    key: 'ashdown-reef',
    name: 'Living room reef',
    siteLabel: 'Ashdown family home — living room',
    owners: ['u-helen'],
    style: 'mixed-reef',
    displayVolumeL: 300,
    sumpVolumeL: 80,
    dimensionsCm: { length: 120, width: 50, height: 55 },
    setUpDaysAgo: 940,
    technician: 'u-tomas',
    serviceIntervalDays: 14,
    notes:
      'Sump and both power boards are in the left-hand cabinet. The children feed the fish on Saturdays; ' +
      'one pinch of pellets is plenty.',
  },
  {
    key: 'ashdown-river',
    name: "Kids' river tank",
    siteLabel: 'Ashdown family home — playroom',
    owners: ['u-helen'],
    style: 'community-freshwater',
    displayVolumeL: 120,
    sumpVolumeL: 0,
    dimensionsCm: { length: 80, width: 35, height: 45 },
    setUpDaysAgo: 410,
    technician: 'u-priya',
    serviceIntervalDays: 21,
    notes: 'Lid stays on: the cat sits on it. Water changes with dechlorinated tap water, 25 % each visit.',
  },
  {
    key: 'quayside-reef',
    name: 'Waiting room reef',
    siteLabel: 'Quayside Dental — waiting room',
    owners: ['u-felix'],
    style: 'soft-lps-reef',
    displayVolumeL: 450,
    sumpVolumeL: 100,
    dimensionsCm: { length: 150, width: 60, height: 55 },
    setUpDaysAgo: 1320,
    technician: 'u-priya',
    serviceIntervalDays: 14,
    notes:
      'Visits before 8:30 or after 18:00 so patients are not disturbed. Reception keeps the cabinet key. ' +
      'The waiting room runs warm in summer; the chiller is on board B.',
  },
  {
    key: 'saltfig-lagoon',
    name: 'Dining room lagoon',
    siteLabel: 'Salt Fig Kitchen — dining room',
    owners: ['u-rosa'],
    style: 'fish-only-marine',
    displayVolumeL: 600,
    sumpVolumeL: 150,
    dimensionsCm: { length: 180, width: 60, height: 60 },
    setUpDaysAgo: 760,
    technician: 'u-tomas',
    serviceIntervalDays: 7,
    notes:
      'Service on Mondays when the restaurant is closed. Staff must not feed from the kitchen; frozen food ' +
      'is in the labelled box in the bar freezer.',
  },
  {
    key: 'ferrous-planted',
    name: 'Reception planted tank',
    siteLabel: 'Ferrous Studio — reception',
    owners: ['u-sam'],
    style: 'planted-freshwater',
    displayVolumeL: 200,
    sumpVolumeL: 0,
    dimensionsCm: { length: 100, width: 45, height: 45 },
    setUpDaysAgo: 220,
    technician: 'u-priya',
    serviceIntervalDays: 14,
    notes: 'Lights on a timer 10:00–18:00. CO₂ cylinder swap every six weeks; spare is in the store room.',
  },
] as const satisfies readonly DemoTank[];

export type DemoTankKey = (typeof demoTanks)[number]['key'];

export interface DemoEquipment {
  key: string;
  kind: EquipmentKind;
  description: string;
  installedDaysAgo?: number;
  maintenanceIntervalDays?: number;
  lastServicedDaysAgo?: number;
  powerBoard?: string;
  outlet?: string;
  notes?: string;
}

const board = (label: string, where: string): DemoEquipment => ({
  key: `board-${label.toLowerCase()}`,
  kind: 'power-board',
  description: `Power board ${label} — ${where}`,
  powerBoard: label,
  notes: 'Switched outlets, each labelled with what it feeds. Mounted above the water line, with drip loops.',
});

export const demoEquipment: Record<DemoTankKey, DemoEquipment[]> = {
  'ashdown-reef': [
    board('A', 'left cabinet wall, sump side'),
    board('B', 'right cabinet wall, display side'),
    {
      key: 'return',
      kind: 'return-pump',
      description: 'Return pump in the sump',
      powerBoard: 'A',
      outlet: '1',
      installedDaysAgo: 940,
      maintenanceIntervalDays: 180,
      lastServicedDaysAgo: 64,
    },
    {
      key: 'skimmer',
      kind: 'skimmer',
      description: 'Protein skimmer, sump chamber 1',
      powerBoard: 'A',
      outlet: '2',
      installedDaysAgo: 940,
      maintenanceIntervalDays: 14,
      lastServicedDaysAgo: 9,
    },
    {
      key: 'heater',
      kind: 'heater',
      description: '200 W heater in the sump',
      powerBoard: 'A',
      outlet: '3',
      installedDaysAgo: 300,
      maintenanceIntervalDays: 90,
      lastServicedDaysAgo: 37,
      notes: 'Replaced after the old one stuck on.',
    },
    {
      key: 'ato',
      kind: 'auto-top-off',
      description: 'Auto top-off pump and float switch',
      powerBoard: 'A',
      outlet: '4',
      installedDaysAgo: 600,
      maintenanceIntervalDays: 60,
      lastServicedDaysAgo: 23,
    },
    {
      key: 'light',
      kind: 'lighting',
      description: 'LED reef light over the display',
      powerBoard: 'B',
      outlet: '1',
      installedDaysAgo: 940,
    },
    {
      key: 'wave-left',
      kind: 'wavemaker',
      description: 'Wavemaker, left glass',
      powerBoard: 'B',
      outlet: '2',
      installedDaysAgo: 940,
      maintenanceIntervalDays: 90,
      lastServicedDaysAgo: 51,
    },
    {
      key: 'wave-right',
      kind: 'wavemaker',
      description: 'Wavemaker, right glass',
      powerBoard: 'B',
      outlet: '3',
      installedDaysAgo: 500,
      maintenanceIntervalDays: 90,
      lastServicedDaysAgo: 51,
    },
    {
      key: 'doser',
      kind: 'dosing-pump',
      description: 'Two-part dosing pump (alkalinity and calcium)',
      powerBoard: 'B',
      outlet: '4',
      installedDaysAgo: 420,
      maintenanceIntervalDays: 30,
      lastServicedDaysAgo: 9,
    },
    {
      key: 'controller',
      kind: 'controller',
      description: 'Tank controller with temperature and pH probes',
      powerBoard: 'B',
      outlet: '5',
      installedDaysAgo: 420,
    },
  ],
  'ashdown-river': [
    board('A', 'behind the cabinet, back left'),
    {
      key: 'filter',
      kind: 'filter',
      description: 'Hang-on-back filter',
      powerBoard: 'A',
      outlet: '1',
      installedDaysAgo: 410,
      maintenanceIntervalDays: 21,
      lastServicedDaysAgo: 12,
    },
    {
      key: 'heater',
      kind: 'heater',
      description: '100 W heater with guard',
      powerBoard: 'A',
      outlet: '2',
      installedDaysAgo: 410,
      maintenanceIntervalDays: 180,
      lastServicedDaysAgo: 96,
    },
    {
      key: 'light',
      kind: 'lighting',
      description: 'LED strip in the lid',
      powerBoard: 'A',
      outlet: '3',
      installedDaysAgo: 410,
    },
  ],
  'quayside-reef': [
    board('A', 'cabinet, left'),
    board('B', 'cabinet, right'),
    {
      key: 'return',
      kind: 'return-pump',
      description: 'Return pump in the sump',
      powerBoard: 'A',
      outlet: '1',
      installedDaysAgo: 1320,
      maintenanceIntervalDays: 180,
      lastServicedDaysAgo: 120,
    },
    {
      key: 'skimmer',
      kind: 'skimmer',
      description: 'Protein skimmer',
      powerBoard: 'A',
      outlet: '2',
      installedDaysAgo: 1320,
      maintenanceIntervalDays: 14,
      lastServicedDaysAgo: 6,
    },
    {
      key: 'heater-1',
      kind: 'heater',
      description: '300 W heater, sump',
      powerBoard: 'A',
      outlet: '3',
      installedDaysAgo: 700,
      maintenanceIntervalDays: 90,
      lastServicedDaysAgo: 20,
    },
    {
      key: 'heater-2',
      kind: 'heater',
      description: '300 W heater, sump (second, on its own outlet)',
      powerBoard: 'A',
      outlet: '4',
      installedDaysAgo: 700,
      maintenanceIntervalDays: 90,
      lastServicedDaysAgo: 20,
    },
    {
      key: 'reactor',
      kind: 'reactor',
      description: 'Carbon reactor',
      powerBoard: 'A',
      outlet: '5',
      installedDaysAgo: 900,
      maintenanceIntervalDays: 30,
      lastServicedDaysAgo: 20,
    },
    {
      key: 'chiller',
      kind: 'chiller',
      description: 'Chiller behind the cabinet',
      powerBoard: 'B',
      outlet: '1',
      installedDaysAgo: 400,
      maintenanceIntervalDays: 180,
      lastServicedDaysAgo: 150,
      notes: 'Keep the vents clear; reception once stacked leaflets on it.',
    },
    {
      key: 'light',
      kind: 'lighting',
      description: 'Two LED fixtures on one timer',
      powerBoard: 'B',
      outlet: '2',
      installedDaysAgo: 1320,
    },
    {
      key: 'wave',
      kind: 'wavemaker',
      description: 'Pair of wavemakers, back glass',
      powerBoard: 'B',
      outlet: '3',
      installedDaysAgo: 1100,
      maintenanceIntervalDays: 90,
      lastServicedDaysAgo: 70,
    },
    {
      key: 'ato',
      kind: 'auto-top-off',
      description: 'Auto top-off with reservoir in the cabinet',
      powerBoard: 'B',
      outlet: '4',
      installedDaysAgo: 1320,
      maintenanceIntervalDays: 60,
      lastServicedDaysAgo: 34,
    },
  ],
  'saltfig-lagoon': [
    board('A', 'plant room behind the bar'),
    board('B', 'cabinet under the display'),
    {
      key: 'return',
      kind: 'return-pump',
      description: 'Return pump, plant room sump',
      powerBoard: 'A',
      outlet: '1',
      installedDaysAgo: 760,
      maintenanceIntervalDays: 180,
      lastServicedDaysAgo: 44,
    },
    {
      key: 'skimmer',
      kind: 'skimmer',
      description: 'Protein skimmer, plant room',
      powerBoard: 'A',
      outlet: '2',
      installedDaysAgo: 760,
      maintenanceIntervalDays: 7,
      lastServicedDaysAgo: 4,
    },
    {
      key: 'uv',
      kind: 'uv-steriliser',
      description: 'UV steriliser on the return line',
      powerBoard: 'A',
      outlet: '3',
      installedDaysAgo: 760,
      maintenanceIntervalDays: 365,
      lastServicedDaysAgo: 300,
      notes: 'Lamp due for replacement soon.',
    },
    {
      key: 'heater',
      kind: 'heater',
      description: 'Titanium heater, 500 W, plant room sump',
      powerBoard: 'A',
      outlet: '4',
      installedDaysAgo: 760,
      maintenanceIntervalDays: 90,
      lastServicedDaysAgo: 44,
    },
    {
      key: 'chiller',
      kind: 'chiller',
      description: 'Chiller, plant room (the kitchen heats the wall)',
      powerBoard: 'A',
      outlet: '5',
      installedDaysAgo: 700,
      maintenanceIntervalDays: 180,
      lastServicedDaysAgo: 90,
    },
    {
      key: 'light',
      kind: 'lighting',
      description: 'LED bar over the display',
      powerBoard: 'B',
      outlet: '1',
      installedDaysAgo: 760,
    },
    {
      key: 'wave',
      kind: 'wavemaker',
      description: 'Wavemakers, both end panels',
      powerBoard: 'B',
      outlet: '2',
      installedDaysAgo: 760,
      maintenanceIntervalDays: 90,
      lastServicedDaysAgo: 44,
    },
  ],
  'ferrous-planted': [
    board('A', 'inside the cabinet, back wall'),
    {
      key: 'filter',
      kind: 'filter',
      description: 'Canister filter under the cabinet',
      powerBoard: 'A',
      outlet: '1',
      installedDaysAgo: 220,
      maintenanceIntervalDays: 42,
      lastServicedDaysAgo: 30,
    },
    {
      key: 'heater',
      kind: 'heater',
      description: 'Inline heater on the filter return',
      powerBoard: 'A',
      outlet: '2',
      installedDaysAgo: 220,
    },
    {
      key: 'light',
      kind: 'lighting',
      description: 'Planted-tank LED on a timer',
      powerBoard: 'A',
      outlet: '3',
      installedDaysAgo: 220,
    },
    {
      key: 'co2',
      kind: 'other',
      description: 'CO₂ solenoid and regulator on the cylinder',
      powerBoard: 'A',
      outlet: '4',
      installedDaysAgo: 220,
      maintenanceIntervalDays: 42,
      lastServicedDaysAgo: 30,
      notes: 'Solenoid runs on the same timer as the light.',
    },
  ],
};

export interface DemoStatusChange {
  status: LivestockStatus;
  daysAgo: number;
  note: string;
  by: 'u-tomas' | 'u-priya' | 'u-mara';
}

export interface DemoLivestock {
  key: string;
  speciesId: string;
  quantity?: number;
  nickname?: string;
  placement?: string;
  source?: string;
  addedDaysAgo: number;
  /** Oldest first; the first entry is the addition, the last one the status now. */
  history: DemoStatusChange[];
  /** A drawing of it becomes its photo. */
  photo?: boolean;
}

const added = (
  by: DemoStatusChange['by'],
  daysAgo: number,
  status: LivestockStatus = 'stable',
  note = 'Added to the tank.',
): DemoStatusChange => ({ status, daysAgo, note, by });

export const demoLivestock: Record<DemoTankKey, DemoLivestock[]> = {
  'ashdown-reef': [
    {
      key: 'clownfish',
      speciesId: 'ocellaris-clownfish',
      quantity: 2,
      nickname: 'Pip and Dot',
      placement: 'Around the anemone, right rock',
      source: 'Captive-bred pair',
      addedDaysAgo: 800,
      photo: true,
      history: [
        added('u-tomas', 800),
        { status: 'thriving', daysAgo: 500, note: 'Paired up and feeding well.', by: 'u-tomas' },
      ],
    },
    {
      key: 'anemone',
      speciesId: 'bubble-tip-anemone',
      placement: 'Right rock, mid height',
      source: 'Split from a client’s anemone',
      addedDaysAgo: 120,
      photo: true,
      history: [
        added(
          'u-tomas',
          120,
          'stable',
          'Added with compatibility warnings acknowledged: placed on the right rock, well away from the hammer coral, pump intakes guarded.',
        ),
        {
          status: 'watch',
          daysAgo: 12,
          note: 'Moved 20 cm left overnight and now touches the hammer coral. Keep an eye on both; do not pull it off the rock.',
          by: 'u-tomas',
        },
      ],
    },
    {
      key: 'hammer',
      speciesId: 'hammer-coral',
      placement: 'Centre rock, low',
      source: 'Aquacultured frag',
      addedDaysAgo: 600,
      photo: true,
      history: [
        added('u-tomas', 600),
        { status: 'thriving', daysAgo: 300, note: 'Two new heads.', by: 'u-tomas' },
        {
          status: 'watch',
          daysAgo: 12,
          note: 'Heads nearest the anemone retracted after contact.',
          by: 'u-tomas',
        },
      ],
    },
    {
      key: 'duncan',
      speciesId: 'duncan-coral',
      placement: 'Sand bed, front left',
      addedDaysAgo: 400,
      history: [added('u-tomas', 400)],
    },
    {
      key: 'zoas',
      speciesId: 'zoanthids',
      placement: 'Left rock, top',
      source: 'Aquacultured frag',
      addedDaysAgo: 700,
      photo: true,
      history: [
        added('u-tomas', 700),
        { status: 'thriving', daysAgo: 200, note: 'Colony has doubled.', by: 'u-tomas' },
      ],
    },
    {
      key: 'montipora',
      speciesId: 'montipora',
      placement: 'Left rock, upper shelf',
      addedDaysAgo: 350,
      history: [added('u-tomas', 350)],
    },
    {
      key: 'goby',
      speciesId: 'yellow-watchman-goby',
      placement: 'Burrow under the centre rock',
      addedDaysAgo: 760,
      // With the anemone gone from the tank, the reef's livestock keeps five portraits.
      photo: true,
      history: [added('u-tomas', 760)],
    },
    {
      key: 'shrimp',
      speciesId: 'skunk-cleaner-shrimp',
      addedDaysAgo: 760,
      photo: true,
      history: [added('u-tomas', 760)],
    },
    {
      key: 'snails',
      speciesId: 'trochus-snail',
      quantity: 4,
      addedDaysAgo: 880,
      history: [added('u-tomas', 880)],
    },
  ],
  'ashdown-river': [
    {
      key: 'neons',
      speciesId: 'neon-tetra',
      quantity: 12,
      addedDaysAgo: 380,
      photo: true,
      history: [
        added('u-priya', 380),
        { status: 'thriving', daysAgo: 200, note: 'Schooling tightly and colourful.', by: 'u-priya' },
      ],
    },
    {
      key: 'corys',
      speciesId: 'corydoras',
      quantity: 6,
      placement: 'Sand at the front',
      addedDaysAgo: 380,
      history: [added('u-priya', 380)],
    },
    {
      key: 'pleco',
      speciesId: 'bristlenose-pleco',
      nickname: 'Captain Whiskers',
      addedDaysAgo: 300,
      photo: true,
      history: [added('u-priya', 300)],
    },
    {
      key: 'platys',
      speciesId: 'platy',
      quantity: 5,
      addedDaysAgo: 200,
      history: [
        added('u-priya', 200),
        { status: 'sick', daysAgo: 30, note: 'One platy with clamped fins; others fine.', by: 'u-priya' },
        { status: 'stable', daysAgo: 16, note: 'Recovered after two water changes.', by: 'u-priya' },
      ],
    },
    {
      key: 'nerites',
      speciesId: 'nerite-snail',
      quantity: 2,
      addedDaysAgo: 380,
      history: [added('u-priya', 380)],
    },
    {
      key: 'fern',
      speciesId: 'java-fern',
      placement: 'Tied to the driftwood',
      addedDaysAgo: 410,
      history: [added('u-priya', 410)],
    },
    { key: 'anubias', speciesId: 'anubias', addedDaysAgo: 410, history: [added('u-priya', 410)] },
  ],
  'quayside-reef': [
    {
      key: 'leather',
      speciesId: 'leather-coral',
      placement: 'Centre rock, top',
      addedDaysAgo: 1200,
      photo: true,
      history: [
        added('u-priya', 1200),
        {
          status: 'thriving',
          daysAgo: 400,
          note: 'Now the centrepiece; sheds its skin every few weeks.',
          by: 'u-priya',
        },
      ],
    },
    {
      key: 'kenya',
      speciesId: 'kenya-tree-coral',
      placement: 'Left rock',
      addedDaysAgo: 1100,
      history: [added('u-priya', 1100)],
    },
    {
      key: 'frogspawn',
      speciesId: 'frogspawn-coral',
      placement: 'Right rock, low',
      addedDaysAgo: 900,
      history: [added('u-priya', 900)],
    },
    {
      key: 'torch',
      speciesId: 'torch-coral',
      placement: 'Right rock, 25 cm above the frogspawn',
      addedDaysAgo: 500,
      photo: true,
      history: [
        added(
          'u-priya',
          500,
          'stable',
          'Added with compatibility warnings acknowledged: kept 25 cm from the frogspawn.',
        ),
      ],
    },
    {
      key: 'brain',
      speciesId: 'open-brain-coral',
      placement: 'Sand bed, front centre',
      addedDaysAgo: 800,
      history: [added('u-priya', 800)],
    },
    {
      key: 'mushrooms',
      speciesId: 'mushroom-coral',
      quantity: 6,
      placement: 'Shaded cave, left',
      addedDaysAgo: 1000,
      history: [added('u-priya', 1000)],
    },
    {
      key: 'chromis',
      speciesId: 'green-chromis',
      quantity: 7,
      addedDaysAgo: 1250,
      photo: true,
      history: [
        added('u-priya', 1250),
        { status: 'thriving', daysAgo: 600, note: 'Patients’ favourite.', by: 'u-priya' },
      ],
    },
    {
      key: 'blenny',
      speciesId: 'lawnmower-blenny',
      nickname: 'Gus',
      addedDaysAgo: 1000,
      history: [added('u-priya', 1000)],
    },
    {
      key: 'firefish',
      speciesId: 'firefish',
      addedDaysAgo: 300,
      history: [
        added('u-priya', 300),
        {
          status: 'died',
          daysAgo: 180,
          note: 'Jumped through the gap at the back of the lid; gap now meshed.',
          by: 'u-priya',
        },
      ],
    },
    {
      key: 'turbos',
      speciesId: 'turbo-snail',
      quantity: 5,
      addedDaysAgo: 1200,
      history: [added('u-priya', 1200)],
    },
  ],
  'saltfig-lagoon': [
    {
      key: 'lionfish',
      speciesId: 'volitans-lionfish',
      nickname: 'Duchess',
      placement: 'Overhang, right',
      addedDaysAgo: 700,
      photo: true,
      history: [
        added('u-tomas', 700),
        {
          status: 'thriving',
          daysAgo: 300,
          note: 'Takes frozen food from the feeding stick.',
          by: 'u-tomas',
        },
      ],
    },
    { key: 'foxface', speciesId: 'foxface-rabbitfish', addedDaysAgo: 700, history: [added('u-tomas', 700)] },
    {
      key: 'trigger',
      speciesId: 'niger-triggerfish',
      addedDaysAgo: 650,
      photo: true,
      history: [added('u-tomas', 650)],
    },
    {
      key: 'yellow-tang',
      speciesId: 'yellow-tang',
      addedDaysAgo: 600,
      photo: true,
      history: [
        added(
          'u-tomas',
          600,
          'stable',
          'Added together with the blue tang, with compatibility warnings acknowledged.',
        ),
      ],
    },
    {
      key: 'blue-tang',
      speciesId: 'blue-tang',
      addedDaysAgo: 600,
      history: [
        added(
          'u-tomas',
          600,
          'stable',
          'Added together with the yellow tang, with compatibility warnings acknowledged.',
        ),
        {
          status: 'sick',
          daysAgo: 21,
          note: 'White spots on the fins after the chiller fault.',
          by: 'u-tomas',
        },
        {
          status: 'watch',
          daysAgo: 6,
          note: 'Spots gone; eating again. Watching for a relapse.',
          by: 'u-tomas',
        },
      ],
    },
  ],
  'ferrous-planted': [
    {
      key: 'rasboras',
      speciesId: 'harlequin-rasbora',
      quantity: 14,
      addedDaysAgo: 180,
      photo: true,
      history: [
        added('u-priya', 180),
        { status: 'thriving', daysAgo: 60, note: 'Spawning behaviour seen among the plants.', by: 'u-priya' },
      ],
    },
    {
      key: 'otos',
      speciesId: 'otocinclus',
      quantity: 4,
      addedDaysAgo: 170,
      history: [added('u-priya', 170)],
    },
    {
      key: 'amanos',
      speciesId: 'amano-shrimp',
      quantity: 6,
      addedDaysAgo: 170,
      history: [added('u-priya', 170)],
    },
    {
      key: 'nerites',
      speciesId: 'nerite-snail',
      quantity: 3,
      addedDaysAgo: 170,
      history: [added('u-priya', 170)],
    },
    {
      key: 'sword',
      speciesId: 'amazon-sword',
      placement: 'Back right',
      addedDaysAgo: 220,
      photo: true,
      history: [added('u-priya', 220)],
    },
    {
      key: 'moss',
      speciesId: 'java-moss',
      placement: 'On the driftwood',
      addedDaysAgo: 220,
      history: [added('u-priya', 220)],
    },
    {
      key: 'anubias',
      speciesId: 'anubias',
      placement: 'On the front stones',
      addedDaysAgo: 220,
      history: [added('u-priya', 220)],
    },
  ],
};
