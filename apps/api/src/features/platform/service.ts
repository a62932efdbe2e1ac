import { graceLapsed, type PlatformRinkRow } from '@rinkwright/core';
import { platform } from '@rinkwright/db';

export async function listAllRinks(): Promise<{ rinks: PlatformRinkRow[] }> {
  const rows = await platform.listRinksWithCounts();
  const now = new Date();
  return {
    rinks: rows.map(({ planState, planStations, planGraceUntil, activeStations, suspendedAt, suspendedReason, pairs30d, feesMinor30d, ...r }) => ({
      ...r,
      members: Number(r.members),
      customers: Number(r.customers),
      createdAt: r.createdAt.toISOString(),
      plan: {
        // As the rink's own billing page says it: past_due turns read_only when its grace runs out.
        state: graceLapsed(planState, planGraceUntil, now) ? 'read_only' : (planState ?? 'none'),
        stations: planStations ?? 0,
        activeStations: Number(activeStations),
        graceUntil: planGraceUntil?.toISOString() ?? null,
      },
      suspension: suspendedAt ? { at: suspendedAt.toISOString(), reason: suspendedReason ?? '' } : null,
      volume: { pairs30d: Number(pairs30d), feesMinor30d: Number(feesMinor30d) },
    })),
  };
}
