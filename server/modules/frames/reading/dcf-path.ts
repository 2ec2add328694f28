/**
 * Camera file names after DCF (JEITA CP-3461): folders `DCIM/NNNxxxxx` with NNN 100-999, files
 * of four characters from 0-9 A-Z _ and a four-digit number 0001-9999. A leading `_` marks a
 * file in the optional colour space (DCF 2.0). Names that do not follow it still upload; they
 * simply carry no folder or number.
 */
export interface DcfPath {
  folderNumber: number | null;
  folderName: string | null;
  fileNumber: number | null;
  /** The four characters before the number, upper case (e.g. `HPE_` or `_HPE`). */
  stem: string;
  extension: string;
  wideGamut: boolean;
}

const folderPattern = /^([1-9]\d{2})([0-9A-Z_]{5})$/;
const filePattern = /^([0-9A-Z_]{4})(\d{4})$/;

export function parseDcfPath(cardPath: string): DcfPath {
  const parts = cardPath.replace(/\\/g, '/').split('/').filter(Boolean);
  const fileName = parts.at(-1) ?? '';
  const folder = (parts.at(-2) ?? '').toUpperCase();
  const dot = fileName.lastIndexOf('.');
  const base = (dot > 0 ? fileName.slice(0, dot) : fileName).toUpperCase();
  const extension = dot > 0 ? fileName.slice(dot + 1).toUpperCase() : '';
  const folderMatch = folderPattern.exec(folder);
  const fileMatch = filePattern.exec(base);
  const number = fileMatch ? Number(fileMatch[2]) : null;
  return {
    folderNumber: folderMatch ? Number(folderMatch[1]) : null,
    folderName: folderMatch ? folder : null,
    fileNumber: number !== null && number >= 1 ? number : null,
    stem: fileMatch?.[1] ?? base,
    extension,
    wideGamut: base.startsWith('_'),
  };
}

/** Card order: by folder, then by number (numbers repeat across folders after a rollover). */
export function frameSortKey(path: DcfPath): number {
  return (path.folderNumber ?? 0) * 10_000 + (path.fileNumber ?? 0);
}
