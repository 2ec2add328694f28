import { renderMail } from '../../adapters/mail/render-mail';
import type { OutgoingMail } from '../../adapters/mail/mailer';
import { wallClockAt, formatOffset, offsetMinutesAt } from '../days/zoned-time';
import type { DayRecord } from '../days/days.repository';

/** What to wear (common studio practice; see "common practice" in tests/reference/SOURCES.md). */
export const whatToWear = [
  'Solid, mid-tone colours photograph best.',
  'Avoid fine stripes, small checks and tight patterns: they shimmer on camera.',
  'Skip neon colours; pressed clothes and discreet jewellery look best.',
  'If you wear glasses, bring them cleaned.',
];

export const flashCaution =
  'If flash is a problem for you (for example photosensitive epilepsy), tell the photographer: the studio will use continuous light instead.';

/** "Thursday 4 March 2027 at 09:15 (Europe/London, UTC+00:00)": the day's own clock, zone named. */
export function localWhen(startsAt: Date, timeZone: string): string {
  const wall = wallClockAt(startsAt.getTime(), timeZone);
  const date = new Intl.DateTimeFormat('en-GB', {
    timeZone,
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
  }).format(startsAt);
  return `${date} at ${wall.time} (${timeZone}, ${formatOffset(offsetMinutesAt(startsAt.getTime(), timeZone))})`;
}

const place = (day: DayRecord) => (day.room ? `${day.room}, ${day.address}` : day.address);

export function bookingMail(input: {
  kind: 'booked' | 'moved' | 'updated' | 'cancelled' | 'day_before';
  to: string;
  name: string;
  day: DayRecord;
  startsAt: Date;
  passPng: Buffer | null;
  ics: string;
  calendarMethod: 'REQUEST' | 'PUBLISH' | 'CANCEL';
  url: string;
}): OutgoingMail {
  const when = localWhen(input.startsAt, input.day.timeZone);
  const client = input.day.clientName;
  const subjects = {
    booked: `Your portrait sitting for ${client} is booked`,
    moved: `Your portrait sitting for ${client} has moved`,
    updated: `Your portrait sitting for ${client} has changed`,
    cancelled: `Your portrait sitting for ${client} is cancelled`,
    day_before: `Tomorrow: your portrait sitting for ${client}`,
  };
  const opening = {
    booked: `You are booked for ${when}.`,
    moved: `Your sitting is now ${when}.`,
    updated: `The studio changed the details of your sitting on ${when}.`,
    cancelled: `Your sitting on ${when} is cancelled. You can book another slot from your page.`,
    day_before: `See you tomorrow, ${when}.`,
  };
  const paragraphs = [opening[input.kind]];
  if (input.kind !== 'cancelled') {
    paragraphs.push(
      `Where: ${place(input.day)}.`,
      'Show your pass (the square code in this message or on your page) at the station. The code is just a random number; it holds no personal details.',
      `What to wear: ${whatToWear.join(' ')}`,
      flashCaution,
    );
  }
  const content = renderMail({
    heading: `Hello ${input.name},`,
    paragraphs,
    action: { label: 'Open my booking page', url: input.url },
    footnote: 'The calendar invitation attached to this message keeps your calendar up to date.',
  });
  const passHtml = input.passPng
    ? `<p style="margin:16px 0"><img src="cid:pass@likeness" width="200" height="200" alt="Your pass: a square code to show at the station"></p>`
    : '';
  return {
    to: input.to,
    subject: subjects[input.kind],
    text: content.text,
    html: content.html.replace('</h1>', `</h1>${passHtml}`),
    attachments: input.passPng
      ? [
          {
            filename: 'pass.png',
            content: input.passPng,
            contentType: 'image/png',
            cid: 'pass@likeness',
          },
        ]
      : [],
    calendar: {
      method: input.calendarMethod,
      content: input.ics,
      filename: input.kind === 'cancelled' ? 'cancel.ics' : 'invite.ics',
    },
  };
}
