// Team members and invitations (`/api/users`, admin only).
import type { z } from 'zod';
import type { ListResult } from 'shared/common';
import type { invitationBody, UserOutput, userListQuery, userUpdateBody } from 'shared/user';
import { api, type QueryOf } from './client';

export type UserListQuery = QueryOf<z.output<typeof userListQuery>>;
export type InvitationInput = z.input<typeof invitationBody>;
export type UserUpdate = z.input<typeof userUpdateBody>;

export const usersApi = {
  list: (query: UserListQuery = {}) => api.get<ListResult<UserOutput>>('/api/users', query),
  invite: (body: InvitationInput) => api.post<UserOutput>('/api/users/invitations', body),
  update: (id: number, body: UserUpdate) => api.patch<UserOutput>(`/api/users/${id}`, body),
  resendInvitation: (id: number) => api.post<UserOutput | undefined>(`/api/users/${id}/invitation`),
};
