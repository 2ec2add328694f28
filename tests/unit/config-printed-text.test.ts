import { describe, expect, it } from 'vitest';
import { parseEnvironment } from '../../server/config';

describe("the studio's printed details in the environment", () => {
  it('take one line of text and refuse a tab, a line break or another control character', () => {
    const ok = parseEnvironment({
      STUDIO_ADDRESS: '12 Lantern Yard, Leeds',
      STUDIO_TAX_ID: 'GB 123',
    });
    expect([ok.STUDIO_ADDRESS, ok.STUDIO_TAX_ID]).toEqual(['12 Lantern Yard, Leeds', 'GB 123']);
    for (const bad of ['12 Lantern Yard\nLeeds', 'GB\t123', 'Northlight\u001b[31m', 'A\u0085B']) {
      expect(() => parseEnvironment({ STUDIO_ADDRESS: bad })).toThrow(
        /STUDIO_ADDRESS: Write it on one line/,
      );
      expect(() => parseEnvironment({ STUDIO_TAX_ID: bad })).toThrow(/STUDIO_TAX_ID/);
      expect(() => parseEnvironment({ STUDIO_NAME: bad })).toThrow(/STUDIO_NAME/);
    }
  });
});
