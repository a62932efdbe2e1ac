import { and, asc, desc, eq, getTableColumns, like, or, sql } from 'drizzle-orm';
import { customer, customerSearch, preparedJoined, scoped, SEARCH_TERM_LENGTH, skateProfile, ticket } from '@rinkwright/db';

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/**
 * Name, e-mail or phone containing the text, or the exact member code (what the portal's code shows). The search
 * index narrows the rink's customers to those with a term starting with the text (or its digits) in one index
 * range; the full comparison then runs on those few.
 */
const recentCustomers = preparedJoined(customer, [], () => ({ fields: getTableColumns(customer), joins: [], orderBy: desc(customer.createdAt), limit: 25 }));

/** The search's select, with or without the phone's digits (a text of three digits or more). */
const matchingCustomers = (byDigits: boolean) =>
  preparedJoined(customer, ['textStart', 'digitsStart', 'text', 'code', 'digits'], (value, filter) => {
    const phoneDigits = sql`regexp_replace(${customer.phone}, '[^0-9]', '')`;
    const indexed = filter(customerSearch, or(like(customerSearch.term, value('textStart')), byDigits ? like(customerSearch.term, value('digitsStart')) : undefined));
    return {
      fields: getTableColumns(customer),
      joins: [],
      where: and(
        sql`${customer.id} in (select ${customerSearch.customerId} from ${customerSearch} where ${indexed})`,
        or(
          like(customer.name, value('text')),
          like(customer.email, value('text')),
          eq(customer.memberCode, value('code')),
          // Phones are stored as they were typed ("(555) 013-4477"), so both sides are compared as digits only.
          byDigits ? like(phoneDigits, value('digits')) : undefined,
        ),
      ),
      orderBy: asc(customer.name),
      limit: 25,
    };
  });
const searches = { text: matchingCustomers(false), textAndDigits: matchingCustomers(true) };

export function searchCustomers(tenantId: string, q: string) {
  const scope = scoped(tenantId);
  if (!q) return scope.run(recentCustomers, {});
  const digits = q.replace(/\D/g, '');
  const start = (part: string) => `${escapeLike(part.toLowerCase().slice(0, SEARCH_TERM_LENGTH))}%`;
  return scope.run(digits.length >= 3 ? searches.textAndDigits : searches.text, {
    textStart: start(q),
    digitsStart: start(digits),
    text: `%${escapeLike(q)}%`,
    code: q.toUpperCase(),
    digits: `%${digits}%`,
  });
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
