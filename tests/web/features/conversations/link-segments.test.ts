import { describe, expect, it } from 'vitest';
import { linkSegments } from '../../../../web/features/conversations/utils/link-segments';

const origin = 'https://portal.brinewatch.test';

describe('linkSegments', () => {
  it('cuts a message into text and links, keeping every character', () => {
    const text = 'The pump manual is at https://example.org/pumps?model=2, page 4.';
    const segments = linkSegments(text, origin);

    expect(segments).toEqual([
      { kind: 'text', text: 'The pump manual is at ' },
      {
        kind: 'link',
        text: 'https://example.org/pumps?model=2',
        href: 'https://example.org/pumps?model=2',
        external: true,
      },
      { kind: 'text', text: ', page 4.' },
    ]);
    expect(segments.map((s) => s.text).join('')).toBe(text);
  });

  it('links an address typed with www. and an e-mail address, the latter in the same tab', () => {
    const segments = linkSegments('See www.example.com or write to kim@example.com', origin);

    expect(segments.filter((s) => s.kind === 'link')).toEqual([
      { kind: 'link', text: 'www.example.com', href: 'http://www.example.com/', external: true },
      { kind: 'link', text: 'kim@example.com', href: 'mailto:kim@example.com', external: false },
    ]);
  });

  it('keeps links to Brinewatch itself in this tab', () => {
    const [link] = linkSegments(`${origin}/tanks/abc`, origin);

    expect(link).toMatchObject({ kind: 'link', external: false });
  });

  it('leaves other schemes as text', () => {
    const text = 'javascript:alert(1) ftp://files.example.org //example.org data:text/html,<b>hi</b>';

    expect(linkSegments(text, origin)).toEqual([{ kind: 'text', text }]);
  });

  it('does not take a missed space after a full stop for a country’s site', () => {
    const text = 'Salinity is 1.026 in the tank.It looks fine, KH 8.2 dKH.';

    expect(linkSegments(text, origin)).toEqual([{ kind: 'text', text }]);
  });
});
