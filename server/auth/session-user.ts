import type { SessionUser } from '../shared/auth.js';
import { Organization, User } from '../models/index.js';

/** Loads the signed-in user with their organisation, or null when absent or no longer active. */
export async function loadSessionUser(id: number): Promise<SessionUser | null> {
  const user = await User.findByPk(id, { include: [{ model: Organization, as: 'organization' }] });
  if (!user || user.status !== 'active') return null;
  const organization = (user as User & { organization: Organization }).organization;
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    organization: { id: organization.id, name: organization.name },
  };
}
