import { z } from 'zod';
import { formatRange, joinWithAnd, parameterLabel, rangesOverlap } from '@shared/livestock/comfort-range';
import {
  coralGroups,
  sessileGroups,
  speciesId,
  type LivestockGroup,
  type PreyGroup,
  type Species,
  type Territoriality,
} from '@shared/livestock/species';
import type { ParameterKey } from '@shared/parameters/keys';
import type { WaterType } from '@shared/parameters/water-types';

export const compatibilityWarningKinds = [
  'water-type',
  'stings-neighbours',
  'wanders',
  'nips-corals',
  'nips-clams',
  'eats-invertebrates',
  'eats-fish',
  'territorial',
  'care-range',
] as const;

export const compatibilityWarning = z.object({
  kind: z.enum(compatibilityWarningKinds),
  severity: z.enum(['caution', 'serious']),
  message: z.string(),
  /** The candidate first, then the inhabitants the warning concerns. */
  speciesIds: z.array(speciesId).min(1),
});
export type CompatibilityWarning = z.infer<typeof compatibilityWarning>;

export interface Inhabitant {
  species: Species;
  quantity?: number;
  nickname?: string;
}

export interface CompatibilityTank {
  waterType: WaterType;
}

/** Inhabitants of one species, counted together. */
interface Resident {
  species: Species;
  count: number;
  name: string;
}

/** A fish this much shorter than a fish-eater, or less, fits in its mouth. */
const swallowableFraction = 1 / 3;

const waterWording: Record<WaterType, { needs: string; tank: string }> = {
  marine: { needs: 'marine', tank: 'a marine' },
  fresh: { needs: 'fresh', tank: 'a freshwater' },
  brackish: { needs: 'brackish', tank: 'a brackish' },
};

const groupPlural: Record<LivestockGroup, string> = {
  fish: 'fish',
  'sps-coral': 'small-polyp stony corals',
  'lps-coral': 'large-polyp stony corals',
  'soft-coral': 'soft corals',
  zoanthid: 'zoanthids',
  mushroom: 'mushroom corals',
  anemone: 'anemones',
  clam: 'clams',
  shrimp: 'shrimp',
  snail: 'snails',
  crab: 'crabs',
  urchin: 'urchins',
  starfish: 'starfish',
  plant: 'plants',
  'other-invertebrate': 'invertebrates',
};

/**
 * What could go wrong if `candidate` joins the tank: each warning names the animals concerned.
 * Pass only the livestock in the tank now (not removed or dead). An empty list means no known
 * problem, not a guarantee.
 */
export function checkCompatibility(
  candidate: Species,
  inhabitants: readonly Inhabitant[],
  tank: CompatibilityTank,
): CompatibilityWarning[] {
  const residents = groupBySpecies(inhabitants);
  const others = residents.filter((resident) => resident.species.id !== candidate.id);

  const waterType = waterTypeWarnings(candidate, tank);
  const warnings = [
    ...waterType,
    ...stingWarnings(candidate, others),
    ...wanderWarnings(candidate, others),
    ...nipWarnings(candidate, others, 'nips-corals'),
    ...nipWarnings(candidate, others, 'nips-clams'),
    ...invertebratePredationWarnings(candidate, others),
    ...fishPredationWarnings(candidate, others),
    ...territorialWarnings(candidate, residents),
    // Wrong water makes every range clash; the water-type warning already says why.
    ...(waterType.length > 0 ? [] : careRangeWarnings(candidate, others)),
  ];
  return warnings.sort((a, b) => severityRank(b) - severityRank(a));
}

function severityRank(warning: CompatibilityWarning): number {
  return warning.severity === 'serious' ? 1 : 0;
}

function groupBySpecies(inhabitants: readonly Inhabitant[]): Resident[] {
  const byId = new Map<string, { species: Species; count: number; nicknames: string[] }>();
  for (const { species, quantity, nickname } of inhabitants) {
    const entry = byId.get(species.id) ?? { species, count: 0, nicknames: [] };
    entry.count += quantity ?? 1;
    if (nickname) entry.nicknames.push(nickname);
    byId.set(species.id, entry);
  }
  return [...byId.values()].map(({ species, count, nicknames }) => ({
    species,
    count,
    name: nicknames.length > 0 ? `${species.commonName} (${nicknames.join(', ')})` : species.commonName,
  }));
}

function names(residents: readonly Resident[]): string {
  return joinWithAnd(residents.map((resident) => resident.name));
}

function ids(candidate: Species, residents: readonly Resident[]): string[] {
  return [candidate.id, ...residents.map((resident) => resident.species.id)];
}

function isStingable(species: Species): boolean {
  return sessileGroups.includes(species.profile.group);
}

function stingReach(species: Species): number {
  return species.profile.behaviour.stingReachCm ?? 0;
}

function tentacles(species: Species): string {
  return species.profile.group === 'anemone' ? 'tentacles' : 'sweeper tentacles';
}

function waterTypeWarnings(candidate: Species, tank: CompatibilityTank): CompatibilityWarning[] {
  const suits = candidate.profile.waterTypes;
  if (suits.includes(tank.waterType)) return [];
  const needs = joinWithAnd(suits.map((type) => waterWording[type].needs)).replace(/ and /, ' or ');
  return [
    {
      kind: 'water-type',
      severity: 'serious',
      message: `The ${candidate.commonName} needs ${needs} water and cannot live in ${waterWording[tank.waterType].tank} tank.`,
      speciesIds: [candidate.id],
    },
  ];
}

function stingWarnings(candidate: Species, others: readonly Resident[]): CompatibilityWarning[] {
  const candidateStings = candidate.profile.behaviour.stings;
  const victims = candidateStings ? others.filter((other) => isStingable(other.species)) : [];
  const attackers = isStingable(candidate)
    ? others.filter((other) => other.species.profile.behaviour.stings)
    : [];
  const mutual = victims.filter((victim) => attackers.includes(victim));
  const warnings: CompatibilityWarning[] = [];

  for (const other of mutual) {
    const reach = Math.max(stingReach(candidate), stingReach(other.species));
    const wanderer = [candidate, other.species].find((entry) => entry.profile.behaviour.wanders);
    warnings.push({
      kind: 'stings-neighbours',
      severity: wanderer ? 'serious' : 'caution',
      message:
        `The ${candidate.commonName} may sting the ${other.name}, and the ${other.species.commonName} may ` +
        'sting it back. ' +
        (wanderer
          ? `The ${wanderer.commonName} moves around, so spacing alone will not keep them apart.`
          : `Keep at least ${reach} cm between them, allowing for growth.`),
      speciesIds: ids(candidate, [other]),
    });
  }

  const onlyVictims = victims.filter((victim) => !mutual.includes(victim));
  if (onlyVictims.length > 0) {
    const reach = stingReach(candidate);
    const wanders = candidate.profile.behaviour.wanders;
    warnings.push({
      kind: 'stings-neighbours',
      severity: wanders ? 'serious' : 'caution',
      message:
        `The ${candidate.commonName} may sting the ${names(onlyVictims)}: its ${tentacles(candidate)} reach ` +
        `about ${reach} cm` +
        (wanders
          ? ` and it moves around, so spacing alone will not protect ${onlyVictims.length === 1 ? 'it' : 'them'}.`
          : `. Place it at least ${reach} cm away, allowing for growth.`),
      speciesIds: ids(candidate, onlyVictims),
    });
  }

  for (const attacker of attackers.filter((other) => !mutual.includes(other))) {
    const reach = stingReach(attacker.species);
    const wanders = attacker.species.profile.behaviour.wanders;
    warnings.push({
      kind: 'stings-neighbours',
      severity: wanders ? 'serious' : 'caution',
      message:
        `The ${attacker.name} already in the tank may sting the new ${candidate.commonName}: its ` +
        `${tentacles(attacker.species)} reach about ${reach} cm` +
        (wanders
          ? ' and it moves around, so no spot is safe for long.'
          : `. Place the ${candidate.commonName} at least ${reach} cm away.`),
      speciesIds: ids(candidate, [attacker]),
    });
  }

  return warnings;
}

const pumpAdvice =
  'Cover pump intakes with foam guards, and switch pumps off at the wall before freeing an anemone from one.';

function wanderWarnings(candidate: Species, others: readonly Resident[]): CompatibilityWarning[] {
  const warnings: CompatibilityWarning[] = [];

  if (candidate.profile.behaviour.wanders) {
    const neighbours = others.filter((other) => isStingable(other.species));
    warnings.push({
      kind: 'wanders',
      severity: 'caution',
      message:
        `The ${candidate.commonName} may wander until it finds a spot it likes, ` +
        (neighbours.length > 0
          ? `onto the ${names(neighbours)} or into a pump intake. `
          : 'into a pump intake. ') +
        pumpAdvice,
      speciesIds: ids(candidate, neighbours),
    });
  }

  if (isStingable(candidate)) {
    for (const wanderer of others.filter((other) => other.species.profile.behaviour.wanders)) {
      warnings.push({
        kind: 'wanders',
        severity: 'caution',
        message:
          `The ${wanderer.name} already in the tank may wander onto the new ${candidate.commonName}. ` +
          `Place the ${candidate.commonName} well away from where the ${wanderer.species.commonName} has settled.`,
        speciesIds: ids(candidate, [wanderer]),
      });
    }
  }

  return warnings;
}

function nipWarnings(
  candidate: Species,
  others: readonly Resident[],
  kind: 'nips-corals' | 'nips-clams',
): CompatibilityWarning[] {
  const targets: readonly LivestockGroup[] = kind === 'nips-corals' ? coralGroups : ['clam'];
  const nips = (species: Species) =>
    kind === 'nips-corals' ? species.profile.behaviour.nipsCorals : species.profile.behaviour.nipsClams;
  const isTarget = (species: Species) => targets.includes(species.profile.group);
  const warnings: CompatibilityWarning[] = [];

  const candidateNips = nips(candidate);
  const victims = candidateNips ? others.filter((other) => isTarget(other.species)) : [];
  if (victims.length > 0) {
    warnings.push({
      kind,
      severity: candidateNips === true ? 'serious' : 'caution',
      message:
        candidateNips === true
          ? `The ${candidate.commonName} eats ${kind === 'nips-corals' ? 'corals' : 'clams'} and will likely nip the ${names(victims)}.`
          : `The ${candidate.commonName} may pick at the ${names(victims)}; watch it closely after adding it.`,
      speciesIds: ids(candidate, victims),
    });
  }

  if (isTarget(candidate)) {
    for (const nipper of others) {
      const tendency = nips(nipper.species);
      if (!tendency) continue;
      warnings.push({
        kind,
        severity: tendency === true ? 'serious' : 'caution',
        message:
          tendency === true
            ? `The ${nipper.name} already in the tank will likely nip the new ${candidate.commonName}.`
            : `The ${nipper.name} already in the tank may pick at the new ${candidate.commonName}.`,
        speciesIds: ids(candidate, [nipper]),
      });
    }
  }

  return warnings;
}

function isPreyGroup(group: LivestockGroup, prey: readonly PreyGroup[]): boolean {
  return (prey as readonly LivestockGroup[]).includes(group);
}

function invertebratePredationWarnings(
  candidate: Species,
  others: readonly Resident[],
): CompatibilityWarning[] {
  const warnings: CompatibilityWarning[] = [];
  const { eatsInvertebrates, mayEatInvertebrates } = candidate.profile.behaviour;

  const hunted = others.filter((other) => isPreyGroup(other.species.profile.group, eatsInvertebrates));
  if (hunted.length > 0) {
    warnings.push({
      kind: 'eats-invertebrates',
      severity: 'serious',
      message: `The ${candidate.commonName} hunts ${groupsOf(hunted)} and will likely eat the ${names(hunted)}.`,
      speciesIds: ids(candidate, hunted),
    });
  }
  const atRisk = others.filter(
    (other) => !hunted.includes(other) && isPreyGroup(other.species.profile.group, mayEatInvertebrates),
  );
  if (atRisk.length > 0) {
    warnings.push({
      kind: 'eats-invertebrates',
      severity: 'caution',
      message: `The ${candidate.commonName} may eat the ${names(atRisk)}, especially small or weak ones.`,
      speciesIds: ids(candidate, atRisk),
    });
  }

  for (const predator of others) {
    const { behaviour } = predator.species.profile;
    if (isPreyGroup(candidate.profile.group, behaviour.eatsInvertebrates)) {
      warnings.push({
        kind: 'eats-invertebrates',
        severity: 'serious',
        message: `The ${predator.name} already in the tank hunts ${groupPlural[candidate.profile.group]} and will likely eat the new ${candidate.commonName}.`,
        speciesIds: ids(candidate, [predator]),
      });
    } else if (isPreyGroup(candidate.profile.group, behaviour.mayEatInvertebrates)) {
      warnings.push({
        kind: 'eats-invertebrates',
        severity: 'caution',
        message: `The ${predator.name} already in the tank may eat the new ${candidate.commonName}, especially a small one.`,
        speciesIds: ids(candidate, [predator]),
      });
    }
  }

  return warnings;
}

function groupsOf(residents: readonly Resident[]): string {
  return joinWithAnd([...new Set(residents.map((resident) => groupPlural[resident.species.profile.group]))]);
}

function canSwallow(predator: Species, prey: Species): boolean {
  const predatorSize = predator.profile.adultSizeCm;
  const preySize = prey.profile.adultSizeCm;
  return (
    predator.profile.behaviour.eatsSmallFish &&
    prey.profile.group === 'fish' &&
    predatorSize !== undefined &&
    preySize !== undefined &&
    preySize <= predatorSize * swallowableFraction
  );
}

function fishPredationWarnings(candidate: Species, others: readonly Resident[]): CompatibilityWarning[] {
  const warnings: CompatibilityWarning[] = [];

  const prey = others.filter((other) => canSwallow(candidate, other.species));
  if (prey.length > 0) {
    warnings.push({
      kind: 'eats-fish',
      severity: 'serious',
      message: `The ${candidate.commonName} eats fish small enough to swallow and will likely eat the ${names(prey)}.`,
      speciesIds: ids(candidate, prey),
    });
  }

  for (const predator of others.filter((other) => canSwallow(other.species, candidate))) {
    warnings.push({
      kind: 'eats-fish',
      severity: 'serious',
      message: `The ${predator.name} already in the tank eats fish small enough to swallow and will likely eat the new ${candidate.commonName}.`,
      speciesIds: ids(candidate, [predator]),
    });
  }

  return warnings;
}

function genus(species: Species): string {
  return species.scientificName.split(' ')[0] ?? species.scientificName;
}

function treatsAsRival(holder: Species, other: Species): boolean {
  const territorial: Territoriality = holder.profile.behaviour.territorial;
  if (!territorial) return false;
  switch (territorial.towards) {
    case 'same-species':
      return holder.id === other.id;
    case 'same-genus':
      return genus(holder) === genus(other);
    case 'same-family':
      return holder.family !== undefined && other.family !== undefined
        ? holder.family === other.family
        : genus(holder) === genus(other);
    case 'same-group':
      return holder.profile.group === other.profile.group;
  }
}

function territorialWarnings(candidate: Species, residents: readonly Resident[]): CompatibilityWarning[] {
  const warnings: CompatibilityWarning[] = [];
  const territorial = candidate.profile.behaviour.territorial;

  const sameSpecies = residents.find((resident) => resident.species.id === candidate.id);
  if (territorial && sameSpecies && !(territorial.pairTolerated && sameSpecies.count === 1)) {
    warnings.push({
      kind: 'territorial',
      severity: 'serious',
      message: territorial.pairTolerated
        ? `The tank already has ${sameSpecies.count} of the ${sameSpecies.name}; beyond a pair, another will be chased and may be killed.`
        : `The ${sameSpecies.name} already in the tank will fight another ${candidate.commonName}; the newcomer may be chased and killed.`,
      speciesIds: [candidate.id],
    });
  }

  for (const other of residents) {
    if (other === sameSpecies) continue;
    const candidateIsRival = treatsAsRival(candidate, other.species);
    const residentIsRival = treatsAsRival(other.species, candidate);
    if (!candidateIsRival && !residentIsRival) continue;

    const [holder, target] = candidateIsRival
      ? [candidate.commonName, `the ${other.name}`]
      : [other.name, `the new ${candidate.commonName}`];
    const holderSpecies = candidateIsRival ? candidate : other.species;
    const towards = holderSpecies.profile.behaviour.territorial;
    const message =
      towards && towards.towards === 'same-group'
        ? `The ${holder} defends its territory against other ${groupPlural[holderSpecies.profile.group]} and may harass ${target}.`
        : `The ${holder} treats close relatives as rivals and may fight ${target}. Add them at the same time, with plenty of rockwork, or choose one.`;
    warnings.push({ kind: 'territorial', severity: 'caution', message, speciesIds: ids(candidate, [other]) });
  }

  return warnings;
}

function careRangeWarnings(candidate: Species, others: readonly Resident[]): CompatibilityWarning[] {
  const warnings: CompatibilityWarning[] = [];
  for (const [parameter, range] of Object.entries(candidate.profile.ranges) as [
    ParameterKey,
    { min: number; max: number },
  ][]) {
    // Intervals have a common point exactly when every pair of them does, so naming the
    // inhabitants that clash with the candidate one by one explains why the comfort range breaks.
    const clashing = others.flatMap((other) => {
      const theirs = other.species.profile.ranges[parameter];
      return theirs && !rangesOverlap(range, theirs) ? [{ other, theirs }] : [];
    });
    if (clashing.length === 0) continue;

    const label = parameterLabel(parameter);
    warnings.push({
      kind: 'care-range',
      severity: 'serious',
      message:
        `The ${candidate.commonName} needs ${label} ${formatRange(parameter, range)}, but ` +
        joinWithAnd(
          clashing.map(({ other, theirs }) => `the ${other.name} needs ${formatRange(parameter, theirs)}`),
        ) +
        `: no ${label} suits ${clashing.length === 1 ? 'both' : 'them all'}.`,
      speciesIds: ids(
        candidate,
        clashing.map(({ other }) => other),
      ),
    });
  }
  return warnings;
}
