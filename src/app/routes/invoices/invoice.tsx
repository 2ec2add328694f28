import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { useInvoice, invoiceQueryOptions } from '../../../features/invoices/api/get-invoice';
import { InvoiceLinesTable } from '../../../features/invoices/components/invoice-lines-table';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator']);
    await queryClient.ensureQueryData(invoiceQueryOptions(params.invoiceId ?? ''));
    return null;
  };

const downloadClass =
  'inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700';

/** An issued invoice, as printed: the page prints without the buttons. */
export function InvoicePage() {
  const invoiceId = useParams().invoiceId ?? '';
  const { data: invoice } = useInvoice(invoiceId);
  if (!invoice) return null;
  return (
    <article className="mx-auto flex max-w-3xl flex-col gap-6 rounded-card border border-line bg-paper-raised p-8 print:border-0 print:p-0">
      <div className="no-print flex flex-wrap gap-3">
        <Button onClick={() => window.print()}>Print</Button>
        <a className={downloadClass} href={`/api/invoices/${invoice.id}/invoice.pdf`} download>
          Download PDF
        </a>
        <a className={downloadClass} href={`/api/invoices/${invoice.id}/invoice.csv`} download>
          Download CSV
        </a>
      </div>
      <header className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <h1 className="text-3xl font-semibold">Invoice</h1>
          <p className="text-lg font-semibold">{invoice.number}</p>
        </div>
        <p className="text-ink-muted">Issued {invoice.issuedAt.slice(0, 10)}</p>
      </header>
      <dl className="grid gap-3 sm:grid-cols-3">
        {invoice.issuer ? (
          <div>
            <dt className="text-sm text-ink-muted">From</dt>
            <dd className="font-semibold">{invoice.issuer.name}</dd>
            <dd>{invoice.issuer.address}</dd>
            {invoice.issuer.taxId ? <dd>Tax number {invoice.issuer.taxId}</dd> : null}
          </div>
        ) : null}
        <div>
          <dt className="text-sm text-ink-muted">Bill to</dt>
          <dd className="font-semibold">{invoice.clientName}</dd>
        </div>
        <div>
          <dt className="text-sm text-ink-muted">Shoot day</dt>
          <dd>
            {invoice.officeName} · {invoice.dayDate}
          </dd>
        </div>
      </dl>
      <InvoiceLinesTable totals={invoice} caption={`Lines of invoice ${invoice.number}`} />
      <p className="text-sm text-ink-muted">
        Tax is worked out on the subtotal and rounded half up to the minor unit.
      </p>
    </article>
  );
}
