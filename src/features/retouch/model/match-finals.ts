/**
 * Ties retouched files to their picks by the original's name or number, as editors keep them:
 * "HPE_0452.jpg", "HPE_0452-Edit.tif", "HPE_0452 copy.jpg", or just "0452_final.jpg". A file
 * that fits no pick, or more than one, is left for a person to decide.
 */
export interface PickForMatching {
  pickId: string;
  fileName: string;
}

export interface FinalMatch {
  fileName: string;
  pickId: string | null;
  by: 'name' | 'number' | null;
  /** Several picks fit: the person chooses. */
  ambiguous: boolean;
}

const stemOf = (fileName: string) =>
  (fileName.split('/').pop() ?? fileName).replace(/\.[^.]+$/, '').toLowerCase();

const numberOf = (fileName: string): string | null => {
  const digits = stemOf(fileName).match(/\d{4}/g);
  return digits ? digits[digits.length - 1]! : null;
};

export function matchFinals(fileNames: string[], picks: PickForMatching[]): FinalMatch[] {
  return fileNames.map((fileName) => {
    const stem = stemOf(fileName);
    const byName = picks.filter((pick) => {
      const original = stemOf(pick.fileName);
      // The original's name, then nothing or a separator that is not part of a longer number.
      return (
        stem === original || (stem.startsWith(original) && !/^\d/.test(stem.slice(original.length)))
      );
    });
    if (byName.length === 1)
      return { fileName, pickId: byName[0]!.pickId, by: 'name', ambiguous: false };
    if (byName.length > 1) return { fileName, pickId: null, by: null, ambiguous: true };
    const number = numberOf(fileName);
    const byNumber = number ? picks.filter((pick) => numberOf(pick.fileName) === number) : [];
    if (byNumber.length === 1) {
      return { fileName, pickId: byNumber[0]!.pickId, by: 'number', ambiguous: false };
    }
    return { fileName, pickId: null, by: null, ambiguous: byNumber.length > 1 };
  });
}
