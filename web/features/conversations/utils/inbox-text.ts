import type { ConversationSummary } from '@shared/schemas/conversations';

const minute = 60_000;
const hour = 60 * minute;
const day = 24 * hour;

/** "Waiting 25 min", "Waiting 3 h 5 min", "Waiting 2 days": how long an owner has waited for an answer. */
export function waitingLabel(since: string, now: number): string {
  const waited = Math.max(0, now - Date.parse(since));
  if (waited < minute) return 'Waiting less than a minute';
  if (waited < hour) return `Waiting ${Math.floor(waited / minute)} min`;
  if (waited < day) {
    const hours = Math.floor(waited / hour);
    const minutes = Math.floor((waited % hour) / minute);
    return minutes === 0 ? `Waiting ${hours} h` : `Waiting ${hours} h ${minutes} min`;
  }
  const days = Math.floor(waited / day);
  return `Waiting ${days} ${days === 1 ? 'day' : 'days'}`;
}

const previewLength = 140;

/** The newest line on one line: internal notes say so first, long text is cut at a word. */
export function previewLine(last: ConversationSummary['lastMessage']): string {
  if (!last) return 'No messages yet';
  const text = last.body.replace(/\s+/g, ' ').trim();
  const cut =
    text.length <= previewLength
      ? text
      : `${text.slice(0, previewLength).replace(/\s+\S*$/, '') || text.slice(0, previewLength)}…`;
  return last.kind === 'internal-note' ? `Note: ${cut}` : cut;
}
