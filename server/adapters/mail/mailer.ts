import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Files; an image with a cid can be shown inside the HTML part as <img src="cid:...">. */
  attachments?: Array<{
    filename: string;
    content: Buffer | string;
    contentType: string;
    cid?: string;
  }>;
  /** A calendar part (text/calendar; method=...), as RFC 6047 asks for iTIP over e-mail. */
  calendar?: { method: 'REQUEST' | 'CANCEL'; content: string; filename: string };
}

/** Sends mail; the real and the local implementation both speak SMTP through nodemailer. */
export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

export function createSmtpMailer(options: { smtpUrl: string; from: string }): Mailer {
  const url = new URL(options.smtpUrl);
  const local = url.hostname === '127.0.0.1' || url.hostname === 'localhost';
  const transport = nodemailer.createTransport({
    host: url.hostname,
    port: Number(url.port || (url.protocol === 'smtps:' ? 465 : 587)),
    secure: url.protocol === 'smtps:',
    auth: url.username
      ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) }
      : undefined,
    // The local catcher has no certificate; real servers keep STARTTLS.
    ignoreTLS: local,
  });
  return {
    async send(mail) {
      const { calendar, ...rest } = mail;
      await transport.sendMail({
        from: options.from,
        ...rest,
        ...(calendar ? { icalEvent: calendar } : {}),
      });
    },
    close() {
      transport.close();
    },
  };
}
