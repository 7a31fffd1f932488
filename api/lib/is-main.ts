import { pathToFileURL } from 'node:url';

/** True when the module at `moduleUrl` is the script Node was asked to run. */
export function isMain(moduleUrl: string): boolean {
  const entry = process.argv[1];
  return entry !== undefined && moduleUrl === pathToFileURL(entry).href;
}
