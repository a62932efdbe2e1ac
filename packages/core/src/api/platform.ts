import { z } from 'zod';

export const platformRinkRow = z.object({
  id: z.string(),
  slug: z.string(),
  name: z.string(),
  timeZone: z.string(),
  currency: z.string(),
  members: z.number().int(),
  customers: z.number().int(),
  createdAt: z.iso.datetime(),
});
export const platformRinkList = z.object({ rinks: z.array(platformRinkRow) });
export type PlatformRinkRow = z.infer<typeof platformRinkRow>;
