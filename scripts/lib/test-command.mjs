// npm test: every check in order, each run even when an earlier one failed, and one summary line at the very end.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { BootstrapError, paths } from './data.mjs';
import { stopMariadb } from './mariadb.mjs';
import { onInterrupt, portFree, run, stopRecorded } from './procs.mjs';
import { WEB_DIST, fakeServices, installTools, prepareSystem, startServices, testPorts } from './services.mjs';

function withDatabase(url, name) {
  const parsed = new URL(url);
  parsed.pathname = `/${name}`;
  return parsed.toString();
}

async function commandCheck(cmd, args, env) {
  const code = await run(cmd, args, { env });
  return code === 0 ? { passed: 1, failed: 0 } : { passed: 0, failed: 1, note: `exit ${code}` };
}

/** Counts from vitest's JSON report; a crash, a missing report or an empty project is never green. */
async function vitestCheck(project, env) {
  const file = join(paths.results, `${project}.json`);
  rmSync(file, { force: true });
  const args = ['exec', 'vitest', 'run', '--project', project, '--reporter=default', '--reporter=json'];
  const code = await run('pnpm', [...args, `--outputFile.json=${file}`], { env });
  let report;
  try {
    report = JSON.parse(readFileSync(file, 'utf8'));
  } catch {
    return { passed: 0, failed: 1, note: `no report written (exit ${code})` };
  }
  const passed = report.numPassedTests ?? 0;
  const failed = report.numFailedTests ?? 0;
  const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
  const note = skipped > 0 ? `${skipped} skipped` : undefined;
  if ((report.numTotalTests ?? 0) === 0) return { passed, failed: Math.max(failed, 1), note: 'no tests ran' };
  if (code !== 0 && failed === 0) {
    return { passed, failed: 1, note: `exit ${code} with no failed test (a suite failed to load?)` };
  }
  return { passed, failed, note };
}

/** The first line of an error, short enough for the table; the whole message is printed where it happened. */
function brief(message) {
  const first = message.split('\n')[0];
  return first.length > 72 ? `${first.slice(0, 71)}…` : first;
}

function printSummary(rows) {
  const table = [['step', 'result', 'passed', 'failed', 'time', ''], ...rows.map((row) => row.cells)];
  const widths = table[0].map((_, i) => Math.max(...table.map((cells) => cells[i].length)));
  const line = (cells) =>
    cells
      .map((cell, i) => (i >= 2 && i <= 4 ? cell.padStart(widths[i]) : cell.padEnd(widths[i])))
      .join('  ')
      .trimEnd();
  const passed = rows.reduce((sum, row) => sum + row.passed, 0);
  const failed = rows.reduce((sum, row) => sum + row.failed, 0);
  console.log(`\n${table.map(line).join('\n')}\n\n${passed} passed, ${failed} failed`);
  return failed;
}

export async function test() {
  const ports = testPorts();
  const rows = [];
  const record = (name, { passed = 0, failed = 0, note } = {}, seconds) => {
    const result = failed > 0 ? 'FAILED' : seconds === undefined ? 'not run' : 'ok';
    const time = seconds === undefined ? '' : `${seconds.toFixed(1)}s`;
    rows.push({ passed, failed, cells: [name, result, String(passed), String(failed), time, note ?? ''] });
  };
  /**
   * Runs one check; an error inside it counts as one failure of that check, and the run goes on. A setup step
   * (`setup: true`) is no check of its own: it shows in the table only when it fails.
   */
  const check = async (name, fn, { setup = false } = {}) => {
    const began = Date.now();
    let outcome;
    try {
      outcome = (await fn()) ?? {};
    } catch (error) {
      console.error(error instanceof BootstrapError ? `\n✗ ${error.message}` : error);
      outcome = { failed: 1, note: error instanceof BootstrapError ? brief(error.message) : 'crashed' };
    }
    const ok = !outcome.failed;
    if (!(setup && ok)) record(name, outcome, (Date.now() - began) / 1000);
    return ok;
  };
  const notRun = (names, reason) => names.forEach((name) => record(name, { note: `not run: ${reason}` }));

  const state = { startedDb: false };
  let mailDir;
  const cleanup = async () => {
    await stopRecorded(paths.testPids);
    if (mailDir) rmSync(mailDir, { recursive: true, force: true });
    if (state.startedDb) await stopMariadb();
  };

  const steps = async () => {
    if (!(await check('install', installTools, { setup: true }))) {
      notRun(['build', 'typecheck', 'lint', 'unit', 'integration', 'e2e'], 'dependencies missing');
      return;
    }
    // Leftovers of a test run that was killed before it could clean up.
    await stopRecorded(paths.testPids);

    let context;
    const systemReady = await check(
      'database, browser',
      async () => {
        context = await prepareSystem({ ports, browser: true }, state);
      },
      { setup: true },
    );
    await check('build', () => commandCheck('pnpm', ['build']));

    mailDir = mkdtempSync(join(tmpdir(), 'rinkwright-mail-'));
    const fakesReady = await check(
      'test fakes',
      () => startServices(fakeServices(ports, mailDir, 'test-'), paths.testPids),
      { setup: true },
    );
    if (!(await portFree(ports.api))) {
      console.warn(`! port ${ports.api} (E2E_PORT) is in use; the e2e tests cannot start their API there`);
    }

    await check('typecheck', () => commandCheck('pnpm', ['typecheck']));
    await check('lint', () => commandCheck('pnpm', ['lint']));
    await check('unit', () => vitestCheck('unit', {}));

    if (!systemReady || !fakesReady) {
      notRun(['integration', 'e2e'], systemReady ? 'test fakes unavailable' : 'database or browser unavailable');
      return;
    }
    const testUrl = process.env.TEST_DATABASE_URL || withDatabase(context.databaseUrl, 'rinkwright_test');
    const e2eUrl = process.env.E2E_DATABASE_URL || withDatabase(context.databaseUrl, 'rinkwright_e2e');
    const shared = {
      BETTER_AUTH_SECRET: context.authSecret,
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(ports.smtp),
      MAIL_API_URL: `http://127.0.0.1:${ports.mailWeb}`,
      MAIL_INBOX_URL: `http://127.0.0.1:${ports.mailWeb}`,
      STRIPE_API_BASE: `http://127.0.0.1:${ports.stripe}`,
      APP_URL: `http://127.0.0.1:${ports.api}`,
      TEST_DATABASE_URL: testUrl,
      E2E_DATABASE_URL: e2eUrl,
    };
    // The replica test follows the primary as the replication user; with an outside DATABASE_URL it is whatever
    // REPLICATION_SOURCE_URL the caller set.
    const replication = context.replicationSourceUrl ? { REPLICATION_SOURCE_URL: context.replicationSourceUrl } : {};
    await check('integration', () => vitestCheck('integration', { ...shared, ...replication, DATABASE_URL: testUrl }));
    await check('e2e', () =>
      vitestCheck('e2e', {
        ...shared,
        DATABASE_URL: e2eUrl,
        E2E_PORT: String(ports.api),
        WEB_DIST,
        CHROMIUM_PATH: '/usr/bin/chromium',
      }),
    );
  };

  const undo = onInterrupt(cleanup);
  await check('test runner', steps, { setup: true });
  undo();
  await check('cleanup', cleanup, { setup: true });
  return printSummary(rows) > 0 ? 1 : 0;
}
