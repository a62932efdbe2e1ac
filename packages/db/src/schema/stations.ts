import { boolean, index, int, mysqlEnum, mysqlTable, primaryKey, text, unique, varchar } from 'drizzle-orm/mysql-core';
import { at, createdAt, id, ref, rinkFk, sameRinkFk, tenantId } from './columns';

// Stations (sharpening machines), their wheels, and their upkeep log. Lengths are integer nanometres.

/** The rink's counter settings: level bands, the default leveling response, the drift watch's parameters. */
export const deskSettings = mysqlTable(
  'desk_settings',
  {
    tenantId: tenantId(),
    trueNm: int('true_nm').notNull(),
    fairNm: int('fair_nm').notNull(),
    precisionTrueNm: int('precision_true_nm').notNull(),
    precisionFairNm: int('precision_fair_nm').notNull(),
    /** Change in reading per turn of the adjusting screw, used until a station has its own fit. */
    defaultResponseNmPerTurn: int('default_response_nm_per_turn').notNull(),
    defaultMinutesPerPair: int('default_minutes_per_pair').notNull(),
    ewmaLambdaMilli: int('ewma_lambda_milli').notNull(),
    ewmaKMilli: int('ewma_k_milli').notNull(),
    updatedAt: at('updated_at').notNull(),
  },
  (t) => [primaryKey({ name: 'desk_settings_pk', columns: [t.tenantId] }), rinkFk('desk_settings_rink_fk', t.tenantId)],
);

export const station = mysqlTable(
  'station',
  {
    id: id(),
    tenantId: tenantId(),
    name: varchar('name', { length: 80 }).notNull(),
    status: mysqlEnum('status', ['active', 'maintenance', 'retired']).notNull(),
    rpm: int('rpm').notNull(),
    adjustUnit: mysqlEnum('adjust_unit', ['turns', 'mm']).notNull(),
    /** Smallest adjustment the screw is set in, in thousandths of the unit. */
    adjustStepMilli: int('adjust_step_milli').notNull(),
    ownTrueNm: int('own_true_nm'),
    ownFairNm: int('own_fair_nm'),
    precision: boolean('precision').notNull().default(false),
    createdAt: createdAt(),
  },
  (t) => [
    unique('station_tenant_id_unique').on(t.tenantId, t.id),
    unique('station_tenant_name_unique').on(t.tenantId, t.name),
    rinkFk('station_rink_fk', t.tenantId),
  ],
);

export const wheel = mysqlTable(
  'wheel',
  {
    id: id(),
    tenantId: tenantId(),
    stationId: ref('station_id').notNull(),
    label: varchar('label', { length: 80 }).notNull(),
    grit: int('grit').notNull(),
    diameterNewNm: int('diameter_new_nm').notNull(),
    minDiameterNm: int('min_diameter_nm').notNull(),
    ratedMaxRpm: int('rated_max_rpm').notNull(),
    mountedAt: at('mounted_at').notNull(),
    mountedBy: ref('mounted_by').notNull(),
    removedAt: at('removed_at'),
  },
  (t) => [
    unique('wheel_tenant_id_unique').on(t.tenantId, t.id),
    index('wheel_tenant_station_idx').on(t.tenantId, t.stationId, t.removedAt),
    rinkFk('wheel_rink_fk', t.tenantId),
    sameRinkFk('wheel_station_fk', t.tenantId, t.stationId, station.tenantId, station.id),
  ],
);

/** Append-only: mounting, each dressing (with the hollow dressed and the diameter after), removal. */
export const wheelEvent = mysqlTable(
  'wheel_event',
  {
    id: id(),
    tenantId: tenantId(),
    wheelId: ref('wheel_id').notNull(),
    stationId: ref('station_id').notNull(),
    kind: mysqlEnum('kind', ['mount', 'dressing', 'removal']).notNull(),
    hollowNm: int('hollow_nm'),
    diameterNm: int('diameter_nm'),
    note: text('note'),
    at: at('at').notNull(),
    byUserId: ref('by_user_id').notNull(),
  },
  (t) => [
    index('wheel_event_tenant_wheel_idx').on(t.tenantId, t.wheelId, t.at),
    rinkFk('wheel_event_rink_fk', t.tenantId),
    sameRinkFk('wheel_event_wheel_fk', t.tenantId, t.wheelId, wheel.tenantId, wheel.id),
  ],
);

/** Append-only: a correction of the blade holder alignment, in signed thousandths of the station's unit. */
export const levelingAdjustment = mysqlTable(
  'leveling_adjustment',
  {
    id: id(),
    tenantId: tenantId(),
    stationId: ref('station_id').notNull(),
    amountMilli: int('amount_milli').notNull(),
    note: text('note'),
    at: at('at').notNull(),
    byUserId: ref('by_user_id').notNull(),
  },
  (t) => [
    index('leveling_adjustment_tenant_station_idx').on(t.tenantId, t.stationId, t.at),
    rinkFk('leveling_adjustment_rink_fk', t.tenantId),
    sameRinkFk('leveling_adjustment_station_fk', t.tenantId, t.stationId, station.tenantId, station.id),
  ],
);

