import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
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
      await transport.sendMail({ from: options.from, ...mail });
    },
    close() {
      transport.close();
    },
  };
}
