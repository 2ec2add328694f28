import { z } from 'zod';
import { emailSchema, newPasswordSchema, roleSchema } from './common';

export const signInRequestSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, { error: 'Enter your password.' }).max(200),
});
export type SignInRequest = z.infer<typeof signInRequestSchema>;

export const signInLinkRequestSchema = z.object({ email: emailSchema });
export type SignInLinkRequest = z.infer<typeof signInLinkRequestSchema>;

export const linkTokenSchema = z.object({
  token: z.string().min(20, { error: 'This link is incomplete.' }).max(200),
});
export type LinkTokenRequest = z.infer<typeof linkTokenSchema>;

export const passwordResetRequestSchema = z.object({ email: emailSchema });
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

export const setPasswordRequestSchema = z
  .object({
    token: linkTokenSchema.shape.token,
    password: newPasswordSchema,
    confirmPassword: z.string(),
  })
  .refine((value) => value.password === value.confirmPassword, {
    error: 'The two passwords differ.',
    path: ['confirmPassword'],
  });
export type SetPasswordRequest = z.infer<typeof setPasswordRequestSchema>;

export const sessionUserSchema = z.object({
  kind: z.enum(['staff', 'sitter']),
  id: z.string(),
  role: roleSchema,
  displayName: z.string(),
  email: z.string(),
  clientId: z.string().nullable(),
  clientName: z.string().nullable(),
  officeName: z.string().nullable(),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

export const sessionResponseSchema = z.object({
  user: sessionUserSchema,
  expiresAt: z.string(),
});
export type SessionResponse = z.infer<typeof sessionResponseSchema>;

export const acceptedResponseSchema = z.object({ message: z.string() });
export type AcceptedResponse = z.infer<typeof acceptedResponseSchema>;

/** One of the viewer's own sessions, as the account page lists them. */
export const sessionSummarySchema = z.object({
  id: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
  ipAddress: z.string().nullable(),
  userAgent: z.string().nullable(),
  current: z.boolean(),
});
export type SessionSummary = z.infer<typeof sessionSummarySchema>;

export const sessionListSchema = z.object({ sessions: z.array(sessionSummarySchema) });
export type SessionList = z.infer<typeof sessionListSchema>;
