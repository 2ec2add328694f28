import type { Db } from '../../server/db/database';
import { hashPassword } from '../../server/lib/secrets';
import { demoDepartments as departments, demoOffices as offices } from './demo-names';
import { insertDemoDays } from './demo-days';

/**
 * The invented demo scenario: Northlight Portrait Co. photographs the staff of
 * Halvorsen & Pike Engineering in Leeds, Rotterdam and Porto. Every name is generated
 * from common given and family names; none belongs to a real person.
 */

export const DEMO_PASSWORD = 'northlight-demo';

export const demoStaff = [
  {
    email: 'admin@northlight.example',
    displayName: 'Ines Calloway',
    role: 'studio_admin' as const,
  },
  { email: 'tomas@northlight.example', displayName: 'Tomas Reyne', role: 'photographer' as const },
  {
    email: 'lotte@northlight.example',
    displayName: 'Lotte Brandvik',
    role: 'photographer' as const,
  },
];

export const demoCoordinators = [
  {
    email: 'people@halvorsen-pike.example',
    displayName: 'Priya Holmwood',
    client: 'Halvorsen & Pike Engineering',
  },
  {
    email: 'hr@aldermoor.example',
    displayName: 'Gareth Pennock',
    client: 'Aldermoor Housing Trust',
  },
];

/** A small deterministic generator (mulberry32) so every install gets the same demo. */
function repeatableRandom(start: number) {
  let state = start >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function emailLocalPart(given: string, family: string): string {
  return `${given}.${family}`
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z.]+/g, '');
}

export interface DemoPerson {
  givenName: string;
  familyName: string;
  email: string;
  employeeId: string;
  department: string;
  jobTitle: string;
  office: string;
}

export function generateDemoPeople(): DemoPerson[] {
  const random = repeatableRandom(20270304);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)] as T;
  const used = new Set<string>();
  const people: DemoPerson[] = [];
  let serial = 1;
  for (const office of offices) {
    for (let i = 0; i < office.share; i += 1) {
      const given = pick(office.given);
      const family = pick(office.family);
      const plain = emailLocalPart(given, family);
      // Two people may share a name; their addresses may not.
      const local = used.has(plain) ? `${plain}${serial}` : plain;
      used.add(local);
      const [department, jobTitle] = pick(departments);
      people.push({
        givenName: given,
        familyName: family,
        email: `${local}@halvorsen-pike.example`,
        employeeId: `HP-${String(serial).padStart(4, '0')}`,
        department,
        jobTitle,
        office: office.name,
      });
      serial += 1;
    }
  }
  return people;
}

/** Loads the scenario once; returns false when it was already there. */
export async function loadDemoScenario(db: Db): Promise<boolean> {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  return db.transaction().execute(async (trx) => {
    const marker = await trx
      .insertInto('installationFacts')
      .values({ name: 'demo_scenario', value: 'halvorsen-pike-v1' })
      .onConflict((conflict) => conflict.column('name').doNothing())
      .returning('name')
      .executeTakeFirst();
    if (!marker) return false;

    const clientIds = new Map<string, string>();
    for (const [name, slug] of [
      ['Halvorsen & Pike Engineering', 'halvorsen-and-pike-engineering'],
      ['Aldermoor Housing Trust', 'aldermoor-housing-trust'],
    ] as const) {
      const row = await trx
        .insertInto('clients')
        .values({ name, slug })
        .returning('id')
        .executeTakeFirstOrThrow();
      clientIds.set(name, row.id);
    }
    const mainClient = clientIds.get('Halvorsen & Pike Engineering') as string;

    for (const member of demoStaff) {
      await trx
        .insertInto('users')
        .values({ ...member, clientId: null, passwordHash })
        .execute();
    }
    for (const coordinator of demoCoordinators) {
      await trx
        .insertInto('users')
        .values({
          email: coordinator.email,
          displayName: coordinator.displayName,
          role: 'coordinator',
          clientId: clientIds.get(coordinator.client) as string,
          passwordHash,
        })
        .execute();
    }

    const officeIds = new Map<string, string>();
    for (const office of offices) {
      const row = await trx
        .insertInto('offices')
        .values({ clientId: mainClient, name: office.name, timeZone: office.timeZone })
        .returning('id')
        .executeTakeFirstOrThrow();
      officeIds.set(office.name, row.id);
    }
    const people = generateDemoPeople();
    await trx
      .insertInto('people')
      .values(
        people.map(({ office, ...person }) => ({
          ...person,
          clientId: mainClient,
          officeId: officeIds.get(office) ?? null,
        })),
      )
      .execute();
    await insertDemoDays(trx, mainClient, officeIds);

    const aldermoor = clientIds.get('Aldermoor Housing Trust') as string;
    const york = await trx
      .insertInto('offices')
      .values({ clientId: aldermoor, name: 'York', timeZone: 'Europe/London' })
      .returning('id')
      .executeTakeFirstOrThrow();
    await trx
      .insertInto('people')
      .values(
        ['Hollis', 'Brennan', 'Oduya', 'Lindqvist', 'Farrant', 'Moss'].map((family, index) => ({
          clientId: aldermoor,
          officeId: york.id,
          givenName: ['Beth', 'Callum', 'Dami', 'Elin', 'Fergus', 'Hana'][index] as string,
          familyName: family,
          email: `${['beth', 'callum', 'dami', 'elin', 'fergus', 'hana'][index]}.${family.toLowerCase()}@aldermoor.example`,
          employeeId: `AH-${100 + index}`,
          department: 'Housing Services',
          jobTitle: 'Housing Officer',
        })),
      )
      .execute();
    return true;
  });
}

export function firstDemoSitterEmail(): string {
  return generateDemoPeople()[0]?.email ?? '';
}
