// Bundles the API (with the workspace packages, which ship TypeScript sources) into one ESM file;
// third-party packages stay external and load from node_modules at run time.
import { build } from 'esbuild';
import { readFileSync } from 'node:fs';

const deps = (dir) => Object.keys(JSON.parse(readFileSync(`${dir}/package.json`, 'utf8')).dependencies ?? {});
// Only the API's own dependencies resolve from apps/api/dist under pnpm's strict layout, so each package the
// workspace code needs at run time is listed there too; anything else would be bundled in.
const external = deps('apps/api').filter((d) => !d.startsWith('@rinkwright/'));

await build({
  entryPoints: ['apps/api/src/server.ts'],
  outfile: 'apps/api/dist/server.js',
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'esm',
  sourcemap: true,
  external: [...external, ...external.map((d) => `${d}/*`)],
  logLevel: 'warning',
});
console.log('api bundled: apps/api/dist/server.js');
