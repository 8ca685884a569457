import type { Mailer } from '../lib/mail.js';
import { route, type RouteSpec } from '../lib/routing.js';
import { idParams } from '../shared/common.js';
import { invitationBody, userList, userListQuery, userOutput, userUpdateBody } from '../shared/user.js';
import { inviteUser, listUsers, resendInvitation, updateUser } from './service.js';

const ADMIN = ['admin'] as const;

export function userRoutes(mailer: Mailer, publicUrl: string): RouteSpec[] {
  return [
    route({
      method: 'get',
      path: '/users',
      summary: 'List the organisation’s users (Team)',
      tag: 'users',
      access: ADMIN,
      query: userListQuery,
      response: userList,
      handler: ({ tenant, query }) => listUsers(tenant, query),
    }),
    route({
      method: 'post',
      path: '/users/invitations',
      summary: 'Invite a user by e-mail with a role',
      tag: 'users',
      access: ADMIN,
      body: invitationBody,
      response: userOutput,
      status: 201,
      handler: ({ tenant, body }) => inviteUser(tenant, body, mailer, publicUrl),
    }),
    route({
      method: 'post',
      path: '/users/:id/invitation',
      summary: 'Send a new invitation e-mail',
      tag: 'users',
      access: ADMIN,
      params: idParams,
      response: userOutput,
      handler: ({ tenant, params }) => resendInvitation(tenant, params.id, mailer, publicUrl),
    }),
    route({
      method: 'patch',
      path: '/users/:id',
      summary: 'Change a user’s role or disable them (send the version you loaded)',
      tag: 'users',
      access: ADMIN,
      params: idParams,
      body: userUpdateBody,
      response: userOutput,
      handler: ({ tenant, params, body }) => updateUser(tenant, params.id, body),
    }),
  ];
}
