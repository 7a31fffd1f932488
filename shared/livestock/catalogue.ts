/*
 * Brinewatch species catalogue.
 *
 * Care ranges and behaviour are common aquarium-trade practice, written from memory by the
 * Brinewatch team. They are general guidance for keeping healthy livestock, not measurements
 * from a study: individual animals, farmed versus wild stock and each tank differ, and a
 * company's technician has the last word. Companies can add their own species beside these.
 */
import type { Behaviour, CareRanges, ParameterRange, Species } from '@shared/livestock/species';

export const catalogueSource =
  'Common aquarium-trade practice, from memory: general care guidance written by the Brinewatch team, ' +
  'not measured data. Individual animals and tanks differ; follow your technician’s advice.';

const r = (min: number, max: number): ParameterRange => ({ min, max });

const behaves = (overrides: Partial<Behaviour> = {}): Behaviour => ({
  stings: false,
  wanders: false,
  nipsCorals: false,
  nipsClams: false,
  eatsInvertebrates: [],
  mayEatInvertebrates: [],
  eatsSmallFish: false,
  territorial: false,
  reefSafe: true,
  ...overrides,
});

const rivals = (
  towards: 'same-species' | 'same-genus' | 'same-family' | 'same-group',
  pairTolerated = false,
): Behaviour['territorial'] => ({ towards, pairTolerated });

const gloves = {
  palytoxin: {
    hazard: 'contact-toxin',
    caution:
      'Can carry palytoxin, which is dangerous in the eyes, in cuts and if inhaled. Wear gloves and eye ' +
      'protection, never cut or scrub it out of the water, and never boil or dry rock it grows on.',
  },
  softCoral: {
    hazard: 'irritant',
    caution:
      'Its mucus can irritate skin and eyes. Wear gloves when handling or cutting it, and rinse tools.',
  },
  venomousSpines: {
    hazard: 'venomous-spines',
    caution:
      'Venomous spines. Never handle it by hand; move it with a container, not a net. A sting needs hot (not ' +
      'scalding) water on the wound and medical advice.',
  },
} as const satisfies Record<string, Behaviour['toxic']>;

const marineFishWater: CareRanges = { temperature: r(23, 28), salinity: r(30, 36), ph: r(7.8, 8.5) };
const reefInvertebrateWater: CareRanges = { temperature: r(23, 28), salinity: r(33, 36), ph: r(7.9, 8.5) };
const spsWater: CareRanges = {
  temperature: r(24, 27),
  salinity: r(33, 36),
  ph: r(8, 8.4),
  alkalinity: r(7, 10),
  calcium: r(400, 460),
  magnesium: r(1280, 1450),
  nitrate: r(1, 10),
  phosphate: r(0.02, 0.1),
};
const lpsWater: CareRanges = {
  temperature: r(24, 27.5),
  salinity: r(33, 36),
  ph: r(7.9, 8.4),
  alkalinity: r(7.5, 11),
  calcium: r(380, 450),
  magnesium: r(1250, 1400),
  nitrate: r(2, 20),
  phosphate: r(0.03, 0.2),
};
const softCoralWater: CareRanges = {
  temperature: r(23, 28),
  salinity: r(32, 36),
  ph: r(7.8, 8.4),
  alkalinity: r(7, 12),
  calcium: r(360, 460),
  magnesium: r(1200, 1450),
  nitrate: r(2, 25),
  phosphate: r(0.03, 0.3),
};
const tropicalSoftWater: CareRanges = { temperature: r(22, 27), ph: r(6, 7.5), gh: r(2, 12), kh: r(1, 8) };
const tropicalHardWater: CareRanges = { temperature: r(22, 28), ph: r(7, 8.2), gh: r(8, 20), kh: r(4, 15) };
const easyPlantWater: CareRanges = { temperature: r(18, 28), ph: r(6, 8), gh: r(2, 20), kh: r(1, 12) };

const marineFish: Species[] = [
  {
    id: 'ocellaris-clownfish',
    commonName: 'ocellaris clownfish',
    scientificName: 'Amphiprion ocellaris',
    family: 'Pomacentridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 28) },
      adultSizeCm: 9,
      behaviour: behaves({ territorial: rivals('same-genus', true) }),
      careNotes:
        'Hardy and reef safe. Keep one pair; two clownfish settle into a pair, a third is usually driven ' +
        'off. Needs no anemone, though it may host a bubble-tip.',
    },
  },
  {
    id: 'maroon-clownfish',
    commonName: 'maroon clownfish',
    scientificName: 'Premnas biaculeatus',
    family: 'Pomacentridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 28) },
      adultSizeCm: 15,
      behaviour: behaves({ territorial: rivals('same-family', true) }),
      careNotes:
        'The largest and most aggressive clownfish; the female bullies other clownfish and damselfish. ' +
        'Add it last, as a pair.',
    },
  },
  {
    id: 'green-chromis',
    commonName: 'green chromis',
    scientificName: 'Chromis viridis',
    family: 'Pomacentridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 28) },
      adultSizeCm: 8,
      behaviour: behaves(),
      careNotes: 'A peaceful schooling fish; keep five or more, added together. Feed small meals often.',
    },
  },
  {
    id: 'yellowtail-blue-damselfish',
    commonName: 'yellowtail blue damselfish',
    scientificName: 'Chrysiptera parasema',
    family: 'Pomacentridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 28) },
      adultSizeCm: 7,
      behaviour: behaves({ territorial: rivals('same-family') }),
      careNotes:
        'One of the calmer damselfish and reef safe, but it defends its patch against its relatives.',
    },
  },
  {
    id: 'domino-damselfish',
    commonName: 'domino damselfish',
    scientificName: 'Dascyllus trimaculatus',
    family: 'Pomacentridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 28) },
      adultSizeCm: 14,
      behaviour: behaves({ territorial: rivals('same-group') }),
      careNotes:
        'Hardy but grows aggressive with age and chases most tankmates. Better in a large fish-only tank.',
    },
  },
  {
    id: 'yellow-tang',
    commonName: 'yellow tang',
    scientificName: 'Zebrasoma flavescens',
    family: 'Acanthuridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 27) },
      adultSizeCm: 20,
      flow: 'high',
      behaviour: behaves({ territorial: rivals('same-family') }),
      careNotes:
        'A grazer that needs swimming room and dried seaweed daily. Quarrels with other tangs, especially ' +
        'ones of the same shape or colour; add tangs together or not at all.',
    },
  },
  {
    id: 'blue-tang',
    commonName: 'blue tang',
    scientificName: 'Paracanthurus hepatus',
    family: 'Acanthuridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 27) },
      adultSizeCm: 30,
      flow: 'high',
      behaviour: behaves({ territorial: rivals('same-family') }),
      careNotes:
        'Needs a long tank and stable water; prone to white spot when stressed. The tail spines can cut ' +
        'hands and nets. Quarrels with other tangs.',
    },
  },
  {
    id: 'kole-tang',
    commonName: 'kole tang',
    scientificName: 'Ctenochaetus strigosus',
    family: 'Acanthuridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 27) },
      adultSizeCm: 18,
      behaviour: behaves({ territorial: rivals('same-family') }),
      careNotes: 'Combs film algae off rock and glass all day. Quarrels with other tangs.',
    },
  },
  {
    id: 'yellow-watchman-goby',
    commonName: 'yellow watchman goby',
    scientificName: 'Cryptocentrus cinctus',
    family: 'Gobiidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 8,
      behaviour: behaves({ territorial: rivals('same-species', true) }),
      careNotes:
        'Lives in a burrow under rock, often shared with a pistol shrimp; needs a sand bed. Jumps, so keep ' +
        'the tank covered.',
    },
  },
  {
    id: 'firefish',
    commonName: 'firefish',
    scientificName: 'Nemateleotris magnifica',
    family: 'Microdesmidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 8,
      behaviour: behaves({ territorial: rivals('same-species', true) }),
      careNotes: 'Shy and peaceful; hovers near a bolt-hole. A notorious jumper: the tank needs a cover.',
    },
  },
  {
    id: 'clown-goby',
    commonName: 'clown goby',
    scientificName: 'Gobiodon spp.',
    family: 'Gobiidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 3.5,
      behaviour: behaves({ nipsCorals: 'sometimes', reefSafe: 'with-caution' }),
      careNotes: 'Perches among branching coral and may nip the polyps of the colony it calls home.',
    },
  },
  {
    id: 'six-line-wrasse',
    commonName: 'six-line wrasse',
    scientificName: 'Pseudocheilinus hexataenia',
    family: 'Labridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 7,
      behaviour: behaves({ mayEatInvertebrates: ['shrimp'], territorial: rivals('same-family') }),
      careNotes:
        'Hunts pests such as flatworms and small snails, but can bully other small wrasse and shy fish ' +
        'and pick off small shrimp.',
    },
  },
  {
    id: 'fairy-wrasse',
    commonName: 'fairy wrasse',
    scientificName: 'Cirrhilabrus spp.',
    family: 'Labridae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 10,
      behaviour: behaves(),
      careNotes: 'Peaceful, active and reef safe; keep one male with females. Jumps: the tank needs a cover.',
    },
  },
  {
    id: 'flame-angelfish',
    commonName: 'flame angelfish',
    scientificName: 'Centropyge loricula',
    family: 'Pomacanthidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 27) },
      adultSizeCm: 10,
      behaviour: behaves({
        nipsCorals: 'sometimes',
        nipsClams: 'sometimes',
        territorial: rivals('same-family'),
        reefSafe: 'with-caution',
      }),
      careNotes:
        'A dwarf angelfish that grazes rock; some individuals pick at large-polyp stony corals, zoanthids ' +
        'and clam mantles. One angelfish per tank unless the tank is large.',
    },
  },
  {
    id: 'coral-beauty-angelfish',
    commonName: 'coral beauty angelfish',
    scientificName: 'Centropyge bispinosa',
    family: 'Pomacanthidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 27) },
      adultSizeCm: 10,
      behaviour: behaves({
        nipsCorals: 'sometimes',
        nipsClams: 'sometimes',
        territorial: rivals('same-family'),
        reefSafe: 'with-caution',
      }),
      careNotes:
        'Hardy dwarf angelfish. May pick at fleshy corals and clam mantles; watch it after it is added.',
    },
  },
  {
    id: 'emperor-angelfish',
    commonName: 'emperor angelfish',
    scientificName: 'Pomacanthus imperator',
    family: 'Pomacanthidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 27) },
      adultSizeCm: 40,
      behaviour: behaves({
        nipsCorals: true,
        nipsClams: true,
        mayEatInvertebrates: ['other-invertebrate'],
        territorial: rivals('same-family'),
        reefSafe: false,
      }),
      careNotes:
        'A large angelfish for big fish-only tanks. Eats soft and stony corals, clams, sponges and fan ' +
        'worms.',
    },
  },
  {
    id: 'copperband-butterflyfish',
    commonName: 'copperband butterflyfish',
    scientificName: 'Chelmon rostratus',
    family: 'Chaetodontidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 27) },
      adultSizeCm: 20,
      behaviour: behaves({
        nipsCorals: 'sometimes',
        mayEatInvertebrates: ['other-invertebrate'],
        reefSafe: 'with-caution',
      }),
      careNotes:
        'Delicate feeder that eats pest anemones; may also pick at fan worms and fleshy corals. Needs a ' +
        'settled tank and frozen foods several times a day.',
    },
  },
  {
    id: 'picasso-triggerfish',
    commonName: 'Picasso triggerfish',
    scientificName: 'Rhinecanthus aculeatus',
    family: 'Balistidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 25,
      behaviour: behaves({
        nipsCorals: 'sometimes',
        nipsClams: true,
        eatsInvertebrates: ['shrimp', 'crab', 'snail', 'urchin', 'starfish', 'other-invertebrate'],
        territorial: rivals('same-family'),
        reefSafe: false,
        toxic: {
          hazard: 'bite',
          caution: 'Bites hard. Keep fingers clear when feeding or working in the tank.',
        },
      }),
      careNotes:
        'Tough and full of character, for fish-only tanks. Eats shrimp, crabs, snails and urchins and ' +
        'rearranges loose rock.',
    },
  },
  {
    id: 'niger-triggerfish',
    commonName: 'niger triggerfish',
    scientificName: 'Odonus niger',
    family: 'Balistidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 30,
      behaviour: behaves({
        mayEatInvertebrates: ['shrimp', 'crab', 'snail'],
        territorial: rivals('same-family'),
        reefSafe: 'with-caution',
        toxic: { hazard: 'bite', caution: 'Bites. Keep fingers clear when feeding or working in the tank.' },
      }),
      careNotes:
        'One of the calmer triggerfish and usually leaves corals alone, but small shrimp, crabs and snails ' +
        'are at risk as it grows.',
    },
  },
  {
    id: 'volitans-lionfish',
    commonName: 'volitans lionfish',
    scientificName: 'Pterois volitans',
    family: 'Scorpaenidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 35,
      behaviour: behaves({
        eatsInvertebrates: ['shrimp', 'crab'],
        eatsSmallFish: true,
        reefSafe: 'with-caution',
        toxic: gloves.venomousSpines,
      }),
      careNotes:
        'Leaves corals alone but swallows any fish or shrimp that fits in its mouth. Needs a large tank ' +
        'and meaty frozen food.',
    },
  },
  {
    id: 'dwarf-fuzzy-lionfish',
    commonName: 'dwarf fuzzy lionfish',
    scientificName: 'Dendrochirus brachypterus',
    family: 'Scorpaenidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 15,
      behaviour: behaves({
        eatsInvertebrates: ['shrimp'],
        eatsSmallFish: true,
        reefSafe: 'with-caution',
        toxic: gloves.venomousSpines,
      }),
      careNotes: 'A small lionfish that still eats shrimp and small fish. Slow feeder; target-feed it.',
    },
  },
  {
    id: 'flame-hawkfish',
    commonName: 'flame hawkfish',
    scientificName: 'Neocirrhitus armatus',
    family: 'Cirrhitidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 9,
      behaviour: behaves({
        mayEatInvertebrates: ['shrimp', 'crab'],
        territorial: rivals('same-family'),
        reefSafe: 'with-caution',
      }),
      careNotes:
        'Perches on branching coral and rock. Leaves corals alone but may eat small shrimp and crabs.',
    },
  },
  {
    id: 'longnose-hawkfish',
    commonName: 'longnose hawkfish',
    scientificName: 'Oxycirrhites typus',
    family: 'Cirrhitidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 13,
      behaviour: behaves({
        mayEatInvertebrates: ['shrimp'],
        territorial: rivals('same-family'),
        reefSafe: 'with-caution',
      }),
      careNotes: 'A perching hunter that may pick off small shrimp. Jumps: keep the tank covered.',
    },
  },
  {
    id: 'banggai-cardinalfish',
    commonName: 'Banggai cardinalfish',
    scientificName: 'Pterapogon kauderni',
    family: 'Apogonidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 28) },
      adultSizeCm: 8,
      behaviour: behaves({ territorial: rivals('same-species', true) }),
      careNotes: 'Calm and slow. Keep a single pair: males fight each other. Choose captive-bred fish.',
    },
  },
  {
    id: 'pajama-cardinalfish',
    commonName: 'pajama cardinalfish',
    scientificName: 'Sphaeramia nematoptera',
    family: 'Apogonidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 8,
      behaviour: behaves(),
      careNotes: 'Peaceful, kept in small groups; most active in the evening.',
    },
  },
  {
    id: 'lawnmower-blenny',
    commonName: 'lawnmower blenny',
    scientificName: 'Salarias fasciatus',
    family: 'Blenniidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 13,
      behaviour: behaves({ territorial: rivals('same-family') }),
      careNotes:
        'Grazes film and hair algae; in a very clean tank it starves, so offer algae-based foods. Chases ' +
        'other blennies.',
    },
  },
  {
    id: 'bicolor-blenny',
    commonName: 'bicolor blenny',
    scientificName: 'Ecsenius bicolor',
    family: 'Blenniidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 10,
      behaviour: behaves({
        nipsCorals: 'sometimes',
        territorial: rivals('same-family'),
        reefSafe: 'with-caution',
      }),
      careNotes: 'Lively rock-dweller. Some individuals nip zoanthids and large-polyp stony corals.',
    },
  },
  {
    id: 'orchid-dottyback',
    commonName: 'orchid dottyback',
    scientificName: 'Pseudochromis fridmani',
    family: 'Pseudochromidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 7,
      behaviour: behaves({ mayEatInvertebrates: ['shrimp'], territorial: rivals('same-family') }),
      careNotes:
        'One of the calmer dottybacks, but still defends its cave from similar fish and may eat small ' +
        'shrimp. Usually captive bred.',
    },
  },
  {
    id: 'royal-dottyback',
    commonName: 'royal dottyback',
    scientificName: 'Pictichromis paccagnellae',
    family: 'Pseudochromidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 7,
      behaviour: behaves({ mayEatInvertebrates: ['shrimp'], territorial: rivals('same-family') }),
      careNotes: 'Bold for its size and territorial. Add it after the more peaceful fish.',
    },
  },
  {
    id: 'royal-gramma',
    commonName: 'royal gramma',
    scientificName: 'Gramma loreto',
    family: 'Grammatidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 8,
      behaviour: behaves({ territorial: rivals('same-species') }),
      careNotes: 'Peaceful and hardy; claims one cave and defends it from its own kind.',
    },
  },
  {
    id: 'foxface-rabbitfish',
    commonName: 'foxface rabbitfish',
    scientificName: 'Siganus vulpinus',
    family: 'Siganidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: marineFishWater,
      adultSizeCm: 24,
      behaviour: behaves({ nipsCorals: 'sometimes', reefSafe: 'with-caution', toxic: gloves.venomousSpines }),
      careNotes:
        'A grazer that eats nuisance algae; some nip soft and large-polyp corals. Its fin spines are ' +
        'venomous.',
    },
  },
  {
    id: 'mandarin-dragonet',
    commonName: 'mandarin dragonet',
    scientificName: 'Synchiropus splendidus',
    family: 'Callionymidae',
    profile: {
      waterTypes: ['marine'],
      group: 'fish',
      ranges: { ...marineFishWater, temperature: r(24, 27) },
      adultSizeCm: 7,
      behaviour: behaves({ territorial: rivals('same-species', true) }),
      careNotes:
        'Picks tiny crustaceans off rock all day. Only for mature tanks with plenty of live rock, or fish ' +
        'trained to frozen food. Males fight each other.',
    },
  },
];

const stonyCorals: Species[] = [
  {
    id: 'acropora',
    commonName: 'Acropora',
    scientificName: 'Acropora spp.',
    family: 'Acroporidae',
    profile: {
      waterTypes: ['marine'],
      group: 'sps-coral',
      ranges: spsWater,
      light: 'high',
      flow: 'high',
      behaviour: behaves(),
      careNotes:
        'Branching small-polyp stony coral. Needs strong light, strong varied flow and very stable ' +
        'alkalinity; a swing of more than 1 dKH a day can bleach it.',
    },
  },
  {
    id: 'montipora',
    commonName: 'Montipora',
    scientificName: 'Montipora spp.',
    family: 'Acroporidae',
    profile: {
      waterTypes: ['marine'],
      group: 'sps-coral',
      ranges: {
        ...spsWater,
        temperature: r(24, 28),
        alkalinity: r(7, 11),
        calcium: r(380, 460),
        nitrate: r(1, 15),
        phosphate: r(0.02, 0.15),
      },
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves(),
      careNotes:
        'Plating and encrusting forms grow fast and forgive more than Acropora; a good first stony coral.',
    },
  },
  {
    id: 'pocillopora',
    commonName: 'cauliflower coral',
    scientificName: 'Pocillopora spp.',
    family: 'Pocilloporidae',
    profile: {
      waterTypes: ['marine'],
      group: 'sps-coral',
      ranges: {
        ...spsWater,
        temperature: r(24, 28),
        alkalinity: r(7, 11),
        calcium: r(380, 450),
        nitrate: r(2, 20),
        phosphate: r(0.03, 0.2),
      },
      light: 'moderate',
      flow: 'high',
      behaviour: behaves(),
      careNotes: 'Hardy branching stony coral that grows quickly; may need trimming away from neighbours.',
    },
  },
  {
    id: 'birdsnest-coral',
    commonName: 'birdsnest coral',
    scientificName: 'Seriatopora hystrix',
    family: 'Pocilloporidae',
    profile: {
      waterTypes: ['marine'],
      group: 'sps-coral',
      ranges: spsWater,
      light: 'high',
      flow: 'high',
      behaviour: behaves(),
      careNotes: 'Fine, brittle branches; handle the colony by its base. Sensitive to temperature swings.',
    },
  },
  {
    id: 'hammer-coral',
    commonName: 'hammer coral',
    scientificName: 'Fimbriaphyllia ancora',
    family: 'Euphylliidae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ stings: true, stingReachCm: 12 }),
      careNotes:
        'Large-polyp stony coral with hammer-shaped tips. Sends out sweeper tentacles at night; give it room ' +
        'from other corals.',
    },
  },
  {
    id: 'frogspawn-coral',
    commonName: 'frogspawn coral',
    scientificName: 'Fimbriaphyllia divisa',
    family: 'Euphylliidae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ stings: true, stingReachCm: 12 }),
      careNotes: 'Branching or wall form with frilly polyps. Sweeper tentacles at night; give it room.',
    },
  },
  {
    id: 'torch-coral',
    commonName: 'torch coral',
    scientificName: 'Euphyllia glabrescens',
    family: 'Euphylliidae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ stings: true, stingReachCm: 15 }),
      careNotes:
        'Long flowing polyps with a strong sting; its sweepers reach well beyond the colony. Place it on ' +
        'its own.',
    },
  },
  {
    id: 'galaxy-coral',
    commonName: 'galaxy coral',
    scientificName: 'Galaxea fascicularis',
    family: 'Euphylliidae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ stings: true, stingReachCm: 20 }),
      careNotes:
        'Hardy, but one of the most aggressive corals: long sweeper tentacles sting anything nearby.',
    },
  },
  {
    id: 'open-brain-coral',
    commonName: 'open brain coral',
    scientificName: 'Trachyphyllia geoffroyi',
    family: 'Merulinidae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'moderate',
      flow: 'low',
      behaviour: behaves({ stings: true, stingReachCm: 5 }),
      careNotes: 'Lives loose on the sand bed in gentle flow. Feed it small meaty food in the evening.',
    },
  },
  {
    id: 'lobed-brain-coral',
    commonName: 'lobed brain coral',
    scientificName: 'Lobophyllia spp.',
    family: 'Lobophylliidae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ stings: true, stingReachCm: 5 }),
      careNotes: 'Fleshy, colourful and hardy; feeds readily. Keep it a hand-width from other corals.',
    },
  },
  {
    id: 'moon-brain-coral',
    commonName: 'moon brain coral',
    scientificName: 'Dipsastraea spp.',
    family: 'Merulinidae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ stings: true, stingReachCm: 8 }),
      careNotes: 'Hardy encrusting brain coral; looks harmless by day but sends out sweepers at night.',
    },
  },
  {
    id: 'bubble-coral',
    commonName: 'bubble coral',
    scientificName: 'Plerogyra sinuosa',
    family: 'Plerogyridae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'low',
      flow: 'low',
      behaviour: behaves({ stings: true, stingReachCm: 10 }),
      careNotes: 'Inflates water-filled bubbles by day. Gentle flow only; sweepers at night.',
    },
  },
  {
    id: 'duncan-coral',
    commonName: 'Duncan coral',
    scientificName: 'Duncanopsammia axifuga',
    family: 'Dendrophylliidae',
    profile: {
      waterTypes: ['marine'],
      group: 'lps-coral',
      ranges: lpsWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves(),
      careNotes: 'Peaceful, hardy large-polyp coral that grows new heads steadily when fed.',
    },
  },
];

const softCorals: Species[] = [
  {
    id: 'leather-coral',
    commonName: 'leather coral',
    scientificName: 'Sarcophyton spp.',
    family: 'Alcyoniidae',
    profile: {
      waterTypes: ['marine'],
      group: 'soft-coral',
      ranges: softCoralWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ toxic: gloves.softCoral }),
      careNotes:
        'Toadstool-shaped and very hardy. Sheds a waxy skin now and then; run activated carbon because ' +
        'its chemicals slow the growth of stony corals nearby.',
    },
  },
  {
    id: 'finger-leather-coral',
    commonName: 'finger leather coral',
    scientificName: 'Sinularia spp.',
    family: 'Alcyoniidae',
    profile: {
      waterTypes: ['marine'],
      group: 'soft-coral',
      ranges: softCoralWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ toxic: gloves.softCoral }),
      careNotes:
        'Hardy and easy to frag. Like other leathers, it releases chemicals that bother stony corals.',
    },
  },
  {
    id: 'pulsing-xenia',
    commonName: 'pulsing xenia',
    scientificName: 'Xenia spp.',
    family: 'Xeniidae',
    profile: {
      waterTypes: ['marine'],
      group: 'soft-coral',
      ranges: { ...softCoralWater, nitrate: r(1, 30) },
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves(),
      careNotes: 'Pulses its polyps and can spread over rock quickly; best on an isolated rock.',
    },
  },
  {
    id: 'kenya-tree-coral',
    commonName: 'Kenya tree coral',
    scientificName: 'Capnella spp.',
    family: 'Nephtheidae',
    profile: {
      waterTypes: ['marine'],
      group: 'soft-coral',
      ranges: softCoralWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ toxic: gloves.softCoral }),
      careNotes: 'Tree-shaped and hardy; drops small branches that root nearby and can spread.',
    },
  },
  {
    id: 'green-star-polyps',
    commonName: 'green star polyps',
    scientificName: 'Briareum violaceum',
    family: 'Briareidae',
    profile: {
      waterTypes: ['marine'],
      group: 'soft-coral',
      ranges: softCoralWater,
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves(),
      careNotes:
        'A fast-spreading purple mat with green polyps; overgrows neighbours, so keep it on its own rock.',
    },
  },
  {
    id: 'zoanthids',
    commonName: 'zoanthids',
    scientificName: 'Zoanthus spp.',
    family: 'Zoanthidae',
    profile: {
      waterTypes: ['marine'],
      group: 'zoanthid',
      ranges: {
        ...lpsWater,
        alkalinity: r(7, 11),
        nitrate: r(1, 20),
        phosphate: r(0.02, 0.15),
      },
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ toxic: gloves.palytoxin }),
      careNotes: 'Colourful colonial polyps, easy to grow. Handle only with gloves and eye protection.',
    },
  },
  {
    id: 'button-polyps',
    commonName: 'button polyps',
    scientificName: 'Palythoa spp.',
    family: 'Sphenopidae',
    profile: {
      waterTypes: ['marine'],
      group: 'zoanthid',
      ranges: { ...softCoralWater, temperature: r(24, 28) },
      light: 'moderate',
      flow: 'moderate',
      behaviour: behaves({ toxic: gloves.palytoxin }),
      careNotes:
        'Very hardy and fast spreading, and the most likely of the polyps to carry high levels of palytoxin. ' +
        'Gloves and eye protection every time.',
    },
  },
  {
    id: 'mushroom-coral',
    commonName: 'mushroom coral',
    scientificName: 'Discosoma spp.',
    family: 'Discosomidae',
    profile: {
      waterTypes: ['marine'],
      group: 'mushroom',
      ranges: { ...softCoralWater, nitrate: r(2, 30) },
      light: 'low',
      flow: 'low',
      behaviour: behaves(),
      careNotes:
        'Undemanding disc-shaped polyps for low light; they multiply and can crowd out their neighbours.',
    },
  },
  {
    id: 'ricordea-mushroom',
    commonName: 'ricordea mushroom',
    scientificName: 'Ricordea florida',
    family: 'Ricordeidae',
    profile: {
      waterTypes: ['marine'],
      group: 'mushroom',
      ranges: { ...softCoralWater, nitrate: r(2, 20), phosphate: r(0.02, 0.2) },
      light: 'moderate',
      flow: 'low',
      behaviour: behaves(),
      careNotes: 'Bumpy, colourful mushrooms; prefer gentle flow and moderate light.',
    },
  },
];

const anemonesAndClams: Species[] = [
  {
    id: 'bubble-tip-anemone',
    commonName: 'bubble-tip anemone',
    scientificName: 'Entacmaea quadricolor',
    family: 'Actiniidae',
    profile: {
      waterTypes: ['marine'],
      group: 'anemone',
      ranges: {
        temperature: r(24, 27),
        salinity: r(33, 36),
        ph: r(7.9, 8.4),
        alkalinity: r(7, 11),
        nitrate: r(1, 20),
        phosphate: r(0.02, 0.15),
      },
      light: 'high',
      flow: 'moderate',
      adultSizeCm: 30,
      behaviour: behaves({ stings: true, stingReachCm: 15, wanders: true }),
      careNotes:
        'Hosts clownfish. Add it only to a mature, stable tank. It moves until it finds a spot it likes, ' +
        'so cover pump intakes with foam guards.',
    },
  },
  {
    id: 'carpet-anemone',
    commonName: 'carpet anemone',
    scientificName: 'Stichodactyla spp.',
    family: 'Stichodactylidae',
    profile: {
      waterTypes: ['marine'],
      group: 'anemone',
      ranges: {
        temperature: r(24, 27),
        salinity: r(33, 36),
        ph: r(8, 8.4),
        alkalinity: r(7, 11),
        nitrate: r(1, 15),
        phosphate: r(0.02, 0.1),
      },
      light: 'high',
      flow: 'moderate',
      adultSizeCm: 50,
      behaviour: behaves({ stings: true, stingReachCm: 25, wanders: true, reefSafe: 'with-caution' }),
      careNotes:
        'Large, sticky and powerful: it can catch and eat fish other than the clownfish it hosts. For ' +
        'experienced keepers and big tanks only.',
    },
  },
  {
    id: 'rock-flower-anemone',
    commonName: 'rock flower anemone',
    scientificName: 'Phymanthus crucifer',
    family: 'Phymanthidae',
    profile: {
      waterTypes: ['marine'],
      group: 'anemone',
      ranges: { ...reefInvertebrateWater, nitrate: r(1, 25), phosphate: r(0.02, 0.2) },
      light: 'moderate',
      flow: 'low',
      adultSizeCm: 12,
      behaviour: behaves({ stings: true, stingReachCm: 5 }),
      careNotes:
        'A small anemone that settles in a crevice and, unlike most, seldom moves. Does not host clownfish.',
    },
  },
  {
    id: 'maxima-clam',
    commonName: 'maxima clam',
    scientificName: 'Tridacna maxima',
    family: 'Cardiidae',
    profile: {
      waterTypes: ['marine'],
      group: 'clam',
      ranges: {
        temperature: r(24, 28),
        salinity: r(33, 36),
        ph: r(8, 8.4),
        alkalinity: r(7, 11),
        calcium: r(380, 450),
        magnesium: r(1250, 1400),
        nitrate: r(1, 10),
        phosphate: r(0.02, 0.1),
      },
      light: 'high',
      flow: 'moderate',
      behaviour: behaves(),
      careNotes:
        'Needs strong light and stable calcium and alkalinity. Place it on rock, in reach of the light.',
    },
  },
  {
    id: 'crocea-clam',
    commonName: 'crocea clam',
    scientificName: 'Tridacna crocea',
    family: 'Cardiidae',
    profile: {
      waterTypes: ['marine'],
      group: 'clam',
      ranges: {
        temperature: r(24, 28),
        salinity: r(33, 36),
        ph: r(8, 8.4),
        alkalinity: r(7, 11),
        calcium: r(380, 450),
        magnesium: r(1250, 1400),
        nitrate: r(1, 10),
        phosphate: r(0.02, 0.1),
      },
      light: 'high',
      flow: 'moderate',
      behaviour: behaves(),
      careNotes: 'The smallest clam, needing the most light; bores into rock, so place it high in the tank.',
    },
  },
];

const marineInvertebrates: Species[] = [
  {
    id: 'skunk-cleaner-shrimp',
    commonName: 'skunk cleaner shrimp',
    scientificName: 'Lysmata amboinensis',
    family: 'Lysmatidae',
    profile: {
      waterTypes: ['marine'],
      group: 'shrimp',
      ranges: { ...reefInvertebrateWater, temperature: r(24, 27) },
      behaviour: behaves(),
      careNotes:
        'Cleans parasites off fish. Sensitive to copper and to sudden salinity change; acclimatise it ' +
        'slowly.',
    },
  },
  {
    id: 'fire-shrimp',
    commonName: 'fire shrimp',
    scientificName: 'Lysmata debelius',
    family: 'Lysmatidae',
    profile: {
      waterTypes: ['marine'],
      group: 'shrimp',
      ranges: { ...reefInvertebrateWater, temperature: r(24, 27) },
      behaviour: behaves(),
      careNotes: 'Shy, deep red cleaner that stays in caves by day. Sensitive to copper.',
    },
  },
  {
    id: 'peppermint-shrimp',
    commonName: 'peppermint shrimp',
    scientificName: 'Lysmata wurdemanni',
    family: 'Lysmatidae',
    profile: {
      waterTypes: ['marine'],
      group: 'shrimp',
      ranges: reefInvertebrateWater,
      behaviour: behaves({ nipsCorals: 'sometimes', reefSafe: 'with-caution' }),
      careNotes:
        'Kept to eat pest anemones. A hungry one may pick at zoanthids and large-polyp corals, so keep it fed.',
    },
  },
  {
    id: 'pistol-shrimp',
    commonName: 'pistol shrimp',
    scientificName: 'Alpheus spp.',
    family: 'Alpheidae',
    profile: {
      waterTypes: ['marine'],
      group: 'shrimp',
      ranges: reefInvertebrateWater,
      behaviour: behaves({ territorial: rivals('same-species', true) }),
      careNotes:
        'Digs a burrow it may share with a watchman goby; the snap of its claw is loud but harmless to the ' +
        'glass. It moves sand and small rocks, so secure rockwork.',
    },
  },
  {
    id: 'coral-banded-shrimp',
    commonName: 'coral banded shrimp',
    scientificName: 'Stenopus hispidus',
    family: 'Stenopodidae',
    profile: {
      waterTypes: ['marine'],
      group: 'shrimp',
      ranges: reefInvertebrateWater,
      behaviour: behaves({
        mayEatInvertebrates: ['shrimp'],
        territorial: rivals('same-species', true),
        reefSafe: 'with-caution',
      }),
      careNotes: 'Bold and long-armed. Fights its own kind except a mated pair and may kill smaller shrimp.',
    },
  },
  {
    id: 'trochus-snail',
    commonName: 'Trochus snail',
    scientificName: 'Trochus spp.',
    family: 'Trochidae',
    profile: {
      waterTypes: ['marine'],
      group: 'snail',
      ranges: reefInvertebrateWater,
      behaviour: behaves(),
      careNotes: 'An algae grazer that can right itself when it falls over. Breeds in the tank.',
    },
  },
  {
    id: 'nassarius-snail',
    commonName: 'Nassarius snail',
    scientificName: 'Nassarius spp.',
    family: 'Nassariidae',
    profile: {
      waterTypes: ['marine'],
      group: 'snail',
      ranges: reefInvertebrateWater,
      behaviour: behaves(),
      careNotes: 'A scavenger that lives buried in the sand and emerges at feeding time. Needs a sand bed.',
    },
  },
  {
    id: 'turbo-snail',
    commonName: 'Turbo snail',
    scientificName: 'Turbo spp.',
    family: 'Turbinidae',
    profile: {
      waterTypes: ['marine'],
      group: 'snail',
      ranges: reefInvertebrateWater,
      behaviour: behaves(),
      careNotes: 'A large, hungry algae grazer; may knock over loose corals. Cannot right itself on sand.',
    },
  },
  {
    id: 'cerith-snail',
    commonName: 'Cerith snail',
    scientificName: 'Cerithium spp.',
    family: 'Cerithiidae',
    profile: {
      waterTypes: ['marine'],
      group: 'snail',
      ranges: reefInvertebrateWater,
      behaviour: behaves(),
      careNotes: 'Grazes algae on rock and stirs the top of the sand bed.',
    },
  },
  {
    id: 'emerald-crab',
    commonName: 'emerald crab',
    scientificName: 'Mithraculus sculptus',
    family: 'Mithracidae',
    profile: {
      waterTypes: ['marine'],
      group: 'crab',
      ranges: reefInvertebrateWater,
      behaviour: behaves({ nipsCorals: 'sometimes', reefSafe: 'with-caution' }),
      careNotes: 'Eats bubble algae. If underfed it may pick at soft corals and zoanthids.',
    },
  },
  {
    id: 'blue-leg-hermit-crab',
    commonName: 'blue-leg hermit crab',
    scientificName: 'Clibanarius tricolor',
    family: 'Diogenidae',
    profile: {
      waterTypes: ['marine'],
      group: 'crab',
      ranges: reefInvertebrateWater,
      behaviour: behaves({ mayEatInvertebrates: ['snail'], reefSafe: 'with-caution' }),
      careNotes:
        'A small algae and detritus eater. Provide spare empty shells, or it may kill snails for theirs.',
    },
  },
  {
    id: 'scarlet-hermit-crab',
    commonName: 'scarlet reef hermit crab',
    scientificName: 'Paguristes cadenati',
    family: 'Diogenidae',
    profile: {
      waterTypes: ['marine'],
      group: 'crab',
      ranges: reefInvertebrateWater,
      behaviour: behaves({ mayEatInvertebrates: ['snail'] }),
      careNotes: 'One of the calmest hermits and a good algae eater. Give it spare shells as it grows.',
    },
  },
  {
    id: 'tuxedo-urchin',
    commonName: 'tuxedo urchin',
    scientificName: 'Mespilia globulus',
    family: 'Temnopleuridae',
    profile: {
      waterTypes: ['marine'],
      group: 'urchin',
      ranges: reefInvertebrateWater,
      behaviour: behaves({ reefSafe: 'with-caution' }),
      careNotes:
        'A good algae grazer with short spines. Carries shells and small frags on its back and can knock ' +
        'over loose corals; glue them down.',
    },
  },
  {
    id: 'long-spine-urchin',
    commonName: 'long-spine urchin',
    scientificName: 'Diadema setosum',
    family: 'Diadematidae',
    profile: {
      waterTypes: ['marine'],
      group: 'urchin',
      ranges: reefInvertebrateWater,
      behaviour: behaves({
        reefSafe: 'with-caution',
        toxic: {
          hazard: 'venomous-spines',
          caution:
            'Long, brittle, mildly venomous spines break off in the skin. Wear thick gloves and move it with a ' +
            'container; never reach into the tank without looking.',
        },
      }),
      careNotes: 'A strong grazer for large tanks; its spines can dislodge corals as it moves at night.',
    },
  },
  {
    id: 'sand-sifting-starfish',
    commonName: 'sand-sifting starfish',
    scientificName: 'Astropecten polyacanthus',
    family: 'Astropectinidae',
    profile: {
      waterTypes: ['marine'],
      group: 'starfish',
      ranges: reefInvertebrateWater,
      adultSizeCm: 20,
      behaviour: behaves({ reefSafe: 'with-caution' }),
      careNotes: 'Burrows through the sand eating the life in it; starves in small or young tanks.',
    },
  },
  {
    id: 'green-brittle-star',
    commonName: 'green brittle star',
    scientificName: 'Ophiarachna incrassata',
    family: 'Ophiodermatidae',
    profile: {
      waterTypes: ['marine'],
      group: 'starfish',
      ranges: reefInvertebrateWater,
      adultSizeCm: 40,
      behaviour: behaves({ eatsSmallFish: true, mayEatInvertebrates: ['shrimp'], reefSafe: 'with-caution' }),
      careNotes: 'A large, fast scavenger that can catch sleeping small fish and shrimp at night.',
    },
  },
  {
    id: 'blue-linckia-starfish',
    commonName: 'blue linckia starfish',
    scientificName: 'Linckia laevigata',
    family: 'Ophidiasteridae',
    profile: {
      waterTypes: ['marine'],
      group: 'starfish',
      ranges: { ...reefInvertebrateWater, salinity: r(34, 36) },
      adultSizeCm: 30,
      behaviour: behaves(),
      careNotes:
        'Harmless but hard to keep: needs a large mature tank and very slow acclimatisation; never expose ' +
        'it to air.',
    },
  },
  {
    id: 'feather-duster-worm',
    commonName: 'feather duster worm',
    scientificName: 'Sabellastarte spp.',
    family: 'Sabellidae',
    profile: {
      waterTypes: ['marine'],
      group: 'other-invertebrate',
      ranges: reefInvertebrateWater,
      flow: 'moderate',
      behaviour: behaves(),
      careNotes: 'Filter feeder in a tube; fine particulate food helps. Drops its crown when stressed.',
    },
  },
  {
    id: 'tiger-tail-sea-cucumber',
    commonName: 'tiger tail sea cucumber',
    scientificName: 'Holothuria hilla',
    family: 'Holothuriidae',
    profile: {
      waterTypes: ['marine'],
      group: 'other-invertebrate',
      ranges: reefInvertebrateWater,
      behaviour: behaves({
        toxic: {
          hazard: 'contact-toxin',
          caution:
            'Releases a toxin if stressed, injured or dying that can kill fish. Handle it gently with gloves; ' +
            'cover pump intakes so it cannot be sucked in.',
        },
      }),
      careNotes:
        'Cleans the sand bed. A dead or damaged one needs removing at once, with a large water change.',
    },
  },
];

const freshwaterLivestock: Species[] = [
  {
    id: 'neon-tetra',
    commonName: 'neon tetra',
    scientificName: 'Paracheirodon innesi',
    family: 'Characidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(20, 26), ph: r(6, 7.5), gh: r(1, 10), kh: r(1, 8) },
      adultSizeCm: 3.5,
      behaviour: behaves(),
      careNotes: 'A peaceful schooling fish; keep at least eight. Best added to a settled, planted tank.',
    },
  },
  {
    id: 'cardinal-tetra',
    commonName: 'cardinal tetra',
    scientificName: 'Paracheirodon axelrodi',
    family: 'Characidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(24, 29), ph: r(5, 7), gh: r(1, 8), kh: r(0, 4) },
      adultSizeCm: 4,
      behaviour: behaves(),
      careNotes: 'Likes warm, soft, slightly acid water. Keep a school of eight or more.',
    },
  },
  {
    id: 'harlequin-rasbora',
    commonName: 'harlequin rasbora',
    scientificName: 'Trigonostigma heteromorpha',
    family: 'Danionidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: tropicalSoftWater,
      adultSizeCm: 5,
      behaviour: behaves(),
      careNotes: 'Peaceful and hardy schooling fish for planted tanks.',
    },
  },
  {
    id: 'zebra-danio',
    commonName: 'zebra danio',
    scientificName: 'Danio rerio',
    family: 'Danionidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(18, 25), ph: r(6.5, 8), gh: r(5, 19), kh: r(3, 12) },
      adultSizeCm: 5,
      flow: 'moderate',
      behaviour: behaves(),
      careNotes: 'Fast, tough and happy in cooler water. Keep a group of six or more.',
    },
  },
  {
    id: 'corydoras',
    commonName: 'Corydoras catfish',
    scientificName: 'Corydoras spp.',
    family: 'Callichthyidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(22, 26), ph: r(6, 7.8), gh: r(2, 15), kh: r(1, 10) },
      adultSizeCm: 6,
      behaviour: behaves(),
      careNotes:
        'Peaceful bottom-dwellers kept in groups of six or more, on soft sand that spares their barbels. ' +
        'Sinking food at night.',
    },
  },
  {
    id: 'bristlenose-pleco',
    commonName: 'bristlenose pleco',
    scientificName: 'Ancistrus spp.',
    family: 'Loricariidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(22, 27), ph: r(6, 8), gh: r(2, 20), kh: r(2, 12) },
      adultSizeCm: 13,
      behaviour: behaves({ territorial: rivals('same-species', true) }),
      careNotes: 'Grazes algae and needs driftwood to rasp; add algae wafers and vegetables.',
    },
  },
  {
    id: 'otocinclus',
    commonName: 'otocinclus catfish',
    scientificName: 'Otocinclus spp.',
    family: 'Loricariidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: tropicalSoftWater,
      adultSizeCm: 4,
      behaviour: behaves(),
      careNotes: 'A small, shy algae grazer kept in groups; only for mature tanks with film algae to eat.',
    },
  },
  {
    id: 'freshwater-angelfish',
    commonName: 'freshwater angelfish',
    scientificName: 'Pterophyllum scalare',
    family: 'Cichlidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(24, 30), ph: r(6, 7.5), gh: r(3, 12), kh: r(1, 8) },
      adultSizeCm: 15,
      behaviour: behaves({
        eatsSmallFish: true,
        mayEatInvertebrates: ['shrimp'],
        territorial: rivals('same-species', true),
      }),
      careNotes:
        'Graceful but a cichlid: a grown angelfish eats neon-sized fish and small shrimp. Needs a tall tank.',
    },
  },
  {
    id: 'betta',
    commonName: 'betta',
    scientificName: 'Betta splendens',
    family: 'Osphronemidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(24, 30), ph: r(6, 7.5), gh: r(2, 15), kh: r(1, 10) },
      adultSizeCm: 6,
      flow: 'low',
      behaviour: behaves({ mayEatInvertebrates: ['shrimp'], territorial: rivals('same-species') }),
      careNotes:
        'Breathes air at the surface and likes still, warm water. Males fight to the death: one male per ' +
        'tank. Long-finned fish are targets for fin-nippers.',
    },
  },
  {
    id: 'dwarf-gourami',
    commonName: 'dwarf gourami',
    scientificName: 'Trichogaster lalius',
    family: 'Osphronemidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(24, 28), ph: r(6, 7.5), gh: r(4, 15), kh: r(2, 10) },
      adultSizeCm: 8,
      flow: 'low',
      behaviour: behaves({ territorial: rivals('same-species', true) }),
      careNotes: 'Peaceful with other fish; males squabble with each other. Likes floating plants.',
    },
  },
  {
    id: 'guppy',
    commonName: 'guppy',
    scientificName: 'Poecilia reticulata',
    family: 'Poeciliidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: tropicalHardWater,
      adultSizeCm: 5,
      behaviour: behaves(),
      careNotes: 'Hardy livebearer that breeds freely; keep more females than males.',
    },
  },
  {
    id: 'platy',
    commonName: 'platy',
    scientificName: 'Xiphophorus maculatus',
    family: 'Poeciliidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(20, 26), ph: r(7, 8.2), gh: r(10, 25), kh: r(5, 15) },
      adultSizeCm: 6,
      behaviour: behaves(),
      careNotes: 'Peaceful, hardy livebearer that likes hard water and some vegetable food.',
    },
  },
  {
    id: 'molly',
    commonName: 'molly',
    scientificName: 'Poecilia sphenops',
    family: 'Poeciliidae',
    profile: {
      waterTypes: ['fresh', 'brackish'],
      group: 'fish',
      ranges: { temperature: r(24, 28), salinity: r(0, 15), ph: r(7.5, 8.5), gh: r(12, 30), kh: r(8, 20) },
      adultSizeCm: 10,
      behaviour: behaves(),
      careNotes: 'A livebearer for hard water; happy with a little salt. Grazes algae.',
    },
  },
  {
    id: 'clown-loach',
    commonName: 'clown loach',
    scientificName: 'Chromobotia macracanthus',
    family: 'Botiidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'fish',
      ranges: { temperature: r(25, 30), ph: r(6, 7.5), gh: r(5, 12), kh: r(2, 8) },
      adultSizeCm: 25,
      behaviour: behaves({ eatsInvertebrates: ['snail'], mayEatInvertebrates: ['shrimp'] }),
      careNotes:
        'A social loach kept in groups that grows large over years. Eats snails, which is often why it is ' +
        'bought.',
    },
  },
  {
    id: 'bumblebee-goby',
    commonName: 'bumblebee goby',
    scientificName: 'Brachygobius doriae',
    family: 'Gobiidae',
    profile: {
      waterTypes: ['brackish'],
      group: 'fish',
      ranges: { temperature: r(24, 29), salinity: r(2, 10), ph: r(7.5, 8.5), gh: r(10, 20) },
      adultSizeCm: 3.5,
      behaviour: behaves({ territorial: rivals('same-species', true) }),
      careNotes: 'A tiny brackish-water goby that claims a cave; feed small frozen foods.',
    },
  },
  {
    id: 'cherry-shrimp',
    commonName: 'cherry shrimp',
    scientificName: 'Neocaridina davidi',
    family: 'Atyidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'shrimp',
      ranges: { temperature: r(18, 28), ph: r(6.5, 8), gh: r(6, 14), kh: r(2, 8) },
      behaviour: behaves(),
      careNotes:
        'Hardy and breeds readily in a planted tank; very sensitive to copper in medicines and fertilisers.',
    },
  },
  {
    id: 'amano-shrimp',
    commonName: 'Amano shrimp',
    scientificName: 'Caridina multidentata',
    family: 'Atyidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'shrimp',
      ranges: { temperature: r(18, 28), ph: r(6.5, 8), gh: r(5, 15), kh: r(2, 10) },
      behaviour: behaves(),
      careNotes: 'A tireless algae eater. Will not breed in fresh water. Sensitive to copper.',
    },
  },
  {
    id: 'nerite-snail',
    commonName: 'nerite snail',
    scientificName: 'Neritina spp.',
    family: 'Neritidae',
    profile: {
      waterTypes: ['fresh', 'brackish'],
      group: 'snail',
      ranges: { temperature: r(22, 28), salinity: r(0, 15), ph: r(7, 8.5), gh: r(6, 18), kh: r(3, 12) },
      behaviour: behaves(),
      careNotes:
        'An excellent algae grazer that cannot breed in fresh water, though it lays hard white eggs. Soft ' +
        'water erodes its shell.',
    },
  },
  {
    id: 'mystery-snail',
    commonName: 'mystery snail',
    scientificName: 'Pomacea bridgesii',
    family: 'Ampullariidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'snail',
      ranges: { temperature: r(20, 28), ph: r(7, 8), gh: r(8, 18), kh: r(4, 12) },
      behaviour: behaves(),
      careNotes:
        'A large, peaceful scavenger. Needs hard water for its shell; lays eggs above the waterline.',
    },
  },
  {
    id: 'assassin-snail',
    commonName: 'assassin snail',
    scientificName: 'Anentome helena',
    family: 'Nassariidae',
    profile: {
      waterTypes: ['fresh'],
      group: 'snail',
      ranges: { temperature: r(22, 28), ph: r(7, 8), gh: r(6, 15), kh: r(3, 10) },
      behaviour: behaves({ eatsInvertebrates: ['snail'], mayEatInvertebrates: ['shrimp'] }),
      careNotes: 'Kept to control pest snails; it eats other snails, including ones you want to keep.',
    },
  },
  {
    id: 'java-fern',
    commonName: 'Java fern',
    scientificName: 'Microsorum pteropus',
    family: 'Polypodiaceae',
    profile: {
      waterTypes: ['fresh'],
      group: 'plant',
      ranges: easyPlantWater,
      light: 'low',
      behaviour: behaves(),
      careNotes: 'Tie it to wood or rock; burying the rhizome rots it. Grows slowly in low light.',
    },
  },
  {
    id: 'anubias',
    commonName: 'Anubias',
    scientificName: 'Anubias spp.',
    family: 'Araceae',
    profile: {
      waterTypes: ['fresh'],
      group: 'plant',
      ranges: { ...easyPlantWater, temperature: r(22, 28) },
      light: 'low',
      behaviour: behaves(),
      careNotes: 'Tough, slow-growing plant for wood or rock; keep the rhizome above the substrate.',
    },
  },
  {
    id: 'java-moss',
    commonName: 'Java moss',
    scientificName: 'Taxiphyllum barbieri',
    family: 'Hypnaceae',
    profile: {
      waterTypes: ['fresh'],
      group: 'plant',
      ranges: easyPlantWater,
      light: 'low',
      behaviour: behaves(),
      careNotes:
        'Undemanding moss for wood and rock; shelter for shrimp. Trim it so it does not trap debris.',
    },
  },
  {
    id: 'amazon-sword',
    commonName: 'Amazon sword',
    scientificName: 'Echinodorus spp.',
    family: 'Alismataceae',
    profile: {
      waterTypes: ['fresh'],
      group: 'plant',
      ranges: { temperature: r(22, 28), ph: r(6.5, 7.5), gh: r(3, 15), kh: r(2, 10) },
      light: 'moderate',
      behaviour: behaves(),
      careNotes: 'A large rooted plant; feed the roots with fertiliser tabs and give it room to spread.',
    },
  },
];

export const speciesCatalogue: readonly Species[] = [
  ...marineFish,
  ...stonyCorals,
  ...softCorals,
  ...anemonesAndClams,
  ...marineInvertebrates,
  ...freshwaterLivestock,
];

const byId = new Map(speciesCatalogue.map((entry) => [entry.id, entry]));

export function findSpecies(id: string): Species | undefined {
  return byId.get(id);
}
