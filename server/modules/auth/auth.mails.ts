import { renderMail } from '../../adapters/mail/render-mail';

const minutesOrHours = (ms: number) => {
  const minutes = Math.round(ms / 60_000);
  if (minutes < 120) return `${minutes} minutes`;
  const hours = Math.round(minutes / 60);
  return hours % 24 === 0 ? `${hours / 24} days` : `${hours} hours`;
};

export function sitterSignInMail(input: {
  name: string;
  clientName: string;
  url: string;
  ttlMs: number;
}) {
  return {
    subject: `Your sign-in link for the ${input.clientName} portrait day`,
    ...renderMail({
      heading: `Hello ${input.name},`,
      paragraphs: [
        `Here is your personal link to see your portrait booking for ${input.clientName}.`,
        `It works once and for ${minutesOrHours(input.ttlMs)}. If you did not ask for it, you can ignore this message.`,
      ],
      action: { label: 'Open my booking page', url: input.url },
    }),
  };
}

export function staffSetPasswordMail(input: {
  name: string;
  invitedAs: string;
  url: string;
  ttlMs: number;
}) {
  return {
    subject: 'You have been invited to Likeness',
    ...renderMail({
      heading: `Hello ${input.name},`,
      paragraphs: [
        `You have been given a Likeness account as ${input.invitedAs}. Choose a password to finish setting it up.`,
        `The link works once and for ${minutesOrHours(input.ttlMs)}.`,
      ],
      action: { label: 'Choose my password', url: input.url },
    }),
  };
}

export function passwordResetMail(input: { name: string; url: string; ttlMs: number }) {
  return {
    subject: 'Reset your Likeness password',
    ...renderMail({
      heading: `Hello ${input.name},`,
      paragraphs: [
        'Someone (hopefully you) asked to reset the password of your Likeness account.',
        `The link works once and for ${minutesOrHours(input.ttlMs)}. If you did not ask, ignore this message: your password stays as it is.`,
      ],
      action: { label: 'Choose a new password', url: input.url },
    }),
  };
}
