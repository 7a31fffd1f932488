import { z } from 'zod';
import { distinctList } from '@shared/lists/distinct';
import { parameterKey } from '@shared/parameters/keys';
import { waterType } from '@shared/parameters/water-types';

export const livestockGroups = [
  'fish',
  'sps-coral',
  'lps-coral',
  'soft-coral',
  'zoanthid',
  'mushroom',
  'anemone',
  'clam',
  'shrimp',
  'snail',
  'crab',
  'urchin',
  'starfish',
  'plant',
  'other-invertebrate',
] as const;
export const livestockGroup = z.enum(livestockGroups);
export type LivestockGroup = z.infer<typeof livestockGroup>;

export const livestockGroupLabels: Readonly<Record<LivestockGroup, string>> = {
  fish: 'Fish',
  'sps-coral': 'Small-polyp stony coral',
  'lps-coral': 'Large-polyp stony coral',
  'soft-coral': 'Soft coral',
  zoanthid: 'Zoanthid',
  mushroom: 'Mushroom coral',
  anemone: 'Anemone',
  clam: 'Clam',
  shrimp: 'Shrimp',
  snail: 'Snail',
  crab: 'Crab',
  urchin: 'Urchin',
  starfish: 'Starfish',
  plant: 'Plant',
  'other-invertebrate': 'Other invertebrate',
};

/** Groups that live fixed in place (or nearly so) and can be stung by a neighbour. */
export const sessileGroups: readonly LivestockGroup[] = [
  'sps-coral',
  'lps-coral',
  'soft-coral',
  'zoanthid',
  'mushroom',
  'anemone',
  'clam',
];

/** Groups a coral-nipping fish goes after; clams are judged separately by `nipsClams`. */
export const coralGroups: readonly LivestockGroup[] = [
  'sps-coral',
  'lps-coral',
  'soft-coral',
  'zoanthid',
  'mushroom',
];

export const preyGroups = [
  'shrimp',
  'crab',
  'snail',
  'urchin',
  'starfish',
  'clam',
  'other-invertebrate',
] as const;
export const preyGroup = z.enum(preyGroups);
export type PreyGroup = z.infer<typeof preyGroup>;

export const level = z.enum(['low', 'moderate', 'high']);
export type Level = z.infer<typeof level>;

export const parameterRange = z
  .object({ min: z.number(), max: z.number() })
  .refine((range) => range.min < range.max, { message: 'min must be below max', path: ['max'] });
export type ParameterRange = z.infer<typeof parameterRange>;

export const careRanges = z.partialRecord(parameterKey, parameterRange);
export type CareRanges = z.infer<typeof careRanges>;

/**
 * Whom the animal treats as a rival. `same-genus` and `same-family` catch related fish that look
 * alike (other clownfish, other tangs); `same-group` means every animal of its group (a damselfish
 * that chases all fish). `pairTolerated`: one more of the same species makes a pair, not a fight.
 */
export const territoriality = z.union([
  z.literal(false),
  z.object({
    towards: z.enum(['same-species', 'same-genus', 'same-family', 'same-group']),
    pairTolerated: z.boolean().default(false),
  }),
]);
export type Territoriality = z.infer<typeof territoriality>;

/** Long enough for a full handling caution; a species list is sent to every owner, so it stays bounded. */
export const maxCautionLength = 2000;
export const maxCareNotesLength = 4000;

export const handlingHazard = z.object({
  hazard: z.enum(['contact-toxin', 'irritant', 'venomous-spines', 'sharp-spines', 'bite']),
  caution: z.string().trim().min(1).max(maxCautionLength),
});
export type HandlingHazard = z.infer<typeof handlingHazard>;

export const behaviour = z
  .object({
    stings: z.boolean().default(false),
    stingReachCm: z.number().positive().max(100).optional(),
    wanders: z.boolean().default(false),
    nipsCorals: z.union([z.boolean(), z.literal('sometimes')]).default(false),
    nipsClams: z.union([z.boolean(), z.literal('sometimes')]).default(false),
    /** Prey it hunts as food. */
    eatsInvertebrates: distinctList(preyGroup, preyGroups.length).default([]),
    /** Prey it may pick off when small or weak. */
    mayEatInvertebrates: distinctList(preyGroup, preyGroups.length).default([]),
    /** Eats fish small enough to swallow (about a third of its own length or less). */
    eatsSmallFish: z.boolean().default(false),
    territorial: territoriality.default(false),
    reefSafe: z.union([z.boolean(), z.literal('with-caution')]).default(true),
    toxic: handlingHazard.optional(),
  })
  .refine((b) => b.stings === (b.stingReachCm !== undefined), {
    message: 'a species that stings needs stingReachCm, and only one that stings',
    path: ['stingReachCm'],
  });
export type Behaviour = z.infer<typeof behaviour>;

export const careProfile = z
  .object({
    waterTypes: distinctList(waterType, waterType.options.length).pipe(z.array(waterType).min(1)),
    group: livestockGroup,
    ranges: careRanges,
    light: level.optional(),
    flow: level.optional(),
    /** Adult length for fish, spread for anemones and starfish; used to judge who can eat whom. */
    adultSizeCm: z.number().positive().optional(),
    behaviour,
    careNotes: z.string().trim().min(1).max(maxCareNotesLength),
  })
  .refine((p) => p.group !== 'fish' || p.adultSizeCm !== undefined, {
    message: 'fish need an adult size',
    path: ['adultSizeCm'],
  });
export type CareProfile = z.infer<typeof careProfile>;

export const speciesId = z
  .string()
  .min(2)
  .max(80)
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'use lowercase words joined by hyphens');

export const species = z.object({
  id: speciesId,
  commonName: z.string().trim().min(1).max(120),
  scientificName: z
    .string()
    .trim()
    .max(120)
    .regex(/^[A-Z][a-z]+(?: (?:[a-z-]+|spp\.|sp\.))?$/, 'use "Genus species", "Genus spp." or "Genus"'),
  /** Scientific family, when known; lets rivalry between related fish be judged. */
  family: z
    .string()
    .max(80)
    .regex(/^[A-Z][a-z]+(?:idae|aceae|inae)$/, 'use the scientific family name')
    .optional(),
  profile: careProfile,
});
export type Species = z.infer<typeof species>;
