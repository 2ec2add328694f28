import { describe, expect, it } from 'vitest';
import { currentTimeZones, currentZoneName, renamedZones } from '../../src/lib/time-zones';

// The IANA time zone database renamed these zones (its "backward" file keeps the old names as
// links); ICU, which Node and Chromium use, still lists several by the old name. Checked with
// Intl itself (ICU, an independent implementation): the new name is known and is the same zone.
describe('time-zone names', () => {
  it('lists current IANA names, not retired ones', () => {
    const zones = currentTimeZones();
    expect(zones).toContain('Asia/Kolkata');
    expect(zones).toContain('Europe/Kyiv');
    expect(zones).not.toContain('Asia/Calcutta');
    expect(zones).not.toContain('Europe/Kiev');
    expect(zones.filter((zone) => zone in renamedZones)).toEqual([]);
    expect(new Set(zones).size).toBe(zones.length);
  });

  it('maps each retired name to a current one that is the same zone', () => {
    for (const [old, current] of Object.entries(renamedZones)) {
      expect(currentZoneName(old)).toBe(current);
      const resolve = (zone: string) =>
        new Intl.DateTimeFormat('en', { timeZone: zone }).resolvedOptions().timeZone;
      expect(resolve(current), `${old} -> ${current}`).toBe(resolve(old));
    }
    expect(currentZoneName('Europe/London')).toBe('Europe/London');
  });

  it('works from any list the runtime gives, keeping each zone once', () => {
    expect(currentTimeZones(['Europe/Kiev', 'Europe/Kyiv', 'Asia/Calcutta'])).toEqual([
      'Asia/Kolkata',
      'Europe/Kyiv',
    ]);
  });
});
