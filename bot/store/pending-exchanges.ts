import type Database from 'better-sqlite3';
import { parseJsonColumn } from './json-column.js';
import type { PendingExchange } from './types.js';

interface PendingDbRow {
  team_id: string;
  channel: string;
  user_id: string;
  kind: string;
  state: string;
  created_at: number;
}

/** At most one open exchange per sender and channel; a new one replaces the old. */
export interface PendingExchangesRepo {
  get(teamId: string, channel: string, userId: string): PendingExchange | undefined;
  put(exchange: PendingExchange): void;
  clear(teamId: string, channel: string, userId: string): boolean;
}

export function pendingExchangesRepo(db: Database.Database): PendingExchangesRepo {
  const get = db.prepare<[string, string, string], PendingDbRow>(
    'SELECT * FROM pending_exchanges WHERE team_id = ? AND channel = ? AND user_id = ?',
  );
  const put = db.prepare(
    `INSERT INTO pending_exchanges (team_id, channel, user_id, kind, state, created_at) VALUES (?, ?, ?, ?, ?, ?)
     ON CONFLICT (team_id, channel, user_id) DO UPDATE SET kind = excluded.kind, state = excluded.state,
       created_at = excluded.created_at`,
  );
  const clear = db.prepare('DELETE FROM pending_exchanges WHERE team_id = ? AND channel = ? AND user_id = ?');
  return {
    get: (teamId, channel, userId) => {
      const r = get.get(teamId, channel, userId);
      if (!r) return undefined;
      return {
        teamId: r.team_id,
        channel: r.channel,
        userId: r.user_id,
        kind: r.kind,
        state: parseJsonColumn<Record<string, unknown>>(r.state, {}),
        createdAt: r.created_at,
      };
    },
    put: (e) => {
      put.run(e.teamId, e.channel, e.userId, e.kind, JSON.stringify(e.state), e.createdAt);
    },
    clear: (teamId, channel, userId) => clear.run(teamId, channel, userId).changes === 1,
  };
}
