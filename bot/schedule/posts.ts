import type Database from 'better-sqlite3';
import type { Reply } from '../replies/reply.js';

/** What a post is: the morning digest, a threshold notice, or a stale-tank reminder. */
export type PostKind = 'digest' | 'notice' | 'stale';

export interface PostKey {
  teamId: string;
  channel: string;
  kind: PostKind;
  /** A digest's local date ("2026-03-08"); a notice's tank, rule and crossing; a reminder's tank and date. */
  key: string;
}

export interface PendingPost extends PostKey {
  dueAt: number;
  replies: Reply[];
  attempts: number;
}

interface PostRow {
  team_id: string;
  channel: string;
  kind: PostKind;
  key: string;
  due_at: number;
  payload: string | null;
  attempts: number;
}

const keyArgs = (k: PostKey) => [k.teamId, k.channel, k.kind, k.key] as const;

/**
 * Claimed posts: a row is inserted (claimed) before its message is delivered and marked delivered after, so
 * a post is claimed once whatever the number of processes or restarts. The claim stores the replies, so a
 * retry after a crash between claim and delivery posts the same message under the same key (adapters that
 * can deduplicate, e.g. a Discord nonce, use the key).
 */
export interface PostsRepo {
  exists(key: PostKey): boolean;
  /** Inserts a pending claim; false when the key was already claimed (by anyone, in any state). */
  claim(key: PostKey, dueAt: number, replies: Reply[], holder: string, now: number): boolean;
  /** Records a post that will not be sent (missed beyond the grace period); false when already recorded. */
  skip(key: PostKey, dueAt: number, note: string, now: number): boolean;
  /**
   * Pending posts this holder may deliver now: its own claims, and claims whose holder went silent for
   * `orphanMs` (it crashed between claim and delivery). Each taken row is stamped with holder and attempt.
   */
  take(holder: string, now: number, orphanMs: number): PendingPost[];
  markDelivered(key: PostKey, now: number): void;
  /** Gives a pending post up (too late to be useful); false when it was not pending. */
  expire(key: PostKey, note: string): boolean;
  /** When the last digest to this channel was delivered (its due time), or null. */
  lastDigestDueAt(teamId: string, channel: string): number | null;
  /** Every row for a team, oldest first (for tests and the console). */
  history(teamId: string): { channel: string; kind: PostKind; key: string; status: string; dueAt: number }[];
}

export function postsRepo(db: Database.Database): PostsRepo {
  const where = 'team_id = ? AND channel = ? AND kind = ? AND key = ?';
  const exists = db.prepare(`SELECT 1 FROM schedule_posts WHERE ${where}`).pluck();
  const insert = db.prepare(
    `INSERT OR IGNORE INTO schedule_posts (team_id, channel, kind, key, due_at, status, payload, claimed_by, claimed_at, note)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const pending = db.prepare<[string, number], PostRow>(
    `SELECT team_id, channel, kind, key, due_at, payload, attempts FROM schedule_posts
     WHERE status = 'pending' AND (claimed_by = ? OR claimed_at <= ?) ORDER BY due_at, team_id, channel, kind, key`,
  );
  const anyPending = db.prepare("SELECT 1 FROM schedule_posts WHERE status = 'pending' LIMIT 1").pluck();
  const stamp = db.prepare(
    `UPDATE schedule_posts SET claimed_by = ?, claimed_at = ?, attempts = attempts + 1 WHERE ${where}`,
  );
  const delivered = db.prepare(
    `UPDATE schedule_posts SET status = 'delivered', delivered_at = ?, payload = NULL WHERE ${where} AND status = 'pending'`,
  );
  const expire = db.prepare(
    `UPDATE schedule_posts SET status = 'expired', note = ? WHERE ${where} AND status = 'pending'`,
  );
  const lastDigest = db
    .prepare(
      `SELECT MAX(due_at) FROM schedule_posts WHERE team_id = ? AND channel = ? AND kind = 'digest' AND status = 'delivered'`,
    )
    .pluck();
  const history = db.prepare<
    [string],
    { channel: string; kind: PostKind; key: string; status: string; due_at: number }
  >(
    'SELECT channel, kind, key, status, due_at FROM schedule_posts WHERE team_id = ? ORDER BY due_at, kind, key',
  );

  const take = db.transaction((holder: string, now: number, orphanMs: number): PendingPost[] => {
    const rows = pending.all(holder, now - orphanMs);
    return rows.map((row) => {
      const key: PostKey = { teamId: row.team_id, channel: row.channel, kind: row.kind, key: row.key };
      stamp.run(holder, now, ...keyArgs(key));
      return { ...key, dueAt: row.due_at, replies: parseReplies(row.payload), attempts: row.attempts + 1 };
    });
  });

  return {
    exists: (key) => exists.get(...keyArgs(key)) !== undefined,
    claim: (key, dueAt, replies, holder, now) =>
      insert.run(...keyArgs(key), dueAt, 'pending', JSON.stringify(replies), holder, now, null).changes === 1,
    skip: (key, dueAt, note, now) =>
      insert.run(...keyArgs(key), dueAt, 'skipped', null, null, now, note).changes === 1,
    // Most ticks find nothing pending: look before taking the write lock.
    take: (holder, now, orphanMs) =>
      anyPending.get() === undefined ? [] : take.immediate(holder, now, orphanMs),
    markDelivered: (key, now) => {
      delivered.run(now, ...keyArgs(key));
    },
    expire: (key, note) => expire.run(note, ...keyArgs(key)).changes === 1,
    lastDigestDueAt: (teamId, channel) => {
      const value = lastDigest.get(teamId, channel);
      return typeof value === 'number' ? value : null;
    },
    history: (teamId) =>
      history
        .all(teamId)
        .map((r) => ({ channel: r.channel, kind: r.kind, key: r.key, status: r.status, dueAt: r.due_at })),
  };
}

/** A stored payload that cannot be read (hand-edited file) becomes no replies rather than a crash. */
function parseReplies(payload: string | null): Reply[] {
  if (payload === null) return [];
  try {
    const value: unknown = JSON.parse(payload);
    return Array.isArray(value) ? (value as Reply[]) : [];
  } catch {
    return [];
  }
}
