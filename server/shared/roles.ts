/** The four roles of DESIGN.md, from most to least privileged. */
export const ROLES = ['admin', 'engineer', 'approver', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

/** Roles that may change sites, motors, imports, studies and designs. */
export const EDITORS: readonly Role[] = ['admin', 'engineer'];
/** Roles that may read caught e-mail in the Outbox. */
export const OUTBOX_READERS: readonly Role[] = ['admin', 'engineer', 'approver'];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  engineer: 'Engineer',
  approver: 'Approver',
  viewer: 'Viewer',
};
