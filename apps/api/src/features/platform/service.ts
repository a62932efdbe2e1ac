import type { PlatformRinkRow } from '@rinkwright/core';
import { platform } from '@rinkwright/db';

export async function listAllRinks(): Promise<{ rinks: PlatformRinkRow[] }> {
  const rows = await platform.listRinksWithCounts();
  return {
    rinks: rows.map((r) => ({ ...r, members: Number(r.members), customers: Number(r.customers), createdAt: r.createdAt.toISOString() })),
  };
}
