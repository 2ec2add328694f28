import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * Demo, test and bench data use invented places only (the product brief's demo scenario). Every
 * street-like phrase in those folders must name one of the streets below, which were made up for
 * Likeness; a real address ("… Wharf Street, Leeds", a real Rotterdam office block) fails here.
 */
const inventedStreets = [
  'Quillfield Row',
  'Brugmeesterkade',
  'Rua da Lanterna Velha',
  'Osterby Row',
];

const root = join(import.meta.dirname, '..', '..');
const folders = ['tests', 'bench', 'scripts'];
const thisFile = relative(root, import.meta.filename);

function sourceFiles(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) return sourceFiles(path);
    return /\.(ts|tsx|mjs|json|csv)$/.test(name) ? [path] : [];
  });
}

// "1 Wharf Street", "Weena 70", "Rua da Lanterna Velha 14", "Brugmeesterkade 9": a number before
// an English street word, or a Dutch/Portuguese/German street name before its number.
const streetPatterns = [
  /\b\d+[a-z]? ((?:[A-Z][a-z]+ )+(?:Street|Road|Lane|Avenue|Row|Square|Place|Way|Terrace|Quay))\b/g,
  /\b((?:Rua|Avenida|Praça|Largo)(?: [a-z]+)*(?: [A-Z][a-z]+)+) \d+\b/g,
  /\b([A-Z][a-z]+(?:straat|kade|weg|laan|plein|gracht|singel|straße|strasse)) \d+\b/g,
  /\b(Weena|Coolsingel|Blaak) \d+\b/g,
];

function streetsIn(text: string): string[] {
  return streetPatterns.flatMap((pattern) =>
    [...text.matchAll(pattern)].map((match) => match[1] ?? ''),
  );
}

describe('addresses in demo, test and bench data', () => {
  it('recognises real-looking addresses (the check itself can fail)', () => {
    expect(streetsIn("address: '1 Wharf Street, Leeds'")).toEqual(['Wharf Street']);
    expect(streetsIn("'Weena 70, Rotterdam'")).toEqual(['Weena']);
    expect(streetsIn("'Rua da Lanterna Velha 14, Porto'")).toEqual(['Rua da Lanterna Velha']);
  });

  it('names only invented streets', () => {
    const found = folders
      .flatMap((folder) => sourceFiles(join(root, folder)))
      .filter((path) => relative(root, path) !== thisFile)
      .flatMap((path) =>
        streetsIn(readFileSync(path, 'utf8')).map((street) => `${relative(root, path)}: ${street}`),
      );
    expect(found.length).toBeGreaterThan(0);
    expect(
      found.filter((entry) => !inventedStreets.some((street) => entry.endsWith(`: ${street}`))),
    ).toEqual([]);
  });
});
