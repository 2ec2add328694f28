import { toCsv } from '../../lib/csv';
import { formatTaxRate, minorToDecimal, type Invoice } from '../../schemas/invoices';

/**
 * The invoice for a spreadsheet: the header facts, then one row per line and the totals, with
 * amounts as plain decimals in the invoice's currency. toCsv quotes (RFC 4180) and neutralises
 * formula-like cells (OWASP), so a client named "=HYPERLINK(…)" stays text.
 */
export function invoiceCsv(invoice: Invoice): { fileName: string; csv: string } {
  const money = (minor: number) => minorToDecimal(minor, invoice.currency);
  const rows: string[][] = [
    ['Invoice', invoice.number],
    ['Issued', invoice.issuedAt.slice(0, 10)],
    ...(invoice.issuer
      ? [
          ['From', invoice.issuer.name],
          ['Address', invoice.issuer.address],
          ...(invoice.issuer.taxId ? [['Tax number', invoice.issuer.taxId]] : []),
        ]
      : []),
    ['Client', invoice.clientName],
    ['Shoot day', `${invoice.officeName} ${invoice.dayDate}`],
    ['Currency', invoice.currency],
    [],
    ['Description', 'Quantity', 'Unit price', 'Amount'],
    ...invoice.lines.map((line) => [
      line.description,
      String(line.quantity),
      money(line.unitMinor),
      money(line.amountMinor),
    ]),
    ['Subtotal', '', '', money(invoice.subtotalMinor)],
    [`Tax ${formatTaxRate(invoice.taxRateBasisPoints)}`, '', '', money(invoice.taxMinor)],
    ['Total', '', '', money(invoice.totalMinor)],
  ];
  return { fileName: `${invoice.number}.csv`, csv: toCsv(rows) };
}
