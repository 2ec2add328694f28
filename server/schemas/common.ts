import { z } from 'zod';

export const roles = ['studio_admin', 'photographer', 'coordinator', 'sitter'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

export const staffRoles = ['studio_admin', 'photographer', 'coordinator'] as const;
export const staffRoleSchema = z.enum(staffRoles);
export type StaffRole = z.infer<typeof staffRoleSchema>;

export const roleLabels: Record<Role, string> = {
  studio_admin: 'Studio admin',
  photographer: 'Photographer',
  coordinator: 'Coordinator',
  sitter: 'Sitter',
};

/** Trimmed and case-folded before the syntax check, so "  Ana@X.example " is accepted. */
export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

export const newPasswordSchema = z
  .string({ error: 'Choose a password.' })
  .min(12, { error: 'Use at least 12 characters.' })
  .max(200, { error: 'Use at most 200 characters.' });

/** C0 controls, DEL and C1 controls: never part of a name, a path or a label. */
// eslint-disable-next-line no-control-regex
export const controlCharacterPattern = /[\u0000-\u001f\u007f-\u009f]/;

/**
 * Fields where a person may type line breaks or tabs (a note in a textarea). Every other text
 * field refuses them at the edge, like any other control character (server/lib/validate.ts).
 */
export const lineBreakFields = z.registry<{ lineBreaks: true }>();

/** Marks a text schema as accepting tab, line feed and carriage return. */
export function allowLineBreaks<Schema extends z.ZodType>(schema: Schema): Schema {
  lineBreakFields.add(schema, { lineBreaks: true });
  return schema;
}

export const uuidSchema = z.uuid({ error: 'Not a valid identifier.' });

export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;
