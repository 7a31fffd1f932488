/*
 * First aid an owner can give while help is on the way. General advice in plain words: the
 * company's technician has the last word, and local codes and licensed practice come first.
 * Rates such as "about 1 °C an hour" are common practice, not a published standard.
 */
import type { ParameterKey } from '@shared/parameters/keys';
import type { LimitDirection, LimitSeverity } from '@shared/parameters/limits';

export const cautionKinds = ['electricity', 'chemicals', 'livestock', 'lifting', 'general'] as const;
export type CautionKind = (typeof cautionKinds)[number];

export const cautions: Readonly<Record<CautionKind, string>> = {
  electricity:
    'Water and electricity: switch equipment off at the wall before you put your hands in the tank or touch ' +
    'anything wet, and unplug only with dry hands. If a socket, plug or cable is wet, scorched or has tripped ' +
    'the power, leave it off and do not touch it. Wiring faults are for a licensed electrician; follow local codes.',
  chemicals:
    'Chemicals: use dosing products only as their label says, wear gloves and eye protection, never mix ' +
    'concentrates, and change the water gradually.',
  livestock:
    'Livestock: some corals and zoanthids carry toxins and some animals sting or have venomous spines. Wear ' +
    'gloves and eye protection, never cut or scrub coral out of the water, and lift animals out in a container.',
  lifting:
    'Lifting: buckets of water, glass lids and rock are heavy. Lift with care, keep your back straight and wipe ' +
    'up spills at once.',
  general:
    'This is general first aid, not a repair. Your technician has the last word; local codes and licensed ' +
    'practice come first.',
};

interface Step {
  readonly text: string;
  /** Steps for a warning are the gentle ones; a critical reading gets every step. */
  readonly warning?: true;
  readonly cautions?: readonly CautionKind[];
}

const retest: Step = { text: 'Test again to make sure the reading is right.', warning: true };
const retestAfter: Step = { text: 'Test again in an hour or so to see that it is moving the right way.' };
const tellTechnician: Step = {
  text: 'Your technician can see this reading. Send the company a message from this tank’s page if it keeps moving.',
  warning: true,
};
const matchedWaterChange: Step = {
  text:
    'Change about a fifth of the water with water matched to the tank (same temperature and, for salt water, ' +
    'the same salinity).',
  cautions: ['electricity', 'lifting'],
};
const pauseDosing: Step = {
  text: 'Pause any dosing pump or automatic dosing for this until your technician has looked at it.',
  warning: true,
  cautions: ['electricity', 'chemicals'],
};
const stopFeeding: Step = { text: 'Stop feeding for a day.', warning: true };
const removeDead: Step = {
  text: 'Look for anything dead or dying and lift it out.',
  cautions: ['livestock'],
};

type Steps = Readonly<Record<LimitDirection, readonly Step[]>>;

const stepsByParameter: Readonly<Record<ParameterKey, Steps>> = {
  temperature: {
    high: [
      {
        text: 'Switch the heater off at the wall, with dry hands, and leave it off.',
        warning: true,
        cautions: ['electricity'],
      },
      { text: 'Open the lid, turn the tank lights off and point a fan across the water surface.' },
      {
        text: 'Do not add ice or cold tap water: let it come down gradually, about 1 °C an hour.',
      },
      { text: 'Cool the room if you can: draw the blinds and switch on the air conditioning.' },
    ],
    low: [
      {
        text: 'Check that the heater has power and that its power board has not tripped. Look; do not touch anything wet.',
        warning: true,
        cautions: ['electricity'],
      },
      { text: 'Keep the lid on and the room warm; a towel over the back and sides holds heat.' },
      { text: 'Do not pour in hot water: let it rise gradually, about 1 °C an hour.' },
    ],
  },
  salinity: {
    high: [
      {
        text: 'Check the top-up reservoir: it may be empty or its pump off. Refill it with fresh RO (reverse osmosis) water.',
        warning: true,
        cautions: ['electricity'],
      },
      {
        text: 'Top up with fresh RO water, never salt water, a little at a time. Bring salinity down gradually, about 1 ppt a day.',
      },
    ],
    low: [
      {
        text: 'Check that the top-up pump has not stuck on; if it has, switch it off at the wall with dry hands.',
        warning: true,
        cautions: ['electricity'],
      },
      {
        text: 'Do not add dry salt to the tank. Your technician will raise salinity gradually with mixed salt water.',
      },
    ],
  },
  ph: {
    high: [pauseDosing, { text: 'Do not add acids or pH-lowering products yourself.' }],
    low: [
      {
        text: 'Let fresh air reach the tank: open a window nearby. Stale indoor air lowers pH.',
        warning: true,
      },
      { text: 'Make sure the pumps are moving the water surface; switch nothing on or off with wet hands.' },
      pauseDosing,
    ],
  },
  alkalinity: {
    high: [pauseDosing],
    low: [
      {
        text: 'Check the alkalinity dosing pump and its container; it may have run dry.',
        warning: true,
        cautions: ['electricity', 'chemicals'],
      },
      {
        text: 'Do not dose extra to catch up: raise it by no more than about 1 dKH a day.',
        cautions: ['chemicals'],
      },
    ],
  },
  calcium: {
    high: [pauseDosing],
    low: [
      {
        text: 'Check the calcium dosing pump and its container; it may have run dry.',
        warning: true,
        cautions: ['electricity', 'chemicals'],
      },
      {
        text: 'Do not dose extra to catch up; your technician will raise it gradually.',
        cautions: ['chemicals'],
      },
    ],
  },
  magnesium: {
    high: [pauseDosing],
    low: [{ text: 'Do not dose extra to catch up; your technician will raise it gradually.', warning: true }],
  },
  nitrate: {
    high: [stopFeeding, matchedWaterChange, removeDead],
    low: [
      {
        text: 'Nothing urgent: keep feeding as usual and tell your technician at the next visit.',
        warning: true,
      },
    ],
  },
  phosphate: {
    high: [stopFeeding, matchedWaterChange],
    low: [
      {
        text: 'Nothing urgent: keep feeding as usual and tell your technician at the next visit.',
        warning: true,
      },
    ],
  },
  ammonia: {
    high: [
      stopFeeding,
      removeDead,
      { ...matchedWaterChange, warning: true },
      {
        text: 'Check that the filter and skimmer are running. Do not clean or replace the filter media now.',
        cautions: ['electricity'],
      },
    ],
    low: [],
  },
  nitrite: {
    high: [stopFeeding, removeDead, { ...matchedWaterChange, warning: true }],
    low: [],
  },
  orp: {
    high: [
      {
        text: 'If the tank runs an ozone unit, switch it off at the wall with dry hands.',
        warning: true,
        cautions: ['electricity'],
      },
    ],
    low: [
      { text: 'Check that the skimmer and pumps are running.', warning: true, cautions: ['electricity'] },
      stopFeeding,
      removeDead,
    ],
  },
  gh: {
    high: [
      {
        text: 'Top up with the usual fresh water only; add no minerals until your technician advises.',
        warning: true,
      },
    ],
    low: [{ text: 'Add no minerals to catch up; your technician will raise it gradually.', warning: true }],
  },
  kh: {
    high: [pauseDosing],
    low: [
      { text: 'Add no buffer to catch up; your technician will raise it gradually.', warning: true },
      matchedWaterChange,
    ],
  },
};

export interface FirstSteps {
  readonly steps: readonly string[];
  /** Caution texts to show with the steps; always includes electricity and general when critical. */
  readonly cautions: readonly string[];
}

export function firstSteps(
  parameter: ParameterKey,
  direction: LimitDirection,
  severity: LimitSeverity,
): FirstSteps {
  const chosen = stepsByParameter[parameter][direction].filter(
    (step) => severity === 'critical' || step.warning,
  );
  // A critical reading calls for action first; checking the reading comes after.
  const steps =
    severity === 'critical' ? [...chosen, retestAfter, tellTechnician] : [retest, ...chosen, tellTechnician];
  const kinds = new Set<CautionKind>(steps.flatMap((step) => step.cautions ?? []));
  // A critical reading sends people to the tank in a hurry, where the water meets the wiring.
  if (severity === 'critical') kinds.add('electricity');
  kinds.add('general');
  return {
    steps: steps.map((step) => step.text),
    cautions: cautionKinds.filter((kind) => kinds.has(kind)).map((kind) => cautions[kind]),
  };
}

/** For a device that has gone quiet: the tank may be fine, but nobody can see it. */
export function deviceStaleFirstSteps(): FirstSteps {
  return {
    steps: [
      'Check that the device has power and that its power board has not tripped. Look; do not touch anything wet.',
      'Check that the internet connection it uses is working.',
      'If the tank has its own thermometer, read it and note the temperature.',
      tellTechnician.text,
    ],
    cautions: [cautions.electricity, cautions.general],
  };
}
