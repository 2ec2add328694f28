import { renditionSchema, type Rendition } from '../../schemas/looks';
import { faceProportions } from './crop-geometry';

/**
 * The renditions a studio starts from, each value with where it comes from beside it. Values
 * marked "(from memory)" were not checked against the published text; "(value as quoted by
 * open checkers, …; verify)" means the figure is as quoted by open checkers, not read in the
 * standard itself (tests/reference/SOURCES.md lists the sources).
 */
export type Sourced<T> = { [K in keyof T]: { value: T[K]; source: string } };

export interface RenditionPreset {
  key: 'portrait_4_5' | 'square_profile' | 'id_badge';
  rendition: Rendition;
  sources: Partial<Record<keyof Rendition, string>>;
}

const COMMON_PRACTICE = 'common practice';
const OUR_CHOICE = 'our choice';
const PRIVACY = 'our rule: only credit and copyright may be kept, never GPS or camera serials';

function preset(
  key: RenditionPreset['key'],
  values: Sourced<Omit<Rendition, 'maxRotationDeg' | 'fillColour'>> &
    Partial<Sourced<Pick<Rendition, 'maxRotationDeg' | 'fillColour'>>>,
): RenditionPreset {
  const entries = Object.entries(values) as Array<
    [keyof Rendition, { value: unknown; source: string }]
  >;
  // Parsed, so a preset is held to the same limits as a studio's own rendition.
  const rendition = renditionSchema.parse(
    Object.fromEntries(entries.map(([field, { value }]) => [field, value])),
  );
  const sources = Object.fromEntries(entries.map(([field, { source }]) => [field, source]));
  return { key, rendition, sources };
}

/** Directories and intranets: head and shoulders, eyes on the upper third. */
export const portraitPreset = preset('portrait_4_5', {
  name: { value: 'Portrait 4:5', source: OUR_CHOICE },
  width: { value: 1200, source: '4:5, the usual portrait aspect for directories: common practice' },
  height: { value: 1500, source: '4:5: common practice' },
  eyeLine: {
    value: 1 / 3,
    source: 'eyes on the upper third line, about 33 % from the top: common practice',
  },
  headSize: {
    value: { measure: 'eye_distance', fraction: 0.16 },
    source:
      'our choice: head about 38 % of the width and crown to chin about 46 % of the height ' +
      '(with the anthropometric ratios in crop-geometry.ts, from memory), so the crop sits just ' +
      'over the hair and below the shoulders (common practice)',
  },
  centreX: { value: 0.5, source: COMMON_PRACTICE },
  overflow: { value: 'refuse', source: OUR_CHOICE },
  jpegQuality: { value: 90, source: OUR_CHOICE },
  keepMetadata: { value: { copyright: true, credit: true }, source: PRIVACY },
});

/** Profile pictures on networking sites, often shown in a circle. */
export const squareProfilePreset = preset('square_profile', {
  name: { value: 'Square profile', source: OUR_CHOICE },
  width: {
    value: 800,
    source: 'square, at least 400 x 400 px for professional networking sites: common practice',
  },
  height: { value: 800, source: 'square: common practice' },
  eyeLine: { value: 0.4, source: 'our choice: the face fills a centred circle crop' },
  headSize: {
    value: { measure: 'eye_to_chin', fraction: 0.3 },
    source: 'our choice: crown to chin about 62 % of the height (anthropometry, from memory)',
  },
  centreX: { value: 0.5, source: COMMON_PRACTICE },
  overflow: { value: 'extend', source: 'our choice: a plain band beats refusing a headshot' },
  fillColour: { value: '#e8e8e8', source: 'our choice: a light neutral grey' },
  jpegQuality: { value: 85, source: OUR_CHOICE },
  keepMetadata: { value: { copyright: true, credit: true }, source: PRIVACY },
});

/** Eye distance fraction of the badge's width, chosen so every range below holds with margin. */
const BADGE_EYE_DISTANCE = 0.27;

/** ID badges: inside the ISO/IEC 19794-5 full-frontal geometry, in ICAO's 35 x 45 mm frame. */
export const idBadgePreset = preset('id_badge', {
  name: { value: 'ID badge', source: OUR_CHOICE },
  width: {
    value: 420,
    source:
      'ICAO Doc 9303 Part 3 (from memory; clause not verified): 35 x 45 mm, aspect 7:9 ' +
      '(value as quoted by open checkers, see tests/reference/SOURCES.md; verify); 420 px = 35 mm at 12 px/mm (about 300 dpi): our choice',
  },
  height: { value: 540, source: 'ICAO Doc 9303 Part 3 (from memory): 45 mm, 7:9 with the width' },
  eyeLine: {
    value: 0.45,
    source:
      'ISO/IEC 19794-5:2005 clause 8.3.3 (clause number from memory): eye line 30-50 % of the ' +
      'height from the top (value as quoted by open checkers, see tests/reference/SOURCES.md; verify); 45 % puts the crown at about ' +
      '7 % and the chin at about 83 % with the head size below',
  },
  headSize: {
    value: { measure: 'eye_distance', fraction: BADGE_EYE_DISTANCE },
    source:
      `eye distance ${BADGE_EYE_DISTANCE} of the width = ${Math.round(BADGE_EYE_DISTANCE * 420)} px: ` +
      'ISO/IEC 19794-5:2005 clause 8.4.1 (from memory) asks at least 90 px between the eye ' +
      'centres; clause 8.3.4 (from memory) head width 50-75 % of the width, here ' +
      `${Math.round((BADGE_EYE_DISTANCE / faceProportions.eyeDistancePerHeadWidth) * 100)} %; ` +
      'ICAO Doc 9303 Part 3 (from memory) crown to chin 70-80 % of the height, here ' +
      `${Math.round(((BADGE_EYE_DISTANCE * 420 * faceProportions.crownToChinPerEyeDistance) / 540) * 100)} % ` +
      '(values as quoted by open checkers, see tests/reference/SOURCES.md; verify; head width and crown to chin estimated from the eye ' +
      'distance with the anthropometric ratios in crop-geometry.ts, from memory)',
  },
  centreX: {
    value: 0.5,
    source:
      'ISO/IEC 19794-5:2005 clause 8.3.2 (clause number from memory): face centre 45-55 % of ' +
      'the width (value as quoted by open checkers, see tests/reference/SOURCES.md; verify)',
  },
  overflow: {
    value: 'refuse',
    source: 'our choice: an ID photo with a painted-in band is better retaken',
  },
  jpegQuality: { value: 92, source: OUR_CHOICE },
  keepMetadata: {
    value: { copyright: true, credit: false },
    source: `${PRIVACY}; badges carry the copyright only`,
  },
});

export const lookPresets: readonly RenditionPreset[] = [
  portraitPreset,
  squareProfilePreset,
  idBadgePreset,
];
