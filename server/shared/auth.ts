import { z } from 'zod';
import { ROLES } from './roles.js';

export const PASSWORD_MIN_LENGTH = 10;

export const password = z
  .string()
  .min(PASSWORD_MIN_LENGTH, `must be at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(200, 'must be at most 200 characters');

export const loginBody = z.object({
  email: z.string().trim().toLowerCase().email('must be an e-mail address'),
  password: z.string().min(1, 'is required').max(200),
});

export const sessionUser = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  organization: z.object({ id: z.number().int(), name: z.string() }),
});
export type SessionUser = z.infer<typeof sessionUser>;

export const meResponse = z.object({ user: sessionUser, csrfToken: z.string() });
export const csrfResponse = z.object({ token: z.string() });

export const changePasswordBody = z.object({
  currentPassword: z.string().min(1, 'is required'),
  newPassword: password,
});

export const acceptInvitationBody = z.object({
  token: z.string().min(20, 'is not a valid invitation token').max(200),
  name: z.string().trim().min(1, 'is required').max(120),
  password,
});
