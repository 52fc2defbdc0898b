import type Database from 'better-sqlite3';
import type { Delivery, NewDelivery } from './types.js';

export interface DeliveryDbRow {
  id: number;
  team_id: string;
  tank_id: number;
  time: number;
  volume: number;
  unit: string;
  ticket: string | null;
  raw_text: string;
  user_id: string;
  created_at: number;
}

export interface DeliveriesRepo {
  add(teamId: string, delivery: NewDelivery, at: number): Delivery;
  byId(teamId: string, id: number): Delivery | undefined;
  forTank(teamId: string, tankId: number, options?: { since?: number }): Delivery[];
  softDelete(teamId: string, id: number, at: number): boolean;
  restore(teamId: string, id: number): boolean;
}

export const toDelivery = (r: DeliveryDbRow): Delivery => ({
  id: r.id,
  teamId: r.team_id,
  tankId: r.tank_id,
  time: r.time,
  volume: r.volume,
  unit: r.unit,
  ticket: r.ticket,
  rawText: r.raw_text,
  userId: r.user_id,
  createdAt: r.created_at,
});

export function deliveriesRepo(db: Database.Database): DeliveriesRepo {
  const insert = db.prepare(
    `INSERT INTO deliveries (team_id, tank_id, time, volume, unit, ticket, raw_text, user_id, created_at)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const byId = db.prepare<[string, number], DeliveryDbRow>(
    'SELECT * FROM deliveries WHERE team_id = ? AND id = ? AND deleted_at IS NULL',
  );
  const forTank = db.prepare<[string, number, number], DeliveryDbRow>(
    `SELECT * FROM deliveries WHERE team_id = ? AND tank_id = ? AND deleted_at IS NULL AND time >= ?
     ORDER BY time, id`,
  );
  const softDelete = db.prepare(
    'UPDATE deliveries SET deleted_at = ? WHERE team_id = ? AND id = ? AND deleted_at IS NULL',
  );
  const restore = db.prepare(
    'UPDATE deliveries SET deleted_at = NULL WHERE team_id = ? AND id = ? AND deleted_at IS NOT NULL',
  );
  return {
    add: (teamId, d, at) => {
      const info = insert.run(
        teamId,
        d.tankId,
        d.time,
        d.volume,
        d.unit,
        d.ticket ?? null,
        d.rawText,
        d.userId,
        at,
      );
      return toDelivery(byId.get(teamId, Number(info.lastInsertRowid))!);
    },
    byId: (teamId, id) => {
      const row = byId.get(teamId, id);
      return row ? toDelivery(row) : undefined;
    },
    forTank: (teamId, tankId, options = {}) =>
      forTank.all(teamId, tankId, options.since ?? Number.MIN_SAFE_INTEGER).map(toDelivery),
    softDelete: (teamId, id, at) => softDelete.run(at, teamId, id).changes === 1,
    restore: (teamId, id) => restore.run(teamId, id).changes === 1,
  };
}
