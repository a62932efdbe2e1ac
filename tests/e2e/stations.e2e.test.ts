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
    await session.shot('stations-empty');

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
    await mount.getByText('Shelf B wheel mounted.', { exact: false }).waitFor();
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
    await logCheckReading(session, '0.2');
    expect(await page.getByRole('region', { name: 'Station settings', exact: true }).count()).toBe(0);
    await session.shot('station');
    expectNoProblems(session);
    await session.context.close();
  });
});
