import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { PageHeading } from '../../../components/ui/page-heading';
import {
  clientSummaryQueryOptions,
  useClientSummary,
} from '../../../features/invoices/api/get-client-summary';
import { BookedPhotographedChart } from '../../../features/invoices/components/booked-photographed-chart';
import { SummaryFigures } from '../../../features/invoices/components/summary-figures';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator']);
    await queryClient.ensureQueryData(clientSummaryQueryOptions(params.clientId ?? ''));
    return null;
  };

/** A client's figures over all its days, with booked against photographed per day. */
export function ClientSummaryPage() {
  const { clientId = '' } = useParams();
  const { data } = useClientSummary(clientId);
  if (!data) return null;
  return (
    <>
      <PageHeading title={`Summary: ${data.clientName}`}>
        Every shoot day of this client, counted from its own records.
      </PageHeading>
      <div className="flex flex-col gap-5">
        <Card title="All days together">
          <SummaryFigures counts={data.totals} />
        </Card>
        <Card title="Booked and photographed per day">
          <BookedPhotographedChart
            title="Booked and photographed per day"
            groups={data.days.map((day) => ({
              label: `${day.date} ${day.officeName}`,
              booked: day.counts.booked,
              photographed: day.counts.photographed,
            }))}
          />
        </Card>
        <Card title="Days">
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">Days of this client</caption>
            <thead>
              <tr>
                <th scope="col" className="p-2">
                  Day
                </th>
                <th scope="col" className="p-2">
                  Booked
                </th>
                <th scope="col" className="p-2">
                  Photographed
                </th>
                <th scope="col" className="p-2">
                  Missed
                </th>
                <th scope="col" className="p-2">
                  Renditions delivered
                </th>
                <th scope="col" className="p-2">
                  Invoice
                </th>
              </tr>
            </thead>
            <tbody>
              {data.days.map((day) => (
                <tr key={day.dayId} className="border-t border-line">
                  <th scope="row" className="p-2 font-medium">
                    <Link className="text-spruce-700 underline" to={`/days/${day.dayId}/summary`}>
                      {day.date} · {day.officeName}
                    </Link>
                  </th>
                  <td className="p-2 tabular-nums">{day.counts.booked}</td>
                  <td className="p-2 tabular-nums">{day.counts.photographed}</td>
                  <td className="p-2 tabular-nums">{day.counts.missed}</td>
                  <td className="p-2 tabular-nums">{day.counts.renditionsDelivered}</td>
                  <td className="p-2">
                    {day.invoice ? (
                      <Link
                        className="text-spruce-700 underline"
                        to={`/invoices/${day.invoice.id}`}
                      >
                        {day.invoice.number}
                      </Link>
                    ) : (
                      'not issued'
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </Card>
      </div>
    </>
  );
}
