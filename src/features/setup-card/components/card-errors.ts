import type { z } from 'zod';

/** zod issues keyed by their dotted path ("camera.aperture", "lights.1.power"). */
export function issuesByPath(error: z.ZodError | undefined): Record<string, string> {
  const byPath: Record<string, string> = {};
  for (const issue of error?.issues ?? []) {
    const key = issue.path.join('.');
    byPath[key] ??= issue.code === 'invalid_type' ? 'Enter a number.' : issue.message;
  }
  return byPath;
}
