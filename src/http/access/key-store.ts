/**
 * The bearer keys a replica accepts: keys from the configuration (TROPODELAY_API_KEYS, its file, the
 * deprecated TROPO_API_KEYS) and keys stored in the database's api_keys table, which every replica on
 * the same database shares. Secrets are held as SHA-256 digests only; a presented key is hashed and
 * compared with every digest in constant time (crypto.timingSafeEqual, no early exit). SHA-256 without
 * salt or stretching is enough for secrets of 256 random bits (common practice; a password would need
 * a slow hash).
 *
 * The database keys are cached and read again at most every KEY_REFRESH_MS (a key revoked on another
 * replica stops working here within that time; on the replica that revoked it, at once), and at most
 * every KEY_MISS_REFRESH_MS when an unknown key is presented (a key just created on another replica).
 */

import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';
import type { ConfiguredKey } from '../../config.js';
import type { KeyRole, StoredApiKey } from '../../storage/access-rows.js';
import type { Repository } from '../../storage/repository.js';

export type { KeyRole };
export const KEY_REFRESH_MS = 10_000;
export const KEY_MISS_REFRESH_MS = 1_000;

/** Who made a request: the name and role of the key presented. */
export interface CallerKey {
  name: string;
  role: KeyRole;
}

const ROLE_RANK: Record<KeyRole, number> = { read: 1, write: 2, admin: 3 };
/** admin ⊇ write ⊇ read. */
export const roleAllows = (held: KeyRole, needed: KeyRole): boolean => ROLE_RANK[held] >= ROLE_RANK[needed];

export const sha256Hex = (secret: string): string => createHash('sha256').update(secret, 'utf8').digest('hex');
/** A new secret: 32 random bytes, base64url (43 characters). */
export const newSecret = (): string => randomBytes(32).toString('base64url');

interface Entry extends CallerKey {
  digest: Buffer;
  origin: 'configuration' | 'database';
}

export class KeyStore {
  private readonly configured: Entry[];
  private stored: Entry[] = [];
  private storedAt = -Infinity;
  private refreshing: Promise<void> | undefined;

  constructor(
    configured: readonly ConfiguredKey[],
    private readonly repository: Repository,
    private readonly onRefreshError: (err: unknown) => void = () => undefined,
  ) {
    this.configured = configured.map((k) => ({
      name: k.name,
      role: k.role,
      digest: Buffer.from(sha256Hex(k.secret), 'hex'),
      origin: 'configuration',
    }));
  }

  /** A short id of a secret for rate-limit buckets (16 hex digits of its SHA-256; never the secret). */
  static shortId(secret: string): string {
    return sha256Hex(secret).slice(0, 16);
  }

  get configuredNames(): string[] {
    return this.configured.map((k) => k.name);
  }

  /** The key a secret belongs to, from the current cache (no database access). */
  matchCached(secret: string): CallerKey | null {
    const digest = createHash('sha256').update(secret, 'utf8').digest();
    let found: Entry | null = null;
    for (const e of [...this.configured, ...this.stored]) {
      if (timingSafeEqual(digest, e.digest) && !found) found = e; // every digest compared
    }
    return found ? { name: found.name, role: found.role } : null;
  }

  /** The key a secret belongs to; reads the database keys again when the cache is stale. */
  async match(secret: string, nowMs = Date.now()): Promise<CallerKey | null> {
    if (nowMs - this.storedAt > KEY_REFRESH_MS) await this.refresh(nowMs);
    const hit = this.matchCached(secret);
    if (hit || nowMs - this.storedAt <= KEY_MISS_REFRESH_MS) return hit;
    await this.refresh(nowMs);
    return this.matchCached(secret);
  }

  /** Reads the valid database keys (one read at a time; a failed read keeps the old cache). */
  async refresh(nowMs = Date.now()): Promise<void> {
    this.refreshing ??= (async () => {
      try {
        const keys = await this.repository.listApiKeys();
        this.stored = keys
          .filter((k) => k.revokedAt === null)
          .map((k) => ({ name: k.name, role: k.role, digest: Buffer.from(k.secretSha256, 'hex'), origin: 'database' as const }));
      } catch (err) {
        this.onRefreshError(err);
      } finally {
        this.storedAt = nowMs;
        this.refreshing = undefined;
      }
    })();
    await this.refreshing;
  }

  /**
   * Stores a new key under `name` and returns its secret (shown once, never stored); null when the
   * name is taken (by a configured key or a stored one, revoked ones included).
   */
  async create(name: string, role: KeyRole, createdBy: string | null): Promise<{ key: StoredApiKey; secret: string } | null> {
    if (this.configured.some((k) => k.name === name)) return null;
    const secret = newSecret();
    const key: StoredApiKey = {
      name,
      role,
      secretSha256: sha256Hex(secret),
      createdAt: new Date().toISOString(),
      createdBy,
      revokedAt: null,
    };
    if (!(await this.repository.createApiKey(key))) return null;
    await this.refresh();
    return { key, secret };
  }

  async revoke(name: string): Promise<boolean> {
    const done = await this.repository.revokeApiKey(name, new Date().toISOString());
    if (done) await this.refresh();
    return done;
  }

  /** Configured keys (no dates) and stored keys, by name; never a secret or a digest. */
  async list(): Promise<
    {
      name: string;
      role: KeyRole;
      origin: 'configuration' | 'database';
      createdAt: string | null;
      createdBy: string | null;
      revokedAt: string | null;
    }[]
  > {
    const stored = await this.repository.listApiKeys();
    return [
      ...this.configured.map((k) => ({
        name: k.name,
        role: k.role,
        origin: k.origin,
        createdAt: null,
        createdBy: null,
        revokedAt: null,
      })),
      ...stored.map((k) => ({
        name: k.name,
        role: k.role,
        origin: 'database' as const,
        createdAt: k.createdAt,
        createdBy: k.createdBy,
        revokedAt: k.revokedAt,
      })),
    ].sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  }
}
