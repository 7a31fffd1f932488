import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';

export const chromiumPath = '/usr/bin/chromium';

/** The browser tests drive Debian's Chromium; as root we install it when it is missing. */
export function ensureChromium(): string {
  if (existsSync(chromiumPath)) return chromiumPath;
  if (process.getuid?.() !== 0) {
    throw new Error('Chromium is missing: run `sudo apt-get update && sudo apt-get install -y chromium`.');
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update'], { stdio: 'inherit', env });
  execFileSync('apt-get', ['install', '-y', 'chromium'], { stdio: 'inherit', env });
  return chromiumPath;
}
