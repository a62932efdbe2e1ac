import { z } from 'zod';
import { planState } from './billing';

export const platformRinkRow = z.object({
  id: z.string(),
  slug: z.string(),
  name: z.string(),
  timeZone: z.string(),
  currency: z.string(),
  unitPreference: z.enum(['in', 'mm']),
  members: z.number().int(),
  customers: z.number().int(),
  createdAt: z.iso.datetime(),
  /** The rink's Rinkwright plan: read_only once the grace after a failed payment has run out. */
  plan: z.object({ state: planState, stations: z.number().int(), activeStations: z.number().int(), graceUntil: z.iso.datetime().nullable() }),
  /** Set while the platform has the rink suspended. */
  suspension: z.object({ at: z.iso.datetime(), reason: z.string() }).nullable(),
  /** The last 30 days, from the report summaries: pairs sharpened and the platform's fees on the rink's sales. */
  volume: z.object({ pairs30d: z.number().int(), feesMinor30d: z.number().int() }),
});
export const platformRinkList = z.object({ rinks: z.array(platformRinkRow) });
export type PlatformRinkRow = z.infer<typeof platformRinkRow>;

export const suspensionInput = z.object({
  reason: z.string().trim().min(3, 'Say why, in a few words: the rink’s staff will read it').max(300, 'At most 300 characters'),
});
export type SuspensionInput = z.infer<typeof suspensionInput>;
export const platformRinkParams = z.object({ rinkId: z.string().min(1).max(36) });
