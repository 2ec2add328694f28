import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as daysRepo from '../../server/modules/days/days.repository';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { createTestDatabase, type TestDatabase } from '../setup/test-database';

// Who a day invites is one rule (days.repository's invites) read two ways: over the day's
// values, for the list of its invitees (invitations, progress, invoices, delivery), and over the
// day's own row, for one person's yes or no (a sitter's requests and claims). The two readings
// must agree, for every way of inviting and every kind of person.

let database: TestDatabase;

beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(() => database.drop());

describe('the invitation rule, listed and asked one by one', () => {
  it.each(['office', 'department', 'list'] as const)(
    'agrees when inviting by %s',
    async (inviteBy) => {
      const { db } = database;
      const client = await insertClient(db);
      const otherClient = await insertClient(db);
      const leeds = await insertOffice(db, client.id, 'Leeds', 'Europe/London');
      const porto = await insertOffice(db, client.id, 'Porto', 'Europe/Lisbon');
      const photographer = await insertStaff(db, { role: 'photographer' });
      const day = await insertDay(db, {
        clientId: client.id,
        officeId: leeds.id,
        photographerIds: [photographer.id],
        inviteBy,
        inviteDepartments: ['Structures', 'Civil'],
      });
      const person = async (
        clientId: string,
        options: {
          officeId?: string | null;
          active?: boolean;
          department?: string | null;
          listed?: boolean;
        },
      ) => {
        const row = await insertPerson(db, clientId, {
          officeId: options.officeId ?? null,
          active: options.active ?? true,
        });
        await db
          .updateTable('people')
          .set({ department: options.department ?? null })
          .where('id', '=', row.id)
          .execute();
        if (options.listed) {
          await db.insertInto('dayInvitees').values({ dayId: day.id, personId: row.id }).execute();
        }
        return row.id;
      };
      const people = [
        await person(client.id, { officeId: leeds.id, department: 'Structures', listed: true }),
        await person(client.id, { officeId: leeds.id, department: 'Finance' }),
        await person(client.id, { officeId: porto.id, department: 'Civil', listed: true }),
        await person(client.id, { officeId: null, department: null }),
        await person(client.id, {
          officeId: leeds.id,
          department: 'Civil',
          active: false,
          listed: true,
        }),
        await person(client.id, { officeId: porto.id, department: 'civil' }),
        await person(otherClient.id, { department: 'Structures' }),
      ];
      const record = (await daysRepo.findDay(db, day.id))!;
      const listed = new Set(
        (await daysRepo.invitedPeopleQuery(db, record).execute()).map((row) => row.id),
      );
      expect(listed.size).toBeGreaterThan(0);
      for (const id of people) {
        const asked = await daysRepo.findDayForPerson(db, day.id, id);
        expect({ id, invited: asked?.invited }).toEqual({ id, invited: listed.has(id) });
      }
    },
  );
});
