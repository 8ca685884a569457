// The Team screen: members and invitations of the organisation, and the admin's actions on them.
import { ref, watch } from 'vue';
import type { Role } from 'shared/roles';
import type { UserOutput } from 'shared/user';
import { usersApi, type InvitationInput } from 'src/api/users';
import { usePagedTable } from './usePagedTable';

export function useTeam() {
  const roleFilter = ref<Role | null>(null);
  const table = usePagedTable<UserOutput>(
    (request) => usersApi.list({ ...request, role: roleFilter.value ?? undefined }),
    { sortBy: 'name' },
  );
  watch(roleFilter, () => void table.reload(true));

  /** Put the server's answer in place of the row it changed. */
  function replaceRow(updated: UserOutput): void {
    table.rows.value = table.rows.value.map((row) => (row.id === updated.id ? updated : row));
  }

  async function invite(input: InvitationInput): Promise<UserOutput> {
    const user = await usersApi.invite(input);
    await table.reload();
    return user;
  }

  async function changeRole(user: UserOutput, role: Role): Promise<UserOutput> {
    const updated = await usersApi.update(user.id, { role, version: user.version });
    replaceRow(updated);
    return updated;
  }

  async function setDisabled(user: UserOutput, disabled: boolean): Promise<UserOutput> {
    const updated = await usersApi.update(user.id, { status: disabled ? 'disabled' : 'active', version: user.version });
    replaceRow(updated);
    return updated;
  }

  async function resendInvitation(user: UserOutput): Promise<void> {
    const updated = await usersApi.resendInvitation(user.id);
    if (updated && typeof updated === 'object' && 'id' in updated) replaceRow(updated);
  }

  return { ...table, roleFilter, invite, changeRole, setDisabled, resendInvitation };
}
