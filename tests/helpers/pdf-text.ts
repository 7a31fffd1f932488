import { inflateSync } from 'node:zlib';

/*
 * Reads a PDF back the way a viewer's search or copy does: through each font's ToUnicode map and
 * glyph widths, page by page, so a test asserts on the words a reader would see — not on the
 * generator's calls. Enough of the format for what pdfkit writes (a classic xref table, Flate
 * streams, Type0 fonts with Identity-H encoding); anything else fails loudly rather than reading
 * nothing. Text on one baseline is joined into a line: pieces that touch join directly (one word
 * drawn in two font subsets), pieces with a gap between them (table cells) get one space.
 */

class PdfName {
  constructor(readonly name: string) {}
}
class PdfString {
  constructor(readonly bytes: Buffer) {}
}
class PdfRef {
  constructor(readonly id: number) {}
}
class PdfOperator {
  constructor(readonly op: string) {}
}
type PdfDict = Map<string, PdfValue>;
type PdfValue = number | boolean | null | PdfName | PdfString | PdfRef | PdfDict | PdfValue[];

interface PdfStream {
  dict: PdfDict;
  data: Buffer;
}

export interface PdfFragment {
  text: string;
  /** Start of the text on the page, in points from the bottom left corner. */
  x: number;
  y: number;
  width: number;
  size: number;
}

export interface PdfPage {
  fragments: PdfFragment[];
  /** Top to bottom. */
  lines: string[];
  text: string;
}

export interface PdfReading {
  /** Pages in the page tree's order. */
  pages: PdfPage[];
  /** Every page's text, one page after the other. */
  text: string;
  /** The document information dictionary, strings decoded. */
  info: Record<string, string>;
  /** Objects whose /Type is /Page, counted over the whole file (independently of the tree). */
  pageObjects: number;
  /** BaseFont of every font the pages use. */
  fonts: string[];
}

const whitespace = new Set([0x00, 0x09, 0x0a, 0x0c, 0x0d, 0x20]);
const delimiters = new Set('()<>[]{}/%'.split('').map((c) => c.charCodeAt(0)));

class Lexer {
  pos: number;

  constructor(
    readonly bytes: Buffer,
    pos = 0,
  ) {
    this.pos = pos;
  }

  get done(): boolean {
    this.skip();
    return this.pos >= this.bytes.length;
  }

  skip(): void {
    while (this.pos < this.bytes.length) {
      const byte = this.bytes[this.pos]!;
      if (whitespace.has(byte)) this.pos += 1;
      else if (byte === 0x25 /* % */) {
        while (
          this.pos < this.bytes.length &&
          this.bytes[this.pos] !== 0x0a &&
          this.bytes[this.pos] !== 0x0d
        ) {
          this.pos += 1;
        }
      } else break;
    }
  }

  #regular(): string {
    const start = this.pos;
    while (this.pos < this.bytes.length) {
      const byte = this.bytes[this.pos]!;
      if (whitespace.has(byte) || delimiters.has(byte)) break;
      this.pos += 1;
    }
    return this.bytes.toString('latin1', start, this.pos);
  }

  /** A value, or an operator keyword when reading a content stream. */
  next(): PdfValue | PdfOperator {
    this.skip();
    const byte = this.bytes[this.pos];
    if (byte === undefined) throw new Error('PDF ended early');
    const char = String.fromCharCode(byte);
    if (char === '<' && this.bytes[this.pos + 1] === 0x3c) {
      this.pos += 2;
      const dict: PdfDict = new Map();
      for (;;) {
        this.skip();
        if (this.bytes[this.pos] === 0x3e && this.bytes[this.pos + 1] === 0x3e) {
          this.pos += 2;
          return dict;
        }
        const key = this.next();
        if (!(key instanceof PdfName)) throw new Error(`dictionary key is not a name at ${this.pos}`);
        dict.set(key.name, this.value());
      }
    }
    if (char === '<') {
      const end = this.bytes.indexOf(0x3e, this.pos);
      const hex = this.bytes.toString('latin1', this.pos + 1, end).replace(/\s/g, '');
      this.pos = end + 1;
      return new PdfString(Buffer.from(hex.length % 2 ? `${hex}0` : hex, 'hex'));
    }
    if (char === '(') return this.#literal();
    if (char === '[') {
      this.pos += 1;
      const array: PdfValue[] = [];
      for (;;) {
        this.skip();
        if (this.bytes[this.pos] === 0x5d) {
          this.pos += 1;
          return array;
        }
        array.push(this.value());
      }
    }
    if (char === '/') {
      this.pos += 1;
      return new PdfName(
        this.#regular().replace(/#([0-9a-fA-F]{2})/g, (_, hex: string) =>
          String.fromCharCode(parseInt(hex, 16)),
        ),
      );
    }
    const word = this.#regular();
    if (word === '') throw new Error(`unexpected "${char}" at ${this.pos}`);
    if (/^[+-]?(\d+\.?\d*|\.\d+)$/.test(word)) {
      // "12 0 R" is a reference; look ahead without consuming anything else.
      const saved = this.pos;
      const generation = /^\s+(\d+)\s+R(?=[\s/<>[\]()%]|$)/.exec(
        this.bytes.toString('latin1', this.pos, this.pos + 24),
      );
      if (generation && /^\d+$/.test(word)) {
        this.pos += generation[0].length;
        return new PdfRef(Number(word));
      }
      this.pos = saved;
      return Number(word);
    }
    if (word === 'true') return true;
    if (word === 'false') return false;
    if (word === 'null') return null;
    return new PdfOperator(word);
  }

  value(): PdfValue {
    const value = this.next();
    if (value instanceof PdfOperator) throw new Error(`unexpected keyword ${value.op} at ${this.pos}`);
    return value;
  }

  #literal(): PdfString {
    this.pos += 1;
    const out: number[] = [];
    let depth = 1;
    while (this.pos < this.bytes.length) {
      const byte = this.bytes[this.pos++]!;
      if (byte === 0x5c /* \ */) {
        const escaped = this.bytes[this.pos++]!;
        const simple: Record<number, number> = { 0x6e: 0x0a, 0x72: 0x0d, 0x74: 0x09, 0x62: 0x08, 0x66: 0x0c };
        if (simple[escaped] !== undefined) out.push(simple[escaped]);
        else if (escaped >= 0x30 && escaped <= 0x37) {
          let octal = String.fromCharCode(escaped);
          while (octal.length < 3 && this.bytes[this.pos]! >= 0x30 && this.bytes[this.pos]! <= 0x37) {
            octal += String.fromCharCode(this.bytes[this.pos++]!);
          }
          out.push(parseInt(octal, 8) & 0xff);
        } else if (escaped === 0x0d || escaped === 0x0a) {
          if (escaped === 0x0d && this.bytes[this.pos] === 0x0a) this.pos += 1;
        } else out.push(escaped);
        continue;
      }
      if (byte === 0x28) depth += 1;
      if (byte === 0x29 && --depth === 0) break;
      out.push(byte);
    }
    return new PdfString(Buffer.from(out));
  }
}

class PdfFile {
  readonly #offsets = new Map<number, number>();
  readonly #cache = new Map<number, PdfValue | PdfStream>();
  readonly trailer: PdfDict;

  constructor(readonly bytes: Buffer) {
    if (bytes.toString('latin1', 0, 5) !== '%PDF-')
      throw new Error('not a PDF: it does not start with %PDF-');
    const tail = bytes.toString('latin1', Math.max(0, bytes.length - 64));
    const startxref = /startxref\s+(\d+)\s+%%EOF\s*$/.exec(tail);
    if (!startxref) throw new Error('no startxref at the end of the file');
    const lexer = new Lexer(bytes, Number(startxref[1]));
    const keyword = lexer.next();
    if (!(keyword instanceof PdfOperator) || keyword.op !== 'xref')
      throw new Error('only classic xref tables are read');
    for (;;) {
      const first = lexer.next();
      if (first instanceof PdfOperator && first.op === 'trailer') break;
      const count = lexer.value();
      if (typeof first !== 'number' || typeof count !== 'number') throw new Error('malformed xref section');
      for (let index = 0; index < count; index += 1) {
        const offset = lexer.value();
        lexer.value();
        const kind = lexer.next();
        if (kind instanceof PdfOperator && kind.op === 'n' && typeof offset === 'number') {
          this.#offsets.set(first + index, offset);
        }
      }
    }
    const trailer = lexer.value();
    if (!(trailer instanceof Map)) throw new Error('trailer is not a dictionary');
    this.trailer = trailer;
  }

  object(id: number): PdfValue | PdfStream {
    const cached = this.#cache.get(id);
    if (cached !== undefined) return cached;
    const offset = this.#offsets.get(id);
    if (offset === undefined) throw new Error(`object ${id} is not in the xref table`);
    const lexer = new Lexer(this.bytes, offset);
    const [number, , keyword] = [lexer.value(), lexer.value(), lexer.next()];
    if (number !== id || !(keyword instanceof PdfOperator) || keyword.op !== 'obj') {
      throw new Error(`the xref entry of object ${id} points elsewhere`);
    }
    const value = lexer.value();
    let result: PdfValue | PdfStream = value;
    const after = lexer.next();
    if (after instanceof PdfOperator && after.op === 'stream') {
      if (!(value instanceof Map)) throw new Error(`stream ${id} has no dictionary`);
      let start = lexer.pos;
      if (this.bytes[start] === 0x0d) start += 1;
      if (this.bytes[start] === 0x0a) start += 1;
      const length = this.resolve(value.get('Length') ?? null);
      if (typeof length !== 'number') throw new Error(`stream ${id} has no length`);
      result = { dict: value, data: this.bytes.subarray(start, start + length) };
    }
    this.#cache.set(id, result);
    return result;
  }

  resolve(value: PdfValue): PdfValue {
    if (!(value instanceof PdfRef)) return value;
    const target = this.object(value.id);
    if (isStream(target)) throw new Error(`object ${value.id} is a stream where a value was expected`);
    return target;
  }

  dict(value: PdfValue | undefined): PdfDict {
    const resolved = this.resolve(value ?? null);
    if (!(resolved instanceof Map)) throw new Error('expected a dictionary');
    return resolved;
  }

  stream(value: PdfValue | undefined): Buffer {
    if (!(value instanceof PdfRef)) throw new Error('expected a reference to a stream');
    const target = this.object(value.id);
    if (!isStream(target)) throw new Error(`object ${value.id} is not a stream`);
    const filter = target.dict.get('Filter');
    const filters = (Array.isArray(filter) ? filter : filter ? [filter] : []).map((f) => (f as PdfName).name);
    return filters.reduce((data, name) => {
      if (name !== 'FlateDecode') throw new Error(`stream filter ${name} is not read`);
      return inflateSync(data);
    }, target.data);
  }

  countObjectsOfType(type: string): number {
    let count = 0;
    for (const id of this.#offsets.keys()) {
      const value = this.object(id);
      const dict = isStream(value) ? value.dict : value;
      const found = dict instanceof Map ? dict.get('Type') : undefined;
      if (found instanceof PdfName && found.name === type) count += 1;
    }
    return count;
  }
}

const isStream = (value: PdfValue | PdfStream): value is PdfStream =>
  typeof value === 'object' && value !== null && 'data' in value && 'dict' in value;

function decodeTextString(bytes: Buffer): string {
  if (bytes[0] === 0xfe && bytes[1] === 0xff)
    return Buffer.from(bytes.subarray(2)).swap16().toString('utf16le');
  return bytes.toString('latin1');
}

const utf16 = (hex: string) => Buffer.from(hex.replace(/\s/g, ''), 'hex').swap16().toString('utf16le');

interface FontReader {
  name: string;
  decode(bytes: Buffer): { codes: number[]; text: string[] };
  width(code: number): number;
}

function readFont(file: PdfFile, dict: PdfDict): FontReader {
  const subtype = (dict.get('Subtype') as PdfName | undefined)?.name;
  const encoding = (dict.get('Encoding') as PdfName | undefined)?.name;
  const name = (dict.get('BaseFont') as PdfName | undefined)?.name ?? '?';
  if (subtype !== 'Type0' || encoding !== 'Identity-H') {
    throw new Error(
      `font ${name}: only Type0 fonts with Identity-H encoding are read (found ${subtype}, ${encoding})`,
    );
  }
  const toUnicode = new Map<number, string>();
  const cmap = file.stream(dict.get('ToUnicode')).toString('latin1');
  for (const [, body = ''] of cmap.matchAll(/beginbfchar([\s\S]*?)endbfchar/g)) {
    for (const [, code = '', target = ''] of body.matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F\s]+)>/g)) {
      toUnicode.set(parseInt(code, 16), utf16(target));
    }
  }
  for (const [, body = ''] of cmap.matchAll(/beginbfrange([\s\S]*?)endbfrange/g)) {
    for (const [, low = '', high = '', list, single] of body.matchAll(
      /<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>\s*(?:\[([^\]]*)\]|<([0-9a-fA-F]+)>)/g,
    )) {
      const from = parseInt(low, 16);
      const to = parseInt(high, 16);
      if (list !== undefined) {
        // One target per code; a ligature's target holds several UTF-16 units ("<0066 006C>").
        [...list.matchAll(/<([0-9a-fA-F\s]*)>/g)].forEach(([, target = ''], index) => {
          if (from + index <= to) toUnicode.set(from + index, utf16(target));
        });
      } else if (single !== undefined) {
        const base = Buffer.from(single, 'hex');
        for (let code = from; code <= to; code += 1) {
          const target = Buffer.from(base);
          target.writeUInt16BE(target.readUInt16BE(target.length - 2) + (code - from), target.length - 2);
          toUnicode.set(code, Buffer.from(target).swap16().toString('utf16le'));
        }
      }
    }
  }
  const descendants = file.resolve(dict.get('DescendantFonts') ?? null);
  const cidFont = file.dict(Array.isArray(descendants) ? descendants[0] : undefined);
  const defaultWidth = (file.resolve(cidFont.get('DW') ?? null) as number | null) ?? 1000;
  const widths = new Map<number, number>();
  const w = file.resolve(cidFont.get('W') ?? null);
  if (Array.isArray(w)) {
    for (let index = 0; index < w.length;) {
      const first = w[index] as number;
      const next = w[index + 1];
      if (Array.isArray(next)) {
        next.forEach((width, offset) => widths.set(first + offset, width as number));
        index += 2;
      } else {
        for (let code = first; code <= (next as number); code += 1) widths.set(code, w[index + 2] as number);
        index += 3;
      }
    }
  }
  return {
    name,
    decode(bytes) {
      const codes: number[] = [];
      const text: string[] = [];
      for (let index = 0; index + 1 < bytes.length; index += 2) {
        const code = bytes.readUInt16BE(index);
        codes.push(code);
        // A glyph without a Unicode value reads as U+FFFD, so a missing glyph cannot pass for text.
        text.push(toUnicode.get(code) ?? '\uFFFD');
      }
      return { codes, text };
    },
    width: (code) => widths.get(code) ?? defaultWidth,
  };
}

type Matrix = [number, number, number, number, number, number];
const identity: Matrix = [1, 0, 0, 1, 0, 0];

/** m1 then m2. */
function multiply(m1: Matrix, m2: Matrix): Matrix {
  const [a, b, c, d, e, f] = m1;
  const [A, B, C, D, E, F] = m2;
  return [a * A + b * C, a * B + b * D, c * A + d * C, c * B + d * D, e * A + f * C + E, e * B + f * D + F];
}

const apply = (m: Matrix, x: number, y: number): [number, number] => [
  m[0] * x + m[2] * y + m[4],
  m[1] * x + m[3] * y + m[5],
];

function readPage(file: PdfFile, pageDict: PdfDict, fontsSeen: Set<string>): PdfPage {
  const resources = file.dict(pageDict.get('Resources'));
  const fontDict = resources.has('Font') ? file.dict(resources.get('Font')) : new Map<string, PdfValue>();
  const fonts = new Map<string, FontReader>();
  const fontNamed = (name: string) => {
    let font = fonts.get(name);
    if (!font) {
      font = readFont(file, file.dict(fontDict.get(name)));
      fonts.set(name, font);
      fontsSeen.add(font.name);
    }
    return font;
  };

  const contents = pageDict.get('Contents');
  const parts = Array.isArray(contents) ? contents : [contents];
  const content = Buffer.concat(parts.flatMap((part) => [file.stream(part ?? undefined), Buffer.from('\n')]));

  const fragments: PdfFragment[] = [];
  const stack: Matrix[] = [];
  let ctm: Matrix = identity;
  let tm: Matrix = identity;
  let tlm: Matrix = identity;
  let font: FontReader | null = null;
  let size = 0;
  let charSpacing = 0;
  let scale = 1;
  let leading = 0;
  const operands: PdfValue[] = [];
  const num = (index: number) => operands[index] as number;

  const show = (items: PdfValue[]) => {
    if (!font) throw new Error('text shown before a font was set');
    const [startX, startY] = apply(multiply(tm, ctm), 0, 0);
    let text = '';
    let advance = 0;
    for (const item of items) {
      if (typeof item === 'number') {
        advance -= (item / 1000) * size * scale;
      } else if (item instanceof PdfString) {
        const decoded = font.decode(item.bytes);
        text += decoded.text.join('');
        for (const code of decoded.codes) advance += ((font.width(code) / 1000) * size + charSpacing) * scale;
      }
    }
    tm = multiply([1, 0, 0, 1, advance, 0], tm);
    const [endX] = apply(multiply(tm, ctm), 0, 0);
    const rendered = Math.hypot(ctm[0], ctm[1]) * Math.hypot(tm[0], tm[1]) * size;
    if (text !== '') fragments.push({ text, x: startX, y: startY, width: endX - startX, size: rendered });
  };

  const lexer = new Lexer(content);
  while (!lexer.done) {
    const token = lexer.next();
    if (!(token instanceof PdfOperator)) {
      operands.push(token);
      continue;
    }
    switch (token.op) {
      case 'q':
        stack.push(ctm);
        break;
      case 'Q':
        ctm = stack.pop() ?? identity;
        break;
      case 'cm':
        ctm = multiply([num(0), num(1), num(2), num(3), num(4), num(5)], ctm);
        break;
      case 'BT':
        tm = identity;
        tlm = identity;
        break;
      case 'Tf':
        font = fontNamed((operands[0] as PdfName).name);
        size = num(1);
        break;
      case 'Tc':
        charSpacing = num(0);
        break;
      case 'Tz':
        scale = num(0) / 100;
        break;
      case 'TL':
        leading = num(0);
        break;
      case 'Tm':
        tm = [num(0), num(1), num(2), num(3), num(4), num(5)];
        tlm = tm;
        break;
      case 'Td':
      case 'TD':
        if (token.op === 'TD') leading = -num(1);
        tlm = multiply([1, 0, 0, 1, num(0), num(1)], tlm);
        tm = tlm;
        break;
      case 'T*':
        tlm = multiply([1, 0, 0, 1, 0, -leading], tlm);
        tm = tlm;
        break;
      case 'Tj':
        show([operands[0] ?? null]);
        break;
      case 'TJ':
        show(operands[0] as PdfValue[]);
        break;
      case "'":
      case '"':
        tlm = multiply([1, 0, 0, 1, 0, -leading], tlm);
        tm = tlm;
        show([operands.at(-1) ?? null]);
        break;
      case 'BI':
        throw new Error('inline images are not read');
      default:
        break;
    }
    operands.length = 0;
  }

  const rows: PdfFragment[][] = [];
  for (const fragment of [...fragments].sort((a, b) => b.y - a.y || a.x - b.x)) {
    const row = rows.find((r) => Math.abs(r[0]!.y - fragment.y) < 0.5);
    if (row) row.push(fragment);
    else rows.push([fragment]);
  }
  const lines = rows.map((row) =>
    row
      .sort((a, b) => a.x - b.x)
      .reduce((line, fragment, index) => {
        if (index === 0) return fragment.text;
        const previous = row[index - 1]!;
        const gap = fragment.x - (previous.x + previous.width);
        return line + (gap > fragment.size * 0.1 ? ' ' : '') + fragment.text;
      }, ''),
  );
  return { fragments, lines, text: lines.join('\n') };
}

export function readPdf(bytes: Buffer): PdfReading {
  const file = new PdfFile(bytes);
  const root = file.dict(file.trailer.get('Root'));
  const pageDicts: PdfDict[] = [];
  const walk = (node: PdfDict) => {
    const type = (node.get('Type') as PdfName | undefined)?.name;
    if (type === 'Page') pageDicts.push(node);
    else for (const kid of file.resolve(node.get('Kids') ?? null) as PdfValue[]) walk(file.dict(kid));
  };
  walk(file.dict(root.get('Pages')));

  const fonts = new Set<string>();
  const pages = pageDicts.map((pageDict) => readPage(file, pageDict, fonts));
  const info: Record<string, string> = {};
  if (file.trailer.has('Info')) {
    for (const [key, value] of file.dict(file.trailer.get('Info'))) {
      const resolved = file.resolve(value);
      if (resolved instanceof PdfString) info[key] = decodeTextString(resolved.bytes);
    }
  }
  return {
    pages,
    text: pages.map((page) => page.text).join('\n'),
    info,
    pageObjects: file.countObjectsOfType('Page'),
    fonts: [...fonts],
  };
}
