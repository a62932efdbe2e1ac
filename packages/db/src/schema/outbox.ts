import { index, int, mysqlTable, primaryKey, text, unique, varchar } from 'drizzle-orm/mysql-core';
import { at, createdAt, id, ref } from './columns';

// Platform-wide tables of the background worker and the payment service. None holds a rink's business data
// behind the tenancy rule: a mail names its rink only to say where it came from.

/** Mail waiting to go out (or sent). The worker claims rows with SKIP LOCKED and retries with backoff. */
export const outboxMail = mysqlTable(
  'outbox_mail',
  {
    id: id(),
    tenantId: ref('tenant_id'),
    /** A reminder is sent once per thing it reminds of: "expiry:<lot id>", "low:<account id>:<entry id>". */
    dedupeKey: varchar('dedupe_key', { length: 160 }),
    to: varchar('to_address', { length: 320 }).notNull(),
    subject: varchar('subject', { length: 200 }).notNull(),
    text: text('body_text').notNull(),
    html: text('body_html').notNull(),
    /** 1 for a mail carrying a sign-in, reset or invitation link: its body is blanked once it is sent. */
    redactAfterSend: int('redact_after_send').notNull().default(0),
    attempts: int('attempts').notNull().default(0),
    nextAttemptAt: at('next_attempt_at').notNull(),
    sentAt: at('sent_at'),
    lastError: text('last_error'),
    createdAt: createdAt(),
  },
  (t) => [unique('outbox_mail_dedupe_unique').on(t.dedupeKey), index('outbox_mail_due_idx').on(t.sentAt, t.nextAttemptAt)],
);

/** Each payment-service event handled, by its id: a repeat delivery is answered without doing anything. */
export const paymentEvent = mysqlTable(
  'payment_event',
  {
    id: varchar('id', { length: 80 }).primaryKey(),
    type: varchar('type', { length: 80 }).notNull(),
    account: varchar('account', { length: 64 }),
    receivedAt: createdAt(),
  },
  (t) => [index('payment_event_received_idx').on(t.receivedAt)],
);

/** Objects the platform keeps on the payment service (its webhook endpoints with their secrets, the plan's price). */
export const paymentSetting = mysqlTable('payment_setting', {
  key: varchar('setting_key', { length: 120 }).primaryKey(),
  value: varchar('value', { length: 200 }).notNull(),
  secret: varchar('secret', { length: 200 }),
  updatedAt: at('updated_at').notNull(),
});

/** A scheduled job's run for a period ("expiry", "2026-12-01"), so several API processes run it once. */
export const jobRun = mysqlTable(
  'job_run',
  {
    job: varchar('job', { length: 60 }).notNull(),
    period: varchar('period', { length: 40 }).notNull(),
    startedAt: createdAt(),
    finishedAt: at('finished_at'),
  },
  (t) => [primaryKey({ name: 'job_run_pk', columns: [t.job, t.period] })],
);
