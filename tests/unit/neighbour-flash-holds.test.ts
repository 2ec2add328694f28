import { describe, expect, it } from 'vitest';
import { neighbourFlashHolds } from '../../src/features/station-console/model/neighbour-flash-holds';

const stations = [
  { id: 's1', name: 'Station 1', position: 1, photographerName: null },
  { id: 's2', name: 'Station 2', position: 2, photographerName: null },
  { id: 's3', name: 'Station 3', position: 3, photographerName: null },
];
const entries = [
  { personId: 'ada', flashSensitive: true },
  { personId: 'bo', flashSensitive: false },
];

// Caution (safety notes, common practice): a flash-sensitive sitter must not see any flash in
// the room, so the other stations hold theirs while that sitter is in a chair.
describe('neighbouring stations hold their flashes', () => {
  it('tells the other stations while a flash-sensitive sitter is in a chair', () => {
    const sittings = [{ personId: 'ada', stationId: 's2', finishedAt: null }];
    expect(neighbourFlashHolds({ stations, entries, sittings }, 's1')).toEqual(['Station 2']);
    expect(neighbourFlashHolds({ stations, entries, sittings }, 's3')).toEqual(['Station 2']);
    // The sitter's own station already shows the no-flash notice on the slate and queue.
    expect(neighbourFlashHolds({ stations, entries, sittings }, 's2')).toEqual([]);
  });

  it('says nothing once that sitting is finished, or for other sitters', () => {
    expect(
      neighbourFlashHolds(
        {
          stations,
          entries,
          sittings: [
            { personId: 'ada', stationId: 's2', finishedAt: '2027-03-04T09:10:00Z' },
            { personId: 'bo', stationId: 's3', finishedAt: null },
          ],
        },
        's1',
      ),
    ).toEqual([]);
  });
});
