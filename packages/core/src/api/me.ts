import { z } from 'zod';
import { STAFF_ROLES } from '../roles';
import { unitPreference } from './rinks';

export const meResponse = z.object({
  user: z.object({
    id: z.string(),
    name: z.string(),
    email: z.string(),
    emailVerified: z.boolean(),
    platformAdmin: z.boolean(),
  }),
  rinks: z.array(
    z.object({
      slug: z.string(),
      name: z.string(),
      role: z.enum(STAFF_ROLES),
      timeZone: z.string(),
      currency: z.string(),
      unitPreference,
    }),
  ),
  customerOf: z.array(z.object({ slug: z.string(), name: z.string(), memberCode: z.string() })),
});
export type MeResponse = z.infer<typeof meResponse>;

export const publicConfig = z.object({ mailInboxUrl: z.string().nullable() });
export type PublicConfig = z.infer<typeof publicConfig>;
