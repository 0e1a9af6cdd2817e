/**
 * The first admin key when no key is configured. Replicas on one database agree on their keys because
 * the keys live in the database: the first replica to start with an empty api_keys table stores an
 * admin key named `admin` there and writes its secret once to `<data dir>/api-key` (mode 0600);
 * a replica that loses that race (the name is the primary key) or starts later creates nothing.
 *
 * Upgrade from a release with one generated key in the same file: when the table is empty and the
 * file holds a key, that key is stored as the admin key, so the secret operators already use keeps
 * working (it could delete stations before, as admin can now).
 */

import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Repository } from '../../storage/repository.js';
import { MIN_KEY_SECRET_CHARS } from '../../config.js';
import { newSecret, sha256Hex } from './key-store.js';

/** The first admin key's file in the data directory (the generated key file of earlier releases too). */
export const ADMIN_KEY_FILE_NAME = 'api-key';
export const FIRST_ADMIN_KEY_NAME = 'admin';

export type FirstAdminKeyOutcome =
  | { kind: 'keys-exist'; count: number }
  | { kind: 'created'; file: string | null; fromLegacyFile: boolean; secret: string }
  | { kind: 'created-elsewhere' };

export async function ensureFirstAdminKey(repository: Repository, keyDir: string | undefined): Promise<FirstAdminKeyOutcome> {
  const existing = await repository.listApiKeys();
  if (existing.length > 0) return { kind: 'keys-exist', count: existing.filter((k) => k.revokedAt === null).length };
  const legacyPath = keyDir ? join(keyDir, ADMIN_KEY_FILE_NAME) : null;
  const legacy = legacyPath && existsSync(legacyPath) ? readFileSync(legacyPath, 'utf8').trim() : '';
  const fromLegacyFile = legacy.length >= MIN_KEY_SECRET_CHARS;
  const secret = fromLegacyFile ? legacy : newSecret();
  const created = await repository.createApiKey({
    name: FIRST_ADMIN_KEY_NAME,
    role: 'admin',
    secretSha256: sha256Hex(secret),
    createdAt: new Date().toISOString(),
    createdBy: null,
    revokedAt: null,
  });
  if (!created) return { kind: 'created-elsewhere' };
  if (fromLegacyFile) return { kind: 'created', file: legacyPath, fromLegacyFile, secret };
  if (!keyDir) return { kind: 'created', file: null, fromLegacyFile, secret };
  mkdirSync(keyDir, { recursive: true });
  const file = join(keyDir, ADMIN_KEY_FILE_NAME);
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  chmodSync(file, 0o600); // in case the file existed with other permissions
  return { kind: 'created', file, fromLegacyFile, secret };
}
