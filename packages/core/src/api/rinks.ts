import { z } from 'zod';
import { STAFF_ROLES } from '../roles';

// Intl's list leaves out aliases such as UTC on some engines, so a zone is valid when Intl can use it.
const timeZones = new Set([...Intl.supportedValuesOf('timeZone'), 'UTC']);
function isTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone });
    return zone.length > 0;
  } catch {
    return false;
  }
}
const currencies = new Set(Intl.supportedValuesOf('currency'));

export const RESERVED_SLUGS = ['new', 'api', 'admin', 'platform', 'settings', 'app'] as const;

export const rinkSlug = z
  .string()
  .trim()
  .toLowerCase()
  .min(3, 'At least 3 characters')
  .max(48, 'At most 48 characters')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Lower-case letters, digits and single dashes')
  .refine((s) => !(RESERVED_SLUGS as readonly string[]).includes(s), 'That address is reserved');

export const unitPreference = z.enum(['in', 'mm']);
export type UnitPreference = z.infer<typeof unitPreference>;

const rinkFields = {
  name: z.string().trim().min(2, 'At least 2 characters').max(120, 'At most 120 characters'),
  timeZone: z.string().max(64).refine(isTimeZone, 'Choose a time zone from the list'),
  currency: z
    .string()
    .trim()
    .toUpperCase()
    .refine((c) => currencies.has(c), 'Use a three-letter currency code such as CAD or USD'),
  unitPreference,
};

export const createRinkInput = z.object({ ...rinkFields, slug: rinkSlug });
export type CreateRinkInput = z.infer<typeof createRinkInput>;

export const updateRinkInput = z.object(rinkFields).partial();
export type UpdateRinkInput = z.infer<typeof updateRinkInput>;

export const rinkParams = z.object({ rinkSlug: z.string().min(1).max(64) });

export const rinkSummary = z.object({
  id: z.string(),
  slug: z.string(),
  name: z.string(),
  timeZone: z.string(),
  currency: z.string(),
  unitPreference,
  role: z.enum(STAFF_ROLES),
  permissions: z.record(z.string(), z.array(z.string())),
  counts: z.object({ members: z.number().int(), pendingInvitations: z.number().int(), customers: z.number().int() }),
  createdAt: z.iso.datetime(),
});
export type RinkSummary = z.infer<typeof rinkSummary>;

export function listTimeZones(): string[] {
  return [...timeZones];
}
