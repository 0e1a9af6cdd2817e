/**
 * Checks the README's and docs' examples against a running service (`npm run check-examples`).
 *
 * For each markdown file (README.md, then docs/*.md in name order) that has marked examples, it starts
 * the service (`npm start`'s steps: build when stale, then node dist/server.js) on a free port with a
 * fresh, empty data folder, opens one bash session in the repository's root (so variables set by one
 * example are seen by the next, as in a reader's terminal), runs every marked example in the order of the
 * file and compares what each command printed (stdout and stderr) with the output shown under it.
 *
 * Marking, in the markdown: an HTML comment (invisible on the rendered page) on the line just before a
 * fenced block, whose lines starting with `$ ` are commands (a line ending in `\` continues on the next)
 * and whose other lines are the output shown for the command above them:
 *
 *     <!-- example -->
 *     ```console
 *     $ curl -s http://127.0.0.1:8080/v1/health
 *     {"status":"ok"}
 *     ```
 *
 * Volatile values (times, ids, keys, durations) are named in the marker and compared as placeholders:
 * `<!-- example volatile: created_at updated_at /duration \d+ ms/ -->` — a bare word is a JSON key whose
 * value (string, number, null or boolean) is ignored, `/…/` a regular expression whose matches are
 * ignored. The shown output keeps the values of a real run. Commands use port 8080 and the data folder
 * `${TROPO_DATA_DIR:-data}`; the script runs them against its own port and folder and shows 8080 again.
 *
 * `--update` rewrites the shown outputs that differ from the real ones (after a change of an output, check
 * the diff); matching outputs keep their shown text, volatile values included.
 * Exit code 0 when every example matched, 1 at the first mismatch (with a diff), 2 for a usage error.
 */

import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { createTwoFilesPatch } from 'diff';

/** One command of an example and the output shown for it. */
export interface ExampleStep {
  /** The command as bash runs it (continuation lines kept, without the `$ ` prompt). */
  command: string;
  /** The command's lines as the markdown shows them (with the prompt). */
  commandLines: string[];
  /** The output shown under the command (may be empty). */
  expected: string;
}

/** A marked fenced block. */
export interface ExampleBlock {
  file: string;
  /** 1-based line of the opening fence. */
  line: number;
  /** 0-based indices of the block's content lines in the file: [first, end). */
  contentStart: number;
  contentEnd: number;
  volatile: string[];
  steps: ExampleStep[];
}

export const MARKER = /^<!--\s*example(?:\s+volatile:\s*(.*?))?\s*-->\s*$/;
const FENCE = /^(`{3,}|~{3,})/;
const PROMPT = '$ ';
/** What a volatile value is replaced with on both sides before comparing. */
export const PLACEHOLDER = '…';
/** The port the documentation shows. */
export const SHOWN_PORT = 8080;

/**
 * Splits a marker's volatile list at white space: words are JSON keys, `/…/` items regular expressions
 * (which may contain spaces; write a `/` inside one as `\/`).
 */
export function parseVolatile(list: string | undefined): string[] {
  return (list ?? '').match(/\/(?:[^/\\]|\\.)+\/|\S+/g) ?? [];
}

/** The marked examples of one markdown file, in order. Throws for a marker that is not followed by a fence. */
export function parseExamples(markdown: string, file: string): ExampleBlock[] {
  const lines = markdown.split('\n');
  const blocks: ExampleBlock[] = [];
  let fence: string | null = null;
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!;
    const fenceMatch = FENCE.exec(line);
    if (fence !== null) {
      if (fenceMatch && line.trim() === fence) fence = null;
      continue;
    }
    if (fenceMatch) {
      fence = fenceMatch[1]!;
      continue;
    }
    const marker = MARKER.exec(line);
    if (!marker) continue;
    const open = lines[i + 1] ?? '';
    const openMatch = FENCE.exec(open);
    if (!openMatch) throw new Error(`${file}:${i + 1}: an example marker must be followed directly by a fenced block`);
    let close = i + 2;
    while (close < lines.length && lines[close]!.trim() !== openMatch[1]) close++;
    if (close >= lines.length) throw new Error(`${file}:${i + 2}: the example's fenced block is not closed`);
    const steps = parseSteps(lines.slice(i + 2, close), `${file}:${i + 2}`);
    blocks.push({ file, line: i + 2, contentStart: i + 2, contentEnd: close, volatile: parseVolatile(marker[1]), steps });
    i = close;
  }
  return blocks;
}

/** The commands and shown outputs of a block's content lines. */
export function parseSteps(content: string[], where: string): ExampleStep[] {
  const steps: ExampleStep[] = [];
  let k = 0;
  if (content.length > 0 && !content[0]!.startsWith(PROMPT))
    throw new Error(`${where}: an example block must start with a command line ("$ ...")`);
  while (k < content.length) {
    const commandLines = [content[k]!];
    while (commandLines.at(-1)!.endsWith('\\') && k + 1 < content.length) commandLines.push(content[++k]!);
    k++;
    const output: string[] = [];
    while (k < content.length && !content[k]!.startsWith(PROMPT)) output.push(content[k++]!);
    const command = [commandLines[0]!.slice(PROMPT.length), ...commandLines.slice(1)].join('\n');
    steps.push({ command, commandLines, expected: output.join('\n') });
  }
  return steps;
}

/** Replaces the volatile values of `text` by the placeholder and drops trailing white space and blank lines. */
export function normalise(text: string, volatile: readonly string[]): string {
  let out = text;
  for (const item of volatile) {
    if (item.length > 2 && item.startsWith('/') && item.endsWith('/')) {
      out = out.replace(new RegExp(item.slice(1, -1), 'gm'), PLACEHOLDER);
    } else {
      const key = item.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
      out = out.replace(
        new RegExp(`("${key}"\\s*:\\s*)("(?:[^"\\\\]|\\\\.)*"|-?\\d[\\d.eE+-]*|null|true|false)`, 'g'),
        `$1"${PLACEHOLDER}"`,
      );
    }
  }
  return out
    .split('\n')
    .map((line) => line.replace(/\s+$/, ''))
    .join('\n')
    .replace(/\n+$/, '');
}

/** null when `actual` shows what `expected` shows (volatile values aside), else a unified diff (shown → printed). */
export function compareOutput(expected: string, actual: string, volatile: readonly string[]): string | null {
  const want = normalise(expected, volatile);
  const got = normalise(actual, volatile);
  if (want === got) return null;
  return createTwoFilesPatch('shown', 'printed', `${want}\n`, `${got}\n`, '', '', { context: 3 }).split('\n').slice(2).join('\n');
}

/** The command with the shown port replaced by the service's. */
export function toServicePort(command: string, port: number): string {
  return command.replace(/\b(127\.0\.0\.1|localhost):8080\b/g, `$1:${port}`);
}

/** The output with the service's port shown as 8080 again. */
export function toShownPort(output: string, port: number): string {
  return output.replace(new RegExp(`\\b(127\\.0\\.0\\.1|localhost):${port}\\b`, 'g'), `$1:${SHOWN_PORT}`);
}

/** The markdown with the shown outputs of `blocks` replaced by `outputs` (one per step, in order). */
export function rewriteOutputs(markdown: string, blocks: readonly ExampleBlock[], outputs: readonly (readonly string[])[]): string {
  const lines = markdown.split('\n');
  // From the last block to the first, so that earlier line numbers stay valid.
  for (let b = blocks.length - 1; b >= 0; b--) {
    const block = blocks[b]!;
    const content: string[] = [];
    block.steps.forEach((step, s) => {
      content.push(...step.commandLines);
      const out = (outputs[b]?.[s] ?? step.expected).replace(/\n+$/, '');
      if (out !== '') content.push(...out.split('\n').map((line) => line.replace(/\s+$/, '')));
    });
    lines.splice(block.contentStart, block.contentEnd - block.contentStart, ...content);
  }
  return lines.join('\n');
}

// ---- running ------------------------------------------------------------------------------------------------

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const COMMAND_TIMEOUT_MS = 180_000;

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
  });
}

/** The environment of the service and of the shell: the defaults a reader has, with our port and data folder. */
function cleanEnv(dataDir: string): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...process.env, TROPO_DATA_DIR: dataDir, TZ: 'UTC', LC_ALL: 'C' };
  for (const name of [
    'DATABASE_URL',
    'TROPO_API_KEYS',
    'TROPODELAY_API_KEYS',
    'TROPODELAY_API_KEYS_FILE',
    'TROPO_READ_KEYS_REQUIRED',
    'RATE_LIMIT_PER_MINUTE',
    'PORT',
    'HOST',
    'NODE_OPTIONS',
  ])
    delete env[name];
  return env;
}

interface Service {
  port: number;
  child: ChildProcess;
  log: () => string;
}

async function startService(dataDir: string): Promise<Service> {
  const build = spawnSync(process.execPath, [join(ROOT, 'scripts/build-if-stale.mjs')], { cwd: ROOT, stdio: 'inherit' });
  if (build.status !== 0) throw new Error('the build failed');
  const port = await freePort();
  const env = { ...cleanEnv(dataDir), PORT: String(port), HOST: '127.0.0.1', LOG_LEVEL: 'warn' };
  const child = spawn(process.execPath, ['--max-semi-space-size=32', join(ROOT, 'dist/server.js')], {
    cwd: ROOT,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  child.stdout!.on('data', (d: Buffer) => (log += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (log += d.toString()));
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the service exited with code ${child.exitCode}:\n${log}`);
    try {
      const res = await fetch(`http://127.0.0.1:${port}/v1/health`);
      if (res.ok) return { port, child, log: () => log };
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  child.kill('SIGTERM');
  throw new Error(`the service did not answer within 60 s:\n${log}`);
}

async function stopService(service: Service): Promise<void> {
  if (service.child.exitCode !== null) return;
  const exited = new Promise((r) => service.child.once('exit', r));
  service.child.kill('SIGTERM');
  await Promise.race([exited, new Promise((r) => setTimeout(r, 30_000))]);
  if (service.child.exitCode === null) service.child.kill('SIGKILL');
}

/** One bash session; `run` returns what a command printed (stdout and stderr, in order) and its exit status. */
class Shell {
  private readonly child: ChildProcess;
  private buffer = '';
  private readonly sentinel = `__check_examples_${randomBytes(8).toString('hex')}__`;

  constructor(env: NodeJS.ProcessEnv) {
    this.child = spawn('bash', ['--noprofile', '--norc'], { cwd: ROOT, env, stdio: ['pipe', 'pipe', 'pipe'] });
    this.child.stdout!.on('data', (d: Buffer) => (this.buffer += d.toString()));
    this.child.stderr!.on('data', (d: Buffer) => (this.buffer += d.toString()));
    this.child.stdin!.write('exec 2>&1\n');
  }

  async run(command: string): Promise<{ output: string; status: number }> {
    this.buffer = '';
    // Braces keep assignments in this shell; stdin from /dev/null so no command reads the next ones.
    this.child.stdin!.write(`{\n${command}\n} </dev/null\nprintf '\\n%s %d\\n' '${this.sentinel}' "$?"\n`);
    const done = new RegExp(`\\n${this.sentinel} (\\d+)\\n$`);
    const deadline = Date.now() + COMMAND_TIMEOUT_MS;
    for (;;) {
      const m = done.exec(this.buffer);
      if (m) return { output: this.buffer.slice(0, m.index), status: Number(m[1]) };
      if (this.child.exitCode !== null) throw new Error(`the shell exited (code ${this.child.exitCode}); output so far:\n${this.buffer}`);
      if (Date.now() > deadline)
        throw new Error(`the command did not finish within ${COMMAND_TIMEOUT_MS / 1000} s; output so far:\n${this.buffer}`);
      await new Promise((r) => setTimeout(r, 20));
    }
  }

  close(): void {
    this.child.stdin!.end('exit\n');
  }
}

/** The markdown files checked by default: README.md, then docs/*.md by name. */
export function defaultFiles(root = ROOT): string[] {
  const docs = readdirSync(join(root, 'docs'))
    .filter((name) => name.endsWith('.md'))
    .sort()
    .map((name) => join('docs', name));
  return ['README.md', ...docs];
}

/** Runs the examples of one file; returns the number of commands run, or null at the first mismatch (after printing it). */
async function checkFile(file: string, update: boolean): Promise<number | null> {
  const path = join(ROOT, file);
  const markdown = readFileSync(path, 'utf8');
  const blocks = parseExamples(markdown, file);
  if (blocks.length === 0) return 0;
  const steps = blocks.reduce((n, b) => n + b.steps.length, 0);
  process.stdout.write(`${file}: ${blocks.length} examples, ${steps} commands\n`);
  const work = mkdtempSync(join(tmpdir(), 'tropodelay-examples-'));
  const dataDir = join(work, 'data');
  const service = await startService(dataDir);
  const shell = new Shell(cleanEnv(dataDir));
  const outputs: string[][] = [];
  let ok = true;
  let ran = 0;
  try {
    for (const block of blocks) {
      const blockOutputs: string[] = [];
      outputs.push(blockOutputs);
      for (const step of block.steps) {
        const started = Date.now();
        ran++;
        const { output, status } = await shell.run(toServicePort(step.command, service.port));
        const printed = toShownPort(output, service.port);
        const where = `${file}:${block.line}`;
        const shownCommand = step.commandLines.join('\n');
        if (status !== 0) {
          process.stdout.write(`\nFAIL ${where}: the command exited with status ${status}\n${shownCommand}\n${printed}\n`);
          if (service.child.exitCode !== null) process.stdout.write(`service log:\n${service.log()}\n`);
          return null;
        }
        const diff = compareOutput(step.expected, printed, block.volatile);
        // --update takes the printed output only where it differs: a match keeps the shown one (its
        // volatile values too), so the rewrite changes no more lines than the outputs did.
        blockOutputs.push(diff === null ? step.expected : printed);
        if (diff !== null && !update) {
          process.stdout.write(`\nFAIL ${where}: the output differs from the one shown\n${shownCommand}\n${diff}\n`);
          process.stdout.write('(run `npm run check-examples -- --update` to take the printed outputs, then review the diff)\n');
          return null;
        }
        process.stdout.write(
          `  ${diff === null ? 'ok     ' : 'updated'} ${where} ${step.command.split('\n')[0]!.slice(0, 90)} (${Date.now() - started} ms)\n`,
        );
      }
    }
    if (update) {
      const rewritten = rewriteOutputs(markdown, blocks, outputs);
      if (rewritten !== markdown) {
        writeFileSync(path, rewritten);
        process.stdout.write(`  rewrote the shown outputs of ${file}\n`);
      }
    }
  } catch (err) {
    ok = false;
    process.stdout.write(`\nFAIL ${file}: ${err instanceof Error ? err.message : String(err)}\n`);
  } finally {
    shell.close();
    await stopService(service);
    rmSync(work, { recursive: true, force: true });
  }
  return ok ? ran : null;
}

const HELP = `Usage: npm run check-examples [-- --update] [-- FILE.md ...]

Runs every marked example of README.md and docs/*.md (or of the files named) against the service, started
on a free port with a fresh data folder per file, and compares what each command prints with the output
shown in the markdown. --update rewrites the shown outputs from the printed ones.
`;

async function main(): Promise<void> {
  let parsed;
  try {
    parsed = parseArgs({
      args: process.argv.slice(2),
      allowPositionals: true,
      options: { update: { type: 'boolean' }, help: { type: 'boolean', short: 'h' } },
    });
  } catch (err) {
    process.stderr.write(`check-examples: ${err instanceof Error ? err.message : String(err)}\n(see --help)\n`);
    process.exit(2);
  }
  if (parsed.values.help) {
    process.stdout.write(HELP);
    return;
  }
  const missing = ['bash', 'curl', 'jq'].filter((tool) => spawnSync('sh', ['-c', `command -v ${tool}`]).status !== 0);
  if (missing.length > 0) {
    process.stderr.write(
      `check-examples: the examples need ${missing.join(', ')}; install them first (Debian: apt-get install ${missing.join(' ')})\n`,
    );
    process.exit(2);
  }
  const files = parsed.positionals.length > 0 ? parsed.positionals.map((f) => relative(ROOT, join(process.cwd(), f))) : defaultFiles();
  const started = Date.now();
  let filesWithExamples = 0;
  let commands = 0;
  for (const file of files) {
    const ran = await checkFile(file, parsed.values.update === true);
    if (ran === null) process.exit(1);
    if (ran > 0) filesWithExamples++;
    commands += ran;
  }
  process.stdout.write(
    `check-examples: ${commands} commands in ${filesWithExamples} of ${files.length} files, every one ${parsed.values.update ? 'run and its output taken' : 'matched'} (${((Date.now() - started) / 1000).toFixed(1)} s)\n`,
  );
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((err: unknown) => {
    process.stderr.write(`check-examples: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
    process.exit(1);
  });
}
