import { Card } from '../../../components/ui/card';
import { Notice } from '../../../components/ui/notice';
import { PageHeading } from '../../../components/ui/page-heading';
import { SitterBookings } from '../../booking/components/sitter-bookings';
import { MyProofsCard } from '../../proofs/components/my-proofs-card';
import { useMyProfile } from '../api/get-my-profile';

export function SitterHome() {
  const profile = useMyProfile();
  if (profile.isPending) return <p role="status">Loading…</p>;
  if (profile.isError) return <Notice tone="danger">{profile.error.message}</Notice>;
  const me = profile.data;

  return (
    <div className="mx-auto flex max-w-xl flex-col gap-5">
      <PageHeading title={`Hello, ${me.preferredName ?? me.givenName}`}>
        Your portrait for {me.clientName}
        {me.office ? `, ${me.office.name} office` : ''}.
      </PageHeading>
      <MyProofsCard />
      <SitterBookings />
      <Card title="What to wear">
        <ul className="flex list-disc flex-col gap-1.5 pl-5">
          <li>Solid, mid-tone colours photograph best.</li>
          <li>Avoid fine stripes, small checks and tight patterns: they shimmer on camera.</li>
          <li>Skip neon colours; pressed clothes and discreet jewellery look best.</li>
          <li>If you wear glasses, bring them cleaned.</li>
        </ul>
        <p className="mt-3 text-sm text-ink-muted">Common studio advice, not a dress code.</p>
      </Card>
      <Notice tone="caution">
        If flash photography is a problem for you (for example photosensitive epilepsy), say so when
        you book: the studio will use continuous light instead of flash.
      </Notice>
      <Card title="Your details on the roster">
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-muted">Name</dt>
          <dd>
            {me.givenName} {me.familyName}
          </dd>
          <dt className="text-ink-muted">E-mail</dt>
          <dd>{me.email}</dd>
          {me.department ? (
            <>
              <dt className="text-ink-muted">Department</dt>
              <dd>{me.department}</dd>
            </>
          ) : null}
        </dl>
      </Card>
    </div>
  );
}
