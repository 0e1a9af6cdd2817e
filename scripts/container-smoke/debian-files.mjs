#!/usr/bin/env node
/**
 * Lists the files of installed Debian packages and of everything they depend on, so that a container
 * base image can be assembled from the host's own packages when no image registry is reachable.
 *
 * Usage: node debian-files.mjs PACKAGE... > list   (NUL-separated absolute paths, for `tar --null -T`)
 *
 * The closure follows Pre-Depends and Depends (not Recommends), takes the first installed alternative of
 * `a | b`, and resolves virtual packages through Provides. Paths are written with their directories
 * resolved (`/bin/dash` becomes `/usr/bin/dash` on a merged-/usr system), so that they unpack into a root
 * whose /bin, /lib and /lib64 are symbolic links. Directories themselves are not listed (tar creates them).
 * Documentation, manual pages, translations and gcc's LTO dump tool are left out. Update-alternatives links (/usr/bin/cc ->
 * /etc/alternatives/cc -> gcc) whose final target is in the list are added. A package that is named on the
 * command line but not installed is an error (exit 1) naming it.
 */

import { execFileSync } from 'node:child_process';
import { lstatSync, readdirSync, readFileSync, readlinkSync, realpathSync } from 'node:fs';
import path from 'node:path';

/** Not needed to run or compile: documentation, translations, and gcc's 30 MB LTO dump tool. */
const LEFT_OUT = [
  '/usr/share/doc/',
  '/usr/share/man/',
  '/usr/share/info/',
  '/usr/share/locale/',
  '/usr/share/lintian/',
  '/usr/share/bug/',
  '/usr/bin/x86_64-linux-gnu-lto-dump-',
  '/usr/bin/lto-dump',
];
const DPKG_INFO = '/var/lib/dpkg/info';

const requested = process.argv.slice(2);
if (requested.length === 0) {
  process.stderr.write('usage: debian-files.mjs PACKAGE...\n');
  process.exit(2);
}

const nativeArch = execFileSync('dpkg', ['--print-architecture'], { encoding: 'utf8' }).trim();
// eslint-disable-next-line no-template-curly-in-string -- dpkg-query's own ${field} placeholders
const format = '${Package}\t${Architecture}\t${db:Status-Abbrev}\t${Provides}\t${Pre-Depends}\t${Depends}\n';
/** name -> { arch, depends } of installed packages (native architecture or `all`). */
const installed = new Map();
/** virtual package name -> name of an installed package providing it */
const providers = new Map();
for (const row of execFileSync('dpkg-query', ['-W', '-f', format], { encoding: 'utf8', maxBuffer: 64 << 20 }).split('\n')) {
  if (!row) continue;
  const [name, arch, status, provides, preDepends, depends] = row.split('\t');
  if (!status.startsWith('ii') || (arch !== nativeArch && arch !== 'all')) continue;
  installed.set(name, { arch, depends: [preDepends, depends].filter(Boolean).join(', ') });
  for (const virtual of provides.split(',')) {
    const virtualName = bareName(virtual);
    if (virtualName && !providers.has(virtualName)) providers.set(virtualName, name);
  }
}

/** "libc6:any (>= 2.34) [amd64] <!nocheck>" -> "libc6" */
function bareName(relation) {
  return relation
    .trim()
    .split(/[\s([<]/)[0]
    .replace(/:[a-z0-9-]+$/, '');
}

function resolve(name) {
  if (installed.has(name)) return name;
  return providers.get(name);
}

const missing = requested.filter((name) => resolve(name) === undefined);
if (missing.length > 0) {
  process.stderr.write(`debian-files: not installed on this host: ${missing.join(' ')}\n`);
  process.exit(1);
}

const closure = new Set();
const queue = requested.map(resolve);
while (queue.length > 0) {
  const name = queue.pop();
  if (closure.has(name)) continue;
  closure.add(name);
  for (const item of installed.get(name).depends.split(',')) {
    if (!item.trim()) continue;
    const chosen = item
      .split('|')
      .map(bareName)
      .map(resolve)
      .find((n) => n !== undefined);
    if (chosen === undefined) {
      process.stderr.write(`debian-files: ${name}: no installed package satisfies "${item.trim()}" (skipped)\n`);
    } else {
      queue.push(chosen);
    }
  }
}

/** Absolute path with its directory resolved, or undefined for a directory or a path that is gone. */
function canonical(file) {
  let stat;
  try {
    stat = lstatSync(file);
  } catch {
    return undefined;
  }
  if (stat.isDirectory()) return undefined;
  return path.join(realpathSync(path.dirname(file)), path.basename(file));
}

const files = new Set();
for (const name of closure) {
  const { arch } = installed.get(name);
  let list;
  try {
    list = readFileSync(path.join(DPKG_INFO, `${name}:${arch}.list`), 'utf8');
  } catch {
    list = readFileSync(path.join(DPKG_INFO, `${name}.list`), 'utf8');
  }
  for (const file of list.split('\n')) {
    if (!file || LEFT_OUT.some((prefix) => file.startsWith(prefix))) continue;
    const resolved = canonical(file);
    if (resolved && !LEFT_OUT.some((prefix) => resolved.startsWith(prefix))) files.add(resolved);
  }
}

// update-alternatives: /usr/bin/cc -> /etc/alternatives/cc -> /usr/bin/gcc ...
const alternativesDir = '/etc/alternatives';
const chosenAlternatives = new Set();
for (const entry of readdirSync(alternativesDir)) {
  const link = path.join(alternativesDir, entry);
  let target;
  try {
    target = realpathSync(link);
  } catch {
    continue;
  }
  if (files.has(target) || files.has(canonical(readlinkSync(link)) ?? '')) {
    files.add(link);
    chosenAlternatives.add(link);
  }
}
for (const dir of ['/usr/bin', '/usr/sbin']) {
  for (const entry of readdirSync(dir)) {
    const file = path.join(dir, entry);
    try {
      if (lstatSync(file).isSymbolicLink() && chosenAlternatives.has(readlinkSync(file))) files.add(file);
    } catch {
      // vanished while reading: not ours
    }
  }
}

process.stderr.write(`debian-files: ${closure.size} packages, ${files.size} files\n`);
process.stdout.write([...files].sort().join('\0') + '\0');
