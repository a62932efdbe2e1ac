import { bigint, index, int, mysqlEnum, mysqlTable, primaryKey, text, unique, varchar, char } from 'drizzle-orm/mysql-core';
import { at, createdAt, id, ref, rinkFk, sameRinkFk, tenantId } from './columns';
import { customer } from './customers';
import { station, wheel } from './stations';

// The counter: services sold, skate profiles, tickets and their pairs, and the sharpening log with its level
// readings. The log is append-only: a mistake is fixed by a new row that points at the one it corrects.

export const serviceItem = mysqlTable(
  'service_item',
  {
    id: id(),
    tenantId: tenantId(),
    name: varchar('name', { length: 80 }).notNull(),
    kind: mysqlEnum('kind', ['standard', 'profiling', 'new_steel', 'add_on']).notNull(),
    priceMinor: int('price_minor').notNull(),
    active: int('active').notNull().default(1),
    createdAt: createdAt(),
  },
  (t) => [unique('service_item_tenant_id_unique').on(t.tenantId, t.id), rinkFk('service_item_rink_fk', t.tenantId)],
);

export const skateProfile = mysqlTable(
  'skate_profile',
  {
    id: id(),
    tenantId: tenantId(),
    customerId: ref('customer_id').notNull(),
    label: varchar('label', { length: 80 }).notNull(),
    bladeWidthNm: int('blade_width_nm'),
    preferredHollowNm: int('preferred_hollow_nm'),
    /** Rocker radius: metres long, so it needs more than 32 bits of nanometres. */
    profileRadiusNm: bigint('profile_radius_nm', { mode: 'number' }),
    notes: text('notes'),
    createdAt: createdAt(),
    updatedAt: at('updated_at').notNull(),
  },
  (t) => [
    unique('skate_profile_tenant_id_unique').on(t.tenantId, t.id),
    index('skate_profile_tenant_customer_idx').on(t.tenantId, t.customerId),
    rinkFk('skate_profile_rink_fk', t.tenantId),
    sameRinkFk('skate_profile_customer_fk', t.tenantId, t.customerId, customer.tenantId, customer.id),
  ],
);

/** How a ticket is paid: a credit per pair from the skater's account or a team's allocation, at the counter, or not at all. */
export const TICKET_PAYMENTS = ['credit', 'allocation', 'counter', 'no_charge'] as const;

export const TICKET_STATES = ['waiting', 'on_station', 'ready', 'collected', 'void'] as const;

/** One drop-off at the counter. Its state is the latest of its append-only events. */
export const ticket = mysqlTable(
  'ticket',
  {
    id: id(),
    tenantId: tenantId(),
    number: int('number').notNull(),
    customerId: ref('customer_id').notNull(),
    state: mysqlEnum('state', TICKET_STATES).notNull(),
    stationId: ref('station_id'),
    payment: mysqlEnum('payment', TICKET_PAYMENTS).notNull(),
    /** The account its pairs draw credits from, when paid by credit (a skater's account or a team allocation). */
    creditAccountId: ref('credit_account_id'),
    notes: text('notes'),
    droppedAt: at('dropped_at').notNull(),
    promisedAt: at('promised_at').notNull(),
    startedAt: at('started_at'),
    readyAt: at('ready_at'),
    collectedAt: at('collected_at'),
    voidReason: text('void_reason'),
    createdBy: ref('created_by').notNull(),
  },
  (t) => [
    unique('ticket_tenant_id_unique').on(t.tenantId, t.id),
    unique('ticket_tenant_number_unique').on(t.tenantId, t.number),
    index('ticket_tenant_state_idx').on(t.tenantId, t.state, t.promisedAt),
    index('ticket_tenant_customer_idx').on(t.tenantId, t.customerId, t.droppedAt),
    index('ticket_tenant_ready_idx').on(t.tenantId, t.readyAt),
    rinkFk('ticket_rink_fk', t.tenantId),
    sameRinkFk('ticket_customer_fk', t.tenantId, t.customerId, customer.tenantId, customer.id),
    sameRinkFk('ticket_station_fk', t.tenantId, t.stationId, station.tenantId, station.id),
  ],
);

export const ticketEvent = mysqlTable(
  'ticket_event',
  {
    id: id(),
    tenantId: tenantId(),
    ticketId: ref('ticket_id').notNull(),
    fromState: mysqlEnum('from_state', TICKET_STATES),
    toState: mysqlEnum('to_state', TICKET_STATES).notNull(),
    stationId: ref('station_id'),
    reason: text('reason'),
    at: at('at').notNull(),
    byUserId: ref('by_user_id').notNull(),
  },
  (t) => [
    index('ticket_event_tenant_ticket_idx').on(t.tenantId, t.ticketId, t.at),
    index('ticket_event_tenant_at_idx').on(t.tenantId, t.at),
    rinkFk('ticket_event_rink_fk', t.tenantId),
    sameRinkFk('ticket_event_ticket_fk', t.tenantId, t.ticketId, ticket.tenantId, ticket.id),
  ],
);

export const ticketPair = mysqlTable(
  'ticket_pair',
  {
    id: id(),
    tenantId: tenantId(),
    ticketId: ref('ticket_id').notNull(),
    position: int('position').notNull(),
    skateProfileId: ref('skate_profile_id'),
    label: varchar('label', { length: 80 }).notNull(),
    bladeWidthNm: int('blade_width_nm'),
    hollowNm: int('hollow_nm'),
    serviceId: ref('service_id').notNull(),
    priceMinor: int('price_minor').notNull(),
    notes: text('notes'),
  },
  (t) => [
    unique('ticket_pair_tenant_id_unique').on(t.tenantId, t.id),
    unique('ticket_pair_tenant_ticket_position_unique').on(t.tenantId, t.ticketId, t.position),
    rinkFk('ticket_pair_rink_fk', t.tenantId),
    sameRinkFk('ticket_pair_ticket_fk', t.tenantId, t.ticketId, ticket.tenantId, ticket.id),
    sameRinkFk('ticket_pair_service_fk', t.tenantId, t.serviceId, serviceItem.tenantId, serviceItem.id),
    sameRinkFk('ticket_pair_profile_fk', t.tenantId, t.skateProfileId, skateProfile.tenantId, skateProfile.id),
  ],
);

/** One blade pair done at a station. Never updated: a correction is a new row with corrects_id set. */
export const sharpening = mysqlTable(
  'sharpening',
  {
    id: id(),
    tenantId: tenantId(),
    ticketId: ref('ticket_id').notNull(),
    ticketPairId: ref('ticket_pair_id').notNull(),
    stationId: ref('station_id').notNull(),
    wheelId: ref('wheel_id'),
    technicianId: ref('technician_id').notNull(),
    hollowNm: int('hollow_nm').notNull(),
    passes: int('passes').notNull(),
    bladeWidthNm: int('blade_width_nm').notNull(),
    doneAt: at('done_at').notNull(),
    correctsId: ref('corrects_id'),
    correctionReason: text('correction_reason'),
    createdAt: createdAt(),
  },
  (t) => [
    unique('sharpening_tenant_id_unique').on(t.tenantId, t.id),
    index('sharpening_tenant_station_idx').on(t.tenantId, t.stationId, t.doneAt),
    // The report refresh: what was written since it last ran, and a day's pairs across stations.
    index('sharpening_tenant_created_idx').on(t.tenantId, t.createdAt),
    index('sharpening_tenant_done_idx').on(t.tenantId, t.doneAt),
    // A ticket's records, and how many of its pairs are done from the index alone (the ticket list counts them).
    index('sharpening_tenant_ticket_pair_idx').on(t.tenantId, t.ticketId, t.ticketPairId),
    index('sharpening_tenant_pair_idx').on(t.tenantId, t.ticketPairId),
    // A wheel's passes, summed from the index alone; and the corrections of a record.
    index('sharpening_tenant_wheel_idx').on(t.tenantId, t.wheelId, t.correctsId, t.doneAt, t.passes),
    index('sharpening_tenant_corrects_idx').on(t.tenantId, t.correctsId),
    rinkFk('sharpening_rink_fk', t.tenantId),
    sameRinkFk('sharpening_ticket_fk', t.tenantId, t.ticketId, ticket.tenantId, ticket.id),
    sameRinkFk('sharpening_pair_fk', t.tenantId, t.ticketPairId, ticketPair.tenantId, ticketPair.id),
    sameRinkFk('sharpening_station_fk', t.tenantId, t.stationId, station.tenantId, station.id),
    sameRinkFk('sharpening_wheel_fk', t.tenantId, t.wheelId, wheel.tenantId, wheel.id),
  ],
);

/**
 * A signed edge-level reading (nm; positive = the right-hand edge high). Readings of a sharpening are numbered
 * by attempt: a re-run adds attempt 2 and leaves attempt 1 as it was. Check readings belong to no sharpening.
 */
export const levelReading = mysqlTable(
  'level_reading',
  {
    id: id(),
    tenantId: tenantId(),
    stationId: ref('station_id').notNull(),
    sharpeningId: ref('sharpening_id'),
    kind: mysqlEnum('kind', ['sharpening', 'check']).notNull(),
    blade: mysqlEnum('blade', ['left', 'right']).notNull(),
    attempt: int('attempt').notNull(),
    readingNm: int('reading_nm').notNull(),
    /** Set when the reading was computed from a tilt angle, in thousandths of a degree. */
    tiltMillideg: int('tilt_millideg'),
    takenAt: at('taken_at').notNull(),
    takenBy: ref('taken_by').notNull(),
  },
  (t) => [
    index('level_reading_tenant_station_idx').on(t.tenantId, t.stationId, t.takenAt),
    index('level_reading_tenant_sharpening_idx').on(t.tenantId, t.sharpeningId, t.blade, t.attempt),
    index('level_reading_tenant_taken_idx').on(t.tenantId, t.takenAt),
    rinkFk('level_reading_rink_fk', t.tenantId),
    sameRinkFk('level_reading_station_fk', t.tenantId, t.stationId, station.tenantId, station.id),
    sameRinkFk('level_reading_sharpening_fk', t.tenantId, t.sharpeningId, sharpening.tenantId, sharpening.id),
  ],
);

/** The first answer to each client-made Idempotency-Key, per rink, replayed for a repeat of the same request. */
export const idempotencyKey = mysqlTable(
  'idempotency_key',
  {
    tenantId: tenantId(),
    key: varchar('idem_key', { length: 100 }).notNull(),
    route: varchar('route', { length: 200 }).notNull(),
    requestHash: char('request_hash', { length: 64 }).notNull(),
    statusCode: int('status_code').notNull(),
    responseBody: text('response_body').notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ name: 'idempotency_key_pk', columns: [t.tenantId, t.key] }), rinkFk('idempotency_key_rink_fk', t.tenantId)],
);
