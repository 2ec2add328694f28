import { z } from 'zod';
import { emailSchema, staffRoleSchema, uuidSchema } from './common';

export const inviteStaffRequestSchema = z
  .object({
    email: emailSchema,
    displayName: z
      .string({ error: 'Enter a name.' })
      .trim()
      .min(1, { error: 'Enter a name.' })
      .max(120, { error: 'Use at most 120 characters.' }),
    role: staffRoleSchema,
    clientId: uuidSchema.nullable().default(null),
  })
  .refine((value) => (value.role === 'coordinator') === (value.clientId !== null), {
    error: 'A coordinator belongs to one client; studio staff belong to none.',
    path: ['clientId'],
  });
export type InviteStaffRequest = z.input<typeof inviteStaffRequestSchema>;

export const updateUserRequestSchema = z.object({ active: z.boolean() });
export type UpdateUserRequest = z.infer<typeof updateUserRequestSchema>;

export const staffUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
  role: staffRoleSchema,
  clientId: z.string().nullable(),
  clientName: z.string().nullable(),
  active: z.boolean(),
  hasPassword: z.boolean(),
  lastSignedInAt: z.string().nullable(),
});
export type StaffUser = z.infer<typeof staffUserSchema>;

export const staffUserListSchema = z.object({ users: z.array(staffUserSchema) });
export type StaffUserList = z.infer<typeof staffUserListSchema>;
