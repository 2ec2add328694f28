import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  circleOfConfusionMm,
  depthOfField,
} from '../../src/features/setup-card/model/depth-of-field';
import {
  apertureForGuideNumber,
  exposureValue,
  lightingRatio,
  stopsBetweenPowers,
  stopsForDistance,
} from '../../src/features/setup-card/model/exposure';
import { powerSettings } from '../../src/features/setup-card/model/power-scale';

const FOOT_MM = 304.8;
const INCH_MM = 25.4;

describe('depth of field against published worked examples', () => {
  // Worked example of a depth-of-field article (insyncpubs.com): 50 mm, f/4, focus 10 ft, c = 0.03 mm
  // -> near 8 ft 9 in, far 11 ft 8 in (8.742 ft / 11.681 ft computed). Tolerance: one inch.
  it('50 mm f/4 at 10 ft, c = 0.030 mm: 8.742 ft to 11.681 ft', () => {
    const dof = depthOfField({
      focalLengthMm: 50,
      aperture: 4,
      focusDistanceMm: 10 * FOOT_MM,
      circleOfConfusionMm: 0.03,
    });
    expect(Math.abs(dof.nearMm - 8.742 * FOOT_MM)).toBeLessThan(INCH_MM);
    expect(Math.abs(dof.farMm - 11.681 * FOOT_MM)).toBeLessThan(INCH_MM);
  });

  // Same article, c = 0.019 mm (APS-C): 9 ft 2 in to 11 ft (9.165 / 11.003 ft computed).
  it('50 mm f/4 at 10 ft, c = 0.019 mm: 9.165 ft to 11.003 ft', () => {
    const dof = depthOfField({
      focalLengthMm: 50,
      aperture: 4,
      focusDistanceMm: 10 * FOOT_MM,
      circleOfConfusionMm: 0.019,
    });
    expect(Math.abs(dof.nearMm - 9.165 * FOOT_MM)).toBeLessThan(INCH_MM);
    expect(Math.abs(dof.farMm - 11.003 * FOOT_MM)).toBeLessThan(INCH_MM);
  });

  // Worked example (photomatters.org): 50 mm, f/2.8, focus 24 in, c = 0.03 -> 23.6 to 24.5 in.
  it('50 mm f/2.8 at 24 in, c = 0.030 mm: 23.6 in to 24.5 in', () => {
    const dof = depthOfField({
      focalLengthMm: 50,
      aperture: 2.8,
      focusDistanceMm: 24 * INCH_MM,
      circleOfConfusionMm: 0.03,
    });
    expect(Math.abs(dof.nearMm / INCH_MM - 23.6)).toBeLessThan(0.1);
    expect(Math.abs(dof.farMm / INCH_MM - 24.5)).toBeLessThan(0.1);
  });

  // Short form H = f^2 / (N c): 50 mm, f/8, c = 0.02 -> 15,625 mm; the long form adds f.
  it('hyperfocal distance of 50 mm f/8, c = 0.02 mm is 15,625 mm + f', () => {
    const dof = depthOfField({
      focalLengthMm: 50,
      aperture: 8,
      focusDistanceMm: 3000,
      circleOfConfusionMm: 0.02,
    });
    expect(dof.hyperfocalMm).toBeCloseTo(15_625 + 50, 6);
  });

  it('is infinite beyond the hyperfocal distance', () => {
    const dof = depthOfField({
      focalLengthMm: 50,
      aperture: 8,
      focusDistanceMm: 20_000,
      circleOfConfusionMm: 0.02,
    });
    expect(dof.farMm).toBe(Infinity);
  });

  it('takes the circle of confusion from the sensor format: 0.030 mm full frame, divided by crop', () => {
    expect(circleOfConfusionMm(1)).toBeCloseTo(0.03, 10);
    expect(circleOfConfusionMm(1.5)).toBeCloseTo(0.02, 10);
    expect(circleOfConfusionMm(1.6)).toBeCloseTo(0.01875, 10);
  });

  it('property: near limit < focus < far limit', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 10, max: 600, noNaN: true }),
        fc.double({ min: 1, max: 32, noNaN: true }),
        fc.double({ min: 0.005, max: 0.05, noNaN: true }),
        fc.double({ min: 1.05, max: 100, noNaN: true }),
        (focal, aperture, circle, focusOverFocal) => {
          const focus = focal * focusOverFocal;
          const dof = depthOfField({
            focalLengthMm: focal,
            aperture,
            focusDistanceMm: focus,
            circleOfConfusionMm: circle,
          });
          return dof.nearMm < focus && focus < dof.farMm;
        },
      ),
    );
  });
});

describe('exposure against the APEX relations (ASA PH2.5-1960)', () => {
  it('f/16 at 1/125 s is Ev 14.97', () => {
    expect(Math.abs(exposureValue(16, 1 / 125) - 14.97)).toBeLessThan(0.05);
  });
  it('f/2 at 1/125 s is Ev 8.97', () => {
    expect(Math.abs(exposureValue(2, 1 / 125) - 8.97)).toBeLessThan(0.05);
  });
  // Guide number = distance x f-number at ISO 100 (openphotographicsociety.org): GN 32 at 4 m -> f/8.
  it('GN 32 at 4 m needs f/8 at ISO 100, and GN scales with the square root of ISO', () => {
    expect(apertureForGuideNumber(32, 4)).toBeCloseTo(8, 10);
    expect(apertureForGuideNumber(32, 4, 400)).toBeCloseTo(16, 10);
  });
});

describe('flash power and distance', () => {
  // Each halving of power is one stop (common practice, follows from halving).
  it('1/1 to 1/128 is 7 stops; 1/2 to 1/32 is 4 stops', () => {
    expect(stopsBetweenPowers(1, 1 / 128)).toBeCloseTo(7, 10);
    expect(stopsBetweenPowers(1 / 2, 1 / 32)).toBeCloseTo(4, 10);
  });

  it('offers 22 settings, full stops and thirds, from 1/1 to 1/128', () => {
    expect(powerSettings).toHaveLength(22);
    expect(powerSettings[0]?.label).toBe('1/1');
    expect(powerSettings.at(-1)?.label).toBe('1/128');
    expect(
      powerSettings
        .filter((setting) => !setting.label.includes('+'))
        .map((setting) => setting.label),
    ).toEqual(['1/1', '1/2', '1/4', '1/8', '1/16', '1/32', '1/64', '1/128']);
  });

  // Inverse-square law: f/16 at 1 m -> f/8 at 2 m -> f/4 at 4 m (two stops per doubling).
  it('f/16 at 1 m becomes f/8 at 2 m and f/4 at 4 m', () => {
    const apertureAt = (metres: number) => 16 * Math.sqrt(2 ** stopsForDistance(1, metres));
    expect(apertureAt(2)).toBeCloseTo(8, 10);
    expect(apertureAt(4)).toBeCloseTo(4, 10);
  });

  it('property: doubling any distance always costs two stops', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.05, max: 100, noNaN: true }), (metres) => {
        return Math.abs(stopsForDistance(metres, metres * 2) + 2) < 1e-9;
      }),
    );
  });
});

describe('lighting ratio (cinematography handbook definitions)', () => {
  it('one stop is 3:1 incident and 2:1 separate-meter; two stops 5:1 and 4:1; three stops 9:1', () => {
    expect(lightingRatio(1)).toMatchObject({ incident: 3, separateMeter: 2 });
    expect(lightingRatio(2)).toMatchObject({ incident: 5, separateMeter: 4 });
    expect(lightingRatio(3).incident).toBeCloseTo(9, 10);
  });

  it('property: both ratios grow with the stop difference', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -4, max: 8, noNaN: true }),
        fc.double({ min: 0.01, max: 3, noNaN: true }),
        (stops, more) => {
          const a = lightingRatio(stops);
          const b = lightingRatio(stops + more);
          return b.incident > a.incident && b.separateMeter > a.separateMeter;
        },
      ),
    );
  });
});
