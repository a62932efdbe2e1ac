import { asc, eq } from 'drizzle-orm';
import { scoped, serviceItem } from '@rinkwright/db';

export const listServices = (tenantId: string) => scoped(tenantId).find(serviceItem, { orderBy: [asc(serviceItem.kind), asc(serviceItem.name)] });
export const findService = (tenantId: string, serviceId: string) => scoped(tenantId).findOne(serviceItem, eq(serviceItem.id, serviceId));
export const insertService = (tenantId: string, row: Omit<typeof serviceItem.$inferInsert, 'tenantId'>) => scoped(tenantId).insert(serviceItem, row);
export const updateService = (tenantId: string, serviceId: string, set: Partial<typeof serviceItem.$inferInsert>) =>
  scoped(tenantId).update(serviceItem, set, eq(serviceItem.id, serviceId));
