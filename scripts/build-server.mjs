// Compiles the server for a production start without dev packages: esbuild bundles our own code
// (server/, shared/, content/; the @shared alias resolved) into dist-server/, leaves every npm
// package as an import of node_modules, and splits the local fakes into chunks that are loaded only
// when LOCAL_FAKES is on. Migrations stay one file each (dist-server/migrations/), as umzug finds them.
import { build } from 'esbuild';
import { readdirSync, rmSync } from 'node:fs';

const migrations = readdirSync('server/migrations').filter((f) => f.endsWith('.ts')).map((f) => `server/migrations/${f}`);
rmSync('dist-server', { recursive: true, force: true });
await build({
  entryPoints: ['server/index.ts', ...migrations],
  outdir: 'dist-server',
  outbase: 'server',
  bundle: true,
  splitting: true,
  format: 'esm',
  platform: 'node',
  target: 'node20',
  packages: 'external',
  sourcemap: true,
  tsconfig: 'tsconfig.json',
  logLevel: 'warning',
});
console.error(`[sparkwright] server compiled to dist-server/ (${migrations.length} migrations)`);
