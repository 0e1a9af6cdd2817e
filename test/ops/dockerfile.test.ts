/**
 * docker/Dockerfile and .dockerignore, read as text against the Dockerfile reference. What a build can
 * only show (it builds, runs, answers, stops with 0) is checked by scripts/container-smoke.sh in CI.
 */

import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const REPO_ROOT = fileURLToPath(new URL('../..', import.meta.url));
const DOCKERFILE = readFileSync(path.join(REPO_ROOT, 'docker/Dockerfile'), 'utf8');
const DOCKERIGNORE = readFileSync(path.join(REPO_ROOT, '.dockerignore'), 'utf8');

interface Instruction {
  keyword: string;
  args: string;
}
interface Stage {
  from: string;
  name?: string;
  instructions: Instruction[];
}

/** Instructions with continuation lines joined and comments dropped (Dockerfile reference, "Format"). */
function instructions(text: string): Instruction[] {
  const logical: string[] = [];
  let current = '';
  for (const raw of text.split('\n')) {
    const line = raw.trim();
    if (line.startsWith('#')) continue;
    if (line.endsWith('\\')) {
      current += line.slice(0, -1) + ' ';
      continue;
    }
    current += line;
    if (current.trim()) logical.push(current.trim());
    current = '';
  }
  return logical.map((l) => {
    const [keyword, ...rest] = l.split(/\s+/);
    return { keyword: keyword!.toUpperCase(), args: rest.join(' ') };
  });
}

function stages(all: Instruction[]): { globalArgs: Instruction[]; stages: Stage[] } {
  const globalArgs: Instruction[] = [];
  const result: Stage[] = [];
  for (const ins of all) {
    if (ins.keyword === 'FROM') {
      const [from, as, name] = ins.args.split(/\s+/);
      result.push({ from: from!, name: as?.toUpperCase() === 'AS' ? name : undefined, instructions: [] });
    } else if (result.length === 0) {
      globalArgs.push(ins);
    } else {
      result.at(-1)!.instructions.push(ins);
    }
  }
  return { globalArgs, stages: result };
}

const parsed = stages(instructions(DOCKERFILE));
const final = parsed.stages.at(-1)!;
const finalOf = (keyword: string) => final.instructions.filter((i) => i.keyword === keyword);
/** JSON (exec) form of CMD/HEALTHCHECK CMD/ENTRYPOINT; undefined for the shell form. */
function execForm(args: string): string[] | undefined {
  try {
    const value: unknown = JSON.parse(args);
    return Array.isArray(value) ? (value as string[]) : undefined;
  } catch {
    return undefined;
  }
}

describe('air-gapped builds (issue 15 item 7)', () => {
  it('has no "# syntax=" parser directive, which makes BuildKit fetch a frontend image (Dockerfile reference, "Parser directives")', () => {
    const directives = DOCKERFILE.split('\n').filter((l) => /^#\s*syntax\s*=/i.test(l));
    expect(directives).toEqual([]);
  });

  it('declares ARG NPM_REGISTRY in every stage that runs npm ci and hands it to npm as npm_config_registry', () => {
    const npmStages = parsed.stages.filter((s) => s.instructions.some((i) => i.keyword === 'RUN' && /\bnpm ci\b/.test(i.args)));
    expect(npmStages.length).toBeGreaterThanOrEqual(2);
    for (const stage of npmStages) {
      expect(
        stage.instructions.some((i) => i.keyword === 'ARG' && /^NPM_REGISTRY(=|$)/.test(i.args)),
        stage.name,
      ).toBe(true);
      for (const run of stage.instructions.filter((i) => i.keyword === 'RUN' && /\bnpm ci\b/.test(i.args))) {
        expect(run.args).toMatch(/npm_config_registry="\$NPM_REGISTRY"/);
      }
    }
  });
});

describe('Dockerfile reference: multi-stage build, base image argument', () => {
  it('declares BASE_IMAGE before the first FROM, defaulting to a Node 22 image (22 is an LTS line: Node.js release schedule, from memory)', () => {
    const arg = parsed.globalArgs.find((a) => a.keyword === 'ARG' && a.args.startsWith('BASE_IMAGE='));
    expect(arg?.args).toMatch(/^BASE_IMAGE=node:22[-.]/);
  });

  // eslint-disable-next-line no-template-curly-in-string -- the Dockerfile's own ${BASE_IMAGE}
  it('has build stages and a final stage FROM ${BASE_IMAGE}', () => {
    expect(parsed.stages.length).toBeGreaterThanOrEqual(2);
    // eslint-disable-next-line no-template-curly-in-string -- the Dockerfile's own ${BASE_IMAGE}
    expect(final.from).toBe('${BASE_IMAGE}');
  });

  it('installs production dependencies only for the final stage (npm ci --omit=dev) and copies no sources', () => {
    const copies = finalOf('COPY');
    const fromStages = copies.map((c) => /--from=(\S+)/.exec(c.args)?.[1]).filter((s): s is string => s !== undefined);
    const depsCopy = copies.find((c) => /\/node_modules\b/.test(c.args));
    const depsStage = parsed.stages.find((s) => s.name === /--from=(\S+)/.exec(depsCopy?.args ?? '')?.[1]);
    expect(depsStage).toBeDefined();
    const npmCi = depsStage!.instructions.filter((i) => i.keyword === 'RUN' && /\bnpm ci\b/.test(i.args));
    expect(npmCi).toHaveLength(1);
    expect(npmCi[0]!.args).toMatch(/--omit=dev/);
    expect(fromStages.length).toBeGreaterThanOrEqual(2);
    for (const copy of copies) expect(copy.args).not.toMatch(/(^|\s)(\.\/)?src\b|tsconfig|test\//);
    expect(final.instructions.some((i) => i.keyword === 'RUN' && /\bnpm\b/.test(i.args))).toBe(false);
  });
});

describe('Dockerfile reference: the service is PID 1 and gets SIGTERM itself', () => {
  it('starts node directly with the exec form CMD ["node", …, "dist/server.js"] (the shell form runs under /bin/sh -c, which does not pass signals on)', () => {
    const cmds = finalOf('CMD');
    expect(cmds).toHaveLength(1);
    expect(execForm(cmds[0]!.args)).toEqual(['node', '--max-semi-space-size=32', 'dist/server.js']);
    expect(finalOf('ENTRYPOINT')).toHaveLength(0); // no wrapper script in front of node
  });

  it('stops with SIGTERM', () => {
    const stop = finalOf('STOPSIGNAL');
    expect(stop.length === 0 || stop[0]!.args === 'SIGTERM').toBe(true);
  });
});

describe('Dockerfile reference: non-root user, data volume, environment', () => {
  it('runs as a non-root user, given numerically (so a runtime can verify it is not root without /etc/passwd)', () => {
    const users = finalOf('USER');
    expect(users.length).toBeGreaterThanOrEqual(1);
    const [uid, gid] = users.at(-1)!.args.split(':');
    expect(uid).toMatch(/^\d+$/);
    expect(Number(uid)).not.toBe(0);
    if (gid !== undefined) expect(Number(gid)).not.toBe(0);
  });

  it('gives /data to that user before declaring it a VOLUME (changes after VOLUME are discarded: Dockerfile reference, "VOLUME")', () => {
    const uid = finalOf('USER').at(-1)!.args.split(':')[0];
    const index = (pred: (i: Instruction) => boolean) => final.instructions.findIndex(pred);
    const chown = index((i) => i.keyword === 'RUN' && new RegExp(`chown ${uid}(:\\d+)? /data`).test(i.args));
    const volume = index((i) => i.keyword === 'VOLUME' && /(^|["\s[])\/data(["\s\]]|$)/.test(i.args));
    expect(chown).toBeGreaterThanOrEqual(0);
    expect(volume).toBeGreaterThan(chown);
  });

  it('sets TROPODELAY_HOST=0.0.0.0, TROPODELAY_PORT=8080 and TROPODELAY_DATA_DIR=/data (the one prefix), and exposes the port', () => {
    const env = finalOf('ENV')
      .map((e) => e.args)
      .join(' ');
    expect(env).toMatch(/\bTROPODELAY_HOST=0\.0\.0\.0\b/);
    expect(env).toMatch(/\bTROPODELAY_PORT=8080\b/);
    expect(env).toMatch(/\bTROPODELAY_DATA_DIR=\/data\b/);
    expect(env).not.toMatch(/(^|\s)(HOST|PORT|TROPO_DATA_DIR)=/); // an old name beside the new one would be a conflict
    expect(finalOf('EXPOSE').map((e) => e.args)).toContain('8080');
  });
});

describe('Dockerfile reference: HEALTHCHECK', () => {
  it('checks health with node itself (exec form, no curl or shell in the image)', () => {
    const checks = finalOf('HEALTHCHECK');
    expect(checks).toHaveLength(1);
    const command = checks[0]!.args.replace(/^(--\S+\s+)*CMD\s+/, '');
    const argv = execForm(command);
    expect(argv?.[0]).toBe('node');
    const script = argv![1]!;
    expect(existsSync(path.join(REPO_ROOT, script))).toBe(true);
    expect(readFileSync(path.join(REPO_ROOT, script), 'utf8')).toContain("'/v1/ready'"); // readiness (issue 15 item 7)
    expect(argv).not.toContain('--live');
    expect(finalOf('COPY').some((c) => c.args.includes(script))).toBe(true);
  });
});

describe('.dockerignore (Dockerfile reference, ".dockerignore file")', () => {
  const patterns = DOCKERIGNORE.split('\n')
    .map((l) => l.trim())
    .filter((l) => l && !l.startsWith('#'));
  const glob = (p: string) => new RegExp(`^${p.replace(/[.+^${}()|[\]\\]/g, '\\$&').replace(/\*/g, '[^/]*')}(/.*)?$`);
  const ignored = (file: string) => patterns.some((p) => !p.startsWith('!') && glob(p).test(file));

  it('keeps local state, secrets and bulky folders out of the build context', () => {
    for (const file of ['node_modules', 'dist', 'data', '.git', '.env', 'server.log']) expect(ignored(file), file).toBe(true);
  });

  it('does not exclude anything the Dockerfile copies from the context', () => {
    const sources = parsed.stages
      .flatMap((s) => s.instructions)
      .filter((i) => i.keyword === 'COPY' && !i.args.includes('--from='))
      .flatMap((i) =>
        i.args
          .split(/\s+/)
          .filter((a) => !a.startsWith('--'))
          .slice(0, -1),
      );
    expect(sources).toEqual(expect.arrayContaining(['package.json', 'package-lock.json', 'src']));
    for (const source of sources) {
      expect(ignored(source.replace(/^\.\//, '')), source).toBe(false);
      expect(existsSync(path.join(REPO_ROOT, source)), source).toBe(true);
    }
  });
});
