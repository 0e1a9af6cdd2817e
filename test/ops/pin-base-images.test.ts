/**
 * scripts/pin-base-images.sh on copies of docker/Dockerfile and docker/compose.yaml, with a stand-in
 * resolver (PIN_DIGEST_COMMAND) instead of a registry: it writes name:tag@sha256:<digest>, the image
 * reference form with a digest (OCI distribution, "digest" references: algorithm sha256 and 64 lower-case
 * hex digits — from memory), replaces an older digest on a second run, and leaves local images alone.
 */

import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const DIGEST_A = `sha256:${'a1'.repeat(32)}`;
const DIGEST_B = `sha256:${'b2'.repeat(32)}`;

describe('scripts/pin-base-images.sh', () => {
  let dir: string;
  const run = (digest: string) =>
    execFileSync('bash', ['scripts/pin-base-images.sh'], {
      env: {
        ...process.env,
        PIN_DIGEST_COMMAND: join(dir, 'resolver'),
        PIN_DOCKERFILE: join(dir, 'Dockerfile'),
        PIN_COMPOSE_FILE: join(dir, 'compose.yaml'),
        FAKE_DIGEST: digest,
      },
      encoding: 'utf8',
    });
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'tropodelay-pin-'));
    copyFileSync('docker/Dockerfile', join(dir, 'Dockerfile'));
    copyFileSync('docker/compose.yaml', join(dir, 'compose.yaml'));
    writeFileSync(join(dir, 'resolver'), '#!/bin/sh\necho "$FAKE_DIGEST"\necho "$1" >> "$(dirname "$0")/asked"\n');
    chmodSync(join(dir, 'resolver'), 0o755);
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('pins the Dockerfile base and the database image, keeping the tag', () => {
    run(DIGEST_A);
    const dockerfile = readFileSync(join(dir, 'Dockerfile'), 'utf8');
    const compose = readFileSync(join(dir, 'compose.yaml'), 'utf8');
    expect(dockerfile).toMatch(new RegExp(`^ARG BASE_IMAGE=node:22-bookworm-slim@${DIGEST_A}$`, 'm'));
    expect(compose).toMatch(new RegExp(`^    image: postgres:17-bookworm@${DIGEST_A}$`, 'm'));
    expect(compose).toMatch(/^ {2}image: localhost\/tropodelay:compose$/m); // built locally: not pinned
    expect(readFileSync(join(dir, 'asked'), 'utf8').trim().split('\n')).toEqual(['node:22-bookworm-slim', 'postgres:17-bookworm']);
  });

  it('replaces the digest on a later run (an update of the same tag)', () => {
    run(DIGEST_B);
    const dockerfile = readFileSync(join(dir, 'Dockerfile'), 'utf8');
    expect(dockerfile).toMatch(new RegExp(`^ARG BASE_IMAGE=node:22-bookworm-slim@${DIGEST_B}$`, 'm'));
    expect(dockerfile).not.toContain(DIGEST_A);
  });

  it('refuses an answer that is not a sha256 digest, changing nothing', () => {
    const before = readFileSync(join(dir, 'Dockerfile'), 'utf8');
    const r = spawnSync('bash', ['scripts/pin-base-images.sh'], {
      env: {
        ...process.env,
        PIN_DIGEST_COMMAND: join(dir, 'resolver'),
        PIN_DOCKERFILE: join(dir, 'Dockerfile'),
        PIN_COMPOSE_FILE: join(dir, 'compose.yaml'),
        FAKE_DIGEST: 'latest',
      },
      encoding: 'utf8',
    });
    expect(r.status).not.toBe(0);
    expect(r.stderr).toMatch(/not a sha256 digest/);
    expect(readFileSync(join(dir, 'Dockerfile'), 'utf8')).toBe(before);
  });
});
