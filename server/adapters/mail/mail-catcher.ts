import { randomUUID } from 'node:crypto';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CaughtMail {
  id: string;
  receivedAt: string;
  from: string;
  replyTo: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** Attachments and calendar parts, content base64-encoded, so tests can decode them. */
  attachments: Array<{ filename: string; contentType: string; content: string }>;
}

export interface Mailbox {
  list(): CaughtMail[];
  get(id: string): CaughtMail | undefined;
}

export interface MailCatcher extends Mailbox {
  port: number;
  smtpUrl: string;
  /** Resolves with the first message to `address` received after `since` (or already held). */
  waitFor(
    address: string,
    options?: { timeoutMs?: number; subjectIncludes?: string },
  ): Promise<CaughtMail>;
  clear(): void;
  close(): Promise<void>;
}

/** Where caught mail outlives the process (the database under `npm start`). */
export interface CaughtMailStore {
  /** The newest `limit` messages, newest first. */
  load(limit: number): Promise<CaughtMail[]>;
  /** Keeps one message and forgets all but the newest `keep`. */
  save(message: CaughtMail, keep: number): Promise<void>;
}

/**
 * A local stand-in for a real SMTP server: keeps the newest messages in memory, newest first,
 * and in the store when one is given, so the Mailbox survives a restart.
 */
export async function startMailCatcher(
  port = 0,
  options: { keep?: number; store?: CaughtMailStore } = {},
): Promise<MailCatcher> {
  const keep = options.keep ?? 500;
  const store = options.store;
  const messages: CaughtMail[] = store ? await store.load(keep) : [];
  const waiters = new Set<() => void>();

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const to = session.envelope.rcptTo.map((recipient) => recipient.address.toLowerCase());
          const message: CaughtMail = {
            id: randomUUID(),
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? '',
            replyTo: parsed.replyTo?.text ?? '',
            to,
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            attachments: parsed.attachments.map((attachment) => ({
              filename: attachment.filename ?? '',
              contentType: attachment.contentType,
              content: attachment.content.toString('base64'),
            })),
          };
          // Stored before it is accepted: a refused message is sent again, never lost.
          await store?.save(message, keep);
          messages.unshift(message);
          messages.splice(keep);
          for (const wake of waiters) wake();
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const boundPort = typeof address === 'object' && address ? address.port : port;

  const find = (address: string, subjectIncludes?: string) =>
    messages.find(
      (message) =>
        message.to.includes(address.toLowerCase()) &&
        (!subjectIncludes || message.subject.includes(subjectIncludes)),
    );

  return {
    port: boundPort,
    smtpUrl: `smtp://127.0.0.1:${boundPort}`,
    list: () => [...messages],
    get: (id) => messages.find((message) => message.id === id),
    clear: () => {
      messages.length = 0;
    },
    waitFor(address, options = {}) {
      const timeoutMs = options.timeoutMs ?? 5000;
      return new Promise((resolve, reject) => {
        const check = () => {
          const found = find(address, options.subjectIncludes);
          if (!found) return false;
          cleanup();
          resolve(found);
          return true;
        };
        const timer = setTimeout(() => {
          cleanup();
          reject(new Error(`No mail to ${address} within ${timeoutMs} ms`));
        }, timeoutMs);
        const cleanup = () => {
          clearTimeout(timer);
          waiters.delete(check);
        };
        if (!check()) waiters.add(check);
      });
    },
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}
