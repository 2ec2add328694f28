import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import type { Db } from '../../db/database';
import type { AuthService } from '../auth/auth.service';
import { createProofsService } from './proofs.service';

/** The proofs service as the app and the job worker both build it. */
export function proofsServiceFor(deps: {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  auth: AuthService;
  reminderCooldownMs?: number;
}) {
  return createProofsService({
    db: deps.db,
    clock: deps.clock,
    mailer: deps.mailer,
    reminderCooldownMs: deps.reminderCooldownMs,
    // The sign-in link lands the sitter straight on their proofs.
    issueSitterLink: async (personId, next) =>
      `${await deps.auth.issueSitterInvitationLink(personId)}?next=${encodeURIComponent(next)}`,
  });
}
