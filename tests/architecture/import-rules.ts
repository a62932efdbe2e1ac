import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

// Plain-text checks of the source tree. They read files rather than a module graph on purpose: a rule must
// also hold for code that no test imports.

export const repoRoot = fileURLToPath(new URL('../..', import.meta.url));

/** Source files, and the `.ts.fixture` stand-ins the tests feed in to prove the rules can fail. */
const SOURCE = /\.(?:[cm]?[jt]sx?)(?:\.fixture)?$/;
const TEST_FILE = /\.test\.[cm]?[jt]sx?$/;

export function sourceFilesUnder(dir: string): string[] {
  const files: string[] = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === 'node_modules' || entry.name.startsWith('.')) continue;
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) files.push(...sourceFilesUnder(full));
    else if (SOURCE.test(entry.name)) files.push(full);
  }
  return files.sort();
}

/** Module specifiers of static imports and re-exports, dynamic import() and require(). */
export function importedSpecifiers(source: string): string[] {
  const patterns = [/\b(?:import|export)\s[^'"`;]*?\sfrom\s*['"]([^'"]+)['"]/g, /\bimport\s*['"]([^'"]+)['"]/g, /\b(?:import|require)\s*\(\s*['"]([^'"]+)['"]\s*\)/g];
  return patterns.flatMap((pattern) => [...source.matchAll(pattern)].map((m) => m[1] ?? ''));
}

const FORBIDDEN_PACKAGES = ['@rinkwright/db/unscoped', 'drizzle-orm/mysql2', 'mysql2'];
/** packages/db/src/client, client.ts or client/..., reached by a relative path or through the package name. */
const DB_CLIENT = /(?:^|\/)(?:packages\/db|@rinkwright\/db)\/src\/client(?:\.[cm]?[jt]s)?(?:\/|$)/;

function forbiddenReason(specifier: string, importer: string): string | undefined {
  for (const name of FORBIDDEN_PACKAGES) {
    if (specifier === name || specifier.startsWith(`${name}/`)) return `imports ${specifier}`;
  }
  const target = specifier.startsWith('.') ? path.relative(repoRoot, path.resolve(path.dirname(importer), specifier)) : specifier;
  if (DB_CLIENT.test(target.split(path.sep).join('/'))) return `imports the database client (${specifier})`;
  return undefined;
}

export interface Violation {
  file: string;
  problem: string;
}

const relative = (file: string) => path.relative(repoRoot, file);

/** Feature code reaches tenant data only through scoped(): no raw client, no driver. */
export function findUnscopedImports(dir: string): { scanned: number; violations: Violation[] } {
  const files = sourceFilesUnder(dir);
  const violations = files.flatMap((file) =>
    importedSpecifiers(readFileSync(file, 'utf8'))
      .map((specifier) => forbiddenReason(specifier, file))
      .filter((problem): problem is string => problem !== undefined)
      .map((problem) => ({ file: relative(file), problem })),
  );
  return { scanned: files.length, violations };
}

/** Settings are read in one env.ts per app or package, where they are validated; tests are exempt. */
export function findEnvReaders(dirs: string[]): { scanned: number; violations: Violation[] } {
  const files = dirs.flatMap(sourceFilesUnder).filter((file) => {
    const name = path.basename(file).replace(/\.fixture$/, '');
    return name !== 'env.ts' && !TEST_FILE.test(name);
  });
  const violations = files
    .filter((file) => /\bprocess\s*(?:\.\s*env\b|\[\s*['"]env['"]\s*\])/.test(readFileSync(file, 'utf8')))
    .map((file) => ({ file: relative(file), problem: 'mentions process.env' }));
  return { scanned: files.length, violations };
}

/** apps/<name>/src and packages/<name>/src of the workspace. */
export function workspaceSourceDirs(): string[] {
  return ['apps', 'packages'].flatMap((group) =>
    readdirSync(path.join(repoRoot, group), { withFileTypes: true })
      .filter((entry) => entry.isDirectory())
      .map((entry) => path.join(repoRoot, group, entry.name, 'src'))
      .filter((dir) => existsSync(dir)),
  );
}
