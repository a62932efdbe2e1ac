import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import { expectNoProblems, openSession, signIn, useBrowser, type Session } from './browser';

// The report screens in a real browser against the demo's six months of history: a manager reads throughput for
// the default period, narrows it to one station (the address and the figures follow), compares it with the period
// before, reads quality and money, and downloads a table whose CSV header is the table's own header; the league
// manager finds only the league usage report.

const ICE = '/rinks/ice-harbor';

interface Choices {
  today: string;
  stations: { id: string; name: string }[];
}

async function staffSession(browser: () => Browser, label: string, email: string): Promise<Session> {
  const session = await openSession(browser(), label);
  await signIn(session, email);
  await session.page.waitForURL(`**${ICE}`);
  return session;
}

/** A JSON answer of the API, read with the page's own session cookie. */
async function apiGet<T>(page: Page, path: string): Promise<T> {
  return page.evaluate(async (p) => {
    const res = await fetch(p);
    if (!res.ok) throw new Error(`${p} answered ${res.status}`);
    return (await res.json()) as unknown;
  }, path) as Promise<T>;
}

/** The figure under a card's label, as shown. */
const figure = (page: Page, label: string): Locator =>
  page.getByRole('term').filter({ hasText: new RegExp(`^${label}$`) }).locator('xpath=following-sibling::dd[1]');

/** "1,234" → 1234. */
const countOf = (text: string | null) => Number((text ?? '').replace(/[^\d.]/g, ''));

/** A period as the page writes it, in the browser's own locale. */
const formatPeriodIn = (page: Page, from: string, to: string) =>
  page.evaluate(([f, t]) => {
    const day = (d: string) => new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeZone: 'UTC' }).format(new Date(`${d}T00:00:00Z`));
    return `${day(f ?? '')} – ${day(t ?? '')}`;
  }, [from, to]);

const dayMinus = (day: string, days: number) => new Date(Date.parse(`${day}T00:00:00Z`) - days * 86_400_000).toISOString().slice(0, 10);

/** The cells of one CSV line (RFC 4180 quoting: a quoted cell may hold commas and doubled quotes). */
function csvCells(line: string): string[] {
  return [...line.matchAll(/(?:^|,)(?:"((?:[^"]|"")*)"|([^,]*))/g)].map((m) => (m[1] !== undefined ? m[1].replaceAll('""', '"') : (m[2] ?? '')));
}

async function headerLabels(table: Locator): Promise<string[]> {
  return (await table.locator('thead th').allInnerTexts()).map((t) => t.replace(/[▲▼]/g, '').trim());
}

async function expectFitsWidth(page: Page): Promise<void> {
  expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
}

describe('the report screens', () => {
  const browser = useBrowser();

  it('lets a manager read, filter, compare and download the reports', async () => {
    const manager = await staffSession(browser, 'reports-manager', 'manager@ice-harbor.test');
    const { page } = manager;
    const choices = await apiGet<Choices>(page, `/api${ICE}/reports`);
    const bench2 = choices.stations.find((s) => s.name === 'Bench 2');
    expect(bench2).toBeDefined();

    await page.getByRole('navigation', { name: 'Ice Harbor sections' }).getByRole('link', { name: 'Reports' }).click();
    await page.waitForURL(`**${ICE}/reports/throughput`);
    await page.getByRole('heading', { name: 'Reports: Throughput' }).waitFor();
    const filters = page.getByRole('form', { name: 'Report filters' });
    // The default period: the last 30 days, ending on the rink's today.
    await expect(filters.getByLabel('From').inputValue()).resolves.toBe(dayMinus(choices.today, 29));
    await expect(filters.getByLabel('To').inputValue()).resolves.toBe(choices.today);
    const pairs = figure(page, 'Pairs');
    await pairs.waitFor();
    const allPairs = countOf(await pairs.textContent());
    expect(allPairs).toBeGreaterThan(0);
    expect(countOf(await figure(page, 'Staffed hours').textContent())).toBeGreaterThan(0);
    await expect(figure(page, 'Median turnaround').textContent()).resolves.toMatch(/\d+ (min|h)/);
    await page.getByRole('img', { name: /^Pairs by day/ }).waitFor();
    await page.getByRole('img', { name: /^Pairs by weekday and hour/ }).waitFor();
    const byStation = page.getByRole('table', { name: 'By station' });
    await expect(byStation.locator('tbody tr').count()).resolves.toBe(3);
    await expectFitsWidth(page);
    await manager.shot('throughput');

    // One station: the address carries it, and the figures are that station's alone.
    await filters.getByLabel('Station').selectOption({ label: 'Bench 2' });
    await filters.getByRole('button', { name: 'Show report' }).click();
    await page.waitForURL((url) => url.searchParams.get('stationId') === bench2?.id);
    await expect.poll(async () => countOf(await pairs.textContent())).toBeLessThan(allPairs);
    const benchPairs = countOf(await pairs.textContent());
    expect(benchPairs).toBeGreaterThan(0);
    await byStation.locator('tbody tr').filter({ hasText: 'Bench 2' }).waitFor();
    await expect(byStation.locator('tbody tr').count()).resolves.toBe(1);

    // The route's own schema refuses an end before the start, under the field, and the report stays as it was.
    const before = page.url();
    await filters.getByLabel('From').fill(choices.today);
    await filters.getByLabel('To').fill(dayMinus(choices.today, 3));
    await filters.getByRole('button', { name: 'Show report' }).click();
    await filters.getByText('The end date must not be before the start date').waitFor();
    await expect(filters.getByLabel('To').getAttribute('aria-invalid')).resolves.toBe('true');
    expect(page.url()).toBe(before);

    // Compared with the period before: each card says what it was then and the change.
    await filters.getByLabel('From').fill(dayMinus(choices.today, 29));
    await filters.getByLabel('To').fill(choices.today);
    await filters.getByLabel('Compare with').selectOption({ label: 'The period before' });
    await filters.getByText(`${await formatPeriodIn(page, dayMinus(choices.today, 59), dayMinus(choices.today, 30))}, the same number of days.`).waitFor();
    await filters.getByRole('button', { name: 'Show report' }).click();
    await page.waitForURL((url) => url.searchParams.get('compare') === 'previous' && url.searchParams.get('stationId') === bench2?.id);
    await page.getByText(`“Then” is`).waitFor();
    const pairsCard = page.getByRole('term').filter({ hasText: /^Pairs$/ }).locator('xpath=..');
    await expect(pairsCard.getByRole('definition').nth(1).textContent()).resolves.toMatch(/^Then [\d,]+ · (▲ |▼ )?([+−][\d,]+|no change)/);
    expect(countOf(await pairs.textContent())).toBe(benchPairs);
    await manager.shot('throughput-bench-2-compared');

    // A link reproduces the view: the same address in a fresh page shows the same figures. A link whose dates
    // cannot make a report says why under the field, and asks for nothing.
    const link = page.url();
    const again = await manager.context.newPage();
    await again.goto(link);
    await expect(figure(again, 'Pairs').textContent()).resolves.toBe(await pairs.textContent());
    await again.goto(`${ICE}/reports/throughput?from=2025-01-01&to=2026-06-30`);
    await again.getByRole('form', { name: 'Report filters' }).getByText('A report covers at most 367 days').waitFor();
    await expect(again.getByTestId('report-body').count()).resolves.toBe(0);
    await again.close();

    // Quality keeps the filters; each band is its word and its number, not its colour alone.
    const reports = page.getByRole('navigation', { name: 'Reports' });
    await reports.getByRole('link', { name: 'Quality' }).click();
    await page.waitForURL((url) => url.pathname.endsWith('/reports/quality') && url.searchParams.get('stationId') === bench2?.id);
    await page.getByRole('heading', { name: 'Reports: Quality' }).waitFor();
    for (const band of ['True', 'Fair', 'Off']) {
      await figure(page, `${band} first readings`).filter({ hasText: /%$/ }).waitFor();
    }
    const bandChart = page.getByRole('img', { name: /^First readings by band at each station/ });
    await bandChart.waitFor();
    await expect(bandChart.textContent()).resolves.toMatch(/Bench 2.*True [\d.]+%.*Fair [\d.]+%.*Off [\d.]+%/);
    expect(await headerLabels(page.getByRole('table', { name: 'First readings by station' }))).toEqual(
      expect.arrayContaining(['True', 'Fair', 'Off', 'Mean absolute reading (thou)']),
    );
    await page.getByRole('table', { name: 'Leveling adjustments and their effect' }).waitFor();
    await expectFitsWidth(page);
    await manager.shot('quality');

    await reports.getByRole('link', { name: 'Money' }).click();
    await page.getByRole('heading', { name: 'Reports: Money' }).waitFor();
    // Money belongs to no station: the form does not offer one, and the figures are the rink's.
    await expect(filters.getByLabel('Station').count()).resolves.toBe(0);
    await expect(figure(page, 'Sales').textContent()).resolves.toMatch(/\d/);
    await expect(figure(page, 'Deferred revenue').textContent()).resolves.toMatch(/\d/);
    const byProduct = page.getByRole('table', { name: 'Sales by product and channel' });
    await byProduct.locator('tbody tr').first().waitFor();
    await expectFitsWidth(page);
    await manager.shot('money');

    // The download has the screen's filters and the table's own header row.
    const region = page.getByRole('region', { name: 'Sales by product and channel' });
    const csvLink = region.getByRole('link', { name: /^Download CSV/ });
    const href = (await csvLink.getAttribute('href')) ?? '';
    expect(new URL(href, page.url()).searchParams.get('compareTo')).toBe(dayMinus(choices.today, 30));
    const [download] = await Promise.all([page.waitForEvent('download'), csvLink.click()]);
    const path = await download.path();
    const lines = (await readFile(path, 'utf8')).trim().split(/\r?\n/);
    expect(csvCells(lines[0] ?? '')).toEqual(await headerLabels(byProduct));
    expect(lines.length - 1).toBe(await byProduct.locator('tbody tr').count());

    // A period before the demo's history: words, not a chart of zeros.
    await page.goto(`${ICE}/reports/throughput?from=2024-01-01&to=2024-01-31`);
    await page.getByText('No pairs in this period.', { exact: true }).waitFor();
    await expect(figure(page, 'Pairs').textContent()).resolves.toBe('0');
    await expect(figure(page, 'Median turnaround').textContent()).resolves.toBe('No tickets ready');
    await expect(page.getByRole('img').count()).resolves.toBe(0);
    await manager.shot('throughput-empty');
    expectNoProblems(manager);
    await manager.context.close();
  });

  it('shows the league manager the league usage report and nothing else', async () => {
    const lead = await staffSession(browser, 'reports-league', 'league@ice-harbor.test');
    const { page } = lead;
    await page.getByRole('navigation', { name: 'Ice Harbor sections' }).getByRole('link', { name: 'Reports' }).click();
    await page.waitForURL(`**${ICE}/reports/leagues`);
    await page.getByRole('heading', { name: 'Reports: League usage' }).waitFor();
    await expect(page.getByRole('navigation', { name: 'Reports' }).count()).resolves.toBe(0);
    const teams = page.getByRole('table', { name: 'League usage by team' });
    await teams.locator('tbody tr').first().waitFor();
    const rows = await teams.locator('tbody tr').allInnerTexts();
    expect(rows.every((r) => r.includes('Harbor Youth League'))).toBe(true);
    await page.getByRole('img', { name: /^Credits used against credits allocated/ }).waitFor();
    await expectFitsWidth(page);
    await lead.shot('league-usage');

    await page.goto(`${ICE}/reports/throughput`);
    await page.getByRole('heading', { name: 'We could not find that page' }).waitFor();
    expectNoProblems(lead);
    await lead.context.close();
  });
});
