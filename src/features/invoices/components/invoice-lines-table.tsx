import {
  formatMoney,
  formatTaxRate,
  type InvoiceTotals,
} from '../../../../server/schemas/invoices';

/** The lines, subtotal, tax and total of an invoice (issued or as it would be). */
export function InvoiceLinesTable({ totals, caption }: { totals: InvoiceTotals; caption: string }) {
  const money = (minor: number) => formatMoney(minor, totals.currency);
  return (
    <table className="w-full border-collapse text-left tabular-nums">
      <caption className="sr-only">{caption}</caption>
      <thead>
        <tr className="border-b border-line-strong text-sm text-ink-muted">
          <th scope="col" className="py-2 font-medium">
            Description
          </th>
          <th scope="col" className="py-2 text-right font-medium">
            Quantity
          </th>
          <th scope="col" className="py-2 text-right font-medium">
            Unit price
          </th>
          <th scope="col" className="py-2 text-right font-medium">
            Amount
          </th>
        </tr>
      </thead>
      <tbody>
        {totals.lines.map((line) => (
          <tr key={line.kind} className="border-b border-line">
            <th scope="row" className="py-2 font-normal">
              {line.description}
            </th>
            <td className="py-2 text-right">{line.quantity}</td>
            <td className="py-2 text-right">{money(line.unitMinor)}</td>
            <td className="py-2 text-right">{money(line.amountMinor)}</td>
          </tr>
        ))}
      </tbody>
      <tfoot>
        <tr>
          <th scope="row" colSpan={3} className="pt-3 text-right font-normal">
            Subtotal
          </th>
          <td className="pt-3 text-right">{money(totals.subtotalMinor)}</td>
        </tr>
        <tr>
          <th scope="row" colSpan={3} className="py-1 text-right font-normal">
            Tax {formatTaxRate(totals.taxRateBasisPoints)}
          </th>
          <td className="py-1 text-right">{money(totals.taxMinor)}</td>
        </tr>
        <tr className="text-lg font-semibold">
          <th scope="row" colSpan={3} className="py-1 text-right">
            Total {totals.currency}
          </th>
          <td className="py-1 text-right">{money(totals.totalMinor)}</td>
        </tr>
      </tfoot>
    </table>
  );
}
