import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { memberCode } from '@rinkwright/core';
import { customer, customerSearch, customerSearchRows, directory, type Scope } from '@rinkwright/db';

/**
 * A new customer of the rink (a walk-up, an online buyer, a roster player) with a member code no other customer
 * of the rink has. If an account with this e-mail is verified, the record is linked to it at once.
 */
export async function insertNewCustomer(s: Scope, input: { name: string; email: string | null; phone: string | null }): Promise<string> {
  let code = memberCode();
  while ((await s.count(customer, eq(customer.memberCode, code))) > 0) code = memberCode();
  const account = input.email ? await directory.findUserByEmail(input.email) : undefined;
  const id = randomUUID();
  await s.transaction(async (tx) => {
    await tx.insert(customer, { id, name: input.name, email: input.email, phone: input.phone, memberCode: code, userId: account?.emailVerified ? account.id : null });
    await tx.insert(customerSearch, customerSearchRows({ id, tenantId: s.tenantId, memberCode: code, ...input }).map(({ tenantId: _rink, ...row }) => row));
  });
  return id;
}
