import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { findEnvReaders, findUnscopedImports, repoRoot, workspaceSourceDirs } from './import-rules';

const features = path.join(repoRoot, 'apps/api/src/features');
const badFeature = path.join(repoRoot, 'tests/architecture/fixtures/bad-feature');

describe('feature code reaches tenant data only through scoped()', () => {
  it('no file under apps/api/src/features imports the unscoped client or a driver', () => {
    const { scanned, violations } = findUnscopedImports(features);

    expect(scanned).toBeGreaterThanOrEqual(5);
    expect(violations).toEqual([]);
  });

  it('catches every way the fixture reaches the raw database', () => {
    const { violations } = findUnscopedImports(badFeature);

    expect(violations).toEqual([
      { file: 'tests/architecture/fixtures/bad-feature/driver.ts.fixture', problem: 'imports mysql2/promise' },
      { file: 'tests/architecture/fixtures/bad-feature/driver.ts.fixture', problem: 'imports drizzle-orm/mysql2' },
      {
        file: 'tests/architecture/fixtures/bad-feature/driver.ts.fixture',
        problem: 'imports the database client (../../../../packages/db/src/client)',
      },
      {
        file: 'tests/architecture/fixtures/bad-feature/driver.ts.fixture',
        problem: 'imports the database client (@rinkwright/db/src/client.ts)',
      },
      { file: 'tests/architecture/fixtures/bad-feature/driver.ts.fixture', problem: 'imports mysql2' },
      { file: 'tests/architecture/fixtures/bad-feature/repository.ts.fixture', problem: 'imports @rinkwright/db/unscoped' },
    ]);
  });
});

describe('settings are read only in env.ts', () => {
  it('no source file of apps/*/src or packages/*/src besides env.ts mentions process.env', () => {
    const dirs = workspaceSourceDirs();
    const { scanned, violations } = findEnvReaders(dirs);

    expect(dirs.map((d) => path.relative(repoRoot, d))).toEqual(expect.arrayContaining(['apps/api/src', 'packages/db/src']));
    expect(scanned).toBeGreaterThanOrEqual(20);
    expect(violations).toEqual([]);
  });

  it('flags the fixture that reads process.env, and spares env.ts and test files', () => {
    expect(findEnvReaders([badFeature]).violations).toEqual([
      { file: 'tests/architecture/fixtures/bad-feature/repository.ts.fixture', problem: 'mentions process.env' },
    ]);
  });
});
