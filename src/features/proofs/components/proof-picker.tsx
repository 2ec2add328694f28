import { useState } from 'react';
import { pickNoteLimit, type SitterProofs } from '../../../../server/schemas/proofs';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useSavePicks } from '../api/sitter-proofs';

const money = (cents: number) =>
  new Intl.NumberFormat('en-GB', { style: 'currency', currency: 'GBP' }).format(cents / 100);

const when = (iso: string) =>
  new Intl.DateTimeFormat('en-GB', { dateStyle: 'full', timeStyle: 'short' }).format(new Date(iso));

const standingWords = {
  yours: 'Your choice is saved.',
  coordinator: 'Your HR team chose for you.',
  studio: 'The photographer’s choice stands.',
  fallback: 'The first frame after your slate stands, as nobody chose.',
} as const;

/** A sitter's proofs on a phone: tap to choose, a note per choice, save. */
export function ProofPicker({ proofs }: { proofs: SitterProofs }) {
  const [picks, setPicks] = useState(
    () => new Map(proofs.picks.map((pick) => [pick.frameId, pick.note ?? ''])),
  );
  const [notice, setNotice] = useState<{
    tone: 'success' | 'danger' | 'info';
    text: string;
  } | null>(null);
  const save = useSavePicks(proofs.dayId);
  const most = proofs.package.included + proofs.package.extraAllowed;
  const extra = Math.max(0, picks.size - proofs.package.included);

  const toggle = (frameId: string) => {
    setNotice(null);
    setPicks((current) => {
      const next = new Map(current);
      if (next.has(frameId)) next.delete(frameId);
      else if (most === 1) return new Map([[frameId, [...current.values()][0] ?? '']]);
      else if (next.size >= most) {
        setNotice({ tone: 'info', text: `You can choose ${most} at most: unchoose one first.` });
        return current;
      } else next.set(frameId, '');
      return next;
    });
  };

  const submit = () =>
    save.mutate(
      { picks: [...picks].map(([frameId, note]) => ({ frameId, note: note.trim() || null })) },
      {
        onSuccess: () =>
          setNotice({ tone: 'success', text: 'Saved. You can change it until the deadline.' }),
        onError: (error) =>
          setNotice({
            tone: 'danger',
            text: error instanceof ApiError ? error.message : 'Your choice was not saved.',
          }),
      },
    );

  return (
    <div className="flex flex-col gap-4">
      <Card>
        <p>
          Your package includes{' '}
          {proofs.package.included === 1 ? 'one portrait' : `${proofs.package.included} portraits`}
          {proofs.package.extraAllowed > 0
            ? `; you may choose up to ${proofs.package.extraAllowed} more at ${money(proofs.package.extraPriceCents)} each.`
            : '.'}
        </p>
        <p className="mt-2 font-medium">
          {proofs.open ? `Choose by ${when(proofs.picksCloseAt)}.` : 'Choosing has closed.'}
        </p>
        {proofs.standing ? (
          <p className="mt-1 text-sm text-ink-muted">{standingWords[proofs.standing]}</p>
        ) : null}
      </Card>
      <ul className="flex flex-col gap-4" aria-label="Your proofs">
        {proofs.frames.map((frame) => {
          const chosen = picks.has(frame.id);
          return (
            <li
              key={frame.id}
              className={`flex flex-col gap-2 rounded-card border-2 bg-paper-raised p-2 ${chosen ? 'border-spruce-600' : 'border-line'}`}
            >
              <img
                src={frame.url}
                alt={frame.label}
                loading="lazy"
                className="w-full rounded-control bg-paper-sunk"
                width={frame.width ?? undefined}
                height={frame.height ?? undefined}
              />
              <Button
                variant={chosen ? 'primary' : 'secondary'}
                aria-pressed={chosen}
                disabled={!proofs.open}
                onClick={() => toggle(frame.id)}
              >
                {chosen ? `${frame.label}: chosen` : `Choose ${frame.label.toLowerCase()}`}
              </Button>
              {chosen ? (
                <label className="flex flex-col gap-1 text-sm">
                  Note for the retouch (optional)
                  <textarea
                    value={picks.get(frame.id)}
                    maxLength={pickNoteLimit}
                    disabled={!proofs.open}
                    rows={2}
                    onChange={(event) =>
                      setPicks((current) => new Map(current).set(frame.id, event.target.value))
                    }
                    className="rounded-control border border-line-strong px-3 py-2 text-base"
                  />
                  <span className="text-ink-muted">
                    {(picks.get(frame.id) ?? '').length} of {pickNoteLimit} characters
                  </span>
                </label>
              ) : null}
            </li>
          );
        })}
      </ul>
      {notice ? <Notice tone={notice.tone}>{notice.text}</Notice> : null}
      {proofs.open ? (
        <div className="sticky bottom-0 flex flex-col gap-1 bg-paper py-2">
          <Button onClick={submit} busy={save.isPending} disabled={picks.size === 0}>
            Save my choice ({picks.size} chosen{extra > 0 ? `, ${extra} extra` : ''})
          </Button>
          {extra > 0 ? (
            <p className="text-sm text-ink-muted">
              {extra} extra at {money(proofs.package.extraPriceCents)} each, billed to your
              employer’s package.
            </p>
          ) : null}
        </div>
      ) : null}
      <Card title="What the retouch covers">
        <p className="text-sm">
          Temporary things: blemishes, stray hairs, glare on glasses, a crease in a collar, and even
          skin tone and colour.
        </p>
        <p className="mt-2 text-sm">
          Not covered: reshaping faces or bodies, changing eye or hair colour, or swapping in parts
          of other frames.
        </p>
        <p className="mt-2 text-xs text-ink-muted">Common practice for staff portraits.</p>
      </Card>
    </div>
  );
}
