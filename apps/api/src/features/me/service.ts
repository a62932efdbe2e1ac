import { directory } from '@rinkwright/db';
import type { MeResponse, StaffRole } from '@rinkwright/core';
import type { UserContext } from '../../http/route';

export async function describeCaller(caller: UserContext): Promise<MeResponse> {
  const [person, memberships, links] = await Promise.all([
    directory.findUserByEmail(caller.email),
    directory.listMembershipsOfUser(caller.userId),
    directory.listCustomerLinksOfUser(caller.userId),
  ]);
  return {
    user: {
      id: caller.userId,
      name: caller.name,
      email: caller.email,
      emailVerified: person?.emailVerified ?? false,
      platformAdmin: caller.platformAdmin,
    },
    rinks: memberships.map((m) => ({
      slug: m.slug,
      name: m.name,
      role: m.role as StaffRole,
      timeZone: m.timeZone,
      currency: m.currency,
      unitPreference: m.unitPreference,
    })),
    customerOf: links.map((l) => ({ slug: l.slug, name: l.name, memberCode: l.memberCode })),
  };
}
