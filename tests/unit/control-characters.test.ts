import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import {
  controlCharacterMessage,
  findControlCharacters,
  lineBreakMessage,
} from '../../server/lib/control-characters';
import { parseInput } from '../../server/lib/validate';
import { allowLineBreaks } from '../../server/schemas/common';
import { savePicksRequestSchema } from '../../server/schemas/proofs';

// Code points from Unicode's C0 and C1 control sets (Unicode 15, chapter 23.1, "Control Codes").
const frameId = '5b1f7c1e-0a9e-4d2c-9b8e-0f3c2d1a4b5c';

describe('control characters at the edge', () => {
  it('refuses NUL, other C0 controls, DEL and C1 controls in any field, naming the field', () => {
    const schema = z.object({ name: z.string(), rows: z.array(z.object({ email: z.string() })) });
    for (const bad of ['\u0000', '\u0001', '\u001b', '\u007f', '\u0085', '\u009f']) {
      expect(findControlCharacters({ name: `a${bad}`, rows: [] }, schema), bad).toEqual([
        { field: 'name', message: controlCharacterMessage },
      ]);
      expect(findControlCharacters({ name: 'a', rows: [{ email: bad }] }, schema)).toEqual([
        { field: 'rows.0.email', message: controlCharacterMessage },
      ]);
    }
  });

  it('refuses tab and line breaks unless the field allows them', () => {
    const schema = z.object({ name: z.string(), note: allowLineBreaks(z.string()).optional() });
    expect(findControlCharacters({ name: 'a\tb', note: 'x' }, schema)).toEqual([
      { field: 'name', message: lineBreakMessage },
    ]);
    expect(findControlCharacters({ name: 'a', note: 'line one\r\nline two\tend' }, schema)).toEqual(
      [],
    );
    // A NUL is refused even where line breaks are fine.
    expect(findControlCharacters({ name: 'a', note: 'x\u0000' }, schema)).toHaveLength(1);
  });

  it('lets a sitter’s note keep its line breaks through the real picks schema', () => {
    const picks = { picks: [{ frameId, note: 'Crop tighter,\nplease' }] };
    expect(parseInput(savePicksRequestSchema, picks).picks[0]?.note).toBe('Crop tighter,\nplease');
    expect(() =>
      parseInput(savePicksRequestSchema, { picks: [{ frameId, note: 'a\u0000' }] }),
    ).toThrow(expect.objectContaining({ status: 400 }));
  });

  it('answers 400 with the field named, before the schema’s own checks', () => {
    const schema = z.object({ token: z.string().min(20) });
    try {
      parseInput(schema, { token: 'short\u0000' });
      expect.unreachable();
    } catch (error) {
      expect(error).toMatchObject({
        status: 400,
        details: { fieldErrors: { token: [controlCharacterMessage] } },
      });
    }
  });
});
