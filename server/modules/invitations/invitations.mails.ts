import { renderMail } from '../../adapters/mail/render-mail';
import type { OutgoingMail } from '../../adapters/mail/mailer';
import { flashCaution } from '../booking/booking.mails';
import type { DayRecord } from '../days/days.repository';
import { formatOffset, offsetMinutesAt, zonedTimeToInstant } from '../days/zoned-time';

/** "Thursday 4 March 2027, 09:00 to 17:00 (Europe/London, UTC+00:00)": the day's own clock. */
export function dayWhen(day: DayRecord): string {
  const opens = zonedTimeToInstant(day.date, day.opensAt, day.timeZone);
  const date = new Intl.DateTimeFormat('en-GB', {
    timeZone: day.timeZone,
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
  }).format(new Date(opens));
  const offset = formatOffset(offsetMinutesAt(opens, day.timeZone));
  return `${date}, ${day.opensAt} to ${day.closesAt} (${day.timeZone}, ${offset})`;
}

const place = (day: DayRecord) => (day.room ? `${day.room}, ${day.address}` : day.address);

export function invitationMail(input: {
  kind: 'invitation' | 'reminder';
  to: string;
  name: string;
  day: DayRecord;
  url: string;
}): OutgoingMail {
  const client = input.day.clientName;
  const closes = new Intl.DateTimeFormat('en-GB', {
    timeZone: input.day.timeZone,
    dateStyle: 'long',
    timeStyle: 'short',
  }).format(input.day.bookingClosesAt);
  const content = renderMail({
    heading: `Hello ${input.name},`,
    paragraphs: [
      input.kind === 'invitation'
        ? `${client} is having staff portraits taken, and you are invited to book a five-minute sitting.`
        : `A reminder: you have not picked a time for your ${client} portrait yet.`,
      `When: ${dayWhen(input.day)}. Where: ${place(input.day)}.`,
      `Pick a slot that suits you before ${closes} (${input.day.timeZone} time).`,
      flashCaution,
    ],
    action: { label: 'Pick my slot', url: input.url },
    footnote: 'This link is personal: it signs you in once and works for 7 days.',
  });
  return {
    to: input.to,
    subject:
      input.kind === 'invitation'
        ? `Book your portrait sitting for ${client}`
        : `Reminder: book your portrait sitting for ${client}`,
    ...content,
  };
}
