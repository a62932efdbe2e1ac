import { describe, expect, it } from 'vitest';
import { expectNoProblems, openSession, signIn, useBrowser, type Session } from './browser';

// A manager sets up a station from nothing (the demo seed has none yet), does its upkeep from the browser and
// reads its quality page; then a technician finds it and logs a check reading. The readings after the adjustment
// drift steadily upward, so the drift watch has limits to draw and an alert to raise.

const STATION = 'Rinkside station';
const MINUS = '\u2212';
/** How the page writes a typed reading back: signed, one decimal, a real minus sign. */
const shown = (typed: string) => {
  const v = Number(typed);
  return v === 0 ? '0.0' : `${v < 0 ? MINUS : '+'}${Math.abs(v).toFixed(1)}`;
};

async function logCheckReading(session: Session, typed: string) {
  const form = session.page.getByRole('region', { name: 'Check reading', exact: true });
  await form.getByLabel('Level reading (thou)', { exact: true }).fill(typed);
  await form.getByRole('button', { name: 'Log check reading' }).click();
  await form.getByText(`Check reading logged: ${shown(typed)} thou`).waitFor();
}

describe('stations: upkeep and the quality page', () => {
  const browser = useBrowser();

  it('lets a manager add a station, mount and dress a wheel, log readings and an adjustment, and price a service', async () => {
    const session = await openSession(browser(), 'stations-manager');
    const { page } = session;
    await signIn(session, 'manager@ice-harbor.test');
    await page.waitForURL('**/rinks/ice-harbor');
    const sections = page.getByRole('navigation', { name: 'Ice Harbor sections' });
    await sections.getByRole('link', { name: 'Stations' }).click();
    await page.getByRole('heading', { name: 'Stations', exact: true }).waitFor();

    // The rink's bands are checked by the shared schema before anything is sent.
    const bands = page.getByRole('region', { name: 'Level bands and drift watch', exact: true });
    await bands.getByLabel('True up to ± (thou)', { exact: true }).fill('3');
    await bands.getByRole('button', { name: 'Save bands and drift watch' }).click();
    await bands.getByText('The fair limit must be at least the true limit').first().waitFor();
    await bands.getByLabel('True up to ± (thou)', { exact: true }).fill('1.0');
    await session.shot('stations');

    const add = page.getByRole('region', { name: 'Add a station', exact: true });
    await add.getByLabel('Station name', { exact: true }).fill(STATION);
    await add.getByLabel('Spindle speed (RPM)', { exact: true }).fill('3450');
    await add.getByRole('button', { name: 'Add station' }).click();
    await add.getByText(`${STATION} added.`).waitFor();
    await page.getByRole('heading', { name: STATION, level: 2 }).waitFor();
    await session.shot('station-added');

    await page.getByRole('link', { name: `Open ${STATION}: readings, drift watch and upkeep` }).click();
    await page.getByRole('heading', { name: STATION, level: 1 }).waitFor();
    const life = page.getByRole('region', { name: 'Wheel life', exact: true });
    await life.getByText('No wheel mounted.', { exact: false }).waitFor();

    // Mounting is refused until the ring-test box is ticked.
    const mount = page.getByRole('region', { name: 'Mount a wheel', exact: true });
    await mount.getByText('Ring-test and inspect a new wheel before mounting it', { exact: false }).waitFor();
    await mount.getByLabel('Wheel name', { exact: true }).fill('Shelf B wheel');
    await mount.getByLabel('Grit', { exact: true }).fill('100');
    await mount.getByLabel('Diameter new (in)', { exact: true }).fill('7');
    await mount.getByLabel('Minimum diameter (in)', { exact: true }).fill('5.5');
    await mount.getByLabel('Rated maximum speed (RPM)', { exact: true }).fill('4400');
    await mount.getByRole('button', { name: 'Mount wheel' }).click();
    await mount.getByText('Ring-test and inspect the wheel before mounting it').waitFor();
    await session.shot('mount-refused-without-ring-test');
    expect(await life.getByText('No wheel mounted.', { exact: false }).count()).toBe(1);

    await mount.getByLabel('I ring-tested and inspected this wheel', { exact: true }).check();
    await mount.getByRole('button', { name: 'Mount wheel' }).click();
    await page.getByText('Shelf B wheel mounted.', { exact: false }).waitFor();
    await page.getByRole('region', { name: 'Change the wheel', exact: true }).getByRole('button', { name: 'Mount a new wheel' }).waitFor();
    await life.getByText('SFPM', { exact: false }).first().waitFor();

    const dressing = page.getByRole('region', { name: 'Dressing', exact: true });
    await dressing.getByLabel('Dressed to the hollow', { exact: true }).selectOption({ label: '5/8"' });
    await dressing.getByLabel('Diameter after dressing (in)', { exact: true }).fill('6.95');
    await dressing.getByRole('button', { name: 'Log dressing' }).click();
    await dressing.getByText('Dressing logged: 5/8" hollow, 6.950" after.').waitFor();
    await page.getByRole('region', { name: 'Wheel log', exact: true }).getByRole('cell', { name: '5/8"', exact: true }).waitFor();

    await logCheckReading(session, '0.4');
    await logCheckReading(session, '-0.2');

    const adjustment = page.getByRole('region', { name: 'Leveling adjustment', exact: true });
    await adjustment.getByLabel('Adjustment made (turns of the adjusting screw)', { exact: true }).fill('0.1');
    await adjustment.getByRole('button', { name: 'Log adjustment' }).click();
    await adjustment.getByText('Use whole steps of 0.125 turn').waitFor();
    await adjustment.getByLabel('Adjustment made (turns of the adjusting screw)', { exact: true }).fill('+0.250');
    await adjustment.getByRole('button', { name: 'Log adjustment' }).click();
    await adjustment.getByText('Adjustment logged: +0.250 turn.', { exact: false }).waitFor();
    await page.getByRole('region', { name: 'Leveling adjustments', exact: true }).getByRole('cell', { name: '+0.250 turn' }).waitFor();

    for (const typed of ['0.3', '0.1', '0.5', '0.2', '0.6', '0.9', '1.3', '1.6', '2.0', '2.4']) await logCheckReading(session, typed);

    const advice = page.getByRole('region', { name: 'Leveling advice', exact: true });
    await advice.getByText(/Turn the adjusting screw [+−]\d\.\d{3} turns? \(± \d\.\d{2}\)|Level: no change|Too noisy to advise|Not enough readings/).waitFor();
    await page.getByRole('img', { name: /Level readings and the drift watch/ }).waitFor();
    await page.getByRole('alert').filter({ hasText: 'Drift alert' }).waitFor();
    const chart = page.getByRole('region', { name: 'Level readings and drift watch', exact: true });
    await chart.getByText('Show the readings as a table', { exact: false }).click();
    await chart.getByRole('cell', { name: '+2.4 thou' }).waitFor();
    await page.evaluate(() => window.scrollTo(0, 0));
    await session.shot('station-quality-page');

    // The station's own bands replace the rink's on its page.
    const settings = page.getByRole('region', { name: 'Station settings', exact: true });
    await settings.getByLabel("Its own level bands", { exact: true }).check();
    await settings.getByLabel('True up to (thou)', { exact: true }).fill('0.8');
    await settings.getByLabel('Fair up to (thou)', { exact: true }).fill('0.5');
    await settings.getByRole('button', { name: 'Save station' }).click();
    await settings.getByText('The fair limit must be at least the true limit').waitFor();
    await settings.getByLabel('Fair up to (thou)', { exact: true }).fill('1.6');
    await settings.getByRole('button', { name: 'Save station' }).click();
    await settings.getByText('Station saved.').waitFor();
    await page.getByText("this station's own bands: true up to ±0.8 thou, fair up to ±1.6 thou").waitFor();

    await sections.getByRole('link', { name: 'Services' }).click();
    await page.getByRole('heading', { name: 'Services', exact: true }).waitFor();
    const addService = page.getByRole('region', { name: 'Add a service', exact: true });
    await addService.getByLabel('Service name', { exact: true }).fill('Regular sharpening');
    await addService.getByLabel('Price (CAD)', { exact: true }).fill('12.5');
    await addService.getByRole('button', { name: 'Add service' }).click();
    await page.getByRole('cell', { name: 'Regular sharpening', exact: true }).waitFor();
    await page.getByRole('button', { name: 'Change Regular sharpening' }).click();
    const change = page.getByRole('region', { name: 'Change Regular sharpening', exact: true });
    await change.getByLabel('Price (CAD)', { exact: true }).fill('13.75');
    await change.getByRole('button', { name: 'Save service' }).click();
    await page.getByText('Regular sharpening saved.').waitFor();
    await page.getByRole('cell', { name: /13\.75/ }).waitFor();
    await session.shot('services');

    // The seeded stations carry months of history: their pages are the ones a manager reads day to day.
    await sections.getByRole('link', { name: 'Stations' }).click();
    await page.getByRole('heading', { name: STATION, level: 2 }).waitFor();
    const others = (await page.getByRole('link', { name: /^Open .*: readings, drift watch and upkeep$/ }).evaluateAll((links) => links.map((l) => l.getAttribute('aria-label') ?? ''))).filter(
      (name) => !name.startsWith(`Open ${STATION}:`),
    );
    // The list may show its cached copy for a moment while it refetches; wait for the mounted wheel.
    await page.getByText('Shelf B wheel, grit 100').waitFor();
    await session.shot('stations-with-history');
    for (const name of others) {
      await sections.getByRole('link', { name: 'Stations' }).click();
      await page.getByRole('link', { name, exact: true }).click();
      await page.getByRole('heading', { name: 'Leveling advice' }).waitFor();
      await session.shot(`seeded-${name.replace(/^Open (.*): .*$/, '$1').toLowerCase().replace(/\W+/g, '-')}`);
    }

    expectNoProblems(session);
    await session.context.close();
  });

  it('lets a technician read the station and log a check reading, without the manager forms', async () => {
    const session = await openSession(browser(), 'stations-technician');
    const { page } = session;
    await signIn(session, 'tech@ice-harbor.test');
    await page.waitForURL('**/rinks/ice-harbor');
    await page.getByRole('navigation', { name: 'Ice Harbor sections' }).getByRole('link', { name: 'Stations' }).click();
    await page.getByRole('heading', { name: STATION, level: 2 }).waitFor();
    expect(await page.getByRole('region', { name: 'Add a station', exact: true }).count()).toBe(0);
    await page.getByRole('region', { name: 'Level bands and drift watch', exact: true }).getByText('Precision bands').waitFor();
    await session.shot('stations');

    await page.getByRole('link', { name: `Open ${STATION}: readings, drift watch and upkeep` }).click();
    await page.getByRole('heading', { name: STATION, level: 1 }).waitFor();
    const tableToggle = page.getByText(/Show the readings as a table \((\d+), newest first\)/);
    const countOf = async () => Number(/\((\d+),/.exec((await tableToggle.textContent()) ?? '')?.[1]);
    const before = await countOf();

    // The answer to the first try is lost on the way back, after the server logged it: the second press sends
    // the same key, gets the first answer again, and the reading is there once.
    const keys: string[] = [];
    await page.route('**/check-readings', async (route) => {
      keys.push(route.request().headers()['idempotency-key'] ?? '');
      if (keys.length === 1) {
        await route.fetch();
        await route.abort('connectionreset');
      } else {
        await route.continue();
      }
    });
    const form = page.getByRole('region', { name: 'Check reading', exact: true });
    await form.getByLabel('Level reading (thou)', { exact: true }).fill('0.2');
    await form.getByRole('button', { name: 'Log check reading' }).click();
    await form.getByText('it will be logged once', { exact: false }).waitFor();
    await form.getByRole('button', { name: 'Log check reading' }).click();
    await form.getByText('Check reading logged: +0.2 thou').waitFor();
    expect(keys).toHaveLength(2);
    expect(keys[0]).toMatch(/^[\w-]{8,}$/);
    expect(keys[1]).toBe(keys[0]);
    await expect.poll(countOf).toBe(before + 1);
    await page.unroute('**/check-readings');
    await logCheckReading(session, '0.1');
    await expect.poll(countOf).toBe(before + 2);
    // The lost answer is logged by the browser as a failed load; that one is expected.
    session.problems.splice(0, session.problems.length, ...session.problems.filter((p) => !/ERR_CONNECTION_RESET/.test(p)));
    expect(await page.getByRole('region', { name: 'Station settings', exact: true }).count()).toBe(0);
    await session.shot('station');
    expectNoProblems(session);
    await session.context.close();
  });

  it('shows a millimetre rink its stations in millimetres and hundredths', async () => {
    const session = await openSession(browser(), 'stations-mm-rink');
    const { page } = session;
    await signIn(session, 'manager@north-pond.test');
    await page.waitForURL('**/rinks/north-pond-arena');
    await page.getByRole('navigation', { name: 'North Pond Arena sections' }).getByRole('link', { name: 'Stations' }).click();
    const bands = page.getByRole('region', { name: 'Level bands and drift watch', exact: true });
    await bands.getByLabel('True up to ± (0.01 mm)', { exact: true }).waitFor();
    await session.shot('stations');
    const open = page.getByRole('link', { name: /^Open .*: readings, drift watch and upkeep$/ }).first();
    if ((await open.count()) > 0) {
      await open.click();
      await page.getByRole('heading', { name: 'Leveling advice' }).waitFor();
      await page.getByRole('region', { name: 'Check reading', exact: true }).getByLabel('Level reading (0.01 mm)', { exact: true }).waitFor();
      await session.shot('station');
    }
    expectNoProblems(session);
    await session.context.close();
  });
});
