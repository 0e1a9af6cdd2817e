/**
 * `npm run bench`: runs every bench/*.bench.ts in turn (or those named on the command line, e.g.
 * `npm run bench -- slant`) and prints their figures. Each file's default export is an async
 * function that returns lines of text: the figures that go into the README.
 */

import { readdirSync } from 'node:fs';

const filter = process.argv.slice(2);
const dir = new URL('./', import.meta.url);
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => filter.length === 0 || filter.some((w) => f.includes(w)))
  .sort();

for (const file of files) {
  const mod = (await import(new URL(file, dir).href)) as { default: () => Promise<string[]> };
  process.stdout.write(`\n## ${file}\n`);
  const started = performance.now();
  for (const line of await mod.default()) process.stdout.write(`${line}\n`);
  process.stdout.write(`(${((performance.now() - started) / 1000).toFixed(1)} s)\n`);
}
