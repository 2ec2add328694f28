import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { SafetyCautions } from '../../../components/ui/safety-cautions';
import { PageHeading } from '../../../components/ui/page-heading';
import { useSession } from '../../../features/auth/api/get-session';
import { BookForPerson } from '../../../features/booking/components/book-for-person';
import { ManageBookings } from '../../../features/booking/components/manage-bookings';
import { dayQueryOptions, useDay } from '../../../features/days/api/get-day';
import { ConfirmDayForm } from '../../../features/days/components/confirm-day-form';
import { DayChangesPanel } from '../../../features/days/components/day-changes-panel';
import { Notice } from '../../../components/ui/notice';
import { MailingPanel } from '../../../features/progress/components/mailing-panel';
import { ProgressDashboard } from '../../../features/progress/components/progress-dashboard';
import { DeliveryPanel } from '../../../features/looks/components/delivery-panel';
import { ProofsPanel } from '../../../features/proofs/components/proofs-panel';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator', 'photographer']);
    await queryClient.ensureQueryData(dayQueryOptions(params.dayId ?? ''));
    return null;
  };

export function DayPage() {
  const dayId = useParams().dayId ?? '';
  const { data: session } = useSession();
  const { data: day } = useDay(dayId);
  if (!day) return null;
  const manages = session?.user.role === 'studio_admin' || session?.user.role === 'coordinator';
  return (
    <>
      <PageHeading title={`${day.officeName} · ${day.date}`}>
        {day.clientName} · {day.opensAt}–{day.closesAt} ({day.timeZone}) ·{' '}
        {day.room ? `${day.room}, ` : ''}
        {day.address}
      </PageHeading>
      {day.status === 'cancelled' ? (
        <div className="mb-5">
          <Notice tone="caution">
            This day is cancelled. Its bookings were cancelled and the sitters told.
          </Notice>
        </div>
      ) : null}
      <div className="grid gap-5 lg:grid-cols-2">
        <Card title="Stations and seats">
          <p className="mb-3">
            {day.booked} of {day.seats} seats booked, {day.slotMinutes}-minute slots
            {day.breaks.length > 0
              ? `, break ${day.breaks.map((pause) => `${pause.start}–${pause.end}`).join(', ')}`
              : ''}
            .
          </p>
          <ul className="mb-4 flex flex-col gap-1">
            {day.stations.map((station) => (
              <li key={station.id}>
                {station.name}: {station.photographerName ?? 'no photographer yet'}
              </li>
            ))}
          </ul>
          <div className="flex flex-wrap gap-3">
            <Link
              to={`/days/${day.id}/sheet`}
              className="inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700"
            >
              Printable day sheet
            </Link>
            {session?.user.role !== 'coordinator' ? (
              <Link
                to={`/days/${day.id}/setup`}
                className="inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700"
              >
                Setup cards (lights and camera)
              </Link>
            ) : null}
            {session?.user.role !== 'coordinator' ? (
              <Link
                to={`/days/${day.id}/frames`}
                className="inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700"
              >
                Frames (upload the cards)
              </Link>
            ) : null}
            {session?.user.role !== 'coordinator' ? (
              <Link
                to={`/days/${day.id}/review`}
                className="inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700"
              >
                Frames by sitter (review the matching)
              </Link>
            ) : null}
            {session?.user.role !== 'coordinator' ? (
              <Link
                to={`/days/${day.id}/retouch`}
                className="inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700"
              >
                Retouch queue
              </Link>
            ) : null}
            {session?.user.role !== 'coordinator' ? (
              <Link
                to={`/days/${day.id}/set`}
                className="inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700"
              >
                The set (renditions and delivery)
              </Link>
            ) : null}
            {manages ? (
              <Link
                to={`/days/${day.id}/summary`}
                className="inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700"
              >
                Summary and invoice
              </Link>
            ) : null}
            <a
              href={`/api/days/${day.id}/schedule.csv`}
              download
              className="inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700"
            >
              Download the schedule (CSV)
            </a>
          </div>
        </Card>
        {session?.user.role === 'studio_admin' && day.status === 'proposed' ? (
          <Card title="Confirm the day">
            <ConfirmDayForm day={day} />
          </Card>
        ) : null}
        {manages ? (
          <>
            <Card title="Invitations and reminders">
              <MailingPanel dayId={day.id} confirmed={day.status === 'confirmed'} />
            </Card>
            <Card title="Progress" className="lg:col-span-2">
              <ProgressDashboard dayId={day.id} />
            </Card>
            {day.status === 'confirmed' ? (
              <Card title="Finished portraits">
                <DeliveryPanel dayId={day.id} canRelease={false} canDownload />
              </Card>
            ) : null}
            {day.status === 'confirmed' ? (
              <Card title="Portraits chosen">
                <ProofsPanel
                  dayId={day.id}
                  dayDate={day.date}
                  canRelease={session?.user.role === 'studio_admin'}
                />
              </Card>
            ) : null}
            {day.status === 'confirmed' ? (
              <Card title="Book for someone" className="lg:col-span-2">
                <BookForPerson dayId={day.id} />
              </Card>
            ) : null}
            {day.status === 'confirmed' ? (
              <Card title="Booked people: move or cancel" className="lg:col-span-2">
                <ManageBookings dayId={day.id} />
              </Card>
            ) : null}
            <Card title="Safety at the venue" className="lg:col-span-2">
              <p className="mb-2 text-sm">
                For the venue&apos;s people: the studio follows these on the day.
              </p>
              <SafetyCautions />
            </Card>
          </>
        ) : null}
        {manages && day.status !== 'cancelled' ? (
          <DayChangesPanel day={day} studio={session?.user.role === 'studio_admin'} />
        ) : null}
      </div>
    </>
  );
}
