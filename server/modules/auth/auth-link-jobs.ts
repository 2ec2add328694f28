import { z } from 'zod';
import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import type { AppConfig } from '../../config';
import type { Db } from '../../db/database';
import type { LinkPurpose } from '../../db/types';
import { addJob, type JobHandlers } from '../../jobs/job-queue';
import { hashToken, newOpaqueToken } from '../../lib/secrets';
import * as repo from './auth.repository';
import { passwordResetMail, sitterSignInMail } from './auth.mails';

export const SIGN_IN_LINK_TASK = 'send_sign_in_link';
export const PASSWORD_RESET_TASK = 'send_password_reset';

const payloadSchema = z.object({ email: z.string() });

interface LinkJobDeps {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  config: AppConfig;
}

/** Stores a new link token (only its hash) and returns the token for the mail. */
export async function issueLinkToken(
  deps: { db: Db; clock: Clock },
  subject: { userId: string } | { personId: string },
  purpose: LinkPurpose,
  ttlMs: number,
): Promise<string> {
  const token = newOpaqueToken();
  await repo.insertLinkToken(deps.db, {
    tokenHash: hashToken(token),
    purpose,
    userId: 'userId' in subject ? subject.userId : null,
    personId: 'personId' in subject ? subject.personId : null,
    expiresAt: new Date(deps.clock.now().getTime() + ttlMs),
  });
  return token;
}

/**
 * Sign-in links and password resets are looked up, issued and mailed by a job, never in the
 * request: the request only queues the address, so a known and an unknown e-mail cost the same
 * and answer alike. One job key per address keeps a burst of requests to one mail.
 */
export function createAuthLinkJobs(deps: LinkJobDeps) {
  const { db, clock, mailer, config } = deps;

  async function sendSitterLinks(email: string): Promise<void> {
    for (const sitter of await repo.findActiveSittersByEmail(db, email)) {
      // Only the newest sign-in link works: a mail left in an old inbox opens nothing.
      await repo.retireOpenLinks(db, { personId: sitter.id }, ['sitter_sign_in'], clock.now());
      const token = await issueLinkToken(
        deps,
        { personId: sitter.id },
        'sitter_sign_in',
        config.signInLinkTtlMs,
      );
      const mail = sitterSignInMail({
        name: sitter.displayName.split(' ')[0] ?? sitter.displayName,
        clientName: sitter.clientName,
        url: `${config.publicUrl}/link/${token}`,
        ttlMs: config.signInLinkTtlMs,
      });
      await mailer.send({ to: sitter.email, ...mail });
    }
  }

  async function sendPasswordReset(email: string): Promise<void> {
    const account = await repo.findStaffByEmail(db, email);
    if (!account?.active) return;
    await repo.retireOpenLinks(db, { userId: account.id }, ['reset_password'], clock.now());
    const token = await issueLinkToken(
      deps,
      { userId: account.id },
      'reset_password',
      config.passwordResetTtlMs,
    );
    const mail = passwordResetMail({
      name: account.displayName,
      url: `${config.publicUrl}/password/${token}`,
      ttlMs: config.passwordResetTtlMs,
    });
    await mailer.send({ to: account.email, ...mail });
  }

  return {
    async queueSitterLink(email: string): Promise<void> {
      await addJob(db, SIGN_IN_LINK_TASK, { email }, { jobKey: `${SIGN_IN_LINK_TASK}:${email}` });
    },
    async queuePasswordReset(email: string): Promise<void> {
      await addJob(
        db,
        PASSWORD_RESET_TASK,
        { email },
        { jobKey: `${PASSWORD_RESET_TASK}:${email}` },
      );
    },
    handlers(): JobHandlers {
      return {
        [SIGN_IN_LINK_TASK]: (payload) => sendSitterLinks(payloadSchema.parse(payload).email),
        [PASSWORD_RESET_TASK]: (payload) => sendPasswordReset(payloadSchema.parse(payload).email),
      };
    },
  };
}
