import { and, asc, desc, eq, like, or, sql } from 'drizzle-orm';
import { customer, customerSearch, scoped, SEARCH_TERM_LENGTH, skateProfile, ticket } from '@rinkwright/db';

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/**
 * Name, e-mail or phone containing the text, or the exact member code (what the portal's code shows). The search
 * index narrows the rink's customers to those with a term starting with the text (or its digits) in one index
 * range; the full comparison then runs on those few.
 */
export function searchCustomers(tenantId: string, q: string, limit = 25) {
  const scope = scoped(tenantId);
  if (!q) return scope.find(customer, { orderBy: desc(customer.createdAt), limit });
  const text = `%${escapeLike(q)}%`;
  const digits = q.replace(/\D/g, '');
  const phoneDigits = sql`regexp_replace(${customer.phone}, '[^0-9]', '')`;
  const starts = (part: string) => like(customerSearch.term, `${escapeLike(part.toLowerCase().slice(0, SEARCH_TERM_LENGTH))}%`);
  const indexed = scope.filter(customerSearch, or(starts(q), digits.length >= 3 ? starts(digits) : undefined));
  const where = and(
    sql`${customer.id} in (select ${customerSearch.customerId} from ${customerSearch} where ${indexed})`,
    or(
      like(customer.name, text),
      like(customer.email, text),
      eq(customer.memberCode, q.toUpperCase()),
      // Phones are stored as they were typed ("(555) 013-4477"), so both sides are compared as digits only.
      digits.length >= 3 ? like(phoneDigits, `%${digits}%`) : undefined,
    ),
  );
  return scope.find(customer, { where, orderBy: asc(customer.name), limit });
}

export const findCustomer = (tenantId: string, customerId: string) => scoped(tenantId).findOne(customer, eq(customer.id, customerId));

export const profilesOf = (tenantId: string, customerId: string) =>
  scoped(tenantId).find(skateProfile, { where: eq(skateProfile.customerId, customerId), orderBy: asc(skateProfile.label) });

export const findProfile = (tenantId: string, customerId: string, profileId: string) =>
  scoped(tenantId).findOne(skateProfile, and(eq(skateProfile.id, profileId), eq(skateProfile.customerId, customerId))!);

export const insertProfile = (tenantId: string, row: Omit<typeof skateProfile.$inferInsert, 'tenantId'>) => scoped(tenantId).insert(skateProfile, row);

export const updateProfile = (tenantId: string, profileId: string, set: Partial<typeof skateProfile.$inferInsert>) =>
  scoped(tenantId).update(skateProfile, set, eq(skateProfile.id, profileId));

export const ticketsOf = (tenantId: string, customerId: string) =>
  scoped(tenantId).find(ticket, { where: eq(ticket.customerId, customerId), orderBy: desc(ticket.droppedAt), limit: 50 });
