import { createRequire } from 'node:module';
import type { Writable } from 'node:stream';
import PDFDocument from 'pdfkit';
import { formatMoney, formatTaxRate, type Invoice } from '../../schemas/invoices';

const require = createRequire(import.meta.url);
const fontFile = (subset: 'latin' | 'latin-ext', weight: 400 | 600) =>
  require.resolve(`@fontsource/work-sans/files/work-sans-${subset}-${weight}-normal.woff`);

/**
 * Fontsource splits Work Sans by script. These are the code points of its `latin` file (from
 * its CSS unicode-range); anything else is drawn from `latin-ext` (Polish, Czech, Turkish …).
 */
const latinRanges: Array<[number, number]> = [
  [0x0000, 0x00ff],
  [0x0131, 0x0131],
  [0x0152, 0x0153],
  [0x02bb, 0x02bc],
  [0x02c6, 0x02c6],
  [0x02da, 0x02da],
  [0x02dc, 0x02dc],
  [0x2000, 0x206f],
  [0x20ac, 0x20ac],
  [0x2122, 0x2122],
  [0x2212, 0x2212],
];
const inLatin = (char: string) => {
  const code = char.codePointAt(0) ?? 0;
  return latinRanges.some(([from, to]) => code >= from && code <= to);
};

type Weight = 'regular' | 'semibold';
const fontName = (weight: Weight, latin: boolean) => `work-sans-${weight}-${latin ? 'l' : 'x'}`;

/** Splits text into runs each drawn from the one subset that has its letters. */
function runs(text: string) {
  const parts: Array<{ text: string; latin: boolean }> = [];
  for (const char of text) {
    const latin = inLatin(char);
    const last = parts.at(-1);
    if (last && last.latin === latin) last.text += char;
    else parts.push({ text: char, latin });
  }
  return parts;
}

const ink = '#1d2521';
const muted = '#5b6660';
const rule = '#c9d0cb';

/** Writes the invoice as an A4 PDF with Work Sans embedded (subset to the glyphs used). */
export function writeInvoicePdf(invoice: Invoice, out: Writable): Promise<void> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: 56,
    info: { Title: `Invoice ${invoice.number}`, Author: 'Likeness' },
  });
  for (const weight of ['regular', 'semibold'] as const) {
    for (const latin of [true, false]) {
      doc.registerFont(
        fontName(weight, latin),
        fontFile(latin ? 'latin' : 'latin-ext', weight === 'regular' ? 400 : 600),
      );
    }
  }
  const done = new Promise<void>((resolve, reject) => {
    out.on('finish', resolve);
    out.on('error', reject);
    doc.on('error', reject);
  });
  doc.pipe(out);

  /** One line of text at (x, y), left or right within width, never wrapped. */
  function draw(
    text: string,
    x: number,
    y: number,
    options: {
      size?: number;
      weight?: Weight;
      width?: number;
      align?: 'left' | 'right';
      color?: string;
    } = {},
  ) {
    const size = options.size ?? 10;
    const parts = runs(text).map((part) => {
      doc.font(fontName(options.weight ?? 'regular', part.latin)).fontSize(size);
      return { ...part, width: doc.widthOfString(part.text) };
    });
    const total = parts.reduce((sum, part) => sum + part.width, 0);
    let cursor = options.align === 'right' ? x + (options.width ?? 0) - total : x;
    doc.fillColor(options.color ?? ink);
    for (const part of parts) {
      doc.font(fontName(options.weight ?? 'regular', part.latin)).fontSize(size);
      doc.text(part.text, cursor, y, { lineBreak: false });
      cursor += part.width;
    }
  }

  const left = 56;
  const width = doc.page.width - 112;
  const money = (minor: number) => formatMoney(minor, invoice.currency);
  const columns = { quantity: left + 260, unit: left + 330, amount: left + 420 };

  draw('Invoice', left, 56, { size: 24, weight: 'semibold' });
  draw(invoice.number, left, 90, { size: 12, weight: 'semibold' });
  draw(`Issued ${invoice.issuedAt.slice(0, 10)}`, left, 90, {
    width,
    align: 'right',
    color: muted,
  });
  if (invoice.issuer) {
    // The studio issuing it, on the right, facing the client it bills.
    const from = { width, align: 'right' as const };
    draw('From', left, 130, { ...from, size: 9, color: muted });
    draw(invoice.issuer.name, left, 143, { ...from, size: 12, weight: 'semibold' });
    draw(invoice.issuer.address, left, 160, { ...from, size: 10 });
    if (invoice.issuer.taxId)
      draw(`Tax number ${invoice.issuer.taxId}`, left, 174, { ...from, size: 10 });
  }
  draw('Bill to', left, 130, { size: 9, color: muted });
  draw(invoice.clientName, left, 143, { size: 12, weight: 'semibold' });
  draw('Shoot day', left, 170, { size: 9, color: muted });
  draw(`${invoice.officeName} · ${invoice.dayDate}`, left, 183, { size: 11 });

  let y = 226;
  draw('Description', left, y, { size: 9, color: muted });
  draw('Quantity', columns.quantity, y, { size: 9, color: muted, width: 50, align: 'right' });
  draw('Unit price', columns.unit, y, { size: 9, color: muted, width: 80, align: 'right' });
  draw('Amount', columns.amount, y, { size: 9, color: muted, width: width - 420, align: 'right' });
  y += 16;
  doc
    .moveTo(left, y)
    .lineTo(left + width, y)
    .strokeColor(rule)
    .lineWidth(0.75)
    .stroke();
  y += 8;
  for (const line of invoice.lines) {
    draw(line.description, left, y);
    draw(String(line.quantity), columns.quantity, y, { width: 50, align: 'right' });
    draw(money(line.unitMinor), columns.unit, y, { width: 80, align: 'right' });
    draw(money(line.amountMinor), columns.amount, y, { width: width - 420, align: 'right' });
    y += 20;
  }
  doc
    .moveTo(left, y)
    .lineTo(left + width, y)
    .strokeColor(rule)
    .lineWidth(0.75)
    .stroke();
  y += 10;
  const totals: Array<[string, number, Weight]> = [
    ['Subtotal', invoice.subtotalMinor, 'regular'],
    [`Tax ${formatTaxRate(invoice.taxRateBasisPoints)}`, invoice.taxMinor, 'regular'],
    [`Total ${invoice.currency}`, invoice.totalMinor, 'semibold'],
  ];
  for (const [label, amount, weight] of totals) {
    draw(label, columns.unit, y, { weight });
    draw(money(amount), columns.amount, y, { weight, width: width - 420, align: 'right' });
    y += 20;
  }
  draw('Tax is worked out on the subtotal and rounded half up to the minor unit.', left, y + 24, {
    size: 8,
    color: muted,
  });
  doc.end();
  return done;
}
