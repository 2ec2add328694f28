import { describe, expect, it } from 'vitest';
import {
  headerSynonyms,
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

  it('reads "Given" and "Family" alone, as exports of contact cards name them (common practice)', () => {
    expect(suggestMapping(['Given', 'Family', 'E-mail'])).toEqual([
      'givenName',
      'familyName',
      'email',
    ]);
    expect(suggestMapping(['Forenames', 'Surname', 'Email'])).toEqual([
      'givenName',
      'familyName',
      'email',
    ]);
  });

  it('keeps unknown columns as extras, ignores blanks and reads our own Status column as the status', () => {
    expect(suggestMapping(['T-shirt size', '', 'Status'])).toEqual(['extra', 'ignore', 'status']);
  });

  it('takes a Status column remembered as left out (the old default) for the status, but not another choice', () => {
    expect(suggestMapping(['Status'], { status: 'ignore' })).toEqual(['status']);
    expect(suggestMapping(['Status'], { status: 'extra' })).toEqual(['extra']);
  });

  it('ignores the "What to fix" column of its own rows-to-fix file, uploaded again', () => {
    expect(suggestMapping(['First name', 'Last name', 'E-mail', 'What to fix'])).toEqual([
      'givenName',
      'familyName',
      'email',
      'ignore',
    ]);
    // Even where an earlier import kept it as an extra column.
    expect(suggestMapping(['E-mail', 'What to fix'], { 'what to fix': 'extra' })).toEqual([
      'email',
      'ignore',
    ]);
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

  it('reads "Personnel No", "Preferred" and other number spellings (common practice)', () => {
    expect(suggestMapping(['Personnel No', 'Preferred', 'Forename', 'Surname', 'E-mail'])).toEqual([
      'employeeId',
      'preferredName',
      'givenName',
      'familyName',
      'email',
    ]);
    expect(suggestMapping(['Staff Nr.'])).toEqual(['employeeId']);
    expect(suggestMapping(['Payroll #'])).toEqual(['employeeId']);
  });

  // The words below are from memory of everyday HR usage in each language, not a published list.
  it.each([
    [
      'Dutch',
      [
        'Voornaam',
        'Achternaam',
        'Roepnaam',
        'E-mailadres',
        'Personeelsnummer',
        'Afdeling',
        'Functie',
        'Vestiging',
      ],
    ],
    [
      'German',
      [
        'Vorname',
        'Nachname',
        'Rufname',
        'E-Mail-Adresse',
        'Personalnummer',
        'Abteilung',
        'Stellenbezeichnung',
        'Standort',
      ],
    ],
    [
      'French',
      ['Prénom', 'Nom', 'Prénom usuel', 'Courriel', 'Matricule', 'Service', 'Poste', 'Site'],
    ],
    [
      'Spanish',
      [
        'Nombre',
        'Apellidos',
        'Nombre preferido',
        'Correo electrónico',
        'Número de empleado',
        'Departamento',
        'Puesto',
        'Oficina',
      ],
    ],
    [
      'Portuguese',
      [
        'Primeiro nome',
        'Sobrenome',
        'Nome social',
        'Correio eletrónico',
        'Matrícula',
        'Setor',
        'Cargo',
        'Escritório',
      ],
    ],
  ])('recognises %s headers', (_language, headers) => {
    const expected = [
      'givenName',
      'familyName',
      'preferredName',
      'email',
      'employeeId',
      'department',
      'jobTitle',
      'office',
    ];
    expect(suggestMapping(headers)).toEqual(expected);
  });

  it('no header word names two fields', () => {
    const words = Object.values(headerSynonyms).flat();
    expect(words.filter((word, index) => words.indexOf(word) !== index)).toEqual([]);
  });

  it('guesses the e-mail from a column of addresses when no header names it', () => {
    const rows = [
      ['Ada', 'Pike', 'ada@hp.example', 'L'],
      ['Bo', 'Lund', 'bo@hp.example', 'M'],
      ['Cy', 'Moss', 'cy(at)hp.example', 'S'],
      ['Di', 'Ng', 'di@hp.example', 'S'],
      ['Ed', 'Oak', 'ed@hp.example', 'M'],
    ];
    expect(suggestMapping(['First name', 'Last name', 'Contact', 'Size'], {}, rows)).toEqual([
      'givenName',
      'familyName',
      'email',
      'extra',
    ]);
    // A named e-mail column wins; a remembered "extra" choice is respected.
    expect(suggestMapping(['Contact', 'Email'], {}, [['a@x.example', 'b@x.example']])).toEqual([
      'extra',
      'email',
    ]);
    expect(suggestMapping(['Contact'], { contact: 'extra' }, [['a@x.example']])).toEqual(['extra']);
    // Mostly not addresses: no guess.
    expect(suggestMapping(['Notes'], {}, [['a@x.example'], ['call back'], ['n/a']])).toEqual([
      'extra',
    ]);
  });
});
