import { readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { build, type Metafile } from 'esbuild';

// What a first visit downloads: the scripts index.html loads and everything they import statically (the
// browser fetches those before the app starts), and the route chunks loaded later by dynamic import().
// esbuild reads the built chunks' import statements, so a static import is told from a dynamic one exactly.

export interface FileSize {
  file: string;
  bytes: number;
  gzipBytes: number;
}

export interface WebSize {
  dist: string;
  /** When index.html was written: a build older than the sources weighs the app as it was then. */
  builtAt: string;
  initial: { files: FileSize[]; bytes: number; gzipBytes: number };
  /** The biggest chunk reached only through import(), and what loading it adds beyond the initial files. */
  largestRoute: (FileSize & { addedGzipBytes: number }) | null;
  routeChunks: number;
}

const sizeOf = (dist: string, file: string): FileSize => {
  const body = readFileSync(path.join(dist, file));
  // The files as written, at zlib's default level (as a server compressing on the fly sends them).
  return { file, bytes: body.length, gzipBytes: gzipSync(body).length };
};

function assetsOfHtml(html: string): string[] {
  const found = [
    ...html.matchAll(/<script\b[^>]*\btype="module"[^>]*\bsrc="([^"]+)"/g),
    ...html.matchAll(/<link\b[^>]*\brel="modulepreload"[^>]*\bhref="([^"]+)"/g),
  ].map((m) => m[1] ?? '');
  return [...new Set(found.filter((src) => src.startsWith('/') && src.endsWith('.js')).map((src) => src.slice(1)))];
}

async function importGraph(dist: string, entries: string[]): Promise<Metafile> {
  const result = await build({
    absWorkingDir: dist,
    entryPoints: entries,
    bundle: true,
    splitting: true,
    format: 'esm',
    write: false,
    metafile: true,
    outdir: path.join(dist, '.size-probe'),
    logLevel: 'silent',
    plugins: [
      {
        // Only the built scripts matter here; anything else a chunk names stays outside the graph.
        name: 'scripts-only',
        setup(b) {
          b.onResolve({ filter: /.*/ }, (args) => (args.kind === 'entry-point' || args.path.endsWith('.js') ? undefined : { path: args.path, external: true }));
        },
      },
    ],
  });
  return result.metafile;
}

function closure(meta: Metafile, from: string[]): Set<string> {
  const seen = new Set<string>();
  const stack = [...from];
  while (stack.length) {
    const file = stack.pop()!;
    if (seen.has(file)) continue;
    seen.add(file);
    for (const imported of meta.inputs[file]?.imports ?? []) {
      if (imported.kind === 'import-statement' && !imported.external) stack.push(imported.path);
    }
  }
  return seen;
}

export async function measureWeb(distDir: string): Promise<WebSize> {
  const dist = path.resolve(distDir);
  const entries = assetsOfHtml(readFileSync(path.join(dist, 'index.html'), 'utf8'));
  if (entries.length === 0) throw new Error(`no module script in ${path.join(dist, 'index.html')}`);
  const meta = await importGraph(dist, entries);
  const initial = closure(meta, entries);
  const routes = new Set(
    Object.values(meta.inputs)
      .flatMap((input) => input.imports)
      .filter((imported) => imported.kind === 'dynamic-import' && !imported.external)
      .map((imported) => imported.path)
      .filter((file) => !initial.has(file)),
  );
  const initialFiles = [...initial].sort().map((file) => sizeOf(dist, file));
  const routeSizes = [...routes].map((file) => {
    const own = sizeOf(dist, file);
    const added = [...closure(meta, [file])].filter((f) => !initial.has(f)).reduce((n, f) => n + sizeOf(dist, f).gzipBytes, 0);
    return { ...own, addedGzipBytes: added };
  });
  const largest = routeSizes.sort((a, b) => b.gzipBytes - a.gzipBytes)[0] ?? null;
  return {
    dist,
    builtAt: statSync(path.join(dist, 'index.html')).mtime.toISOString(),
    initial: { files: initialFiles, bytes: initialFiles.reduce((n, f) => n + f.bytes, 0), gzipBytes: initialFiles.reduce((n, f) => n + f.gzipBytes, 0) },
    largestRoute: largest,
    routeChunks: routes.size,
  };
}
