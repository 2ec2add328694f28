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

// Sources are listed in tests/reference/SOURCES.md. The two depth-of-field web articles agree
// with the equations under test, so each is backed by a second check that does not use those
// equations: the thin-lens (Gaussian) imaging equation, solved numerically below.

/**
 * Near and far limits straight from the thin-lens equation 1/f = 1/u + 1/v (Gaussian optics,
 * any optics textbook; from memory): a point at u images at v; its blur circle on the sensor,
 * focused for s, is the aperture diameter (f/N) times |v - v_s| / v. Bisection finds the u where
 * the blur equals c, without the closed-form depth-of-field equations.
 */
function thinLensLimits(f: number, n: number, s: number, c: number) {
  const image = (u: number) => (f * u) / (u - f);
  const blur = (u: number) => ((f / n) * Math.abs(image(u) - image(s))) / image(u);
  const solve = (low: number, high: number) => {
    for (let step = 0; step < 200; step += 1) {
      const middle = (low + high) / 2;
      // Blur falls as u approaches s from either side.
      if (blur(middle) > c === middle < s) low = middle;
      else high = middle;
    }
    return (low + high) / 2;
  };
  return { near: solve(f * 1.0001, s), far: solve(s, 1e12) };
}

describe('depth of field against published worked examples', () => {
  // Worked example of a depth-of-field web article (SOURCES.md, "DoF article A"): 50 mm, f/4,
  // focus 10 ft, c = 0.03 mm -> near 8 ft 9 in, far 11 ft 8 in (8.742 ft / 11.681 ft computed).
  // Tolerance: one inch. Second source: the thin-lens equation, checked below.
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

  // Worked example of a second web article (SOURCES.md, "DoF article B"): 50 mm, f/2.8, focus
  // 24 in, c = 0.03 -> 23.6 to 24.5 in. Second source: the thin-lens equation, checked below.
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

  // The second, stable source for the examples above: Gaussian optics (from memory).
  it('agrees with the thin-lens equation solved numerically, for the worked examples and at random', () => {
    const cases: Array<[number, number, number, number]> = [
      [50, 4, 10 * FOOT_MM, 0.03],
      [50, 4, 10 * FOOT_MM, 0.019],
      [50, 2.8, 24 * INCH_MM, 0.03],
      [85, 5.6, 1500, 0.02],
    ];
    const check = ([f, n, s, c]: [number, number, number, number]) => {
      const dof = depthOfField({
        focalLengthMm: f,
        aperture: n,
        focusDistanceMm: s,
        circleOfConfusionMm: c,
      });
      const lens = thinLensLimits(f, n, s, c);
      expect(Math.abs(dof.nearMm - lens.near) / lens.near).toBeLessThan(1e-6);
      if (Number.isFinite(dof.farMm)) {
        expect(Math.abs(dof.farMm - lens.far) / lens.far).toBeLessThan(1e-6);
      }
    };
    cases.forEach(check);
    fc.assert(
      fc.property(
        fc.double({ min: 20, max: 200, noNaN: true }),
        fc.double({ min: 1.4, max: 16, noNaN: true }),
        fc.double({ min: 3, max: 20, noNaN: true }),
        fc.double({ min: 0.015, max: 0.035, noNaN: true }),
        (f, n, focusOverFocal, c) => check([f, n, f * focusOverFocal, c]),
      ),
    );
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
});

describe('aperture from a guide number', () => {
  // Guide number = distance x f-number at ISO 100 and full power (SOURCES.md, "GN article"; the
  // definition of ISO 1230, from memory): GN 32 at 4 m -> f/8.
  it('GN 32 at 4 m needs f/8 at ISO 100 and full power', () => {
    expect(apertureForGuideNumber({ guideNumber: 32, distanceMetres: 4 })).toBeCloseTo(8, 10);
  });

  // Handbook worked example (SOURCES.md, "camera manual"): a guide number of 51 m at ISO 200 and
  // full output, 9 m away -> f/stop = 51 / 9 = 5.67; at ISO 800 the guide number doubles to 102.
  // Our guide numbers are quoted at ISO 100, so that head is 51 / sqrt 2.
  it("a camera manual's example: GN 51 (ISO 200) at 9 m is f/5.67; at ISO 800, f/11.3", () => {
    const guideNumber = 51 / Math.SQRT2;
    expect(apertureForGuideNumber({ guideNumber, distanceMetres: 9, iso: 200 })).toBeCloseTo(
      5.67,
      2,
    );
    expect(apertureForGuideNumber({ guideNumber, distanceMetres: 9, iso: 800 })).toBeCloseTo(
      102 / 9,
      6,
    );
  });

  // From memory (flash manuals tabulate the guide number per output level; common practice):
  // each halving of power divides the guide number by sqrt 2, so at 1/4 power a GN 40 head acts
  // as GN 20: f/8 at 2.5 m instead of f/16.
  it('from memory: at 1/4 power a GN 40 head acts as GN 20 (f/8 at 2.5 m)', () => {
    expect(
      apertureForGuideNumber({ guideNumber: 40, distanceMetres: 2.5, power: 1 / 4 }),
    ).toBeCloseTo(8, 10);
    expect(apertureForGuideNumber({ guideNumber: 40, distanceMetres: 2.5 })).toBeCloseTo(16, 10);
  });

  // From memory (common practice): light lost in a modifier counts like power, one stop = half.
  it('from memory: a modifier losing one stop acts as half power', () => {
    const halfPower = apertureForGuideNumber({ guideNumber: 40, distanceMetres: 2, power: 1 / 2 });
    const oneStopLost = apertureForGuideNumber({
      guideNumber: 40,
      distanceMetres: 2,
      modifierLossStops: 1,
    });
    expect(oneStopLost).toBeCloseTo(halfPower, 10);
    expect(oneStopLost).toBeCloseTo(20 / Math.SQRT2, 10);
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

// Cinematography handbooks define the lighting ratio as (key + fill) : fill (from memory; no
// stable published copy is held in the project, see SOURCES.md).
describe('lighting ratio (cinematography handbook definitions, from memory)', () => {
  it('one stop is 3:1 lighting ratio and 2:1 key-to-fill; two stops 5:1 and 4:1; three stops 9:1', () => {
    expect(lightingRatio(1)).toMatchObject({ lighting: 3, keyToFill: 2 });
    expect(lightingRatio(2)).toMatchObject({ lighting: 5, keyToFill: 4 });
    expect(lightingRatio(3).lighting).toBeCloseTo(9, 10);
  });

  it('property: both ratios grow with the stop difference', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -4, max: 8, noNaN: true }),
        fc.double({ min: 0.01, max: 3, noNaN: true }),
        (stops, more) => {
          const a = lightingRatio(stops);
          const b = lightingRatio(stops + more);
          return b.lighting > a.lighting && b.keyToFill > a.keyToFill;
        },
      ),
    );
  });
});
