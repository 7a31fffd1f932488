import { z } from 'zod';

/** What sits in or under a tank; the trade's own names for each kind. */
export const equipmentKinds = [
  'return-pump',
  'skimmer',
  'heater',
  'chiller',
  'lighting',
  'wavemaker',
  'dosing-pump',
  'reactor',
  'controller',
  'auto-top-off',
  'uv-steriliser',
  'filter',
  'probe',
  'power-board',
  'other',
] as const;
export const equipmentKind = z.enum(equipmentKinds);
export type EquipmentKind = z.infer<typeof equipmentKind>;

export const equipmentKindLabels: Readonly<Record<EquipmentKind, string>> = {
  'return-pump': 'Return pump',
  skimmer: 'Protein skimmer',
  heater: 'Heater',
  chiller: 'Chiller',
  lighting: 'Lighting',
  wavemaker: 'Wavemaker',
  'dosing-pump': 'Dosing pump',
  reactor: 'Reactor',
  controller: 'Controller',
  'auto-top-off': 'Auto top-off',
  'uv-steriliser': 'UV steriliser',
  filter: 'Filter',
  probe: 'Probe',
  'power-board': 'Power board',
  other: 'Other',
};
