import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';

// scripts/build-if-stale.mjs decides from file times whether `npm start` must compile first. It runs here
// on a copy in a temporary tree (its root is the folder above the script), with times set by hand, so the
// test does not depend on how fast anything runs. Without node_modules the tree is a "production install".
const SCRIPT = new URL('../../scripts/build-if-stale.mjs', import.meta.url);
const T0 = new Date('2026-07-10T00:00:00Z');
const later = (s: number) => new Date(T0.getTime() + s * 1000);

let root = '';
function tree(files: Record<string, Date>): string {
  root = mkdtempSync(join(tmpdir(), 'build-if-stale-'));
  mkdirSync(join(root, 'scripts'));
  copyFileSync(SCRIPT, join(root, 'scripts/build-if-stale.mjs'));
  for (const [path, time] of Object.entries(files)) {
    mkdirSync(join(root, path, '..'), { recursive: true });
    writeFileSync(join(root, path), '');
    utimesSync(join(root, path), time, time);
  }
  for (const dir of ['src', 'src/http']) utimesSync(join(root, dir), T0, T0);
  return root;
}
function run(...args: string[]) {
  return spawnSync(process.execPath, [join(root, 'scripts/build-if-stale.mjs'), ...args], { encoding: 'utf8' });
}
afterEach(() => rmSync(root, { recursive: true, force: true }));

describe('scripts/build-if-stale.mjs', () => {
  it('dist/ newer than every source: current (exit 0), nothing printed', () => {
    tree({ 'src/server.ts': T0, 'src/http/app.ts': T0, 'tsconfig.json': T0, 'dist/server.js': later(10) });
    expect(run('--check').status).toBe(0);
    const result = run();
    expect(result.status).toBe(0);
    expect(result.stderr).toBe('');
  });

  it('a source file changed after the build: a build is due', () => {
    tree({ 'src/server.ts': T0, 'src/http/app.ts': later(20), 'tsconfig.json': T0, 'dist/server.js': later(10) });
    expect(run('--check').status).toBe(1);
  });

  it('a changed tsconfig or package-lock.json also makes dist/ stale; no dist/ at all is stale', () => {
    tree({ 'src/server.ts': T0, 'src/http/app.ts': T0, 'package-lock.json': later(20), 'dist/server.js': later(10) });
    expect(run('--check').status).toBe(1);
    rmSync(root, { recursive: true, force: true });
    tree({ 'src/server.ts': T0, 'src/http/app.ts': T0 });
    expect(run('--check').status).toBe(1);
  });

  it('stale without TypeScript (a production install): exit 1 with a message saying what to run, nothing started', () => {
    tree({ 'src/server.ts': T0, 'src/http/app.ts': later(20), 'dist/server.js': later(10) });
    const result = run();
    expect(result.status).toBe(1);
    expect(result.stderr).toMatch(/dist\/ is older than src\/ and TypeScript is not installed .*run `npm ci` .* and `npm run build`/);
  });
});
