import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { ConfirmStep } from '../../../components/ui/confirm-step';
import { Notice } from '../../../components/ui/notice';
import { PageHeading } from '../../../components/ui/page-heading';
import { useSession } from '../../../features/auth/api/get-session';
import {
  daySummaryQueryOptions,
  useDaySummary,
} from '../../../features/invoices/api/get-day-summary';
import { useIssueInvoice } from '../../../features/invoices/api/issue-invoice';
import { BookedPhotographedChart } from '../../../features/invoices/components/booked-photographed-chart';
import { InvoiceLinesTable } from '../../../features/invoices/components/invoice-lines-table';
import { SummaryFigures } from '../../../features/invoices/components/summary-figures';
import { formatDateTime } from '../../../lib/format';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator']);
    await queryClient.ensureQueryData(daySummaryQueryOptions(params.dayId ?? ''));
    return null;
  };

const linkClass =
  'inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700';

/** A day's figures, booked against photographed per office, and its invoice. */
export function DaySummaryPage() {
  const dayId = useParams().dayId ?? '';
  const { data: session } = useSession();
  const { data: summary } = useDaySummary(dayId);
  const issue = useIssueInvoice(dayId);
  const [confirming, setConfirming] = useState(false);
  if (!summary) return null;
  const studioAdmin = session?.user.role === 'studio_admin';
  // Every pick is retouched; those not done yet would be left off for good.
  const openRetouches = Math.max(0, summary.counts.picks - summary.counts.retouchesDone);
  return (
    <>
      <PageHeading title="Summary and invoice">
        {summary.clientName} · {summary.officeName} · {summary.date} ·{' '}
        <Link className="font-medium text-spruce-700 underline" to={`/days/${dayId}`}>
          Back to the day
        </Link>
      </PageHeading>
      <div className="flex flex-col gap-5">
        <Card title="Figures">
          <SummaryFigures counts={summary.counts} />
        </Card>
        <Card title="Booked and photographed">
          <BookedPhotographedChart title="Per office" groups={summary.byOffice} />
        </Card>
        <Card title="Invoice">
          {summary.invoice ? (
            <div className="flex flex-col gap-3">
              <p>
                Invoice <strong>{summary.invoice.number}</strong> was issued{' '}
                {formatDateTime(summary.invoice.issuedAt)}. It stays as it was issued.
              </p>
              <div>
                <Link className={linkClass} to={`/invoices/${summary.invoice.id}`}>
                  Open invoice {summary.invoice.number}
                </Link>
              </div>
            </div>
          ) : summary.draft ? (
            <div className="flex flex-col gap-4">
              <p className="text-ink-muted">
                Not issued yet: these lines follow the client’s price list and the day’s records
                until the invoice is issued.
              </p>
              <InvoiceLinesTable totals={summary.draft} caption="Invoice lines, not issued yet" />
              {studioAdmin ? (
                // Issuing freezes the lines for good: one more step, saying so.
                <ConfirmStep
                  open={confirming}
                  label="Confirm the invoice"
                  trigger="Issue the invoice"
                  confirm="Issue it now"
                  busy={issue.isPending}
                  onOpen={() => setConfirming(true)}
                  onConfirm={() => issue.mutate()}
                  onCancel={() => setConfirming(false)}
                >
                  <p>
                    Once issued, the invoice keeps these lines and gets its number: retouches or
                    renditions finished later are not added.
                  </p>
                  {openRetouches > 0 ? (
                    <Notice tone="caution">
                      {openRetouches === 1
                        ? '1 pick is not retouched yet: it is not on this invoice.'
                        : `${openRetouches} picks are not retouched yet: they are not on this invoice.`}{' '}
                      Issue it once they are done to bill them.
                    </Notice>
                  ) : null}
                </ConfirmStep>
              ) : null}
            </div>
          ) : (
            <Notice tone="caution">
              {studioAdmin ? (
                <>
                  {summary.clientName} has no price list yet. Set it on the{' '}
                  <Link className="underline" to="/studio/clients">
                    clients page
                  </Link>
                  .
                </>
              ) : (
                'The studio has not set prices for this client yet.'
              )}
            </Notice>
          )}
          {issue.error ? (
            <div className="mt-3">
              <Notice tone="danger">{issue.error.message}</Notice>
            </div>
          ) : null}
        </Card>
      </div>
    </>
  );
}
