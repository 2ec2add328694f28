import { describe, expect, it } from 'vitest';
import { hasKeys } from '../../server/lib/has-keys';

// Object.keys (ECMAScript's own enumerable string keys) is the reference for each record.
describe('hasKeys', () => {
  const inherited = Object.create({ inheritedKey: 1 }) as object;
  const hidden = Object.defineProperty({}, 'hidden', { value: 1, enumerable: false });
  const records: object[] = [{}, { a: 1 }, Object.freeze({}), inherited, hidden, { a: undefined }];

  it('says what Object.keys(record).length > 0 says, inherited and hidden keys included', () => {
    for (const record of records) {
      expect(hasKeys(record)).toBe(Object.keys(record).length > 0);
    }
    expect(records.map(hasKeys)).toEqual([false, true, false, false, false, true]);
  });
});
