import type { OutgoingMail } from '../../adapters/mail/mailer';
import { renderMail } from '../../adapters/mail/render-mail';
import type { DayRecord } from '../days/days.repository';

/** "Thursday 11 March 2027 at 23:59 (Europe/London time)": the deadline on the day's own clock. */
export function deadlineWords(picksCloseAt: Date, timeZone: string): string {
  const when = new Intl.DateTimeFormat('en-GB', {
    timeZone,
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(picksCloseAt);
  return `${when.replace(/, (\d\d:\d\d)$/, ' at $1')} (${timeZone} time)`;
}

/** "4 March 2027" for a calendar date. */
const longDate = (date: string) =>
  new Intl.DateTimeFormat('en-GB', { dateStyle: 'long', timeZone: 'UTC' }).format(
    new Date(`${date}T12:00:00Z`),
  );

export type ProofMailKind = 'proofs' | 'proofs_reminder' | 'proofs_deadline';

export function proofsMail(input: {
  kind: ProofMailKind;
  to: string;
  name: string;
  day: DayRecord;
  picksCloseAt: Date;
  picksIncluded: number;
  url: string;
}): OutgoingMail {
  const portraits = input.picksIncluded === 1 ? 'one portrait' : `${input.picksIncluded} portraits`;
  const deadline = deadlineWords(input.picksCloseAt, input.day.timeZone);
  const content = renderMail({
    heading: `Hello ${input.name},`,
    paragraphs: [
      input.kind === 'proofs'
        ? `Your ${input.day.clientName} portraits from ${longDate(input.day.date)} are ready: choose ${portraits} to be finished.`
        : input.kind === 'proofs_deadline'
          ? `The date to choose your ${input.day.clientName} portrait from ${longDate(input.day.date)} has moved.`
          : `A reminder: you have not chosen your ${input.day.clientName} portrait yet.`,
      `Choose by ${deadline}. You can change your mind until then; after it, the photographer’s choice stands.`,
      'You can add a short note for the retouch, such as a blemish, a stray hair or glare on glasses.',
    ],
    action: { label: 'Choose my portrait', url: input.url },
    footnote: 'This link is personal: it signs you in once and works for 7 days.',
  });
  return {
    to: input.to,
    subject:
      input.kind === 'proofs'
        ? `Your ${input.day.clientName} portraits are ready to choose`
        : input.kind === 'proofs_deadline'
          ? `New date to choose your ${input.day.clientName} portrait`
          : `Reminder: choose your ${input.day.clientName} portrait`,
    ...content,
  };
}
