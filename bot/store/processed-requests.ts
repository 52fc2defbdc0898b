import type Database from 'better-sqlite3';
import type { Reply } from '../replies/reply.js';
import { parseJsonColumn } from './json-column.js';

/** Platform redeliveries (Slack retries, Discord replays) carry the same key: handle each key once. */
export interface ProcessedRequestsRepo {
  /** The replies given the first time, or undefined when the key is new. */
  find(teamId: string, dedupeKey: string): Reply[] | undefined;
  /** Records the key with its replies; returns false when it was already there. */
  record(teamId: string, dedupeKey: string, replies: Reply[], at: number): boolean;
  /** Drops a team's keys older than `before` (platforms stop retrying after minutes). */
  prune(teamId: string, before: number): number;
}

export function processedRequestsRepo(db: Database.Database): ProcessedRequestsRepo {
  const find = db.prepare<[string, string], { replies: string }>(
    'SELECT replies FROM processed_requests WHERE team_id = ? AND dedupe_key = ?',
  );
  const insert = db.prepare(
    'INSERT OR IGNORE INTO processed_requests (team_id, dedupe_key, replies, at) VALUES (?, ?, ?, ?)',
  );
  const prune = db.prepare('DELETE FROM processed_requests WHERE team_id = ? AND at < ?');
  return {
    find: (teamId, key) => {
      const row = find.get(teamId, key);
      return row ? parseJsonColumn<Reply[]>(row.replies, []) : undefined;
    },
    record: (teamId, key, replies, at) => insert.run(teamId, key, JSON.stringify(replies), at).changes === 1,
    prune: (teamId, before) => prune.run(teamId, before).changes,
  };
}
