import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { StaffUser } from '../../schemas/users';
import type { AuthService } from '../auth/auth.service';
import { findClientName } from '../clients/clients.repository';
import * as repo from './users.repository';

export type UsersService = ReturnType<typeof createUsersService>;

export function createUsersService(deps: { db: Db; auth: AuthService }) {
  const { db, auth } = deps;
  return {
    list: () => repo.listStaff(db),

    async invite(
      actor: Viewer,
      input: {
        email: string;
        displayName: string;
        role: StaffUser['role'];
        clientId: string | null;
      },
    ): Promise<StaffUser> {
      if (input.clientId && !(await findClientName(db, input.clientId)))
        throw notFound('That client');
      if (await repo.emailTaken(db, input.email)) {
        throw new AppError('email_taken', 409, 'Someone on the team already uses that e-mail.', {
          fieldErrors: { email: ['Someone on the team already uses that e-mail.'] },
        });
      }
      const id = await repo.insertStaff(db, input);
      await recordAudit(db, {
        actorUserId: actor.id,
        action: 'staff.invited',
        subjectType: 'user',
        subjectId: id,
        details: { role: input.role },
      });
      await auth.sendSetPasswordLink(id);
      const created = await repo.findStaff(db, id);
      if (!created) throw notFound('That account');
      return created;
    },

    async resendInvitation(actor: Viewer, id: string): Promise<void> {
      const user = await repo.findStaff(db, id);
      if (!user) throw notFound('That account');
      if (!user.active) throw new AppError('inactive', 409, 'Reactivate the account first.');
      await auth.sendSetPasswordLink(id);
      await recordAudit(db, {
        actorUserId: actor.id,
        action: 'staff.link_sent',
        subjectType: 'user',
        subjectId: id,
      });
    },

    async setActive(actor: Viewer, id: string, active: boolean): Promise<StaffUser> {
      const user = await repo.findStaff(db, id);
      if (!user) throw notFound('That account');
      if (!active && user.id === actor.id) {
        throw new AppError('self_deactivation', 409, 'You cannot deactivate your own account.');
      }
      await db.transaction().execute(async (trx) => {
        await repo.setActive(trx, id, active);
        if (!active) {
          await trx.deleteFrom('sessions').where('userId', '=', id).execute();
          // The studio must always keep someone who can manage it.
          if (user.role === 'studio_admin' && (await repo.countActiveAdmins(trx)) === 0) {
            throw new AppError('last_admin', 409, 'The studio needs at least one active admin.');
          }
        }
      });
      await recordAudit(db, {
        actorUserId: actor.id,
        action: active ? 'staff.reactivated' : 'staff.deactivated',
        subjectType: 'user',
        subjectId: id,
      });
      const updated = await repo.findStaff(db, id);
      if (!updated) throw notFound('That account');
      return updated;
    },
  };
}
