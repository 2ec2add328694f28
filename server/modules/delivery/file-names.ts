import anyAscii from 'any-ascii';
import { controlCharacterPattern } from '../../schemas/common';

/**
 * File names for a delivery set from a client's template, e.g. "{employee_id}_{family}_{rendition}".
 * Names are transliterated to ASCII (any-ascii), safe on Windows (no reserved characters or
 * names, no trailing dot or space, at most 120 characters before the extension) and unique
 * within the set (a counter is added to the second and later of a name).
 */
export const templateTokens = [
  'employee_id',
  'given',
  'family',
  'preferred',
  'office',
  'department',
  'rendition',
  'day',
] as const;
export type TemplateToken = (typeof templateTokens)[number];
export type NameParts = Record<TemplateToken, string | null>;

const tokenPattern = /\{([a-z_]+)\}/g;
// Windows reserves these names for devices, with or without an extension.
const reservedNames = /^(con|prn|aux|nul|com[1-9]|lpt[1-9])$/i;

/** The unknown tokens of a template, so an editor can say which ones are wrong. */
export function unknownTokens(template: string): string[] {
  return [...template.matchAll(tokenPattern)]
    .map((match) => match[1]!)
    .filter((token) => !(templateTokens as readonly string[]).includes(token));
}

export function safeSegment(text: string): string {
  return anyAscii(text)
    .replace(new RegExp(controlCharacterPattern.source, 'g'), '')
    .replace(/[<>:"/\\|?*]/g, '')
    .replace(/\s+/g, '-')
    .replace(/[^A-Za-z0-9._-]/g, '')
    .replace(/-{2,}/g, '-');
}

export function fileStem(template: string, parts: NameParts): string {
  const filled = template.replace(tokenPattern, (_match, token: string) => {
    const value = parts[token as TemplateToken];
    return value ? safeSegment(value) : '';
  });
  let stem = safeSegment(filled)
    .replace(/^[._-]+|[._-]+$/g, '')
    .replace(/([_-])[_-]+/g, '$1')
    .slice(0, 120)
    .replace(/[. ]+$/, '');
  if (stem === '' || reservedNames.test(stem)) stem = `portrait${stem ? `-${stem}` : ''}`;
  return stem;
}

/** Names for a whole set, in order, each unique regardless of letter case. */
export function uniqueFileNames(
  template: string,
  entries: Array<{ parts: NameParts; extension: string }>,
): string[] {
  const used = new Set<string>();
  return entries.map(({ parts, extension }) => {
    const stem = fileStem(template, parts);
    let name = `${stem}.${extension}`;
    // A counter, rising until free: "-2" may itself be someone's real name.
    for (let count = 2; used.has(name.toLowerCase()); count += 1) {
      name = `${stem}-${count}.${extension}`;
    }
    used.add(name.toLowerCase());
    return name;
  });
}
