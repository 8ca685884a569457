// How the Team screen describes each role (DESIGN.md's role table, in a sentence).
import { ROLE_LABELS, type Role } from 'shared/roles';

export const ROLE_CHOICES: Record<Role, { label: string; description: string }> = {
  admin: { label: ROLE_LABELS.admin, description: 'Everything, plus team, roles, price book and assumptions' },
  engineer: { label: ROLE_LABELS.engineer, description: 'Edits sites, motors, imports, studies and designs' },
  approver: { label: ROLE_LABELS.approver, description: 'Reads everything; approves or rejects retrofit proposals' },
  viewer: { label: ROLE_LABELS.viewer, description: 'Reads only' },
};

export const STATUS_LABELS = {
  active: 'Active',
  invited: 'Invited',
  disabled: 'Disabled',
} as const;
