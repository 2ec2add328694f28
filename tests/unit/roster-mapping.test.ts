import { describe, expect, it } from 'vitest';
import {
  mappingToRemember,
  normaliseHeader,
  suggestMapping,
} from '../../server/modules/roster/column-mapping';

describe('suggesting a column mapping', () => {
  it('reads the header spellings HR exports use (common practice)', () => {
    const headers = [
      'First name',
      'Surname',
      'E-mail address',
      'Emp #',
      'Dept.',
      'Job Title',
      'Office',
      'Known as',
    ];
    expect(suggestMapping(headers)).toEqual([
      'givenName',
      'familyName',
      'email',
      'employeeId',
      'department',
      'jobTitle',
      'office',
      'preferredName',
    ]);
    expect(suggestMapping(['Given Name', 'Family Name', 'Work Email', 'Staff ID'])).toEqual([
      'givenName',
      'familyName',
      'email',
      'employeeId',
    ]);
  });

  it('keeps unknown columns as extras, ignores blanks and our own Status column', () => {
    expect(suggestMapping(['T-shirt size', '', 'Status'])).toEqual(['extra', 'ignore', 'ignore']);
  });

  it('gives a field to the first column that claims it only', () => {
    expect(suggestMapping(['Email', 'Work email'])).toEqual(['email', 'extra']);
  });

  it('prefers the mapping remembered from the last import', () => {
    const headers = ['Name 1', 'Name 2', 'Mail'];
    const remembered = mappingToRemember(headers, ['givenName', 'familyName', 'email']);
    expect(remembered).toEqual({ 'name 1': 'givenName', 'name 2': 'familyName', mail: 'email' });
    expect(suggestMapping(headers, remembered)).toEqual(['givenName', 'familyName', 'email']);
  });

  it('normalises accents, punctuation and case', () => {
    expect(normaliseHeader('  Émail-Adresse ')).toBe('email adresse');
    expect(normaliseHeader('Emp #')).toBe('emp number');
  });
});
