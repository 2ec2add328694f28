import { escapeHtml } from './render-mail';
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
  calendar?: { method: 'REQUEST' | 'PUBLISH' | 'CANCEL'; content: string; filename: string };
}

/** Sends mail; the real and the local implementation both speak SMTP through nodemailer. */
export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

export interface MailerOptions {
  smtpUrl: string;
  /** Every message comes from the studio: its name and sending address. */
  from: { name: string; address: string };
  replyTo?: string | null;
  /** The sign-off under every message (the studio's name). */
  signature?: string;
}

/** Appends the sign-off to both parts, so every message ends with who sent it. */
export function signMail(
  mail: Pick<OutgoingMail, 'text' | 'html'>,
  signature: string,
): Pick<OutgoingMail, 'text' | 'html'> {
  const line = `<p style="font-size:12px;color:#8a949c;margin-top:28px">${escapeHtml(signature)}</p>`;
  const html = mail.html.includes('</body>')
    ? mail.html.replace('</body>', `${line}</body>`)
    : mail.html + line;
  return { text: `${mail.text}\n-- \n${signature}\n`, html };
}

export function createSmtpMailer(options: MailerOptions): Mailer {
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
        ...(options.replyTo ? { replyTo: options.replyTo } : {}),
        ...rest,
        ...(options.signature ? signMail(mail, options.signature) : {}),
        ...(calendar ? { icalEvent: calendar } : {}),
      });
    },
    close() {
      transport.close();
    },
  };
}
