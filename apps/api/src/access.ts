import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements } from 'better-auth/plugins/organization/access';
import type { StaffRole } from '@rinkwright/core';

// Every permission a rink role can hold, defined once. better-auth's organization plugin checks its own
// endpoints (invitations) with these roles, and our route table checks every rink route with them too.
const rinkStatements = {
  rink: ['read', 'update'],
  member: ['read', 'create', 'update', 'delete'],
  invitation: ['read', 'create', 'cancel'],
  customer: ['read', 'create', 'update'],
  station: ['read', 'manage', 'upkeep'],
  service: ['read', 'manage'],
  ticket: ['read', 'create', 'work'],
  product: ['read', 'manage'],
  sale: ['create', 'refund'],
  credit: ['read', 'redeem', 'adjust'],
  league: ['read', 'manage'],
  billing: ['read', 'manage'],
  /** read: every report of the rink; leagues: the league usage report (a league manager's: their leagues only). */
  report: ['read', 'leagues'],
} as const;

export const statements = { ...defaultStatements, ...rinkStatements } as const;

export const ac = createAccessControl(statements);

const staffRead = { rink: ['read'], customer: ['read'], station: ['read'], service: ['read'], product: ['read'] } as const;
/** Owners hold every rink permission; managers all but the rink's own plan and payout account. */
const manage = rinkStatements;

export const roles = {
  owner: ac.newRole({ organization: ['update', 'delete'], ...manage }),
  manager: ac.newRole({ organization: ['update'], ...manage, billing: ['read'] }),
  technician: ac.newRole({
    ...staffRead,
    customer: ['read', 'create', 'update'],
    station: ['read', 'upkeep'],
    ticket: ['read', 'create', 'work'],
    sale: ['create'],
    credit: ['read', 'redeem'],
    league: ['read'],
  }),
  // A league manager sees and runs only the leagues they manage: the leagues service narrows every read and write.
  league_manager: ac.newRole({ ...staffRead, league: ['read', 'manage'], report: ['leagues'] }),
} satisfies Record<StaffRole, unknown>;

export type Permission = { [K in keyof typeof statements]?: (typeof statements)[K][number][] };

export function roleAllows(role: StaffRole, permission: Permission): boolean {
  return roles[role].authorize(permission as never).success;
}

/** The role's statements, for the web app to shape its navigation. */
export function permissionsOf(role: StaffRole): Record<string, string[]> {
  return Object.fromEntries(
    Object.entries(roles[role].statements).map(([k, v]) => [k, [...(v as readonly string[])]]),
  );
}
