import { z } from 'zod';
import { email, id } from './common';

// Requests and responses of the counter and the stations. Every length is an integer number of nanometres
// (1 in = 25,400,000 nm exactly): the web app converts from the rink's unit, so nothing is lost either way.

const nm = z.number().int();
const positiveNm = nm.positive('Must be more than zero');
const optionalText = (max: number) => z.string().trim().max(max).optional();
export const isoTime = z.iso.datetime();

// ---- stations ------------------------------------------------------------------------------------------
export const stationStatus = z.enum(['active', 'maintenance', 'retired']);
export const adjustUnit = z.enum(['turns', 'mm']);

export const stationInput = z
  .object({
    name: z.string().trim().min(1, 'Give the station a name').max(80),
    status: stationStatus.default('active'),
    rpm: z.number().int().min(100, 'At least 100 RPM').max(10_000, 'At most 10,000 RPM'),
    adjustUnit: adjustUnit.default('turns'),
    adjustStepMilli: z.number().int().min(1, 'At least 0.001').max(1000, 'At most 1'),
    ownTrueNm: positiveNm.nullable().default(null),
    ownFairNm: positiveNm.nullable().default(null),
    precision: z.boolean().default(false),
  })
  .refine((s) => (s.ownTrueNm === null) === (s.ownFairNm === null), { message: 'Give both limits or neither', path: ['ownFairNm'] })
  .refine((s) => s.ownTrueNm === null || s.ownFairNm === null || s.ownTrueNm <= s.ownFairNm, {
    message: 'The fair limit must be at least the true limit',
    path: ['ownFairNm'],
  });
export type StationInput = z.infer<typeof stationInput>;
export const stationParams = z.object({ rinkSlug: z.string(), stationId: id });

export const wheelSummary = z.object({
  id: z.string(),
  label: z.string(),
  grit: z.number().int(),
  diameterNewNm: nm,
  minDiameterNm: nm,
  ratedMaxRpm: z.number().int(),
  mountedAt: isoTime,
  hollowNm: nm.nullable(),
  diameterNm: nm,
  passesSinceMount: z.number().int(),
});

export const stationRow = z.object({
  id: z.string(),
  name: z.string(),
  status: stationStatus,
  rpm: z.number().int(),
  adjustUnit,
  adjustStepMilli: z.number().int(),
  ownTrueNm: nm.nullable(),
  ownFairNm: nm.nullable(),
  precision: z.boolean(),
  wheel: wheelSummary.nullable(),
  queue: z.object({ waiting: z.number().int(), onStation: z.number().int() }),
  /** The drift watch over the station's latest readings raises an alert (shown on the station and the counter). */
  driftAlert: z.boolean(),
});
export type StationRow = z.infer<typeof stationRow>;
export const stationList = z.object({ stations: z.array(stationRow) });

export const mountWheelInput = z
  .object({
    label: z.string().trim().min(1, 'Name the wheel').max(80),
    grit: z.number().int().min(24).max(400),
    diameterNewNm: positiveNm,
    minDiameterNm: positiveNm,
    ratedMaxRpm: z.number().int().min(100).max(30_000),
    hollowNm: positiveNm,
    ringTested: z.literal(true, 'Ring-test and inspect the wheel before mounting it'),
  })
  .refine((w) => w.minDiameterNm < w.diameterNewNm, { message: 'The minimum must be smaller than the new diameter', path: ['minDiameterNm'] });
export type MountWheelInput = z.infer<typeof mountWheelInput>;

export const dressingInput = z.object({ hollowNm: positiveNm, diameterNm: positiveNm, note: optionalText(500) });
export type DressingInput = z.infer<typeof dressingInput>;

export const adjustmentInput = z.object({
  amountMilli: z.number().int().min(-100_000).max(100_000).refine((v) => v !== 0, 'An adjustment of zero changes nothing'),
  note: optionalText(500),
});
export type AdjustmentInput = z.infer<typeof adjustmentInput>;

export const checkReadingInput = z.object({ blade: z.enum(['left', 'right']).default('left'), readingNm: nm });
export type CheckReadingInput = z.infer<typeof checkReadingInput>;

// ---- desk settings ---------------------------------------------------------------------------------------
export const deskSettings = z
  .object({
    trueNm: positiveNm,
    fairNm: positiveNm,
    precisionTrueNm: positiveNm,
    precisionFairNm: positiveNm,
    defaultResponseNmPerTurn: nm.refine((v) => v !== 0, 'The response cannot be zero'),
    defaultMinutesPerPair: z.number().int().min(1).max(120),
    ewmaLambdaMilli: z.number().int().min(50, 'λ at least 0.05').max(1000, 'λ at most 1'),
    ewmaKMilli: z.number().int().min(1000, 'L at least 1').max(5000, 'L at most 5'),
  })
  .refine((s) => s.trueNm <= s.fairNm, { message: 'The fair limit must be at least the true limit', path: ['fairNm'] })
  .refine((s) => s.precisionTrueNm <= s.precisionFairNm, { message: 'The fair limit must be at least the true limit', path: ['precisionFairNm'] })
  .refine((s) => s.precisionFairNm <= s.fairNm, { message: 'Precision limits are the tighter ones', path: ['precisionFairNm'] })
  .refine((s) => s.precisionTrueNm <= s.trueNm, { message: 'Precision limits are the tighter ones', path: ['precisionTrueNm'] });
export type DeskSettings = z.infer<typeof deskSettings>;

// ---- services --------------------------------------------------------------------------------------------
export const serviceKind = z.enum(['standard', 'profiling', 'new_steel', 'add_on']);
export const serviceInput = z.object({
  name: z.string().trim().min(1, 'Name the service').max(80),
  kind: serviceKind,
  priceMinor: z.number().int().min(0, 'A price cannot be negative').max(10_000_000),
  active: z.boolean().default(true),
});
export type ServiceInput = z.infer<typeof serviceInput>;
export const serviceRow = serviceInput.extend({ id: z.string() });
export type ServiceRow = z.infer<typeof serviceRow>;
export const serviceList = z.object({ services: z.array(serviceRow) });
export const serviceParams = z.object({ rinkSlug: z.string(), serviceId: id });

// ---- customers and skate profiles ------------------------------------------------------------------------
/** A walk-up needs only a name; the counter's form also asks for one way to reach them. */
export const createCustomerInput = z.object({
    name: z.string().trim().min(1, 'Enter a name').max(200),
    email: email.optional(),
    phone: z
      .string()
      .trim()
      .max(32)
      .regex(/^[+\d][\d\s().-]{5,}$/, 'Enter a phone number')
      .optional(),
  });
export type CreateCustomerInput = z.infer<typeof createCustomerInput>;

export const customerRow = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string().nullable(),
  phone: z.string().nullable(),
  memberCode: z.string(),
  linked: z.boolean(),
  createdAt: isoTime,
});
export type CustomerRow = z.infer<typeof customerRow>;
export const customerSearch = z.object({ q: z.string().trim().max(100).default('') });
export const customerList = z.object({ customers: z.array(customerRow) });
export const customerParams = z.object({ rinkSlug: z.string(), customerId: id });

export const skateProfileInput = z.object({
  label: z.string().trim().min(1, 'Label the pair, e.g. "Game skates"').max(80),
  bladeWidthNm: positiveNm.nullable().default(null),
  preferredHollowNm: positiveNm.nullable().default(null),
  profileRadiusNm: positiveNm.nullable().default(null),
  notes: z.string().trim().max(1000).nullable().default(null),
});
export type SkateProfileInput = z.infer<typeof skateProfileInput>;
export const skateProfileRow = skateProfileInput.extend({ id: z.string(), updatedAt: isoTime });
export type SkateProfileRow = z.infer<typeof skateProfileRow>;
export const customerDetail = z.object({
  customer: customerRow,
  profiles: z.array(skateProfileRow),
  tickets: z.array(z.object({ id: z.string(), number: z.number().int(), state: z.enum(['waiting', 'on_station', 'ready', 'collected', 'void']), droppedAt: isoTime, readyAt: isoTime.nullable() })),
});
export type CustomerDetail = z.infer<typeof customerDetail>;
export const profileParams = z.object({ rinkSlug: z.string(), customerId: id, profileId: id });

// ---- tickets ---------------------------------------------------------------------------------------------
export const ticketState = z.enum(['waiting', 'on_station', 'ready', 'collected', 'void']);
export type TicketState = z.infer<typeof ticketState>;
export const payment = z.enum(['credit', 'allocation', 'counter', 'no_charge']);

export const pairInput = z.object({
  skateProfileId: id.nullable().default(null),
  label: z.string().trim().min(1, 'Label the pair').max(80),
  bladeWidthNm: positiveNm.nullable().default(null),
  hollowNm: positiveNm.nullable().default(null),
  serviceId: id,
  notes: z.string().trim().max(500).nullable().default(null),
});
export type PairInput = z.infer<typeof pairInput>;

export const createTicketInput = z.object({
  customerId: id,
  payment: payment.default('counter'),
  /** With payment 'allocation': the league team whose allocation the pairs draw from. */
  teamId: id.nullable().default(null),
  pairs: z.array(pairInput).min(1, 'Add at least one pair').max(60, 'At most 60 pairs on one ticket'),
  notes: z.string().trim().max(1000).nullable().default(null),
});
export type CreateTicketInput = z.infer<typeof createTicketInput>;

export const ticketParams = z.object({ rinkSlug: z.string(), ticketId: id });
export const ticketFilter = z.object({
  state: z.union([ticketState, z.literal('open')]).default('open'),
  stationId: id.optional(),
  customerId: id.optional(),
});

export const transitionInput = z.discriminatedUnion('to', [
  z.object({ to: z.literal('on_station'), stationId: id }),
  z.object({ to: z.literal('waiting') }),
  z.object({ to: z.literal('ready') }),
  z.object({ to: z.literal('collected') }),
  z.object({ to: z.literal('void'), reason: z.string().trim().min(3, 'Say why the ticket is void').max(500) }),
]);
export type TransitionInput = z.infer<typeof transitionInput>;

export const readingRow = z.object({
  id: z.string(),
  blade: z.enum(['left', 'right']),
  attempt: z.number().int(),
  readingNm: nm,
  tiltMillideg: z.number().int().nullable(),
  takenAt: isoTime,
  takenBy: z.string(),
});
export type ReadingRow = z.infer<typeof readingRow>;

export const sharpeningRow = z.object({
  id: z.string(),
  ticketPairId: z.string(),
  stationId: z.string(),
  stationName: z.string(),
  wheelId: z.string().nullable(),
  technician: z.string(),
  hollowNm: nm,
  passes: z.number().int(),
  bladeWidthNm: nm,
  doneAt: isoTime,
  correctsId: z.string().nullable(),
  correctionReason: z.string().nullable(),
  readings: z.array(readingRow),
});
export type SharpeningRow = z.infer<typeof sharpeningRow>;

export const ticketPairRow = z.object({
  id: z.string(),
  position: z.number().int(),
  label: z.string(),
  skateProfileId: z.string().nullable(),
  bladeWidthNm: nm.nullable(),
  hollowNm: nm.nullable(),
  serviceId: z.string(),
  serviceName: z.string(),
  priceMinor: z.number().int(),
  notes: z.string().nullable(),
  sharpenings: z.array(sharpeningRow),
});
export type TicketPairRow = z.infer<typeof ticketPairRow>;

export const ticketEventRow = z.object({
  fromState: ticketState.nullable(),
  toState: ticketState,
  stationName: z.string().nullable(),
  reason: z.string().nullable(),
  at: isoTime,
  by: z.string(),
});

export const ticketSummary = z.object({
  id: z.string(),
  number: z.number().int(),
  state: ticketState,
  customer: z.object({ id: z.string(), name: z.string(), memberCode: z.string() }),
  stationId: z.string().nullable(),
  payment,
  droppedAt: isoTime,
  promisedAt: isoTime,
  readyAt: isoTime.nullable(),
  pairCount: z.number().int(),
  pairsDone: z.number().int(),
});
export type TicketSummary = z.infer<typeof ticketSummary>;
export const ticketList = z.object({ tickets: z.array(ticketSummary) });

export const ticketDetail = ticketSummary.extend({
  notes: z.string().nullable(),
  voidReason: z.string().nullable(),
  pairs: z.array(ticketPairRow),
  events: z.array(ticketEventRow),
});
export type TicketDetail = z.infer<typeof ticketDetail>;

export const promiseQuery = z.object({ pairs: z.coerce.number().int().min(1).max(60).default(1) });
export const promiseResponse = z.object({ promisedAt: isoTime, minutesPerPair: z.number(), stationsActive: z.number().int() });

// ---- sharpening log --------------------------------------------------------------------------------------
/** A reading is entered as a signed height difference, or as the tilt angle of a bar resting on both edges. */
export const readingInput = z.union([
  z.object({ blade: z.enum(['left', 'right']), readingNm: nm.min(-2_540_000).max(2_540_000) }),
  z.object({ blade: z.enum(['left', 'right']), tiltDeg: z.number().min(-20).max(20) }),
]);
export type ReadingInput = z.infer<typeof readingInput>;

export const logSharpeningInput = z.object({
  /** The pair on the ticket; in batch mode a new pair is added to the ticket instead. */
  pairId: id.optional(),
  newPair: pairInput.optional(),
  stationId: id,
  hollowNm: positiveNm,
  passes: z.number().int().min(1, 'At least one pass').max(200, 'At most 200 passes'),
  bladeWidthNm: positiveNm,
  readings: z.array(readingInput).max(2).default([]),
}).refine((s) => (s.pairId === undefined) !== (s.newPair === undefined), { message: 'Name the pair, or add a new one', path: ['pairId'] });
export type LogSharpeningInput = z.infer<typeof logSharpeningInput>;

export const sharpeningParams = z.object({ rinkSlug: z.string(), sharpeningId: id });

export const rerunReadingInput = z.object({ readings: z.array(readingInput).min(1).max(2) });
export const correctionInput = z.object({
  reason: z.string().trim().min(3, 'Say what was wrong').max(500),
  hollowNm: positiveNm,
  passes: z.number().int().min(1).max(200),
  bladeWidthNm: positiveNm,
});
export type CorrectionInput = z.infer<typeof correctionInput>;
export type RerunReadingInput = z.infer<typeof rerunReadingInput>;

// ---- a station's quality page ----------------------------------------------------------------------------
export const levelBand = z.enum(['true', 'fair', 'off']);

export const stationDetail = z.object({
  station: stationRow,
  bands: z.object({ trueNm: nm, fairNm: nm, source: z.enum(['station', 'rink']), precision: z.boolean() }),
  /** The latest first readings of each blade and check readings, oldest first: the series the drift watch charts (drift.ewma is aligned with it). */
  readings: z.array(z.object({ takenAt: isoTime, readingNm: nm, band: levelBand, kind: z.enum(['sharpening', 'check']) })),
  bandMix: z.object({ true: z.number().int(), fair: z.number().int(), off: z.number().int() }),
  drift: z.object({
    status: z.enum(['not_enough_data', 'watching']),
    alert: z.boolean(),
    reasons: z.array(z.object({ chart: z.string(), rule: z.string().optional(), index: z.number().int(), valueNm: z.number() })),
    mean: z.number().nullable(),
    ucl: z.number().nullable(),
    lcl: z.number().nullable(),
    ewma: z.array(z.number()),
    ewmaUcl: z.number().nullable(),
    ewmaLcl: z.number().nullable(),
  }),
  /** The leveling advice as computed (kind: advise | level | not_enough_data | too_noisy), with its numbers. */
  advice: z.looseObject({ kind: z.enum(['advise', 'level', 'not_enough_data', 'too_noisy']) }),
  adjustments: z.array(z.object({ at: isoTime, amountMilli: z.number().int(), note: z.string().nullable(), by: z.string(), beforeNm: z.number().nullable(), afterNm: z.number().nullable() })),
  wheelLife: z
    .object({
      wearPerPassNm: z.number().nullable(),
      passesLeft: z.number().nullable(),
      daysLeft: z.number().nullable(),
      predictedAt: isoTime.nullable(),
      atOrBelowMinimum: z.boolean(),
      sfpm: z.number(),
      speedStatus: z.enum(['within', 'over', 'unrated']),
      maxRpm: z.number().nullable(),
    })
    .nullable(),
  wheelEvents: z.array(z.object({ kind: z.enum(['mount', 'dressing', 'removal']), hollowNm: nm.nullable(), diameterNm: nm.nullable(), at: isoTime, note: z.string().nullable() })),
});
export type StationDetail = z.infer<typeof stationDetail>;
