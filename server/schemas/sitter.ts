import { z } from 'zod';

export const sitterProfileSchema = z.object({
  id: z.string(),
  givenName: z.string(),
  familyName: z.string(),
  preferredName: z.string().nullable(),
  email: z.string(),
  department: z.string().nullable(),
  jobTitle: z.string().nullable(),
  clientName: z.string(),
  office: z.object({ name: z.string(), timeZone: z.string() }).nullable(),
});
export type SitterProfile = z.infer<typeof sitterProfileSchema>;
