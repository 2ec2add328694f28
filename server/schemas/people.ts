import { z } from 'zod';

export const peopleSortColumns = [
  'name',
  'email',
  'employeeId',
  'department',
  'jobTitle',
  'office',
  'active',
  'updatedAt',
] as const;
export type PeopleSortColumn = (typeof peopleSortColumns)[number];

export const peopleQuerySchema = z.object({
  q: z.string().trim().max(200).default(''),
  officeId: z.union([z.uuid(), z.literal('')]).default(''),
  department: z.string().trim().max(200).default(''),
  status: z.enum(['active', 'inactive', 'all']).default('active'),
  /** Whether the person holds an active booking on any shoot day. */
  booking: z.enum(['any', 'booked', 'not_booked']).default('any'),
  sort: z.enum(peopleSortColumns).default('name'),
  direction: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(5).max(200).default(25),
});
export type PeopleQuery = z.input<typeof peopleQuerySchema>;
export type PeopleFilter = z.output<typeof peopleQuerySchema>;

export interface Person {
  id: string;
  givenName: string;
  familyName: string;
  preferredName: string | null;
  email: string;
  employeeId: string | null;
  department: string | null;
  jobTitle: string | null;
  officeId: string | null;
  officeName: string | null;
  extras: Record<string, string>;
  active: boolean;
  booked: boolean;
  updatedAt: string;
}

export interface PeoplePage {
  people: Person[];
  total: number;
  page: number;
  pageSize: number;
  departments: string[];
}
