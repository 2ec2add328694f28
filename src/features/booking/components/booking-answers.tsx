import { useState, type FormEvent } from 'react';
import { sittingNeedsSchema, type Booking } from '../../../../server/schemas/booking';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useUpdateAnswers } from '../api/update-answers';
import { SittingNeedsFields, type SittingNeeds } from './sitting-needs-fields';

const fromBooking = (booking: Booking): SittingNeeds => ({
  preferredName: booking.preferredName ?? '',
  glasses: booking.glasses,
  accessNeeds: booking.accessNeeds ?? '',
  flashSensitive: booking.flashSensitive,
});

/** What the sitter said at booking, readable and changeable until they check in. */
export function BookingAnswers({ booking, canChange }: { booking: Booking; canChange: boolean }) {
  const [editing, setEditing] = useState(false);
  const [answers, setAnswers] = useState<SittingNeeds>(() => fromBooking(booking));
  const [errors, setErrors] = useState<Record<string, string | undefined>>({});
  const update = useUpdateAnswers();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = sittingNeedsSchema.safeParse(answers);
    if (!parsed.success) {
      const next: Record<string, string | undefined> = {};
      for (const issue of parsed.error.issues) next[String(issue.path[0])] ??= issue.message;
      setErrors(next);
      return;
    }
    setErrors({});
    update.mutate(
      { bookingId: booking.id, answers: parsed.data },
      {
        onSuccess: () => setEditing(false),
        onError: (error) => {
          if (!(error instanceof ApiError)) return;
          const next: Record<string, string | undefined> = {};
          for (const [key, messages] of Object.entries(error.fieldErrors))
            next[key] = messages?.[0];
          setErrors(next);
        },
      },
    );
  };

  if (editing) {
    return (
      <form
        aria-label="Change my answers"
        noValidate
        onSubmit={submit}
        className="flex flex-col gap-3"
      >
        {update.isError ? <Notice tone="danger">{update.error.message}</Notice> : null}
        <SittingNeedsFields value={answers} onChange={setAnswers} errors={errors} />
        <div className="flex flex-col gap-2 sm:flex-row">
          <Button type="submit" busy={update.isPending}>
            Save my answers
          </Button>
          <Button
            variant="secondary"
            onClick={() => {
              setAnswers(fromBooking(booking));
              setErrors({});
              setEditing(false);
            }}
          >
            Keep them as they were
          </Button>
        </div>
      </form>
    );
  }
  const rows: Array<[string, string]> = [
    ['Name on your photo files', booking.preferredName ?? 'The name on the roster'],
    ['Glasses', booking.glasses ? 'Yes' : 'No'],
    [
      'Flash',
      booking.flashSensitive ? 'No flash: continuous light for this sitter' : 'Flash is fine',
    ],
    ['Access needs', booking.accessNeeds ?? 'None given'],
  ];
  return (
    <section aria-label="Your answers" className="flex flex-col gap-2">
      <h3 className="font-medium">Your answers</h3>
      {update.isSuccess ? <Notice tone="success">Your answers are saved.</Notice> : null}
      <dl className="grid grid-cols-1 gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-sm text-ink-muted">{label}</dt>
            <dd>{value}</dd>
          </div>
        ))}
      </dl>
      {canChange ? (
        <Button
          variant="secondary"
          className="self-start"
          onClick={() => {
            setAnswers(fromBooking(booking));
            setEditing(true);
          }}
        >
          Change my answers
        </Button>
      ) : null}
    </section>
  );
}
