export const STAFF_ROLES = ['owner', 'manager', 'technician', 'league_manager'] as const;
export type StaffRole = (typeof STAFF_ROLES)[number];

export const ROLE_LABELS: Record<StaffRole, string> = {
  owner: 'Owner',
  manager: 'Manager',
  technician: 'Technician',
  league_manager: 'League manager',
};

/** Roles a caller of this role may hand out (invite with, or change a member to). */
export function assignableRoles(role: StaffRole): StaffRole[] {
  if (role === 'owner') return [...STAFF_ROLES];
  if (role === 'manager') return ['manager', 'technician', 'league_manager'];
  return [];
}
