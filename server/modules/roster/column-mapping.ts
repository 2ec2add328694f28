import type { ColumnMapping, ColumnTarget, RosterField } from '../../schemas/roster';

/** "E-mail address", "e_mail", "Émail " all become "e mail address" / "email". */
export function normaliseHeader(header: string): string {
  return header
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/#/g, ' number ')
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();
}

/** Header words HR exports use for each field (common practice), already normalised. */
const synonyms: Record<RosterField, string[]> = {
  givenName: [
    'first name',
    'firstname',
    'given name',
    'givenname',
    'forename',
    'first',
    'name first',
    'legal first name',
  ],
  familyName: [
    'last name',
    'lastname',
    'family name',
    'familyname',
    'surname',
    'last',
    'name last',
    'legal last name',
  ],
  preferredName: [
    'preferred name',
    'preferredname',
    'known as',
    'nickname',
    'preferred first name',
    'display first name',
  ],
  email: [
    'email',
    'e mail',
    'email address',
    'e mail address',
    'work email',
    'work e mail',
    'business email',
    'work email address',
    'mail',
    'company email',
  ],
  employeeId: [
    'employee id',
    'employeeid',
    'emp id',
    'emp number',
    'employee number',
    'staff id',
    'staff number',
    'personnel number',
    'payroll number',
    'id',
    'employee no',
    'emp no',
    'badge number',
  ],
  department: [
    'department',
    'dept',
    'team',
    'division',
    'business unit',
    'cost centre',
    'cost center',
  ],
  jobTitle: ['job title', 'title', 'position', 'role', 'job', 'function', 'jobtitle'],
  office: ['office', 'location', 'site', 'work location', 'office location', 'city', 'branch'],
};

/** Columns our own export writes that are not data to keep. */
const ignored = ['status', 'active'];

const lookup = new Map<string, RosterField>();
for (const [field, words] of Object.entries(synonyms) as [RosterField, string[]][]) {
  for (const word of words) lookup.set(word, field);
}

/**
 * A target for every column: a saved choice for the same header wins (the client's last
 * import), then the synonym list; unknown columns are kept as extras. A field is given to the
 * first column that claims it only.
 */
export function suggestMapping(
  headers: readonly string[],
  saved: Readonly<Record<string, ColumnTarget>> = {},
): ColumnMapping {
  const taken = new Set<ColumnTarget>();
  const mapping: ColumnTarget[] = [];
  for (const header of headers) {
    const key = normaliseHeader(header);
    let target: ColumnTarget;
    if (key === '') target = 'ignore';
    else if (saved[key]) target = saved[key];
    else if (ignored.includes(key)) target = 'ignore';
    else target = lookup.get(key) ?? lookup.get(key.replace(/ (number|no|nr)$/, ' id')) ?? 'extra';
    if (target !== 'extra' && target !== 'ignore' && taken.has(target)) target = 'extra';
    taken.add(target);
    mapping.push(target);
  }
  return mapping;
}

/** What to remember for next time: the chosen target per normalised header. */
export function mappingToRemember(
  headers: readonly string[],
  mapping: ColumnMapping,
): Record<string, ColumnTarget> {
  const remembered: Record<string, ColumnTarget> = {};
  headers.forEach((header, index) => {
    const key = normaliseHeader(header);
    const target = mapping[index];
    if (key && target) remembered[key] = target;
  });
  return remembered;
}
