// Installing what the project needs before any npm package is available: pnpm, the dependencies, system packages.
import { existsSync } from 'node:fs';
import { commandExists, run } from './procs.mjs';
import { fail } from './data.mjs';

export async function ensurePnpm() {
  if (commandExists('pnpm')) return;
  console.log('* Installing pnpm 10 (npm install -g pnpm@10)');
  if ((await run('npm', ['install', '-g', 'pnpm@10'])) !== 0 || !commandExists('pnpm')) {
    fail('could not install pnpm; install it with "npm install -g pnpm@10" and make sure it is on PATH');
  }
}

export async function installDependencies() {
  // Without a terminal pnpm would stop to ask before rebuilding node_modules; the answer is always yes here.
  const args = ['install', '--frozen-lockfile', '--config.confirm-modules-purge=false'];
  if ((await run('pnpm', args)) !== 0) fail('pnpm install --frozen-lockfile failed (see above)');
}

export const MARIADB = {
  label: 'MariaDB',
  files: ['/usr/sbin/mariadbd', '/usr/bin/mariadb', '/usr/bin/mariadb-admin', '/usr/bin/mariadb-install-db'],
  packages: ['mariadb-server', 'mariadb-client'],
  seconds: 20,
};

export const CHROMIUM = {
  label: 'Chromium (for the browser tests)',
  files: ['/usr/bin/chromium'],
  packages: ['chromium'],
  seconds: 40,
};

/** Installs the Debian packages of each wanted program whose files are missing; one apt-get update at most. */
export async function ensureSystemPackages(wanted) {
  const missing = wanted.filter(({ files }) => files.some((file) => !existsSync(file)));
  if (missing.length === 0) return;
  if (process.getuid?.() !== 0) {
    const packages = missing.flatMap((m) => m.packages).join(' ');
    fail(`missing system packages; as root run: apt-get update && apt-get install -y ${packages}`);
  }
  const env = { DEBIAN_FRONTEND: 'noninteractive' };
  console.log('* Updating the apt package lists (apt-get update)');
  if ((await run('apt-get', ['update'], { env })) !== 0) fail('apt-get update failed (see above)');
  for (const { label, packages, seconds } of missing) {
    console.log(`* Installing ${label}: apt-get install ${packages.join(' ')} (about ${seconds} s)`);
    if ((await run('apt-get', ['install', '-y', ...packages], { env })) !== 0) {
      fail(`apt-get install ${packages.join(' ')} failed (see above)`);
    }
  }
}
