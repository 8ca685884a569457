import { z } from 'zod';
import { listOf, listQuery, versionField } from './common.js';
import { ROLES } from './roles.js';

export const userOutput = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  status: z.enum(['active', 'invited', 'disabled']),
  version: z.number().int(),
  createdAt: z.string(),
});
export type UserOutput = z.infer<typeof userOutput>;

export const invitationBody = z.object({
  email: z.string().trim().toLowerCase().email('must be an e-mail address').max(200),
  name: z.string().trim().max(120).optional(),
  role: z.enum(ROLES, { error: `must be one of ${ROLES.join(', ')}` }),
});

export const userUpdateBody = z.object({
  role: z.enum(ROLES).optional(),
  status: z.enum(['active', 'disabled']).optional(),
  version: versionField,
});

export const USER_SORT_FIELDS = ['name', 'email', 'role', 'createdAt'] as const;
export const userListQuery = listQuery(USER_SORT_FIELDS, 'name').extend({
  role: z.enum(ROLES).optional(),
});
export const userList = listOf(userOutput);
