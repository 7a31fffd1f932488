import { createHash } from 'node:crypto';

/** Stable ids for demo rows (name-based, like UUID v5), so seeding twice updates in place. */
export function demoId(key: string): string {
  const hex = createHash('sha1').update(`brinewatch-demo:${key}`).digest('hex');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-5${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`;
}

export const demoTankId = (tankKey: string) => demoId(tankKey);
export const demoLivestockId = (tankKey: string, key: string) => demoId(`livestock:${tankKey}:${key}`);
