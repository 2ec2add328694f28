import type { Db } from '../../db/database';
import type { SitterProfile } from '../../schemas/sitter';

export async function findProfile(db: Db, personId: string): Promise<SitterProfile | undefined> {
  const row = await db
    .selectFrom('people')
    .innerJoin('clients', 'clients.id', 'people.clientId')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .select([
      'people.id',
      'people.givenName',
      'people.familyName',
      'people.preferredName',
      'people.email',
      'people.department',
      'people.jobTitle',
      'clients.name as clientName',
      'offices.name as officeName',
      'offices.timeZone as officeTimeZone',
    ])
    .where('people.id', '=', personId)
    .executeTakeFirst();
  if (!row) return undefined;
  const { officeName, officeTimeZone, ...rest } = row;
  return {
    ...rest,
    office: officeName && officeTimeZone ? { name: officeName, timeZone: officeTimeZone } : null,
  };
}
