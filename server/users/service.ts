/** The Team: an organisation's users, their roles, and invitations by e-mail. */
import type { z } from 'zod';
import { UniqueConstraintError, type WhereOptions } from 'sequelize';
import { Organization, User } from '../models/index.js';
import { newInvitationToken } from '../auth/service.js';
import { database } from '../lib/database.js';
import { conflict, staleVersion } from '../lib/errors.js';
import { definedOnly } from '../lib/objects.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Mailer } from '../lib/mail.js';
import type { Tenant } from '../lib/tenant.js';
import type { ListResult } from '../shared/common.js';
import { ROLE_LABELS } from '../shared/roles.js';
import type { invitationBody, userListQuery, UserOutput, userUpdateBody } from '../shared/user.js';

function toOutput(user: User): UserOutput {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    status: user.status,
    version: user.version,
    createdAt: user.createdAt.toISOString(),
  };
}

export async function listUsers(tenant: Tenant, query: z.infer<typeof userListQuery>): Promise<ListResult<UserOutput>> {
  const where: WhereOptions<User> = query.role ? { role: query.role } : {};
  const { rows, count } = await tenant.findAndCountAll(User, { where, order: orderFrom(query.sort), ...pageWindow(query.page, query.pageSize) });
  return { items: rows.map(toOutput), total: count, page: query.page, pageSize: query.pageSize };
}

async function sendInvitation(tenant: Tenant, user: User, token: string, mailer: Mailer, publicUrl: string): Promise<void> {
  const organization = await Organization.findByPk(tenant.organizationId);
  const link = `${publicUrl}/invitation?token=${encodeURIComponent(token)}`;
  const role = ROLE_LABELS[user.role];
  await mailer.send({
    organizationId: tenant.organizationId,
    to: [user.email],
    subject: `${tenant.user.name} invites you to ${organization?.name ?? 'an organisation'} on Statorline`,
    text: [
      `Hello${user.name ? ` ${user.name}` : ''},`,
      '',
      `${tenant.user.name} has invited you to join ${organization?.name ?? 'their organisation'} on Statorline as ${role}.`,
      'Open this link within 7 days to choose your password:',
      link,
      '',
      'If you did not expect this message, you can ignore it.',
    ].join('\n'),
    html: `<p>Hello${user.name ? ` ${escapeHtml(user.name)}` : ''},</p><p>${escapeHtml(tenant.user.name)} has invited you to join <b>${escapeHtml(organization?.name ?? 'their organisation')}</b> on Statorline as ${role}.</p><p><a href="${escapeHtml(link)}">Accept the invitation and choose a password</a> (valid for 7 days).</p><p>If you did not expect this message, you can ignore it.</p>`,
  });
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (character) => `&#${character.charCodeAt(0)};`);
}

export async function inviteUser(
  tenant: Tenant,
  input: z.infer<typeof invitationBody>,
  mailer: Mailer,
  publicUrl: string,
): Promise<UserOutput> {
  const invitation = newInvitationToken();
  let user: User;
  try {
    user = await database().transaction(async (transaction) => {
      const created = await tenant.create(
        User,
        {
          email: input.email,
          name: input.name ?? '',
          role: input.role,
          status: 'invited',
          passwordHash: null,
          invitationTokenHash: invitation.hash,
          invitationExpiresAt: invitation.expiresAt,
        },
        transaction,
      );
      await tenant.audit('invite', 'user', created.id, { email: input.email, role: input.role }, transaction);
      return created;
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) {
      throw conflict('email-taken', `${input.email} already has a Statorline account.`, [{ field: 'email', message: 'already has an account' }]);
    }
    throw error;
  }
  await sendInvitation(tenant, user, invitation.token, mailer, publicUrl);
  return toOutput(user);
}

export async function resendInvitation(tenant: Tenant, id: number, mailer: Mailer, publicUrl: string): Promise<UserOutput> {
  const user = await tenant.findById(User, id, 'User');
  if (user.status !== 'invited') throw conflict('not-invited', 'This user has already accepted the invitation.');
  const invitation = newInvitationToken();
  await user.update({ invitationTokenHash: invitation.hash, invitationExpiresAt: invitation.expiresAt });
  await sendInvitation(tenant, user, invitation.token, mailer, publicUrl);
  return toOutput(user);
}

export async function updateUser(tenant: Tenant, id: number, input: z.infer<typeof userUpdateBody>): Promise<UserOutput> {
  const { version, ...changes } = input;
  if (id === tenant.user.id && ((changes.role && changes.role !== 'admin') || changes.status === 'disabled')) {
    throw conflict('own-account', 'You cannot remove your own administrator rights or disable yourself; ask another administrator.');
  }
  await database().transaction(async (transaction) => {
    await tenant.findById(User, id, 'User', { transaction });
    const [updated] = await User.update({ ...definedOnly(changes), version: version + 1 }, { where: tenant.where<User>({ id, version }), transaction });
    if (updated === 0) throw staleVersion('This user');
    if (changes.status === 'disabled') {
      // Sign the disabled user out everywhere: their sessions are deleted with them.
      await database().query(`DELETE FROM "session" WHERE (sess->'passport'->>'user')::int = :id`, { replacements: { id }, transaction });
    }
    await tenant.audit('update', 'user', id, changes, transaction);
  });
  return toOutput(await tenant.findById(User, id, 'User'));
}

