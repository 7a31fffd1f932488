import MarkdownIt, { type Env, type Token } from 'markdown-it';
import container from 'markdown-it-container';
import { isOwnPhotoUrl } from '@shared/photos/urls';

/*
 * The one Markdown renderer (visit notes now, care tips next): the client renders screens with it
 * and the API renders e-mails with it, so a note reads the same everywhere. What people type is
 * untrusted, so raw HTML is off, every link address passes an allow-list, and only our own photos
 * become images. Every other module reaches markdown-it through here
 * (tests/shared/text/one-markdown-path.test.ts).
 */

export type MarkdownOptions = {
  /**
   * For text read outside the app (e-mail): relative links become absolute on this origin, and
   * images become their alt text, as a mail client has no session to fetch our photos with.
   */
  origin?: string;
  /** The level the text's biggest heading becomes, below the page's own headings; h3 unless said. */
  topHeading?: 3 | 4 | 5 | 6;
};

const allowedSchemes = new Set(['http', 'https', 'mailto']);
const externalSchemes = new Set(['http', 'https']);
const linkRel = 'noopener nofollow ugc';

const percentDecoded = (url: string) =>
  url.replace(/%([0-9a-f]{2})/gi, (_, hex: string) => String.fromCharCode(Number.parseInt(hex, 16)));

// Browsers drop tabs and newlines anywhere in a URL and controls and spaces around it (WHATWG URL
// Standard, basic URL parser), so "java\tscript:" is a scheme to them; we drop every invisible.
const withoutInvisibles = (text: string) =>
  Array.from(text)
    .filter((char) => {
      const code = char.codePointAt(0) ?? 0;
      return code > 0x20 && (code < 0x7f || code > 0x9f) && !/[\s\u200b-\u200f\u2060\ufeff]/u.test(char);
    })
    .join('');

/** The scheme a browser would read in an address, after entities (done by the parser) and escapes. */
function schemeOf(url: string): string | null {
  const bare = withoutInvisibles(percentDecoded(url));
  return /^([a-z][a-z0-9+.-]*):/i.exec(bare)?.[1]?.toLowerCase() ?? null;
}

function isAllowedUrl(url: string): boolean {
  const scheme = schemeOf(url);
  if (scheme !== null) return allowedSchemes.has(scheme);
  // "//host" (and "/\host", which browsers read alike) leaves the app without naming a scheme.
  return !/^[/\\]{2}/.test(withoutInvisibles(percentDecoded(url)));
}

const originOf = (env: Env | undefined): string | undefined =>
  typeof env?.origin === 'string' ? env.origin : undefined;

function absoluteFor(href: string, env: Env | undefined): string {
  const origin = originOf(env);
  if (origin === undefined || schemeOf(href) !== null) return href;
  return new URL(href, origin).href;
}

const isExternal = (href: string) => externalSchemes.has(schemeOf(href) ?? '');

// Our own shape: a rounded triangle with a bar and a dot, drawn in the text colour.
const cautionIcon =
  '<svg class="md-caution-icon" viewBox="0 0 24 24" width="20" height="20" aria-hidden="true" focusable="false">' +
  '<path d="M12 3.5 2.5 20h19Z" fill="none" stroke="currentColor" stroke-width="2" stroke-linejoin="round"/>' +
  '<path d="M12 10v4.5" stroke="currentColor" stroke-width="2" stroke-linecap="round"/>' +
  '<circle cx="12" cy="17.25" r="1.25" fill="currentColor"/></svg>';

const md = new MarkdownIt({ html: false, linkify: true, breaks: true });
const { escapeHtml } = md.utils;

// Links, autolinks, linkified text, reference definitions and images all pass through here.
md.validateLink = isAllowedUrl;

// A note sits inside a page that already has its own headings: its biggest heading, whatever
// number of `#` it was written with, becomes the level the page asks for, and the rest follow.
md.core.ruler.push('heading_levels', (state) => {
  const env = state.env as { topHeading?: number };
  const levels = state.tokens
    .filter((token) => token.type === 'heading_open')
    .map((token) => Number(token.tag.slice(1)));
  if (levels.length === 0) return;
  const shift = (env.topHeading ?? 3) - Math.min(...levels);
  for (const token of state.tokens) {
    if (token.type === 'heading_open' || token.type === 'heading_close') {
      token.tag = `h${Math.min(6, Number(token.tag.slice(1)) + shift)}`;
    }
  }
});

md.renderer.rules.link_open = (tokens, idx, options, env, self) => {
  const token = tokens[idx]!;
  const href = absoluteFor(String(token.attrGet('href') ?? ''), env);
  token.attrSet('href', href);
  token.attrSet('rel', linkRel);
  if (isExternal(href)) token.attrSet('target', '_blank');
  return self.renderToken(tokens, idx, options);
};

md.renderer.rules.image = (tokens, idx, options, env, self) => {
  const token = tokens[idx]!;
  const alt = self.renderInlineAsText(token.children ?? [], options, env);
  if (originOf(env) !== undefined || !isOwnPhotoUrl(String(token.attrGet('src') ?? ''))) {
    return escapeHtml(alt);
  }
  token.attrSet('alt', alt);
  token.attrSet('loading', 'lazy');
  return self.renderToken(tokens, idx, options);
};

// Safety advice (electricity near water, chemicals) in a box of its own: "::: caution" … ":::".
md.use(container, 'caution', {
  render: (tokens: Token[], idx: number) =>
    tokens[idx]!.nesting === 1
      ? `<aside class="md-caution" role="note" aria-label="Caution">\n<p class="md-caution-title">${cautionIcon}<strong>Caution</strong></p>\n`
      : '</aside>\n',
});

function envFor(options: MarkdownOptions): Env {
  return {
    ...(options.origin === undefined ? {} : { origin: new URL(options.origin).origin }),
    ...(options.topHeading === undefined ? {} : { topHeading: options.topHeading }),
  };
}

export function renderMarkdown(source: string, options: MarkdownOptions = {}): string {
  return md.render(source, envFor(options));
}

/** Builds text line by line, so list markers and quote marks begin every line they belong to. */
class PlainText {
  private text = '';
  private atLineStart = true;
  private readonly prefixes: string[] = [];
  private marker: string | null = null;
  private lead: string | null = null;

  get length() {
    return this.text.length;
  }

  since(position: number) {
    return this.text.slice(position);
  }

  write(part: string) {
    part.split('\n').forEach((line, index) => {
      if (index > 0) this.newline();
      if (line === '') return;
      if (this.atLineStart) {
        this.text += this.linePrefix();
        this.atLineStart = false;
      }
      this.text += line;
    });
  }

  newline() {
    this.text += '\n';
    this.atLineStart = true;
  }

  endLine() {
    if (!this.atLineStart) this.newline();
  }

  endBlock() {
    this.endLine();
    if (this.text !== '' && !this.text.endsWith('\n\n')) this.text += '\n';
  }

  /** The next line in this block starts with `marker`, later ones line up under its text. */
  beginItem(marker: string) {
    this.endLine();
    this.prefixes.push(' '.repeat(marker.length));
    this.marker = marker;
  }

  push(prefix: string) {
    this.prefixes.push(prefix);
  }

  pop() {
    this.prefixes.pop();
    this.marker = null;
  }

  /** Words that open the next line's text, after its marks ("Caution: "). */
  leadWith(words: string) {
    this.lead = words;
  }

  private linePrefix() {
    const marks =
      this.marker === null ? this.prefixes.join('') : this.prefixes.slice(0, -1).join('') + this.marker;
    const lead = this.lead ?? '';
    this.marker = null;
    this.lead = null;
    return marks + lead;
  }

  toString() {
    return this.text
      .replace(/[ \t]+$/gm, '')
      .replace(/\n{3,}/g, '\n\n')
      .trim();
  }
}

function writeInline(out: PlainText, children: Token[], env: Env) {
  const links: Array<{ href: string; from: number; auto: boolean }> = [];
  for (const token of children) {
    switch (token.type) {
      case 'text':
      case 'code_inline':
        out.write(token.content);
        break;
      case 'softbreak':
      case 'hardbreak':
        out.newline();
        break;
      case 'image':
        out.write(md.renderer.renderInlineAsText(token.children ?? [], md.options, env));
        break;
      case 'link_open':
        links.push({
          href: absoluteFor(String(token.attrGet('href') ?? ''), env),
          from: out.length,
          auto: token.markup === 'linkify' || token.info === 'auto',
        });
        break;
      case 'link_close': {
        const link = links.pop();
        if (link && !link.auto && out.since(link.from).trim() !== link.href) out.write(` (${link.href})`);
        break;
      }
      default:
    }
  }
}

/**
 * The same Markdown as words only, for notification bodies and e-mail text: no markup, lists with
 * their markers, links as "text (url)".
 */
export function markdownToPlainText(source: string, options: MarkdownOptions = {}): string {
  const env = envFor(options);
  const tokens = md.parse(source, env);
  const out = new PlainText();
  const lists: Array<{ ordered: boolean; next: number }> = [];
  let cell = 0;
  tokens.forEach((token, index) => {
    switch (token.type) {
      case 'inline':
        writeInline(out, token.children ?? [], env);
        break;
      case 'paragraph_close':
        if (token.hidden) out.endLine();
        else out.endBlock();
        break;
      case 'heading_close':
      case 'table_close':
        out.endBlock();
        break;
      case 'bullet_list_open':
      case 'ordered_list_open':
        out.endLine();
        lists.push({
          ordered: token.type === 'ordered_list_open',
          next: Number(token.attrGet('start') ?? 1),
        });
        break;
      case 'bullet_list_close':
      case 'ordered_list_close':
        lists.pop();
        if (lists.length === 0) out.endBlock();
        else out.endLine();
        break;
      case 'list_item_open': {
        const list = lists.at(-1);
        out.beginItem(list?.ordered ? `${list.next++}. ` : '- ');
        break;
      }
      case 'list_item_close':
        out.endLine();
        out.pop();
        break;
      case 'blockquote_open':
        out.endLine();
        out.push('> ');
        break;
      case 'blockquote_close':
        out.pop();
        out.endBlock();
        break;
      case 'container_caution_open':
        out.endLine();
        if (tokens[index + 1]?.type === 'paragraph_open') out.leadWith('Caution: ');
        else out.write('Caution:\n');
        break;
      case 'container_caution_close':
        out.endBlock();
        break;
      case 'fence':
      case 'code_block':
        out.endLine();
        out.write(token.content.replace(/\n$/, ''));
        out.endBlock();
        break;
      case 'hr':
        out.endLine();
        out.write('---');
        out.endBlock();
        break;
      case 'tr_open':
        cell = 0;
        break;
      case 'th_open':
      case 'td_open':
        if (cell++ > 0) out.write(' | ');
        break;
      case 'tr_close':
        out.endLine();
        break;
      default:
    }
  });
  return out.toString();
}
