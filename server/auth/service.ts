/** Sign-in, lockout, password change and invitations: the work, without HTTP. */
import { createHash, randomBytes } from 'node:crypto';
import { Op } from 'sequelize';
import { User } from '../models/index.js';
import { database } from '../lib/database.js';
import { AppError, badRequest, tooManyAttempts } from '../lib/errors.js';
import { hashPassword, verifyPassword } from '../lib/passwords.js';
import type { SessionUser } from '../shared/auth.js';
import { loadSessionUser } from './session-user.js';

/** Consecutive failures that lock an account, and for how long. */
export const LOCKOUT_AFTER_FAILURES = 5;
export const LOCKOUT_MINUTES = 15;
export const INVITATION_DAYS = 7;

// Compared against when the e-mail is unknown, so a wrong e-mail costs as long as a wrong password.
const UNKNOWN_USER_HASH = await hashPassword(randomBytes(16).toString('hex'));

const invalidCredentials = () => new AppError('invalid-credentials', 'The e-mail or the password is wrong.', 401);

function lockedMessage(until: Date): AppError {
  const minutes = Math.max(1, Math.ceil((until.getTime() - Date.now()) / 60_000));
  return tooManyAttempts(
    `This account is locked after ${LOCKOUT_AFTER_FAILURES} failed sign-ins. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or ask an administrator.`,
    minutes * 60,
  );
}

export async function authenticate(email: string, password: string): Promise<SessionUser> {
  const user = await User.findOne({ where: { email: email.toLowerCase() } });
  if (!user || user.status !== 'active') {
    await verifyPassword(password, UNKNOWN_USER_HASH);
    throw invalidCredentials();
  }
  if (user.lockedUntil && user.lockedUntil > new Date()) throw lockedMessage(user.lockedUntil);
  if (!(await verifyPassword(password, user.passwordHash))) {
    const failures = user.failedSignIns + 1;
    const lock = failures >= LOCKOUT_AFTER_FAILURES ? new Date(Date.now() + LOCKOUT_MINUTES * 60_000) : null;
    await user.update({ failedSignIns: lock ? 0 : failures, lockedUntil: lock });
    if (lock) throw lockedMessage(lock);
    throw invalidCredentials();
  }
  if (user.failedSignIns > 0 || user.lockedUntil) await user.update({ failedSignIns: 0, lockedUntil: null });
  const sessionUser = await loadSessionUser(user.id);
  if (!sessionUser) throw invalidCredentials();
  return sessionUser;
}

/**
 * Changes the password and ends the user's other sessions (every other browser signs in again with
 * the new password); the session `keepSessionId` that asked for the change stays signed in.
 */
export async function changePassword(userId: number, currentPassword: string, newPassword: string, keepSessionId?: string): Promise<void> {
  const user = await User.findByPk(userId);
  if (!user || !(await verifyPassword(currentPassword, user.passwordHash))) {
    throw badRequest('currentPassword: is not your current password', [{ field: 'currentPassword', message: 'is not your current password' }]);
  }
  await user.update({ passwordHash: await hashPassword(newPassword), version: user.version + 1 });
  await endSessions(userId, keepSessionId);
}

/**
 * Ends every stored session of a user ("sign out everywhere"), except `keepSessionId` when given:
 * deletes their rows from the PostgreSQL session store (connect-pg-simple's table; passport keeps
 * the user id at sess.passport.user). A browser holding a deleted session id is simply signed out.
 * Returns how many sessions ended.
 */
export async function endSessions(userId: number, keepSessionId?: string): Promise<number> {
  const [, result] = await database().query(`DELETE FROM "session" WHERE (sess -> 'passport' ->> 'user') = :user AND sid <> :keep`, {
    replacements: { user: String(userId), keep: keepSessionId ?? '' },
  });
  return (result as { rowCount?: number } | undefined)?.rowCount ?? 0;
}

export function hashInvitationToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** A fresh invitation token: the e-mail carries the token, the database only its hash. */
export function newInvitationToken(): { token: string; hash: string; expiresAt: Date } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashInvitationToken(token), expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000) };
}

export async function acceptInvitation(token: string, name: string, password: string): Promise<SessionUser> {
  const user = await User.findOne({
    where: { invitationTokenHash: hashInvitationToken(token), status: 'invited', invitationExpiresAt: { [Op.gt]: new Date() } },
  });
  if (!user) {
    throw new AppError('invalid-invitation', 'This invitation is not valid any more: ask your administrator to send a new one.', 400, [
      { field: 'token', message: 'is not valid any more' },
    ]);
  }
  await user.update({
    name,
    passwordHash: await hashPassword(password),
    status: 'active',
    invitationTokenHash: null,
    invitationExpiresAt: null,
    version: user.version + 1,
  });
  const sessionUser = await loadSessionUser(user.id);
  if (!sessionUser) throw new AppError('invalid-invitation', 'This invitation could not be accepted.', 400);
  return sessionUser;
}
