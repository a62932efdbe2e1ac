import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { expectNoProblems, openSession, signIn, useBrowser } from './browser';

// The platform console in a real browser against the demo: the platform admin sees both rinks with their plans
// and volume, reads Ice Harbor's reports and downloads one of its tables, suspends North Pond Arena (a reason is
// required), whose manager then meets the reason instead of the rink, and reactivates it, after which the
// manager's pages work again.

const REASON = 'Plan unpaid since the spring';

/** "1,234" → 1234. */
const countOf = (text: string | null) => Number((text ?? '').replace(/[^\d.]/g, ''));

/** The figure under a report card's label, as shown. */
const figure = (page: Page, label: string): Locator =>
  page.getByRole('term').filter({ hasText: new RegExp(`^${label}$`) }).locator('xpath=following-sibling::dd[1]');

/** The cells of one CSV line (RFC 4180 quoting: a quoted cell may hold commas and doubled quotes). */
function csvCells(line: string): string[] {
  return [...line.matchAll(/(?:^|,)(?:"((?:[^"]|"")*)"|([^,]*))/g)].map((m) => (m[1] !== undefined ? m[1].replaceAll('""', '"') : (m[2] ?? '')));
}

async function headerLabels(table: Locator): Promise<string[]> {
  return (await table.locator('thead th').allInnerTexts()).map((t) => t.replace(/[▲▼]/g, '').replace(/\s+/g, ' ').trim());
}

async function expectFitsWidth(page: Page): Promise<void> {
  expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
}

/** A table whose own scroller would hide columns (its actions, first of all) fails: everything is in view. */
async function expectTableFits(table: Locator): Promise<void> {
  expect(await table.locator('xpath=..').evaluate((scroller) => scroller.scrollWidth - scroller.clientWidth)).toBeLessThanOrEqual(0);
}

/** The console's columns, in order: the cells of a rink's row are read by the header they sit under. */
async function cellOf(page: Page, rink: string, header: string): Promise<Locator> {
  const table = page.getByRole('table', { name: 'Rinks on the platform' });
  const headers = await headerLabels(table);
  const index = headers.indexOf(header);
  expect(index, `no column "${header}" in ${headers.join(' | ')}`).toBeGreaterThanOrEqual(0);
  return table.locator('tbody tr').filter({ hasText: rink }).locator('td').nth(index);
}

describe('the platform console', () => {
  const browser = useBrowser();

  it('shows every rink, opens any rink’s reports, and suspends and reactivates a rink', async () => {
    const admin = await openSession(browser(), 'platform-admin');
    const { page } = admin;
    await signIn(admin, 'admin@rinkwright.test');
    await page.waitForURL('**/rinks');
    await page.getByRole('navigation', { name: 'Account' }).getByRole('link', { name: 'Platform', exact: true }).click();
    await page.waitForURL('**/platform');
    await page.getByRole('heading', { name: 'Platform console' }).waitFor();
    const table = page.getByRole('table', { name: 'Rinks on the platform' });
    await table.locator('tbody tr').filter({ hasText: 'North Pond Arena' }).waitFor();

    // Plans in words: the demo's North Pond Arena had its plan payment fail and is in its grace.
    await expect((await cellOf(page, 'Ice Harbor', 'Plan')).innerText()).resolves.toMatch(/^Active/);
    await expect((await cellOf(page, 'North Pond Arena', 'Plan')).innerText()).resolves.toMatch(/^In grace\s+Payment failed; read-only after /);
    await expect((await cellOf(page, 'Ice Harbor', 'Access')).innerText()).resolves.toBe('Open');
    await expect((await cellOf(page, 'North Pond Arena', 'Access')).innerText()).resolves.toBe('Open');
    const rows = await table.locator('tbody tr').count();
    expect(countOf(await figure(page, 'Rinks').textContent())).toBe(rows);
    await expect(page.getByRole('definition').filter({ hasText: 'None suspended' }).count()).resolves.toBe(1);

    // Ice Harbor's reports, as its own managers see them, under a heading that names the rink.
    await page.getByRole('link', { name: 'Reports of Ice Harbor' }).click();
    await page.waitForURL(/\/platform\/rinks\/[^/]+\/reports\/throughput$/);
    await page.getByRole('heading', { name: 'Ice Harbor: Throughput' }).waitFor();
    const pairs = figure(page, 'Pairs');
    await pairs.waitFor();
    expect(countOf(await pairs.textContent())).toBeGreaterThan(0);
    expect(countOf(await figure(page, 'Staffed hours').textContent())).toBeGreaterThan(0);
    await page.getByRole('img', { name: /^Pairs by day/ }).waitFor();
    const byStation = page.getByRole('table', { name: 'By station' });
    await expect(byStation.locator('tbody tr').count()).resolves.toBe(3);
    await expectFitsWidth(page);
    await admin.shot('ice-harbor-throughput');

    // The download is the platform's copy of the table: the screen's header row and one line per row.
    const region = page.getByRole('region', { name: 'By station' });
    const csvLink = region.getByRole('link', { name: /^Download CSV/ });
    expect(await csvLink.getAttribute('href')).toMatch(/^\/api\/platform\/rinks\/[^/]+\/reports\/throughput\/byStation\.csv\?from=/);
    const [download] = await Promise.all([page.waitForEvent('download'), csvLink.click()]);
    const lines = (await readFile(await download.path(), 'utf8')).trim().split(/\r?\n/);
    expect(csvCells(lines[0] ?? '')).toEqual(await headerLabels(byStation));
    expect(lines.length - 1).toBe(3);

    // The links between reports stay in the console.
    await page.getByRole('navigation', { name: 'Reports' }).getByRole('link', { name: 'Quality' }).click();
    await page.waitForURL(/\/platform\/rinks\/[^/]+\/reports\/quality$/);
    await page.getByRole('heading', { name: 'Ice Harbor: Quality' }).waitFor();
    const qualityTable = page.getByRole('table', { name: 'First readings by station' });
    await qualityTable.locator('tbody tr').first().waitFor();
    // Ice Harbor works in inches: readings in thousandths, as on the rink's own screens and in its CSV.
    expect(await headerLabels(qualityTable)).toContain('Mean absolute reading (thou)');
    await admin.shot('ice-harbor-quality');

    // Back in the console, the rink's volume, read from the report summaries: the worker brings them up to date on
    // its tick and every report read does too, so after the read above Ice Harbor's are current whatever the timing.
    await page.getByRole('navigation', { name: 'Breadcrumb' }).getByRole('link', { name: 'Platform console' }).click();
    await page.getByRole('heading', { name: 'Platform console' }).waitFor();
    const icePairsCell = await cellOf(page, 'Ice Harbor', 'Pairs last 30 days');
    await expect.poll(async () => countOf(await icePairsCell.innerText())).toBeGreaterThan(0);
    const icePairs = countOf(await icePairsCell.innerText());
    await expect((await cellOf(page, 'Ice Harbor', 'Fees last 30 days')).innerText()).resolves.toMatch(/\d/);
    await expect((await cellOf(page, 'Ice Harbor', 'Stations active / billed')).innerText()).resolves.toMatch(/^\d+ \/ \d+$/);
    // The totals add up the rows; fees are added per currency (both demo rinks take CAD, so one line).
    expect(countOf(await figure(page, 'Pairs, last 30 days').textContent())).toBeGreaterThanOrEqual(icePairs);
    await expect(figure(page, 'Platform fees, last 30 days').textContent()).resolves.toMatch(/\d/);
    await expect((await cellOf(page, 'Ice Harbor', 'Rink')).innerText()).resolves.toMatch(/\d+ staff · \d+ customers$/);
    await expectFitsWidth(page);
    await expectTableFits(table);
    await admin.shot('console');

    // Suspending asks why first: an empty reason is refused under its field, by the route's own schema.
    await page.getByRole('button', { name: 'Suspend North Pond Arena…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Suspend North Pond Arena' });
    await dialog.waitFor();
    await dialog.getByText('Nothing is deleted: its skaters keep their credits').waitFor();
    await dialog.getByRole('button', { name: 'Suspend North Pond Arena' }).click();
    await dialog.getByText('Say why, in a few words: the rink’s staff will read it').waitFor();
    await expect(dialog.getByLabel('Reason').getAttribute('aria-invalid')).resolves.toBe('true');
    await admin.shot('suspend-dialog');
    await dialog.getByLabel('Reason').fill(REASON);
    await dialog.getByRole('button', { name: 'Suspend North Pond Arena' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByText('North Pond Arena is suspended.').waitFor();
    await expect.poll(async () => (await cellOf(page, 'North Pond Arena', 'Access')).innerText()).toMatch(new RegExp(`^Suspended\\s+Since .+: ${REASON}$`));
    await page.getByRole('button', { name: 'Reactivate North Pond Arena' }).waitFor();
    await expect(page.getByRole('definition').filter({ hasText: '1 suspended' }).count()).resolves.toBe(1);
    await expectTableFits(table);
    await admin.shot('console-north-pond-suspended');

    // North Pond's manager meets the reason, not the rink, and a way on.
    const manager = await openSession(browser(), 'platform-north-manager');
    await signIn(manager, 'manager@north-pond.test');
    await manager.page.waitForURL('**/rinks/north-pond-arena');
    await manager.page.getByRole('heading', { name: 'North Pond Arena is suspended' }).waitFor();
    await expect(manager.page.getByTestId('suspended-message').textContent()).resolves.toContain(REASON);
    await expect(manager.page.getByRole('navigation', { name: 'North Pond Arena sections' }).count()).resolves.toBe(0);
    await manager.page.getByRole('link', { name: 'All my rinks' }).waitFor();
    await manager.shot('suspended-notice');
    await manager.page.goto('/rinks/north-pond-arena/stations');
    await manager.page.getByRole('heading', { name: 'North Pond Arena is suspended' }).waitFor();

    // Reactivated, the rink is the manager's again: checking again opens it, and its pages work.
    await page.getByRole('button', { name: 'Reactivate North Pond Arena' }).click();
    await page.getByText('North Pond Arena is reactivated').waitFor();
    await expect.poll(async () => (await cellOf(page, 'North Pond Arena', 'Access')).innerText()).toBe('Open');
    await manager.page.getByRole('button', { name: 'Check again' }).click();
    const sections = manager.page.getByRole('navigation', { name: 'North Pond Arena sections' });
    await sections.waitFor();
    await sections.getByRole('link', { name: 'Counter' }).click();
    await manager.page.waitForURL('**/rinks/north-pond-arena/counter');
    await expect(manager.page.getByRole('heading', { name: 'North Pond Arena is suspended' }).count()).resolves.toBe(0);
    await manager.page.getByRole('heading', { level: 1 }).first().waitFor();
    await expect(manager.page.getByRole('alert').filter({ hasText: 'suspended' }).count()).resolves.toBe(0);

    // The console is the platform admin's alone.
    await manager.page.goto('/platform');
    await manager.page.getByRole('heading', { name: 'We could not find that page' }).waitFor();

    expectNoProblems(admin);
    expectNoProblems(manager);
    await manager.context.close();
    await admin.context.close();
  });
});
