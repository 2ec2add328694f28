import type { Mailer } from '../../adapters/mail/mailer';
import type { Clock } from '../../adapters/clock';
import type { AppConfig } from '../../config';
import type { Db } from '../../db/database';
import { AppError } from '../../lib/errors';
import type { Logger } from '../../lib/logger';
import { hashPassword, hashToken, newOpaqueToken, verifyPassword } from '../../lib/secrets';
import type { Viewer } from '../../lib/viewer';
import type {
  SessionList,
  SessionResponse,
  SetPasswordRequest,
  SignInRequest,
} from '../../schemas/auth';
import { roleLabels } from '../../schemas/common';
import * as repo from './auth.repository';
import { staffSetPasswordMail } from './auth.mails';
import { createAuthLinkJobs, issueLinkToken } from './auth-link-jobs';

export interface AuthDeps {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  config: AppConfig;
  logger: Logger;
}

export interface RequestMeta {
  ipAddress: string | null;
  userAgent: string | null;
}

export interface StartedSession {
  token: string;
  viewer: Viewer;
}

const wrongCredentials = () =>
  new AppError(
    'wrong_credentials',
    401,
    'That e-mail and password do not match an active account.',
  );

const deadLink = (reason: 'used' | 'expired' | 'unknown') =>
  new AppError(
    `link_${reason}`,
    410,
    {
      used: 'This link has already been used. Ask for a fresh one below.',
      expired: 'This link has expired. Ask for a fresh one below.',
      unknown: 'This link is not valid. Ask for a fresh one below.',
    }[reason],
  );

export type AuthService = ReturnType<typeof createAuthService>;

const subjectOf = (viewer: Viewer) =>
  viewer.kind === 'staff' ? { userId: viewer.id } : { personId: viewer.id };

export function createAuthService(deps: AuthDeps) {
  const { db, clock, mailer, config } = deps;

  const staffViewer = (
    account: Omit<repo.StaffAccount, 'clientName' | 'passwordHash'>,
    session: repo.SessionRecord,
  ): Viewer => ({
    kind: 'staff',
    id: account.id,
    role: account.role,
    email: account.email,
    displayName: account.displayName,
    clientId: account.clientId,
    sessionId: session.id,
    sessionExpiresAt: new Date(session.expiresAt),
  });

  const sitterViewer = (
    account: Omit<repo.SitterAccount, 'clientName' | 'officeName'>,
    session: repo.SessionRecord,
  ): Viewer => ({
    kind: 'sitter',
    id: account.id,
    role: 'sitter',
    email: account.email,
    displayName: account.displayName,
    clientId: account.clientId,
    sessionId: session.id,
    sessionExpiresAt: new Date(session.expiresAt),
  });

  async function startSession(
    subject: { userId: string } | { personId: string },
    meta: RequestMeta,
  ): Promise<{ token: string; session: repo.SessionRecord }> {
    const token = newOpaqueToken();
    const session = await repo.insertSession(db, {
      tokenHash: hashToken(token),
      userId: 'userId' in subject ? subject.userId : null,
      personId: 'personId' in subject ? subject.personId : null,
      expiresAt: new Date(clock.now().getTime() + config.sessionTtlMs),
      ipAddress: meta.ipAddress,
      userAgent: meta.userAgent?.slice(0, 300) ?? null,
    });
    return { token, session };
  }

  const linkJobs = createAuthLinkJobs({ db, clock, mailer, config });
  const issueLink = (
    subject: { userId: string } | { personId: string },
    purpose: 'sitter_invitation' | 'set_password',
    ttlMs: number,
  ) => issueLinkToken({ db, clock }, subject, purpose, ttlMs);

  async function explainDeadLink(token: string): Promise<never> {
    const link = await repo.findLinkToken(db, hashToken(token));
    if (!link) throw deadLink('unknown');
    if (link.usedAt) throw deadLink('used');
    throw deadLink('expired');
  }

  return {
    async signIn(input: SignInRequest, meta: RequestMeta): Promise<StartedSession> {
      const account = await repo.findStaffByEmail(db, input.email);
      const passwordMatches = await verifyPassword(account?.passwordHash ?? null, input.password);
      if (!account || !account.active || !passwordMatches) throw wrongCredentials();
      const { token, session } = await startSession({ userId: account.id }, meta);
      await repo.touchStaffSignIn(db, account.id, clock.now());
      // Sign-ins are rare enough to carry the sweep of expired sessions.
      await repo.deleteExpiredSessions(db, clock.now());
      return { token, viewer: staffViewer(account, session) };
    },

    /** The viewer behind a session cookie, or null when it is unknown, expired or disabled. */
    async resolveViewer(token: string): Promise<Viewer | null> {
      const found = await repo.findSessionAccount(db, hashToken(token), clock.now());
      if (found?.staff) return found.staff.active ? staffViewer(found.staff, found.session) : null;
      if (found?.sitter) {
        return found.sitter.active ? sitterViewer(found.sitter, found.session) : null;
      }
      return null;
    },

    async signOut(sessionId: string): Promise<void> {
      await repo.deleteSession(db, sessionId);
    },

    async describe(viewer: Viewer): Promise<SessionResponse> {
      let clientName: string | null = null;
      let officeName: string | null = null;
      if (viewer.kind === 'staff') {
        clientName = (await repo.findStaffById(db, viewer.id))?.clientName ?? null;
      } else {
        const sitter = await repo.findSitterById(db, viewer.id);
        clientName = sitter?.clientName ?? null;
        officeName = sitter?.officeName ?? null;
      }
      return {
        user: {
          kind: viewer.kind,
          id: viewer.id,
          role: viewer.role,
          displayName: viewer.displayName,
          email: viewer.email,
          clientId: viewer.clientId,
          clientName,
          officeName,
        },
        expiresAt: viewer.sessionExpiresAt.toISOString(),
      };
    },

    /** Always succeeds from the caller's view: the lookup and the mail happen in a job. */
    async requestSitterLink(email: string): Promise<void> {
      await linkJobs.queueSitterLink(email);
    },

    /** Used by invitations: a longer-lived personal link to the sitter's booking page. */
    async issueSitterInvitationLink(personId: string): Promise<string> {
      const token = await issueLink({ personId }, 'sitter_invitation', config.invitationLinkTtlMs);
      return `${config.publicUrl}/link/${token}`;
    },

    async redeemSitterLink(token: string, meta: RequestMeta): Promise<StartedSession> {
      const now = clock.now();
      const link = await repo.consumeLinkToken(
        db,
        hashToken(token),
        ['sitter_sign_in', 'sitter_invitation'],
        now,
      );
      if (!link?.personId) return explainDeadLink(token);
      const sitter = await repo.findSitterById(db, link.personId);
      if (!sitter?.active) throw deadLink('unknown');
      const started = await startSession({ personId: sitter.id }, meta);
      return { token: started.token, viewer: sitterViewer(sitter, started.session) };
    },

    async requestPasswordReset(email: string): Promise<void> {
      await linkJobs.queuePasswordReset(email);
    },

    /** The queued work behind requestSitterLink and requestPasswordReset. */
    handlers: () => linkJobs.handlers(),

    /** The viewer's own live sessions, newest first, this one marked. */
    async sessionsOf(viewer: Viewer): Promise<SessionList> {
      const sessions = await repo.listLiveSessions(db, subjectOf(viewer), clock.now());
      return {
        sessions: sessions.map((session) => ({
          id: session.id,
          createdAt: new Date(session.createdAt).toISOString(),
          expiresAt: new Date(session.expiresAt).toISOString(),
          ipAddress: session.ipAddress,
          userAgent: session.userAgent,
          current: session.id === viewer.sessionId,
        })),
      };
    },

    /** Ends every session of the viewer but the one asking (a lost tablet, a shared computer). */
    async signOutElsewhere(viewer: Viewer): Promise<{ ended: number }> {
      const ended = await repo.deleteOtherSessions(db, subjectOf(viewer), viewer.sessionId);
      return { ended };
    },

    /** Sends a staff member the link that lets them choose a password. */
    async sendSetPasswordLink(userId: string): Promise<void> {
      const account = await repo.findStaffById(db, userId);
      if (!account) throw new AppError('not_found', 404, 'That account was not found.');
      await repo.retireOpenLinks(db, { userId }, ['set_password'], clock.now());
      const token = await issueLink({ userId }, 'set_password', config.setPasswordLinkTtlMs);
      const invitedAs =
        account.role === 'coordinator' && account.clientName
          ? `coordinator for ${account.clientName}`
          : roleLabels[account.role].toLowerCase();
      const mail = staffSetPasswordMail({
        name: account.displayName,
        invitedAs,
        url: `${config.publicUrl}/password/${token}`,
        ttlMs: config.setPasswordLinkTtlMs,
      });
      await mailer.send({ to: account.email, ...mail });
    },

    async completePasswordLink(
      input: SetPasswordRequest,
      meta: RequestMeta,
    ): Promise<StartedSession> {
      const now = clock.now();
      const passwordHash = await hashPassword(input.password);
      const outcome = await db.transaction().execute(async (trx) => {
        const link = await repo.consumeLinkToken(
          trx,
          hashToken(input.token),
          ['set_password', 'reset_password'],
          now,
        );
        if (!link?.userId) return null;
        const account = await repo.findStaffById(trx, link.userId);
        if (!account?.active) return null;
        await repo.setPasswordHash(trx, account.id, passwordHash);
        // A new password ends every other session of the account.
        await repo.deleteSessionsOfUser(trx, account.id);
        return account;
      });
      if (!outcome) return explainDeadLink(input.token);
      const started = await startSession({ userId: outcome.id }, meta);
      await repo.touchStaffSignIn(db, outcome.id, now);
      return { token: started.token, viewer: staffViewer(outcome, started.session) };
    },
  };
}
