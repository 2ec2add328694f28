import { describe, expect, it } from 'vitest';
import { matchFinals } from '../../src/features/retouch/model/match-finals';

// Editors' export names keep the original's name or its DCF number (common practice; DCF
// numbers are four digits, JEITA CP-3461).
const picks = [
  { pickId: 'a', fileName: 'HPE_0452.JPG' },
  { pickId: 'b', fileName: 'HPE_0453.JPG' },
  { pickId: 'c', fileName: 'HPE_1045.JPG' },
];

describe('matching retouched finals to picks', () => {
  it('matches by the original name, whatever the extension or an added suffix', () => {
    expect(
      matchFinals(['HPE_0452.jpg', 'hpe_0453-Edit.tif', 'HPE_1045 copy.jpeg'], picks).map(
        (match) => [match.pickId, match.by],
      ),
    ).toEqual([
      ['a', 'name'],
      ['b', 'name'],
      ['c', 'name'],
    ]);
  });

  it('falls back to the frame number when the name was changed', () => {
    expect(matchFinals(['Robin Sample 0453 final.jpg'], picks)[0]).toMatchObject({
      pickId: 'b',
      by: 'number',
    });
  });

  it('does not take HPE_04521 for HPE_0452, and leaves unknown or ambiguous files for a person', () => {
    const [longer, unknown, twice] = matchFinals(
      ['HPE_04521.jpg', 'portrait.jpg', '0452.jpg'],
      [...picks, { pickId: 'd', fileName: 'XYZ_0452.JPG' }],
    );
    expect(longer).toMatchObject({ pickId: null });
    expect(unknown).toMatchObject({ pickId: null, ambiguous: false });
    expect(twice).toMatchObject({ pickId: null, ambiguous: true });
  });
});
