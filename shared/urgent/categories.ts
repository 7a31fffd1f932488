/*
 * What an owner can say is happening when they ask for an urgent visit, and the first-aid steps and
 * safety cautions shown the moment they pick one, before anything is sent. The company can rewrite
 * the text (admins, in the console); these are the defaults. They are common practice in tank
 * keeping and general electrical safety, not a substitute for local codes or a licensed
 * electrician, and the screen says so.
 */

export const urgentCategories = ['leak', 'power', 'equipment', 'temperature', 'livestock', 'other'] as const;
export type UrgentCategory = (typeof urgentCategories)[number];

export const urgentCategoryNames: Readonly<Record<UrgentCategory, { label: string; hint: string }>> = {
  leak: { label: 'Water leak or flood', hint: 'Water on the floor, the stand or near sockets' },
  power: { label: 'Power cut or tripped board', hint: 'Lights and pumps off, a safety switch tripped' },
  equipment: {
    label: 'Equipment stopped',
    hint: 'Return pump, heater, skimmer, chiller, dosing pump…',
  },
  temperature: { label: 'Temperature out of range', hint: 'Too hot or too cold' },
  livestock: { label: 'Livestock in distress or dying', hint: 'Fish gasping, corals closed, deaths' },
  other: { label: 'Something else', hint: 'Describe it below' },
};

/** What the owner reads for one category: what to do now, and what never to do. */
export interface FirstAid {
  steps: string[];
  cautions: string[];
}

/** Shown with every category: the limit of general advice (PRODUCT.md cautions). */
export const licensedPracticeNote =
  'This is general advice. Wiring faults are for a licensed electrician under your local codes; if anyone is hurt or there is smoke or fire, call your local emergency number first.';

const electricalCautions = [
  'Do not touch wet equipment, sockets, plugs or power boards.',
  'Switch off at the wall only where the switch is dry and safe to reach; otherwise switch off at the main board or wait for us.',
  'Keep people and pets away from water near power boards and cables.',
];

/** Defaults (common practice). Admins can replace any category's text for their company. */
export const defaultFirstAid: Readonly<Record<UrgentCategory, FirstAid>> = {
  leak: {
    steps: [
      'If the water is near power, switch off at the main board if it is dry and safe to reach.',
      'Once power is off, find where the water comes from: the tank, the sump, a hose or a fitting.',
      'If the sump or a hose is overflowing and power is safely off, leave the return pump off.',
      'Soak up water with towels and keep it away from other rooms, once nothing nearby is powered.',
    ],
    cautions: electricalCautions,
  },
  power: {
    steps: [
      'If a safety switch tripped, do not reset it while anything near the tank is wet.',
      'Keep the lid closed and do not feed: the water holds its heat and oxygen longest undisturbed.',
      'If power stays off for more than an hour, stir the surface gently by hand or a battery air pump every 30 minutes.',
      'When power returns, check the return pump and heater start again.',
    ],
    cautions: [
      ...electricalCautions,
      'A board that trips again when reset has a fault: leave it off for us or a licensed electrician.',
    ],
  },
  equipment: {
    steps: [
      'Return pump stopped: check the water level in the sump; if it is low, the pump may be running dry, so switch it off.',
      'Find the stopped item on the tank’s power board map to see which outlet it uses, and whether that outlet has power.',
      'Heater stopped: keep the lid on and the room warm. Chiller stopped: see the temperature steps.',
      'Skimmer or dosing pump stopped: switch it off and leave it for us; the tank is fine for a day without it.',
    ],
    cautions: [
      'Unplug only with dry hands, and only what you can reach without touching water.',
      'Do not open or repair equipment that runs on mains power.',
    ],
  },
  temperature: {
    steps: [
      'Too hot: switch the heater off at the wall, open the lid and point a fan across the water surface.',
      'Keep lights off to add no more heat. Do not add ice or cold water straight into the tank.',
      'Too cold: check the heater is on and its light shows; keep the lid on and warm the room.',
      'Change temperature gradually — about one degree Celsius an hour at most.',
    ],
    cautions: [
      'Unplug a heater with dry hands and let it cool in the water before lifting it out: a hot heater in air can crack.',
    ],
  },
  livestock: {
    steps: [
      'Test ammonia and temperature if you have a kit, and note the numbers in the request.',
      'If you can mix it, change about 10–20 % of the water with new water matched in temperature and salinity.',
      'Remove anything dead you can reach with a net, and stop feeding until we arrive.',
      'Check pumps and air are running so the water moves at the surface.',
    ],
    cautions: [
      'Wear gloves: some corals, anemones and fish sting, and some soft corals and zoanthids carry toxins. Keep water away from your eyes.',
      'Switch off at the wall before putting your hands in the water.',
    ],
  },
  other: {
    steps: ['Describe what you see below; photos help us bring the right parts.'],
    cautions: [
      'Switch off at the wall before putting your hands in the water, and never touch wet equipment.',
    ],
  },
};
