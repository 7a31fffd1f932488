import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { inflateSync } from 'node:zlib';
import PDFDocument from 'pdfkit';
import { paymentMethodLabels } from '@shared/billing/invoices';
import { formatMoney, formatTaxRate, quantityToText } from '@shared/billing/money';
import type { InvoiceDetail } from '@shared/schemas/billing';
import { formatDate } from '@shared/text/dates';
import { wallInstant } from '@shared/visits/recurrence';

/*
 * The invoice or credit note as a PDF (A4), laid out line by line here rather than by pdfkit's own
 * wrapping: the brand font comes as fontsource's per-script subsets (latin, latin-ext, …), so one
 * line may need several of them — a client called Dvořák is latin and latin-ext — and only our own
 * measuring knows how tall a table row is before a page has to break.
 */

export interface InvoicePdfOptions {
  /** The company's name: the seller while a draft has no seller yet, and the document's author. */
  companyName: string;
  /** The company's zone, for the days of payments and other moments. */
  timeZone: string;
}

type Weight = 'regular' | 'bold';

interface Style {
  weight: Weight;
  size: number;
  color: string;
}

interface Run {
  font: string;
  text: string;
}

/* ------------------------------------------------------------------ fonts */

// Subsets in the order a browser given fontsource's @font-face rules would try them.
const subsets = ['latin', 'latin-ext', 'vietnamese', 'cyrillic-ext'] as const;
const weights: Record<Weight, number> = { regular: 400, bold: 700 };
const fontPackage = '@fontsource/merriweather-sans';

interface BrandFonts {
  files: { name: string; data: Buffer }[];
  /** Code point ranges per subset, from the package's own unicode-range data. */
  ranges: { subset: (typeof subsets)[number]; from: number; to: number }[];
}

let brandFonts: BrandFonts | undefined;

function loadBrandFonts(): BrandFonts {
  if (brandFonts) return brandFonts;
  const require = createRequire(import.meta.url);
  const unicode = JSON.parse(readFileSync(require.resolve(`${fontPackage}/unicode.json`), 'utf8')) as Record<
    string,
    string
  >;
  const ranges = subsets.flatMap((subset) => {
    const spec = unicode[subset];
    if (!spec) throw new Error(`${fontPackage} has no unicode range for ${subset}`);
    return spec.split(',').map((part) => {
      const [from = '', to = from] = part.trim().replace(/^U\+/i, '').split('-');
      return { subset, from: parseInt(from, 16), to: parseInt(to, 16) };
    });
  });
  const files = subsets.flatMap((subset) =>
    (Object.keys(weights) as Weight[]).map((weight) => ({
      name: fontName(weight, subset),
      data: sfntFromWoff(
        readFileSync(
          require.resolve(`${fontPackage}/files/merriweather-sans-${subset}-${weights[weight]}-normal.woff`),
        ),
      ),
    })),
  );
  brandFonts = { files, ranges };
  return brandFonts;
}

const fontName = (weight: Weight, subset: string) => `brand-${weight}-${subset}`;

/**
 * The TrueType font inside a WOFF 1.0 file (W3C "WOFF File Format 1.0", §3–§5: a 44-byte header, a
 * 20-byte directory entry per table, each table zlib-compressed when that made it smaller). fontkit
 * reads WOFF itself, but inflates every table in JavaScript for every document (about 0.4 s of CPU
 * per document when measured here), so the fonts are unpacked once per process with node's zlib.
 */
function sfntFromWoff(woff: Buffer): Buffer {
  if (woff.readUInt32BE(0) !== 0x774f4646 /* wOFF */) throw new Error('not a WOFF 1.0 font');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  const tables = Array.from({ length: numTables }, (_, index) => {
    const entry = 44 + index * 20;
    const [tag, offset, compLength, origLength, checksum] = [0, 4, 8, 12, 16].map((at) =>
      woff.readUInt32BE(entry + at),
    ) as [number, number, number, number, number];
    const stored = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(stored) : stored;
    if (data.length !== origLength) throw new Error('a WOFF table does not unpack to its stated length');
    return { tag, checksum, data };
  });
  // The sfnt offset table (OpenType spec, "Table directory"): binary-search hints over the records.
  const power = 2 ** Math.floor(Math.log2(numTables));
  const header = Buffer.alloc(12 + 16 * numTables);
  header.writeUInt32BE(flavor, 0);
  header.writeUInt16BE(numTables, 4);
  header.writeUInt16BE(power * 16, 6);
  header.writeUInt16BE(Math.log2(power), 8);
  header.writeUInt16BE(numTables * 16 - power * 16, 10);
  const bodies: Buffer[] = [];
  let offset = header.length;
  tables.forEach((table, index) => {
    const record = 12 + index * 16;
    header.writeUInt32BE(table.tag, record);
    header.writeUInt32BE(table.checksum, record + 4);
    header.writeUInt32BE(offset, record + 8);
    header.writeUInt32BE(table.data.length, record + 12);
    const padded = Buffer.alloc(Math.ceil(table.data.length / 4) * 4);
    table.data.copy(padded);
    bodies.push(padded);
    offset += padded.length;
  });
  return Buffer.concat([header, ...bodies]);
}

/*
 * A character no subset covers (Chinese or Japanese script, emoji) prints as "?" — visible and
 * searchable, unlike the font's empty box, which reads back as nothing. The latin subset's
 * unicode range names U+FFFD, but its font has no glyph for it.
 */
const replacement = '?';

/** Splits one line into runs of one font subset each; invisible format characters are dropped. */
function runsOf(text: string, weight: Weight, fonts: BrandFonts): Run[] {
  const runs: Run[] = [];
  for (const char of text.normalize('NFC').replace(/[\p{Cc}\p{Cf}]/gu, '')) {
    const codePoint = char.codePointAt(0) ?? 0;
    const range = fonts.ranges.find((r) => codePoint >= r.from && codePoint <= r.to);
    const font = fontName(weight, range?.subset ?? 'latin');
    const shown = range ? char : replacement;
    const last = runs.at(-1);
    if (last?.font === font) last.text += shown;
    else runs.push({ font, text: shown });
  }
  return runs;
}

/* ------------------------------------------------------------------ page and palette */

const page = { width: 595.28, height: 841.89, margin: 48 } as const;
const left = page.margin;
const right = page.width - page.margin;
const contentWidth = right - left;

// The portal's own palette (web/styles.css), so the document looks like the product it came from.
const colors = {
  ink: '#061c23',
  muted: '#3a6f7d',
  accent: '#0c6b66',
  rule: '#a9c3c9',
  band: '#e3eef0',
  alert: '#a3261b',
  alertBand: '#fbe0dc',
  healthy: '#23683a',
} as const;

const text = {
  body: { weight: 'regular', size: 9.5, color: colors.ink },
  bodyBold: { weight: 'bold', size: 9.5, color: colors.ink },
  label: { weight: 'bold', size: 8, color: colors.muted },
  small: { weight: 'regular', size: 8, color: colors.muted },
  seller: { weight: 'bold', size: 13, color: colors.ink },
  title: { weight: 'bold', size: 22, color: colors.accent },
  number: { weight: 'bold', size: 11, color: colors.ink },
  total: { weight: 'bold', size: 11, color: colors.ink },
} as const satisfies Record<string, Style>;

const lineHeight = (style: Style) => style.size * 1.35;

/* ------------------------------------------------------------------ text on the page */

class PageWriter {
  readonly doc: PDFKit.PDFDocument;
  readonly #fonts: BrandFonts;

  constructor(doc: PDFKit.PDFDocument, fonts: BrandFonts) {
    this.doc = doc;
    this.#fonts = fonts;
    for (const file of fonts.files) doc.registerFont(file.name, file.data);
  }

  width(line: string, style: Style): number {
    return runsOf(line, style.weight, this.#fonts).reduce(
      (sum, run) => sum + this.doc.font(run.font).fontSize(style.size).widthOfString(run.text),
      0,
    );
  }

  /** Greedy wrapping on spaces; a word wider than the column is broken between characters. */
  wrap(value: string, style: Style, maxWidth: number): string[] {
    const lines: string[] = [];
    for (const paragraph of value.split(/\r?\n/)) {
      const words = paragraph.split(/\s+/).filter((word) => word !== '');
      let current = '';
      for (const word of words) {
        const candidate = current === '' ? word : `${current} ${word}`;
        if (this.width(candidate, style) <= maxWidth) {
          current = candidate;
          continue;
        }
        if (current !== '') lines.push(current);
        current = '';
        for (const char of word) {
          if (current !== '' && this.width(current + char, style) > maxWidth) {
            lines.push(current);
            current = '';
          }
          current += char;
        }
      }
      lines.push(current);
    }
    // Blank lines inside stay (an address's empty line); blank lines at the end do not.
    while (lines.length > 1 && lines.at(-1) === '') lines.pop();
    return lines;
  }

  /** One line whose top is at y; `align: 'right'` puts its end at x. */
  line(value: string, x: number, y: number, style: Style, align: 'left' | 'right' = 'left'): void {
    let at = align === 'right' ? x - this.width(value, style) : x;
    this.doc.fillColor(style.color);
    for (const run of runsOf(value, style.weight, this.#fonts)) {
      this.doc.font(run.font).fontSize(style.size);
      this.doc.text(run.text, at, y, { lineBreak: false });
      at += this.doc.widthOfString(run.text);
    }
  }

  /** Wrapped text in a column; returns the height it took. */
  block(
    value: string,
    x: number,
    y: number,
    maxWidth: number,
    style: Style,
    align: 'left' | 'right' = 'left',
  ): number {
    const lines = this.wrap(value, style, maxWidth);
    lines.forEach((line, index) => {
      this.line(line, align === 'right' ? x + maxWidth : x, y + index * lineHeight(style), style, align);
    });
    return lines.length * lineHeight(style);
  }

  blockHeight(value: string, maxWidth: number, style: Style): number {
    return this.wrap(value, style, maxWidth).length * lineHeight(style);
  }

  rule(y: number, color: string = colors.rule, from: number = left, to: number = right): void {
    this.doc.moveTo(from, y).lineTo(to, y).lineWidth(0.6).strokeColor(color).stroke();
  }

  band(x: number, y: number, width: number, height: number, color: string): void {
    this.doc.rect(x, y, width, height).fillColor(color).fill();
  }
}

/* ------------------------------------------------------------------ words */

const isCalendarDay = (value: string) => /^\d{4}-\d{2}-\d{2}$/.test(value);

/** A calendar day as written ("1 Mar 2026"); an instant as the day it was in the company's zone. */
function day(value: string, timeZone: string): string {
  return isCalendarDay(value) ? formatDate(`${value}T00:00:00Z`, 'UTC') : formatDate(value, timeZone);
}

const titleOf = (invoice: InvoiceDetail) => (invoice.kind === 'credit-note' ? 'Credit note' : 'Invoice');

function quantityWithUnit(hundredths: number, unit: string): string {
  const quantity = quantityToText(hundredths);
  return unit.trim() === '' ? quantity : `${quantity} ${unit.trim()}`;
}

/* ------------------------------------------------------------------ the document */

interface Layout {
  writer: PageWriter;
  invoice: InvoiceDetail;
  options: InvoicePdfOptions;
  /** The lowest point content may reach on a page; the footer lives below it. */
  bottom: number;
  y: number;
}

const money = (invoice: InvoiceDetail, minor: number) => formatMoney(minor, invoice.currency);

/**
 * The document to send or download. Rendering the same invoice in the same state twice gives the
 * same bytes: the creation date is the issue date (a draft's is when it was made), and pdfkit
 * derives the file identifier and font tags from the document's own content.
 */
export async function renderInvoicePdf(invoice: InvoiceDetail, options: InvoicePdfOptions): Promise<Buffer> {
  const title = titleOf(invoice);
  const created = invoice.issueDate
    ? wallInstant(invoice.issueDate, '00:00', options.timeZone)
    : new Date(invoice.createdAt);
  const doc = new PDFDocument({
    size: 'A4',
    margin: page.margin,
    bufferPages: true,
    lang: 'en-GB',
    displayTitle: true,
    info: {
      Title: invoice.number ? `${title} ${invoice.number}` : `${title} (draft)`,
      Author: options.companyName,
      Subject: `${title} for ${invoice.tank.name}`,
      Creator: 'Brinewatch',
      CreationDate: created,
    },
  });
  const chunks: Buffer[] = [];
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const writer = new PageWriter(doc, loadBrandFonts());
  const footer = footerText(invoice);
  const footerHeight = footer ? writer.blockHeight(footer, contentWidth, text.small) + 6 : 0;
  const layout: Layout = {
    writer,
    invoice,
    options,
    bottom: page.height - page.margin - lineHeight(text.small) - footerHeight - 12,
    y: page.margin,
  };

  heading(layout);
  parties(layout);
  linesTable(layout);
  totals(layout);
  settlement(layout);
  note(layout);
  finishPages(layout, footer);

  doc.end();
  return finished;
}

function footerText(invoice: InvoiceDetail): string {
  return invoice.seller?.footer.trim() ?? '';
}

/** Moves to a new page when `height` does not fit on this one; `header` redraws what repeats. */
function ensureRoom(layout: Layout, height: number, header?: () => void): void {
  if (layout.y + height <= layout.bottom) return;
  layout.writer.doc.addPage();
  layout.y = page.margin;
  continuationHeading(layout);
  header?.();
}

function continuationHeading(layout: Layout): void {
  const { writer, invoice } = layout;
  const name = invoice.number ? `${titleOf(invoice)} ${invoice.number}` : `${titleOf(invoice)} (draft)`;
  writer.line(`${name} — continued`, left, layout.y, text.label);
  writer.line(invoice.billToName, right, layout.y, text.small, 'right');
  layout.y += lineHeight(text.label) + 4;
  writer.rule(layout.y);
  layout.y += 10;
}

function heading(layout: Layout): void {
  const { writer, invoice, options } = layout;
  const title = titleOf(invoice);

  if (invoice.status === 'draft') {
    const banner = `DRAFT — not a valid ${title.toLowerCase()}`;
    const explanation = 'Its number, dates and the seller’s details are set when it is issued.';
    const height = lineHeight(text.total) + lineHeight(text.small) + 12;
    writer.band(left, layout.y, contentWidth, height, colors.alertBand);
    writer.line(banner, left + 10, layout.y + 6, { ...text.total, color: colors.alert });
    writer.line(explanation, left + 10, layout.y + 6 + lineHeight(text.total), {
      ...text.small,
      color: colors.alert,
    });
    layout.y += height + 14;
  }

  const top = layout.y;
  const sellerWidth = contentWidth * 0.55;
  let sellerY = top;
  const seller = invoice.seller;
  sellerY += writer.block(seller?.name || options.companyName, left, sellerY, sellerWidth, text.seller);
  if (seller?.address) sellerY += writer.block(seller.address, left, sellerY + 2, sellerWidth, text.body) + 2;
  if (seller?.taxId) {
    sellerY +=
      writer.block(`${invoice.taxLabel} number: ${seller.taxId}`, left, sellerY + 2, sellerWidth, text.body) +
      2;
  }

  const metaWidth = contentWidth - sellerWidth - 12;
  const metaX = right - metaWidth;
  let metaY = top - 4;
  metaY += writer.block(title, metaX, metaY, metaWidth, text.title, 'right');
  metaY +=
    writer.block(invoice.number ?? 'Not numbered yet', metaX, metaY, metaWidth, text.number, 'right') + 4;
  const facts: string[] = [];
  if (invoice.issueDate) facts.push(`Issue date: ${day(invoice.issueDate, options.timeZone)}`);
  else facts.push(`Drafted: ${day(invoice.createdAt, options.timeZone)}`);
  if (invoice.kind === 'invoice' && invoice.dueDate)
    facts.push(`Due date: ${day(invoice.dueDate, options.timeZone)}`);
  for (const fact of facts) metaY += writer.block(fact, metaX, metaY, metaWidth, text.body, 'right');

  const status = statusWords(invoice, options.timeZone);
  if (status) {
    metaY += 4;
    metaY += writer.block(
      status.words,
      metaX,
      metaY,
      metaWidth,
      { ...text.number, color: status.color },
      'right',
    );
  }

  layout.y = Math.max(sellerY, metaY) + 14;
  writer.rule(layout.y);
  layout.y += 12;
}

function statusWords(invoice: InvoiceDetail, timeZone: string): { words: string; color: string } | null {
  if (invoice.status === 'paid') {
    return {
      words: invoice.paidAt ? `Paid on ${day(invoice.paidAt, timeZone)}` : 'Paid',
      color: colors.healthy,
    };
  }
  if (invoice.status === 'void') return { words: 'Cancelled', color: colors.alert };
  return null;
}

function parties(layout: Layout): void {
  const { writer, invoice, options } = layout;
  const columnWidth = (contentWidth - 24) / 2;
  const secondX = left + columnWidth + 24;
  const top = layout.y;

  let billY = top;
  writer.line('BILL TO', left, billY, text.label);
  billY += lineHeight(text.label);
  billY += writer.block(
    invoice.billToName || 'No client chosen yet',
    left,
    billY,
    columnWidth,
    text.bodyBold,
  );
  if (invoice.billToEmail) billY += writer.block(invoice.billToEmail, left, billY, columnWidth, text.body);

  let aboutY = top;
  const fact = (label: string, value: string) => {
    writer.line(label.toUpperCase(), secondX, aboutY, text.label);
    aboutY += lineHeight(text.label);
    aboutY += writer.block(value, secondX, aboutY, columnWidth, text.body) + 4;
  };
  fact('Tank', invoice.tank.name);
  if (invoice.source) fact('For', `${invoice.source.label}, ${day(invoice.source.date, options.timeZone)}`);
  if (invoice.kind === 'credit-note') {
    const credited = invoice.related[0];
    if (credited) {
      const issued = credited.issueDate ? ` of ${day(credited.issueDate, options.timeZone)}` : '';
      fact(
        'Credits',
        `Invoice ${credited.number ?? '(draft)'}${issued}, ${money(invoice, credited.totalMinor)}`,
      );
    }
  }
  if (invoice.reason)
    fact(invoice.kind === 'credit-note' ? 'Reason' : 'Why it was cancelled', invoice.reason);

  layout.y = Math.max(billY, aboutY) + 16;
}

/* ------------------------------------------------------------------ lines table */

interface Column {
  heading: string;
  width: number;
  align: 'left' | 'right';
  cell: (line: InvoiceDetail['lines'][number]) => string;
}

const cellPadding = 6;

function columnsFor(layout: Layout): Column[] {
  const { writer, invoice } = layout;
  const numeric: Omit<Column, 'width'>[] = [
    {
      heading: 'Quantity',
      align: 'right',
      cell: (line) => quantityWithUnit(line.quantityHundredths, line.unit),
    },
    { heading: 'Unit price', align: 'right', cell: (line) => money(invoice, line.unitPriceMinor) },
    { heading: 'Amount', align: 'right', cell: (line) => money(invoice, line.amountMinor) },
  ];
  // Numbers take the width they need (a quantity with a long unit wraps at 120 pt); the description the rest.
  const sized = numeric.map((column) => {
    const widest = Math.max(
      writer.width(column.heading, text.label),
      ...invoice.lines.map((line) => writer.width(column.cell(line), text.body)),
    );
    return {
      ...column,
      width: Math.min(widest, column.heading === 'Quantity' ? 120 : 160) + 2 * cellPadding,
    };
  });
  const rest = contentWidth - sized.reduce((sum, column) => sum + column.width, 0);
  return [{ heading: 'Description', align: 'left', width: rest, cell: (line) => line.description }, ...sized];
}

function linesTable(layout: Layout): void {
  const { writer, invoice } = layout;
  const columns = columnsFor(layout);
  const headerHeight = lineHeight(text.label) + 2 * cellPadding;

  const header = () => {
    writer.band(left, layout.y, contentWidth, headerHeight, colors.band);
    let x = left;
    for (const column of columns) {
      const at = column.align === 'right' ? x + column.width - cellPadding : x + cellPadding;
      writer.line(column.heading.toUpperCase(), at, layout.y + cellPadding, text.label, column.align);
      x += column.width;
    }
    layout.y += headerHeight;
  };

  const rows = invoice.lines.map((line) => {
    const cells = columns.map((column) =>
      writer.wrap(column.cell(line), text.body, column.width - 2 * cellPadding),
    );
    const height = Math.max(...cells.map((cell) => cell.length)) * lineHeight(text.body) + 2 * cellPadding;
    return { cells, height };
  });

  // The header never sits alone at the foot of a page.
  ensureRoom(layout, headerHeight + (rows[0]?.height ?? 0));
  header();
  if (rows.length === 0) {
    writer.line('No lines yet.', left + cellPadding, layout.y + cellPadding, text.small);
    layout.y += lineHeight(text.small) + 2 * cellPadding;
    writer.rule(layout.y);
  }
  for (const row of rows) {
    ensureRoom(layout, row.height, header);
    let x = left;
    row.cells.forEach((cell, index) => {
      const column = columns[index]!;
      const at = column.align === 'right' ? x + column.width - cellPadding : x + cellPadding;
      cell.forEach((line, lineIndex) => {
        writer.line(
          line,
          at,
          layout.y + cellPadding + lineIndex * lineHeight(text.body),
          text.body,
          column.align,
        );
      });
      x += column.width;
    });
    layout.y += row.height;
    writer.rule(layout.y);
  }
  layout.y += 10;
}

/* ------------------------------------------------------------------ totals and what was paid */

interface SumRow {
  label: string;
  amount: string;
  style: Style;
}

const sumsWidth = 300;
// Amounts line up with the table's Amount column.
const sumsRight = right - cellPadding;
const sumsLeft = right - sumsWidth;

function labelWidth(writer: PageWriter, row: SumRow): number {
  return sumsRight - sumsLeft - writer.width(row.amount, row.style) - 12;
}

const rowHeight = (writer: PageWriter, row: SumRow) =>
  writer.blockHeight(row.label, labelWidth(writer, row), row.style) + 4;

/** Label and amount rows at the right, as a column of sums. */
function sumRows(layout: Layout, rows: SumRow[]): void {
  const { writer } = layout;
  for (const row of rows) {
    const height = rowHeight(writer, row);
    ensureRoom(layout, height);
    writer.block(row.label, sumsLeft, layout.y, labelWidth(writer, row), row.style);
    writer.line(row.amount, sumsRight, layout.y, row.style, 'right');
    layout.y += height;
  }
}

/** Moves to a new page unless `height` fits on this one (or could not fit on any). */
function keepTogether(layout: Layout, height: number): void {
  ensureRoom(layout, Math.min(height, layout.bottom - page.margin - 40));
}

function totals(layout: Layout): void {
  const { writer, invoice } = layout;
  const rows: SumRow[] = [
    { label: 'Net', amount: money(invoice, invoice.netMinor), style: text.body },
    {
      label: `${invoice.taxLabel} ${formatTaxRate(invoice.taxRateBp)}`,
      amount: money(invoice, invoice.taxMinor),
      style: text.body,
    },
  ];
  const total: SumRow = {
    label: invoice.kind === 'credit-note' ? 'Total credited' : 'Total',
    amount: money(invoice, invoice.totalMinor),
    style: text.total,
  };
  const included = invoice.pricesIncludeTax ? `Prices include ${invoice.taxLabel}.` : '';
  keepTogether(
    layout,
    [...rows, total].reduce((sum, row) => sum + rowHeight(writer, row), 5) +
      (included ? writer.blockHeight(included, sumsWidth, text.small) : 0),
  );
  sumRows(layout, rows);
  writer.rule(layout.y, colors.ink, sumsLeft, right);
  layout.y += 5;
  sumRows(layout, [total]);
  if (included) layout.y += writer.block(included, sumsLeft, layout.y, sumsWidth, text.small);
  layout.y += 14;
}

function settlement(layout: Layout): void {
  const { writer, invoice, options } = layout;
  if (invoice.kind !== 'invoice' || invoice.status === 'draft') return;

  const credits = invoice.related.filter((related) => related.kind === 'credit-note');
  const rows: SumRow[] = [
    ...credits.map((credit) => ({
      label: `Credit note ${credit.number ?? '(draft)'}${credit.issueDate ? `, ${day(credit.issueDate, options.timeZone)}` : ''}`,
      amount: money(invoice, credit.totalMinor),
      style: text.body,
    })),
    ...invoice.payments.map((payment) => ({
      label: `Paid ${day(payment.receivedAt, options.timeZone)}, ${paymentMethodLabels[payment.method].toLowerCase()}${payment.reference ? ` (${payment.reference})` : ''}`,
      amount: formatMoney(-payment.amountMinor, payment.currency),
      style: text.body,
    })),
  ];
  const balance: SumRow[] =
    invoice.status === 'void'
      ? []
      : [{ label: 'Balance due', amount: money(invoice, invoice.balanceMinor), style: text.total }];
  if (rows.length === 0 && balance.length === 0) return;
  const heading = rows.length > 0 ? lineHeight(text.label) + 4 : 0;
  keepTogether(
    layout,
    [...rows, ...balance].reduce((sum, row) => sum + rowHeight(writer, row), heading + 5),
  );
  if (rows.length > 0) {
    writer.line('CREDITS AND PAYMENTS', sumsLeft, layout.y, text.label);
    layout.y += heading;
    sumRows(layout, rows);
  }
  if (balance.length > 0) {
    writer.rule(layout.y, colors.ink, sumsLeft, right);
    layout.y += 5;
    sumRows(layout, balance);
  }
  layout.y += 14;
}

function note(layout: Layout): void {
  const { writer, invoice } = layout;
  const value = invoice.note.trim();
  if (!value) return;
  keepTogether(layout, lineHeight(text.label) + writer.blockHeight(value, contentWidth, text.body));
  writer.line('NOTE', left, layout.y, text.label);
  layout.y += lineHeight(text.label);
  // A long note continues on the next page line by line.
  for (const line of writer.wrap(value, text.body, contentWidth)) {
    ensureRoom(layout, lineHeight(text.body));
    writer.line(line, left, layout.y, text.body);
    layout.y += lineHeight(text.body);
  }
}

/** Footer text, page numbers and, on a draft, the watermark: drawn once the page count is known. */
function finishPages(layout: Layout, footer: string): void {
  const { writer, invoice } = layout;
  const doc = writer.doc;
  const { start, count } = doc.bufferedPageRange();
  for (let index = start; index < start + count; index += 1) {
    doc.switchToPage(index);
    if (invoice.status === 'draft') watermark(writer);
    const numberY = page.height - page.margin - lineHeight(text.small);
    if (footer) {
      const footerTop = numberY - 6 - writer.blockHeight(footer, contentWidth, text.small);
      writer.rule(footerTop - 6);
      writer.block(footer, left, footerTop, contentWidth, text.small);
    }
    writer.line(`Page ${index - start + 1} of ${count}`, right, numberY, text.small, 'right');
  }
}

function watermark(writer: PageWriter): void {
  const doc = writer.doc;
  const style: Style = { weight: 'bold', size: 110, color: colors.alert };
  const word = 'DRAFT';
  const width = writer.width(word, style);
  doc.save();
  doc.rotate(-35, { origin: [page.width / 2, page.height / 2] });
  doc.fillOpacity(0.07);
  writer.line(word, page.width / 2 - width / 2, page.height / 2 - style.size * 0.6, style);
  doc.restore();
}
