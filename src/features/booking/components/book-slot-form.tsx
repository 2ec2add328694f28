import { useState, type FormEvent } from 'react';
import { createBookingRequestSchema } from '../../../../server/schemas/booking';
import type { SitterDay } from '../../../../server/schemas/booking';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useCreateBooking } from '../api/create-booking';
import { SittingNeedsFields, type SittingNeeds } from './sitting-needs-fields';
import { SlotPicker } from './slot-picker';

export function BookSlotForm({ day }: { day: SitterDay }) {
  const [startsAt, setStartsAt] = useState('');
  const [needs, setNeeds] = useState<SittingNeeds>({
    preferredName: '',
    glasses: false,
    accessNeeds: '',
    flashSensitive: false,
  });
  const [errors, setErrors] = useState<Record<string, string | undefined>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const create = useCreateBooking();

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = createBookingRequestSchema.safeParse({ dayId: day.id, startsAt, ...needs });
    if (!parsed.success) {
      const next: Record<string, string | undefined> = {};
      for (const issue of parsed.error.issues) next[String(issue.path[0])] ??= issue.message;
      setErrors(next);
      setFormError(null);
      return;
    }
    setErrors({});
    setFormError(null);
    create.mutate(parsed.data, {
      onError: (error) => {
        if (error instanceof ApiError) {
          setFormError(error.message);
          const next: Record<string, string | undefined> = {};
          for (const [key, messages] of Object.entries(error.fieldErrors))
            next[key] = messages?.[0];
          setErrors(next);
          // The slot went to someone else: clear the pick so the fresh list is looked at.
          if (error.code === 'slot_taken') setStartsAt('');
        } else {
          setFormError('Something went wrong. Please try again.');
        }
      },
    });
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-5" aria-label="Book a slot">
      {formError ? <Notice tone="danger">{formError}</Notice> : null}
      <SlotPicker dayId={day.id} value={startsAt} onChange={setStartsAt} error={errors.startsAt} />
      <SittingNeedsFields value={needs} onChange={setNeeds} errors={errors} />
      <Button type="submit" busy={create.isPending} className="w-full sm:w-auto">
        Book this time
      </Button>
    </form>
  );
}
