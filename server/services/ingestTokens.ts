import { createHash, randomBytes } from 'node:crypto';
import type { Sequelize } from 'sequelize';
import { QueryTypes } from 'sequelize';
import { cacheGeneration, cachesForgot, ingestCacheMs } from './ingestCacheMs';

/** 32 random bytes (256 bits); only the SHA-256 is stored, which is enough for a secret this long. */
export function newToken(nodeId: number): string {
  return `ppt_${nodeId}_${randomBytes(32).toString('base64url')}`;
}
export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** Issues a new token and revokes every earlier one of the node, in one transaction. */
export async function rotateToken(sequelize: Sequelize, nodeId: number, now: Date): Promise<string> {
  const token = newToken(nodeId);
  await sequelize.transaction(async (transaction) => {
    await sequelize.query('UPDATE node_tokens SET revoked_at = $2 WHERE node_id = $1 AND revoked_at IS NULL', { bind: [nodeId, now], transaction });
    await sequelize.query('INSERT INTO node_tokens (node_id, token_hash, created_at) VALUES ($1, $2, $3)', {
      bind: [nodeId, hashToken(token), now],
      transaction,
    });
  });
  forgetTokens(nodeId);
  return token;
}

export async function revokeTokens(sequelize: Sequelize, nodeId: number, now: Date): Promise<number> {
  const [, count] = await sequelize.query('UPDATE node_tokens SET revoked_at = $2 WHERE node_id = $1 AND revoked_at IS NULL', { bind: [nodeId, now] });
  forgetTokens(nodeId);
  return Number((count as { rowCount?: number })?.rowCount ?? count ?? 0);
}

export interface TokenNode {
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  state: string;
  healthStreak: number;
  lastSeq: string | null;
  lastBootId: string | null;
  reportIntervalS: number;
  thresholds: Record<string, number> | null;
  firmware: string | null;
}

// Token hash → the node with what ingest needs. Ingest updates the node's health fields in place
// after each store, so a hit carries what this process last wrote; a stale one only sends ingest
// down its locked path. Entries live ingestCacheMs(); revoking or rotating forgets them here at once, and
// on every instance that hears the database's change notices (ingestCaches.ts) when the change commits.
const tokenCache = new Map<string, { at: number; node: TokenNode }>();
// Node id → its cached token hashes, so forgetting one node (a notice per edited node) is not a walk of the cache.
const hashesOfNode = new Map<number, Set<string>>();
const TOKEN_CACHE_MAX = 50_000;

/** Forgets cached lookups of one node's tokens (or all of them). */
export function forgetTokens(nodeId?: number) {
  if (nodeId === undefined) {
    tokenCache.clear();
    hashesOfNode.clear();
  } else {
    for (const hash of hashesOfNode.get(nodeId) ?? []) tokenCache.delete(hash);
    hashesOfNode.delete(nodeId);
  }
  cachesForgot();
}

/** The node a bearer token belongs to, with what ingest needs: cached for ingestCacheMs(), else one indexed lookup. */
export async function nodeForToken(sequelize: Sequelize, token: string, hash = hashToken(token)): Promise<TokenNode | null> {
  if (!/^ppt_\d+_[A-Za-z0-9_-]{43}$/.test(token)) return null;
  const hit = tokenCache.get(hash);
  if (hit && Date.now() - hit.at < ingestCacheMs()) return hit.node;
  const generation = cacheGeneration();
  const node = await lookUpToken(sequelize, hash);
  if (!node) tokenCache.delete(hash);
  else if (generation === cacheGeneration()) {
    if (tokenCache.size >= TOKEN_CACHE_MAX) {
      tokenCache.clear();
      hashesOfNode.clear();
    }
    tokenCache.set(hash, { at: Date.now(), node });
    const hashes = hashesOfNode.get(node.nodeId);
    if (hashes) hashes.add(hash);
    else hashesOfNode.set(node.nodeId, new Set([hash]));
  }
  return node;
}

async function lookUpToken(sequelize: Sequelize, hash: string): Promise<TokenNode | null> {
  const rows = await sequelize.query<TokenNode>(
    `SELECT n.id AS "nodeId", n.neighbourhood_id AS "neighbourhoodId", s.host_user_id AS "hostUserId", n.state,
            n.health_streak AS "healthStreak", n.last_seq::text AS "lastSeq", n.last_boot_id AS "lastBootId", n.report_interval_s AS "reportIntervalS",
            n.thresholds, n.firmware
       FROM node_tokens t JOIN nodes n ON n.id = t.node_id JOIN sites s ON s.id = n.site_id
      WHERE t.token_hash = $1 AND t.revoked_at IS NULL`,
    { bind: [hash], type: QueryTypes.SELECT },
  );
  return rows[0] ?? null;
}
