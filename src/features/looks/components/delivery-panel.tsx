import { useState } from 'react';
import { ConfirmStep } from '../../../components/ui/confirm-step';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useDeliveryStatus, useReleaseSet } from '../api/looks';

const linkClass =
  'inline-flex min-h-touch items-center rounded-control border border-line-strong px-4 font-medium text-spruce-700';

/** The released set: the studio releases (again after a correction); HR downloads it. */
export function DeliveryPanel({
  dayId,
  canRelease,
  canDownload,
}: {
  dayId: string;
  canRelease: boolean;
  canDownload: boolean;
}) {
  const { data } = useDeliveryStatus(dayId);
  const release = useReleaseSet(dayId);
  const [message, setMessage] = useState<{ tone: 'success' | 'danger'; text: string } | null>(null);
  const [confirming, setConfirming] = useState(false);
  if (!data) return null;
  const zip = (query = '') => `/api/days/${dayId}/delivery.zip${query}`;
  return (
    <div className="flex flex-col gap-3">
      <p>
        {data.release
          ? `Release ${data.release}, ${new Date(data.releasedAt!).toLocaleString('en-GB')}: ${data.files} files for ${data.people} people${data.changed ? `, ${data.changed} new or changed` : ''}.`
          : 'Nothing released yet.'}
      </p>
      {canRelease ? (
        // A release reaches people at once (HR's downloads, the sitters' e-mails): one more
        // step, saying so.
        <ConfirmStep
          open={confirming}
          label="Confirm the release"
          trigger={data.release ? 'Release the set again' : 'Release the set to HR and the sitters'}
          confirm="Release it now"
          busy={release.isPending}
          disabled={data.releaseBlocker !== null}
          onOpen={() => {
            setMessage(null);
            setConfirming(true);
          }}
          onCancel={() => setConfirming(false)}
          onConfirm={() =>
            release.mutate(undefined, {
              onSuccess: (result) =>
                setMessage({
                  tone: 'success',
                  text: result.unchanged
                    ? `Nothing changed since release ${result.release}: it stands, and nobody is mailed again.`
                    : `Release ${result.release}: ${result.files} files, ${result.changed} new or changed. Sitters whose portraits changed get their link by e-mail.`,
                }),
              onError: (error) =>
                setMessage({
                  tone: 'danger',
                  text: error instanceof ApiError ? error.message : 'Not released.',
                }),
              onSettled: () => setConfirming(false),
            })
          }
        >
          <p>
            {data.release
              ? 'HR downloads the new release at once, and each sitter whose portraits are new or changed since the last one gets an e-mail with their link.'
              : 'HR can download the set at once, and each sitter gets an e-mail with their link.'}{' '}
            A release is not taken back: a later correction is released again.
          </p>
        </ConfirmStep>
      ) : null}
      {canRelease && data.releaseBlocker && !confirming ? (
        <p className="text-sm text-ink-muted">{data.releaseBlocker}</p>
      ) : null}
      {canDownload && data.release ? (
        <div className="flex flex-wrap gap-2">
          <a className={linkClass} href={zip()} download>
            Download the whole set (ZIP)
          </a>
          {data.offices.map((office) => (
            <a
              key={office}
              className={linkClass}
              href={zip(`?office=${encodeURIComponent(office)}`)}
              download
            >
              {office} office only
            </a>
          ))}
          {data.departments.map((department) => (
            <a
              key={department}
              className={linkClass}
              href={zip(`?department=${encodeURIComponent(department)}`)}
              download
            >
              {department} only
            </a>
          ))}
        </div>
      ) : null}
      {canDownload && data.release ? (
        <p className="text-sm text-ink-muted">
          Each download holds manifest.csv (who is in which file) and missing.csv (who has no
          portrait yet, and why).
        </p>
      ) : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
    </div>
  );
}
