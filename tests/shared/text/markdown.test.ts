import { describe, expect, it } from 'vitest';
import { photoUrls } from '@shared/photos/urls';
import { markdownToPlainText, renderMarkdown } from '@shared/text/markdown';

/*
 * The attack strings come from the OWASP XSS Filter Evasion Cheat Sheet
 * (https://cheatsheetseries.owasp.org/cheatsheets/XSS_Filter_Evasion_Cheat_Sheet.html: script and
 * image tags, event handlers, javascript:/vbscript:/data: URLs in mixed case, as HTML entities with
 * and without semicolons, with embedded tabs and newlines) and the rules for URLs in the OWASP
 * Cross Site Scripting Prevention Cheat Sheet
 * (https://cheatsheetseries.owasp.org/cheatsheets/Cross_Site_Scripting_Prevention_Cheat_Sheet.html:
 * allow-list the scheme of any URL placed in href or src), turned into Markdown where they need a
 * link or image to travel in.
 */

const photoId = '0b9f6a1e-6c3a-4c35-9a59-2f7d0f3b1a11';
const ownPhoto = /^\/api\/photos\/[0-9a-f-]{36}(?:\/thumbnail)?$/;

const elementsWeWrite = new Set([
  ...['p', 'br', 'a', 'img', 'strong', 'em', 's', 'code', 'pre', 'blockquote', 'ul', 'ol', 'li', 'hr'],
  ...['h3', 'h4', 'h5', 'h6', 'aside', 'svg', 'path', 'circle'],
  ...['table', 'thead', 'tbody', 'tr', 'th', 'td'],
]);

/** An attribute value as the browser reads it: the HTML escapes markdown-it writes, decoded once. */
const attributeValue = (raw: string) =>
  raw
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');

/** The scheme a browser would act on, read without the module's own helpers. */
function hrefScheme(href: string): string | null {
  const decoded = href.replace(/%([0-9a-f]{2})/gi, (_, hex: string) =>
    String.fromCharCode(parseInt(hex, 16)),
  );
  const bare = Array.from(decoded)
    .filter((char) => (char.codePointAt(0) ?? 0) > 0x20 && !/\s/u.test(char))
    .join('');
  if (/^[/\\]{2}/.test(bare)) return '//';
  return /^([a-z][a-z0-9+.-]*):/i.exec(bare)?.[1]?.toLowerCase() ?? null;
}

/**
 * Every way the HTML could run script or load from elsewhere: an element we never write, an
 * event-handler attribute, attributes that do not parse as name="value", an href outside
 * http/https/mailto/relative, an image not from our own photo URLs.
 */
function activeParts(html: string): string[] {
  const problems: string[] = [];
  for (const [, closing, name = '', attributes = ''] of html.matchAll(/<(\/?)([a-zA-Z][\w:-]*)([^>]*)>/g)) {
    const element = name.toLowerCase();
    if (!elementsWeWrite.has(element)) problems.push(`<${element}>`);
    if (closing) continue;
    if (!/^(?:\s+[a-z][\w:-]*(?:="[^"]*")?)*\s*\/?$/i.test(attributes)) {
      problems.push(`<${element}> attributes ${attributes}`);
    }
    for (const [, attribute = '', raw = ''] of attributes.matchAll(/([a-z][\w:-]*)(?:="([^"]*)")?/gi)) {
      const key = attribute.toLowerCase();
      const value = attributeValue(raw);
      if (key.startsWith('on')) problems.push(`${element} ${key}`);
      if (['style', 'srcset', 'formaction', 'action', 'xlink:href', 'background'].includes(key)) {
        problems.push(`${element} ${key}`);
      }
      if (key === 'href') {
        const scheme = hrefScheme(value);
        if (scheme !== null && !['http', 'https', 'mailto'].includes(scheme)) problems.push(`href ${value}`);
      }
      if (key === 'src' && !ownPhoto.test(value)) problems.push(`src ${value}`);
    }
  }
  return problems;
}

describe('renderMarkdown with hostile input', () => {
  it.each([
    // Raw HTML, as blocks and inline: escaped, shown as the text that was typed.
    ["<script>alert('XSS')</script>", "<p>&lt;script&gt;alert('XSS')&lt;/script&gt;</p>\n"],
    [`<IMG SRC="javascript:alert('XSS');">`, "<p>&lt;IMG SRC=&quot;javascript:alert('XSS');&quot;&gt;</p>\n"],
    ['<img src=x onerror=alert(1)>', '<p>&lt;img src=x onerror=alert(1)&gt;</p>\n'],
    ["<body onload=alert('XSS')>", "<p>&lt;body onload=alert('XSS')&gt;</p>\n"],
    ["<svg/onload=alert('XSS')>", "<p>&lt;svg/onload=alert('XSS')&gt;</p>\n"],
    [
      `<iframe src="javascript:alert('XSS')"></iframe>`,
      "<p>&lt;iframe src=&quot;javascript:alert('XSS')&quot;&gt;&lt;/iframe&gt;</p>\n",
    ],
    [
      '<div onclick="alert(1)">\nclick\n</div>',
      '<p>&lt;div onclick=&quot;alert(1)&quot;&gt;<br>\nclick<br>\n&lt;/div&gt;</p>\n',
    ],
    [
      'Hello <a href="javascript:alert(1)">there</a>',
      '<p>Hello &lt;a href=&quot;javascript:alert(1)&quot;&gt;there&lt;/a&gt;</p>\n',
    ],
    // Links whose scheme is refused stay the text that was typed.
    ['[x](javascript:alert(1))', '<p>[x](javascript:alert(1))</p>\n'],
    ['[x](JaVaScRiPt:alert(1))', '<p>[x](JaVaScRiPt:alert(1))</p>\n'],
    ['[x](  JAVASCRIPT:alert(1))', '<p>[x](  JAVASCRIPT:alert(1))</p>\n'],
    ['[x](&#106;avascript:alert(1))', '<p>[x](javascript:alert(1))</p>\n'],
    ['[x](&#x6A;&#x61;vascript:alert(1))', '<p>[x](javascript:alert(1))</p>\n'],
    ['[x](javascript&colon;alert(1))', '<p>[x](javascript:alert(1))</p>\n'],
    ['[x](java&#9;script:alert(1))', '<p>[x](java\tscript:alert(1))</p>\n'],
    ['[x](java&#x0A;script:alert(1))', '<p>[x](java\nscript:alert(1))</p>\n'],
    ['[x](&#x09;javascript:alert(1))', '<p>[x](\tjavascript:alert(1))</p>\n'],
    ['[x](java%0ascript:alert(1))', '<p>[x](java%0ascript:alert(1))</p>\n'],
    ['[x](<javascript:alert(1)>)', '<p>[x](&lt;javascript:alert(1)&gt;)</p>\n'],
    ['[x](vbscript:msgbox(1))', '<p>[x](vbscript:msgbox(1))</p>\n'],
    ['[x](VBScript:msgbox(1))', '<p>[x](VBScript:msgbox(1))</p>\n'],
    [
      '[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
      '<p>[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)</p>\n',
    ],
    ['[x](DATA:text/html,hi)', '<p>[x](DATA:text/html,hi)</p>\n'],
    ['[x](//evil.example)', '<p>[x](//evil.example)</p>\n'],
    ['[![x](https://evil.example/x.png)](javascript:alert(1))', '<p>[x](javascript:alert(1))</p>\n'],
    // Entities without their semicolons are not entities in Markdown: a harmless relative address.
    [
      '[x](&#0000106&#0000097vascript:alert(1))',
      '<p><a href="&amp;#0000106&amp;#0000097vascript:alert(1)" rel="noopener nofollow ugc">x</a></p>\n',
    ],
    // Autolinks.
    ['<javascript:alert(1)>', '<p>&lt;javascript:alert(1)&gt;</p>\n'],
    ['<JAVASCRIPT:alert(1)>', '<p>&lt;JAVASCRIPT:alert(1)&gt;</p>\n'],
    ['<vbscript:msgbox(1)>', '<p>&lt;vbscript:msgbox(1)&gt;</p>\n'],
    ['<data:text/html,hi>', '<p>&lt;data:text/html,hi&gt;</p>\n'],
    ['javascript:alert(1)', '<p>javascript:alert(1)</p>\n'],
    // Reference-style links go through the same check; a refused definition stays text.
    ['[x][1]\n\n[1]: javascript:alert(1)', '<p>[x][1]</p>\n<p>[1]: javascript:alert(1)</p>\n'],
    ['[x]\n\n[x]: &#106;avascript:alert(1)', '<p>[x]</p>\n<p>[x]: javascript:alert(1)</p>\n'],
    ['[x][a]\n\n[a]: <VBScript:msgbox(1)>', '<p>[x][a]</p>\n<p>[a]: &lt;VBScript:msgbox(1)&gt;</p>\n'],
    // Images from anywhere but our own photo URLs become their alt text, or stay the typed text.
    ['![x](https://evil.example/x.png)', '<p>x</p>\n'],
    ['![x][p]\n\n[p]: https://evil.example/x.png', '<p>x</p>\n'],
    ['![x](//evil.example/x.png)', '<p>![x](//evil.example/x.png)</p>\n'],
    ['![x](data:image/png;base64,iVBORw0KGgo=)', '<p>![x](data:image/png;base64,iVBORw0KGgo=)</p>\n'],
    ['![x](data:image/svg+xml;base64,PHN2Zz4=)', '<p>![x](data:image/svg+xml;base64,PHN2Zz4=)</p>\n'],
    ['![x](javascript:alert(1))', '<p>![x](javascript:alert(1))</p>\n'],
    ['![x](/api/photos/not-a-uuid)', '<p>x</p>\n'],
    [`![x](/api/photos/${photoId}?a=1)`, '<p>x</p>\n'],
    [`![x](/api/photos/${photoId}/../../evil)`, '<p>x</p>\n'],
    [`![x](http://localhost/api/photos/${photoId})`, '<p>x</p>\n'],
    // Attribute break-outs through a title, a linkified address and a code block's language.
    [
      '[x](https://ok.example "a\\" onmouseover=\\"alert(1)")',
      '<p><a href="https://ok.example" title="a&quot; onmouseover=&quot;alert(1)" rel="noopener nofollow ugc" target="_blank">x</a></p>\n',
    ],
    [
      'http://evil.example/"onmouseover="alert(1)',
      '<p><a href="http://evil.example/%22onmouseover=%22alert(1)" rel="noopener nofollow ugc" target="_blank">http://evil.example/&quot;onmouseover=&quot;alert(1)</a></p>\n',
    ],
    [
      '```"><script>alert(1)</script>\ncode\n```',
      '<pre><code class="language-&quot;&gt;&lt;script&gt;alert(1)&lt;/script&gt;">code\n</code></pre>\n',
    ],
  ])('renders %j inert', (source, expected) => {
    const html = renderMarkdown(source);

    expect(html).toBe(expected);
    expect(activeParts(html)).toEqual([]);
  });

  it('leaves nothing active in a note that mixes every vector with real content', () => {
    const source = [
      '# Visit',
      '<script>alert(1)</script> [ok](https://example.com) [bad](jAvAsCrIpT:alert(1))',
      `![own](${photoUrls(photoId).thumbnailUrl}) ![theirs](https://evil.example/x.png)`,
      '::: caution',
      'Unplug the heater <img src=x onerror=alert(1)> first.',
      ':::',
      '> [quoted](vbscript:msgbox(1))',
      '',
      '- [item](data:text/html,hi)',
    ].join('\n');

    const html = renderMarkdown(source);

    expect(activeParts(html)).toEqual([]);
    expect(html.match(/<img /g)).toHaveLength(1);
    expect(html.match(/<a /g)).toHaveLength(1);
  });

  it('would notice an active part (the checker itself)', () => {
    expect(
      activeParts(
        '<p onclick="x"><a href="javascript:alert(1)">x</a><img src="https://e.example/x.png"><script></script></p>',
      ),
    ).toEqual([
      'p onclick',
      'href javascript:alert(1)',
      'src https://e.example/x.png',
      '<script>',
      '<script>',
    ]);
  });
});

describe('renderMarkdown', () => {
  it('renders our own photos, full size and thumbnail, loaded lazily', () => {
    const { url, thumbnailUrl } = photoUrls(photoId);

    expect(renderMarkdown(`![The sump after cleaning](${url})`)).toBe(
      `<p><img src="${url}" alt="The sump after cleaning" loading="lazy"></p>\n`,
    );
    expect(renderMarkdown(`![Before](${thumbnailUrl} "Before the visit")`)).toBe(
      `<p><img src="${thumbnailUrl}" alt="Before" title="Before the visit" loading="lazy"></p>\n`,
    );
  });

  it('opens an external link in a new tab, with rel', () => {
    expect(renderMarkdown('[the skimmer manual](https://example.com/manual.pdf)')).toBe(
      '<p><a href="https://example.com/manual.pdf" rel="noopener nofollow ugc" target="_blank">the skimmer manual</a></p>\n',
    );
    expect(renderMarkdown('See https://example.com/a')).toBe(
      '<p>See <a href="https://example.com/a" rel="noopener nofollow ugc" target="_blank">https://example.com/a</a></p>\n',
    );
  });

  it('keeps relative, fragment and mailto links in the same tab, with rel', () => {
    expect(
      renderMarkdown('[readings](/tanks/1?section=readings) [top](#top) [mail](mailto:office@example.com)'),
    ).toBe(
      '<p><a href="/tanks/1?section=readings" rel="noopener nofollow ugc">readings</a> ' +
        '<a href="#top" rel="noopener nofollow ugc">top</a> ' +
        '<a href="mailto:office@example.com" rel="noopener nofollow ugc">mail</a></p>\n',
    );
  });

  it('follows reference-style links that pass the check', () => {
    expect(renderMarkdown('[the manual][m]\n\n[m]: https://example.com/m')).toBe(
      '<p><a href="https://example.com/m" rel="noopener nofollow ugc" target="_blank">the manual</a></p>\n',
    );
  });

  it('renders a caution block as a labelled note with a hidden icon and a visible word', () => {
    const html = renderMarkdown('::: caution\nUnplug the heater and the pump before you reach in.\n:::');

    expect(html).toMatch(
      /^<aside class="md-caution" role="note" aria-label="Caution">\n<p class="md-caution-title"><svg [^>]*>.*<\/svg><strong>Caution<\/strong><\/p>\n<p>Unplug the heater and the pump before you reach in\.<\/p>\n<\/aside>\n$/,
    );
    expect(html).toMatch(/<svg class="md-caution-icon"[^>]* aria-hidden="true" focusable="false">/);
    expect(activeParts(html)).toEqual([]);
  });

  it('starts headings at h3', () => {
    expect(renderMarkdown('# A\n## B\n### C\n#### D\n##### E\n###### F')).toBe(
      '<h3>A</h3>\n<h4>B</h4>\n<h5>C</h5>\n<h6>D</h6>\n<h6>E</h6>\n<h6>F</h6>\n',
    );
  });

  it('keeps the line breaks a technician typed', () => {
    expect(renderMarkdown('Java fern trimmed.\nThe cat was on the lid again.')).toBe(
      '<p>Java fern trimmed.<br>\nThe cat was on the lid again.</p>\n',
    );
  });

  it('for e-mail, makes relative links absolute and shows images as their alt text', () => {
    const { url } = photoUrls(photoId);

    expect(
      renderMarkdown(`[the tank](/tanks/1) ![After the visit](${url})`, { origin: 'https://app.example/' }),
    ).toBe(
      '<p><a href="https://app.example/tanks/1" rel="noopener nofollow ugc" target="_blank">the tank</a> After the visit</p>\n',
    );
  });
});

describe('markdownToPlainText', () => {
  it('writes words without markup, links as text and address', () => {
    const source = [
      '# Visit',
      'Trimmed the **java fern** and `reset` the doser.',
      'See [the manual](https://example.com/m) or https://example.com/a, and [the tank](/tanks/1).',
      '',
      '- glass',
      '- skimmer',
      '  1. cup',
      '  2. neck',
      '',
      '> quoted',
      '',
      `![After the visit](${photoUrls(photoId).url})`,
    ].join('\n');

    expect(markdownToPlainText(source)).toBe(
      [
        'Visit',
        '',
        'Trimmed the java fern and reset the doser.',
        'See the manual (https://example.com/m) or https://example.com/a, and the tank (/tanks/1).',
        '',
        '- glass',
        '- skimmer',
        '  1. cup',
        '  2. neck',
        '',
        '> quoted',
        '',
        'After the visit',
      ].join('\n'),
    );
  });

  it('keeps a caution with its word', () => {
    expect(markdownToPlainText('Done.\n\n::: caution\nUnplug the heater first.\n:::')).toBe(
      'Done.\n\nCaution: Unplug the heater first.',
    );
  });

  it('for e-mail, makes relative links absolute', () => {
    expect(markdownToPlainText('[the tank](/tanks/1)', { origin: 'https://app.example' })).toBe(
      'the tank (https://app.example/tanks/1)',
    );
  });

  it('leaves refused links as the text that was typed', () => {
    expect(markdownToPlainText('[x](javascript:alert(1)) <b>bold</b>')).toBe(
      '[x](javascript:alert(1)) <b>bold</b>',
    );
  });
});

describe('heading levels', () => {
  it('puts the biggest heading at the level the page asks for, the rest in step, never past h6', () => {
    expect(renderMarkdown('# Top\n\n## Next', { topHeading: 5 })).toBe('<h5>Top</h5>\n<h6>Next</h6>\n');
    // Written with ## as its biggest heading: still one level under the page's heading.
    expect(renderMarkdown('## Routine\n\n### Detail', { topHeading: 5 })).toBe(
      '<h5>Routine</h5>\n<h6>Detail</h6>\n',
    );
    expect(renderMarkdown('# Top\n\n#### Deep', { topHeading: 5 })).toBe('<h5>Top</h5>\n<h6>Deep</h6>\n');
  });
});
