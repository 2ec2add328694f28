import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * Tests and source name where their check values come from; those citations must point inside
 * the project (tests/reference/SOURCES.md), never to a file outside the repository.
 */
const root = join(import.meta.dirname, '..', '..');
const thisFile = relative(root, import.meta.filename);

function files(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) return files(path);
    return /\.(ts|tsx)$/.test(name) ? [path] : [];
  });
}

const sources = ['tests', 'server', 'src', 'scripts'].flatMap((folder) =>
  files(join(root, folder)),
);

describe('citations of check values', () => {
  it('name no file outside the project', () => {
    const outside = sources
      .filter((path) => relative(root, path) !== thisFile)
      .flatMap((path) =>
        readFileSync(path, 'utf8')
          .split('\n')
          .map((line, index) => ({ line, at: `${relative(root, path)}:${index + 1}` }))
          .filter(({ line }) => /REFERENCES(\.md)?\b|\.\.\/shared\/|\/work\//.test(line))
          .map(({ at }) => at),
      );
    expect(outside).toEqual([]);
  });

  it('the sources file they point to exists and lists the standards the reference tests use', () => {
    const listed = readFileSync(join(root, 'tests', 'reference', 'SOURCES.md'), 'utf8');
    for (const name of ['RFC 4180', 'ASA PH2.5-1960', 'camera manual', 'thin-lens equation']) {
      expect(listed).toContain(name);
    }
  });

  it('RFC 4180: padding short rows is credited to our leniency (§2.4 wants equal counts), not §2.3', () => {
    const text = readFileSync(join(root, 'tests', 'reference', 'csv-rfc4180.test.ts'), 'utf8');
    const titles = [...text.matchAll(/it\('([^']+)'/g)].map((match) => match[1] ?? '');
    const padding = titles.filter((title) => /pad/i.test(title));
    expect(padding.length).toBeGreaterThan(0);
    for (const title of padding) {
      expect(title).toMatch(/§2\.4/);
      expect(title).toMatch(/leniency/);
      expect(title).not.toMatch(/§2\.3/);
    }
  });
});
