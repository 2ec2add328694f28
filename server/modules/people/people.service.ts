import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import {
  peopleQuerySchema,
  type PeopleFilter,
  type PeoplePage,
  type Person,
} from '../../schemas/people';
import type { savePersonRequestSchema } from '../../schemas/roster';
import type { z } from 'zod';
import { assertClientAccess } from '../roster/client-access';
import { toCsv } from '../../lib/csv';
import { rosterFieldLabels } from '../../schemas/roster';
import * as repo from './people.repository';

export type PeopleService = ReturnType<typeof createPeopleService>;
type SavePerson = z.output<typeof savePersonRequestSchema>;

const taken = (field: 'email' | 'employeeId') =>
  new AppError('person_exists', 409, 'Someone on the roster already has that.', {
    fieldErrors: {
      [field]: [
        field === 'email'
          ? 'Someone on the roster already has this e-mail.'
          : 'Someone on the roster already has this employee id.',
      ],
    },
  });

export function createPeopleService(deps: { db: Db }) {
  const { db } = deps;

  async function check(clientId: string, values: SavePerson, exceptId: string | null) {
    if (values.officeId && !(await repo.officeBelongsTo(db, clientId, values.officeId))) {
      throw new AppError('invalid_input', 400, 'Some fields need attention.', {
        fieldErrors: { officeId: ['Choose an office from the list.'] },
      });
    }
    const holder = await repo.findHolder(db, clientId, values, exceptId);
    if (holder) throw taken(holder.email.toLowerCase() === values.email ? 'email' : 'employeeId');
  }

  async function existing(clientId: string, personId: string): Promise<Person> {
    const person = await repo.findPerson(db, clientId, personId);
    if (!person) throw notFound('That person');
    return person;
  }

  return {
    async list(viewer: Viewer, clientId: string, query: unknown): Promise<PeoplePage> {
      await assertClientAccess(db, viewer, clientId);
      const filter: PeopleFilter = peopleQuerySchema.parse(query);
      const [page, departments] = await Promise.all([
        repo.listPeople(db, clientId, filter),
        repo.listDepartments(db, clientId),
      ]);
      return { ...page, page: filter.page, pageSize: filter.pageSize, departments };
    },

    async create(viewer: Viewer, clientId: string, values: SavePerson): Promise<Person> {
      await assertClientAccess(db, viewer, clientId);
      await check(clientId, values, null);
      const id = await repo.insertPerson(db, clientId, values);
      await recordAudit(db, {
        actorUserId: viewer.id,
        action: 'person.added',
        subjectType: 'person',
        subjectId: id,
      });
      return existing(clientId, id);
    },

    async update(
      viewer: Viewer,
      clientId: string,
      personId: string,
      change: SavePerson | { active: boolean },
    ) {
      await assertClientAccess(db, viewer, clientId);
      await existing(clientId, personId);
      if ('givenName' in change) await check(clientId, change, personId);
      await repo.updatePerson(db, clientId, personId, change);
      const action =
        'active' in change
          ? change.active
            ? 'person.reactivated'
            : 'person.deactivated'
          : 'person.edited';
      await recordAudit(db, {
        actorUserId: viewer.id,
        action,
        subjectType: 'person',
        subjectId: personId,
      });
      return existing(clientId, personId);
    },

    /** Data-protection erasure: the audit entry keeps only the fact and the record id. */
    async erase(viewer: Viewer, clientId: string, personId: string, confirmEmail: string) {
      await assertClientAccess(db, viewer, clientId);
      const person = await existing(clientId, personId);
      if (person.email.toLowerCase() !== confirmEmail) {
        throw new AppError('confirmation_mismatch', 400, 'Some fields need attention.', {
          fieldErrors: { confirmEmail: ["That is not this person's e-mail address."] },
        });
      }
      await db.transaction().execute(async (trx) => {
        await repo.deletePerson(trx, clientId, personId);
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'person.erased',
          subjectType: 'person',
          subjectId: personId,
          details: { clientId },
        });
      });
    },

    /** The directory as CSV: every matching person, extras as extra columns. */
    async exportCsv(viewer: Viewer, clientId: string, query: unknown): Promise<string> {
      await assertClientAccess(db, viewer, clientId);
      const filter = peopleQuerySchema.parse(query);
      const people = await repo.allPeople(db, clientId, filter);
      const extraKeys = [...new Set(people.flatMap((person) => Object.keys(person.extras)))].sort();
      const header = [
        rosterFieldLabels.givenName,
        rosterFieldLabels.familyName,
        rosterFieldLabels.preferredName,
        rosterFieldLabels.email,
        rosterFieldLabels.employeeId,
        rosterFieldLabels.department,
        rosterFieldLabels.jobTitle,
        rosterFieldLabels.office,
        'Status',
        ...extraKeys,
      ];
      const records = people.map((person) => [
        person.givenName,
        person.familyName,
        person.preferredName ?? '',
        person.email,
        person.employeeId ?? '',
        person.department ?? '',
        person.jobTitle ?? '',
        person.officeName ?? '',
        person.active ? 'Active' : 'Inactive',
        ...extraKeys.map((key) => person.extras[key] ?? ''),
      ]);
      return toCsv([header, ...records]);
    },
  };
}
