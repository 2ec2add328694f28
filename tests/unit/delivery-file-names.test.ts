import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  fileStem,
  uniqueFileNames,
  unknownTokens,
  type NameParts,
} from '../../server/modules/delivery/file-names';

const parts = (overrides: Partial<NameParts> = {}): NameParts => ({
  employee_id: 'E-1042',
  given: 'Zoë',
  family: 'Þórsdóttir',
  preferred: null,
  office: 'Leeds',
  department: 'Finance & Risk',
  rendition: 'portrait',
  day: '2027-03-04',
  ...overrides,
});

// Windows file names: no < > : " / \ | ? * or control characters, no trailing dot or space,
// and not CON, PRN, AUX, NUL, COM1-9 or LPT1-9 (Microsoft, "Naming Files, Paths, and Namespaces").
const windowsSafe = (name: string) =>
  ![...name].some((char) => char.charCodeAt(0) < 32 || '<>:"/\\|?*'.includes(char)) &&
  !/[. ]$/.test(name) &&
  !/^(con|prn|aux|nul|com[1-9]|lpt[1-9])(\..*)?$/i.test(name);

describe('delivery file names', () => {
  it('fills the template and transliterates to ASCII', () => {
    expect(fileStem('{employee_id}_{family}_{given}_{rendition}', parts())).toBe(
      'E-1042_Thorsdottir_Zoe_portrait',
    );
    expect(fileStem('{department}/{family}', parts())).toBe('Finance-RiskThorsdottir');
  });

  it('never gives an empty or reserved name', () => {
    expect(fileStem('{preferred}', parts())).toBe('portrait');
    expect(fileStem('{given}', parts({ given: 'CON' }))).toBe('portrait-CON');
  });

  it('reports unknown tokens', () => {
    expect(unknownTokens('{employee_id}_{surname}_{rendition}')).toEqual(['surname']);
  });

  it('keeps every name unique (regardless of case) and Windows-safe, whatever the names', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ given: fc.string(), family: fc.string(), id: fc.string() }), {
          maxLength: 40,
        }),
        (people) => {
          const names = uniqueFileNames(
            '{family}_{given}_{employee_id}',
            people.map((person) => ({
              parts: parts({ given: person.given, family: person.family, employee_id: person.id }),
              extension: 'jpg',
            })),
          );
          expect(new Set(names.map((name) => name.toLowerCase())).size).toBe(names.length);
          for (const name of names) {
            expect(windowsSafe(name)).toBe(true);
            expect(name).toMatch(/^[\x20-\x7e]+$/);
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});
