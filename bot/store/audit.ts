import type Database from 'better-sqlite3';
import { parseJsonColumn } from './json-column.js';
import type { AuditEntry } from './types.js';

interface AuditDbRow {
  id: number;
  team_id: string;
  user_id: string;
  at: number;
  action: string;
  target: string | null;
  target_id: number | null;
  detail: string;
  undone_at: number | null;
}

export interface NewAuditEntry {
  userId: string;
  action: string;
  target?: 'readings' | 'deliveries' | 'tanks' | 'teams' | 'members';
  targetId?: number;
  detail?: Record<string, unknown>;
}

export interface AuditRepo {
  record(teamId: string, entry: NewAuditEntry, at: number): AuditEntry;
  /** The sender's latest entry that can still be undone (an added reading or delivery). */
  lastUndoable(teamId: string, userId: string): AuditEntry | undefined;
  markUndone(teamId: string, id: number, at: number): boolean;
  recent(teamId: string, limit: number): AuditEntry[];
}

/** Actions whose row an `undo` soft-deletes. */
export const UNDOABLE_ACTIONS = ['reading.add', 'delivery.add'] as const;

const toEntry = (r: AuditDbRow): AuditEntry => ({
  id: r.id,
  teamId: r.team_id,
  userId: r.user_id,
  at: r.at,
  action: r.action,
  target: r.target,
  targetId: r.target_id,
  detail: parseJsonColumn<Record<string, unknown>>(r.detail, {}),
  undoneAt: r.undone_at,
});

export function auditRepo(db: Database.Database): AuditRepo {
  const insert = db.prepare(
    'INSERT INTO audit (team_id, user_id, at, action, target, target_id, detail) VALUES (?, ?, ?, ?, ?, ?, ?)',
  );
  const byId = db.prepare<[string, number], AuditDbRow>('SELECT * FROM audit WHERE team_id = ? AND id = ?');
  const lastUndoable = db.prepare<[string, string], AuditDbRow>(
    `SELECT * FROM audit WHERE team_id = ? AND user_id = ? AND undone_at IS NULL
       AND action IN (${UNDOABLE_ACTIONS.map((a) => `'${a}'`).join(', ')})
     ORDER BY id DESC LIMIT 1`,
  );
  const markUndone = db.prepare(
    'UPDATE audit SET undone_at = ? WHERE team_id = ? AND id = ? AND undone_at IS NULL',
  );
  const recent = db.prepare<[string, number], AuditDbRow>(
    'SELECT * FROM audit WHERE team_id = ? ORDER BY id DESC LIMIT ?',
  );
  return {
    record: (teamId, e, at) => {
      const info = insert.run(
        teamId,
        e.userId,
        at,
        e.action,
        e.target ?? null,
        e.targetId ?? null,
        JSON.stringify(e.detail ?? {}),
      );
      return toEntry(byId.get(teamId, Number(info.lastInsertRowid))!);
    },
    lastUndoable: (teamId, userId) => {
      const row = lastUndoable.get(teamId, userId);
      return row ? toEntry(row) : undefined;
    },
    markUndone: (teamId, id, at) => markUndone.run(at, teamId, id).changes === 1,
    recent: (teamId, limit) => recent.all(teamId, limit).map(toEntry),
  };
}
