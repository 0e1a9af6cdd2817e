#!/usr/bin/env node
// `npm start` runs this before `node dist/server.js`: it compiles src/ with tsc only when dist/ is
// missing or older than a source file (or the tsconfig files, or package-lock.json), so that a start on a
// built tree takes about a second. Plain JavaScript on purpose: it must run before anything is compiled.
//
//   node scripts/build-if-stale.mjs            build when stale, else say nothing
//   node scripts/build-if-stale.mjs --check    exit 0 when dist/ is current, 1 when a build is due (no build)
//
// In a production install (`npm ci --omit=dev`) TypeScript is absent: then a current dist/ is used as it
// is, and a missing or stale one stops the start with a message that says what to run.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const entry = join(root, 'dist', 'server.js');
const inputs = ['src', 'tsconfig.json', 'tsconfig.build.json', 'package-lock.json'].map((p) => join(root, p));

/** Newest modification time [ms] of a file or of every file under a directory; 0 when it does not exist. */
function newestMtimeMs(path) {
  if (!existsSync(path)) return 0;
  const st = statSync(path);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs; // a deleted or renamed file changes the directory's time
  for (const name of readdirSync(path)) newest = Math.max(newest, newestMtimeMs(join(path, name)));
  return newest;
}

const builtMs = existsSync(entry) ? statSync(entry).mtimeMs : 0;
const sourcesMs = Math.max(...inputs.map(newestMtimeMs));
const hasSources = existsSync(join(root, 'src'));
const stale = builtMs === 0 || (hasSources && sourcesMs > builtMs);

if (process.argv.includes('--check')) process.exit(stale ? 1 : 0);
if (!stale) process.exit(0);

let tsc;
try {
  tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
} catch {
  process.stderr.write(
    `tropodelay: ${builtMs === 0 ? 'dist/ is missing' : 'dist/ is older than src/'} and TypeScript is not installed ` +
      '(a production install?): run `npm ci` (with the dev dependencies) and `npm run build`, or ship a built dist/.\n',
  );
  process.exit(1);
}
if (!hasSources) {
  process.stderr.write('tropodelay: dist/server.js is missing and there is no src/ to build it from.\n');
  process.exit(1);
}
process.stderr.write(`tropodelay: ${builtMs === 0 ? 'no build yet' : 'sources changed since the last build'}; compiling (tsc, once) ...\n`);
const started = Date.now();
const result = spawnSync(process.execPath, [tsc, '-p', join(root, 'tsconfig.build.json'), '--noEmitOnError'], { stdio: 'inherit' });
if (result.status !== 0) {
  process.stderr.write('tropodelay: the build failed (see above); nothing was started.\n');
  process.exit(result.status ?? 1);
}
process.stderr.write(`tropodelay: built dist/ in ${((Date.now() - started) / 1000).toFixed(1)} s\n`);
