import { LinkifyIt } from 'linkify-it';

/*
 * Messages are plain text: the only markup they get is a link where someone typed an address.
 * Links are found here and drawn as React elements by the thread, never as HTML, so nothing typed
 * can become markup.
 */

export type Segment =
  { kind: 'text'; text: string } | { kind: 'link'; text: string; href: string; external: boolean };

// Web pages and e-mail only: no ftp, and no scheme-relative "//host". Addresses typed without
// "https://" ("www.example.org") count too, as people type them that way.
const linkify = new LinkifyIt({ fuzzyLink: true }).add('ftp:', null).add('//', null);
const allowedProtocols = new Set(['http:', 'https:', 'mailto:']);

/**
 * An address typed without "https://" is taken for a link only when it looks like one: "www." in
 * front, or a generic ending (.com, .org…). A two-letter ending alone is more often a missed space
 * after a full stop ("the tank.It looks") than a country's site.
 */
function plausibleBareHost(hostname: string): boolean {
  return hostname.startsWith('www.') || !/\.[a-z]{2}$/i.test(hostname);
}

/**
 * The text cut into plain runs and links. `origin` is the app's own (a link to another Brinewatch
 * page stays in this tab); anything else is external and opens in a new one.
 */
export function linkSegments(text: string, origin: string): Segment[] {
  const matches = linkify.match(text) ?? [];
  const segments: Segment[] = [];
  let at = 0;
  for (const match of matches) {
    let url: URL;
    try {
      url = new URL(match.url);
    } catch {
      continue;
    }
    if (!allowedProtocols.has(url.protocol)) continue;
    if (match.schema === '' && url.protocol !== 'mailto:' && !plausibleBareHost(url.hostname)) continue;
    if (match.index > at) segments.push({ kind: 'text', text: text.slice(at, match.index) });
    segments.push({
      kind: 'link',
      text: match.raw,
      href: url.href,
      external: url.protocol !== 'mailto:' && url.origin !== origin,
    });
    at = match.lastIndex;
  }
  if (at < text.length) segments.push({ kind: 'text', text: text.slice(at) });
  return segments;
}
