import { fileURLToPath } from 'node:url';
import { eq } from 'drizzle-orm';
import { createDbHandle, type Database } from './client';
import {
  addMember,
  createCustomer,
  createInvitation,
  createRink,
  createUser,
  memberCode,
  seededFaker,
  type StaffRole,
} from './factories';
import demo from './demo-sign-ins.json';
import { rink } from './schema/index';
import { seedBilling } from './seed-billing';
import { seedDesk } from './seed-desk';

// The demo: two independent, invented rinks. Everything comes from the shared factories and one fixed seed.
// The sign-ins are listed once, in a JSON file that `npm start` prints from as well.
export const DEMO_PASSWORD = demo.password;
const SEED = 20261201;

export async function seedDemo(db: Database): Promise<'seeded' | 'already-seeded'> {
  const existing = await db.select({ id: rink.id }).from(rink).where(eq(rink.slug, 'ice-harbor')).limit(1);
  if (existing.length > 0) return 'already-seeded';
  const faker = seededFaker(SEED);
  const random = () => faker.number.float({ min: 0, max: 1, fractionDigits: 8 });

  await db.transaction(async (tx) => {
    const person = (email: string, name: string, platformRole?: 'admin') =>
      createUser(tx, { email, name, password: DEMO_PASSWORD, verified: true, platformRole });

    await person('admin@rinkwright.test', 'Platform Admin', 'admin');
    const iceHarbor = await createRink(tx, {
      name: 'Ice Harbor',
      slug: 'ice-harbor',
      timeZone: 'America/Halifax',
      currency: 'CAD',
      unitPreference: 'in',
    });
    const northPond = await createRink(tx, {
      name: 'North Pond Arena',
      slug: 'north-pond-arena',
      timeZone: 'America/Winnipeg',
      currency: 'CAD',
      unitPreference: 'mm',
    });

    const staff: [string, string, string, StaffRole][] = [
      [iceHarbor.id, 'owner@ice-harbor.test', 'Rowan Okafor-Lind', 'owner'],
      [iceHarbor.id, 'manager@ice-harbor.test', 'Priya Vandermeer', 'manager'],
      [iceHarbor.id, 'tech@ice-harbor.test', 'Teodor Halloran', 'technician'],
      [iceHarbor.id, 'league@ice-harbor.test', 'Marisol Quennell', 'league_manager'],
      [northPond.id, 'manager@north-pond.test', 'Anneke Bramwell', 'manager'],
      [northPond.id, 'tech@north-pond.test', 'Desmond Aukett', 'technician'],
    ];
    const users = new Map<string, string>();
    for (const [rinkId, email, name, role] of staff) {
      const u = await person(email, name, undefined);
      users.set(email, u.id);
      await addMember(tx, rinkId, u.id, role);
    }
    const northOwner = await person('owner@north-pond.test', 'Ingrid Tallowmere');
    await addMember(tx, northPond.id, northOwner.id, 'owner');

    const skater = await person('skater@ice-harbor.test', 'Jun Castellane');
    await createCustomer(tx, iceHarbor.id, { name: 'Jun Castellane', email: skater.email, userId: skater.id, code: memberCode(random) });
    await createCustomer(tx, northPond.id, { name: 'Jun Castellane', email: skater.email, userId: skater.id, code: memberCode(random) });

    for (const [target, count] of [
      [iceHarbor.id, 40],
      [northPond.id, 15],
    ] as const) {
      for (let i = 0; i < count; i++) {
        const first = faker.person.firstName();
        const last = faker.person.lastName();
        const hasEmail = random() < 0.7;
        await createCustomer(tx, target, {
          name: `${first} ${last}`,
          email: hasEmail ? `${first}.${last}.${i}@skaters.example`.toLowerCase().replace(/[^a-z0-9.@-]/g, '') : null,
          phone: hasEmail && random() < 0.5 ? null : `555-01${String(i).padStart(2, '0')}`,
          code: memberCode(random),
        });
      }
    }

    const managerId = users.get('manager@ice-harbor.test');
    if (managerId) await createInvitation(tx, { rinkId: iceHarbor.id, inviterId: managerId, email: 'new-tech@ice-harbor.test', role: 'technician' });

    const now = new Date();
    const staffOf = (...emails: string[]) => emails.flatMap((e) => (users.get(e) ? [users.get(e) as string] : []));
    await seedDesk(tx as unknown as Database, faker, {
      rinkId: iceHarbor.id,
      technicianIds: staffOf('tech@ice-harbor.test', 'manager@ice-harbor.test'),
      stationNames: ['Bench 1', 'Bench 2', 'Bench 3'],
      driftingStation: 'Bench 2',
      ticketsPerDay: 12,
      priceMinor: 1200,
      days: 182,
      now,
    });
    await seedDesk(tx as unknown as Database, faker, {
      rinkId: northPond.id,
      technicianIds: staffOf('tech@north-pond.test', 'manager@north-pond.test'),
      stationNames: ['Main bench'],
      ticketsPerDay: 4,
      priceMinor: 1000,
      days: 182,
      now,
    });
    await seedBilling(tx as unknown as Database, faker, {
      rinkId: iceHarbor.id,
      currency: 'CAD',
      products: [
        { kind: 'punch_card', name: 'Ten sharpenings', credits: 10, priceMinor: 11000, monthsValid: 12, description: 'Ten standard sharpenings, a year to use them.' },
        { kind: 'punch_card', name: 'Five sharpenings', credits: 5, priceMinor: 5800, monthsValid: 6 },
        { kind: 'single', name: 'Single sharpening', credits: 1, priceMinor: 1200, monthsValid: 3 },
        { kind: 'membership', name: 'Monthly edge club', credits: 4, priceMinor: 3900, interval: 'month', rolloverCap: 2, graceDays: 7, description: 'Four sharpenings a month; up to two unused carry into the next month.' },
        { kind: 'league_pack', name: 'League pack of 100', credits: 100, priceMinor: 90000, monthsValid: 10 },
      ],
      sales: 140,
      technicianIds: staffOf('tech@ice-harbor.test', 'manager@ice-harbor.test'),
      managerId: users.get('manager@ice-harbor.test') ?? null,
      leagueManagerId: users.get('league@ice-harbor.test') ?? null,
      planState: 'active',
      stations: 3,
      now,
    });
    await seedBilling(tx as unknown as Database, faker, {
      rinkId: northPond.id,
      currency: 'CAD',
      products: [
        { kind: 'punch_card', name: 'Six sharpenings', credits: 6, priceMinor: 5400, monthsValid: 12 },
        { kind: 'single', name: 'Single sharpening', credits: 1, priceMinor: 1000, monthsValid: 3 },
      ],
      sales: 40,
      technicianIds: staffOf('tech@north-pond.test', 'manager@north-pond.test'),
      managerId: users.get('manager@north-pond.test') ?? null,
      planState: 'past_due',
      stations: 1,
      now,
    });
  });
  return 'seeded';
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const { dbEnv } = await import('./env');
  const handle = createDbHandle(dbEnv.DATABASE_URL, { connectionLimit: 2 });
  try {
    const outcome = await seedDemo(handle.db);
    console.log(outcome === 'seeded' ? 'demo data seeded' : 'demo data already present: left as it is');
  } finally {
    await handle.close();
  }
}
