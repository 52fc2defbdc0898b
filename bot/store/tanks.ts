import type Database from 'better-sqlite3';
import { BoundedMemo } from '../bounded-memo.js';
import { parseJsonColumn } from './json-column.js';
import type { NewTank, Tank, TankSettings } from './types.js';

/** A tank row as read: its columns in this order, as an array (better-sqlite3 `raw`: a digest reads every
 * tank of every team, and arrays come back faster than objects). */
const TANK_COLUMNS =
  'id, team_id, code, name, site, product, spec, settings, created_by, created_at, updated_at';
type TankDbRow = [
  id: number,
  teamId: string,
  code: string,
  name: string,
  site: string | null,
  product: string | null,
  spec: string,
  settings: string,
  createdBy: string,
  createdAt: number,
  updatedAt: number,
];

export type TankPatch = Partial<Pick<Tank, 'name' | 'site' | 'product' | 'spec' | 'settings'>>;

export interface TanksRepo {
  add(teamId: string, tank: NewTank, userId: string, at: number): Tank;
  /** Case-insensitive on the short code; live tanks only. */
  byCode(teamId: string, code: string): Tank | undefined;
  byId(teamId: string, id: number): Tank | undefined;
  list(teamId: string): Tank[];
  /** Codes and names of the live tanks only: what the language needs on every message, without the JSON. */
  names(teamId: string): { code: string; name: string }[];
  update(teamId: string, id: number, patch: TankPatch, at: number): Tank | undefined;
  /** A new short code; a name that was just the old code follows it. */
  rename(teamId: string, id: number, code: string, at: number): boolean;
  /** Soft delete: history stays for the audit trail; the code becomes free again. */
  remove(teamId: string, id: number, at: number): boolean;
}

/**
 * Parsed spec and settings columns by their text, frozen and shared between the tanks that repeat them: a
 * digest reads every tank of every team, and the figures cache what they derive from these (built shape,
 * validated refill settings) by the object.
 */
const sharedColumns = new BoundedMemo<string, unknown>(4096);

function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null && !Object.isFrozen(value)) {
    for (const inner of Object.values(value)) deepFreeze(inner);
    Object.freeze(value);
  }
  return value;
}

function sharedColumn<T>(text: string, fallback: T): T {
  const parsed = sharedColumns.get(text, () => {
    const value = parseJsonColumn<unknown>(text, undefined);
    return value === undefined ? undefined : deepFreeze(value);
  });
  // A column that does not parse gets the caller's fallback, which is not shared.
  return parsed === undefined ? fallback : (parsed as T);
}

const toTank = ([
  id,
  teamId,
  code,
  name,
  site,
  product,
  spec,
  settings,
  createdBy,
  createdAt,
  updatedAt,
]: TankDbRow): Tank => ({
  teamId,
  id,
  code,
  name,
  site,
  product,
  spec: sharedColumn<unknown>(spec, null),
  settings: sharedColumn<TankSettings>(settings, {}),
  createdBy,
  createdAt,
  updatedAt,
});

export function tanksRepo(db: Database.Database): TanksRepo {
  const insert = db.prepare(
    `INSERT INTO tanks (team_id, code, name, site, product, spec, settings, created_by, created_at, updated_at)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const byCode = db
    .prepare<[string, string], TankDbRow>(
      `SELECT ${TANK_COLUMNS} FROM tanks WHERE team_id = ? AND code = ? COLLATE NOCASE AND deleted_at IS NULL`,
    )
    .raw(true);
  const byId = db
    .prepare<[string, number], TankDbRow>(
      `SELECT ${TANK_COLUMNS} FROM tanks WHERE team_id = ? AND id = ? AND deleted_at IS NULL`,
    )
    .raw(true);
  const list = db
    .prepare<[string], TankDbRow>(
      `SELECT ${TANK_COLUMNS} FROM tanks WHERE team_id = ? AND deleted_at IS NULL ORDER BY code COLLATE NOCASE`,
    )
    .raw(true);
  const names = db.prepare<[string], { code: string; name: string }>(
    'SELECT code, name FROM tanks WHERE team_id = ? AND deleted_at IS NULL ORDER BY code COLLATE NOCASE',
  );
  const update = db.prepare(
    `UPDATE tanks SET name = ?, site = ?, product = ?, spec = ?, settings = ?, updated_at = ?
     WHERE team_id = ? AND id = ? AND deleted_at IS NULL`,
  );
  const rename = db.prepare(
    `UPDATE tanks SET code = ?, name = CASE WHEN name = code THEN ? ELSE name END, updated_at = ?
     WHERE team_id = ? AND id = ? AND deleted_at IS NULL`,
  );
  const remove = db.prepare(
    'UPDATE tanks SET deleted_at = ? WHERE team_id = ? AND id = ? AND deleted_at IS NULL',
  );

  const repo: TanksRepo = {
    add: (teamId, tank, userId, at) => {
      const info = insert.run(
        teamId,
        tank.code,
        tank.name ?? tank.code,
        tank.site ?? null,
        tank.product ?? null,
        JSON.stringify(tank.spec),
        JSON.stringify(tank.settings ?? {}),
        userId,
        at,
        at,
      );
      return toTank(byId.get(teamId, Number(info.lastInsertRowid))!);
    },
    byCode: (teamId, code) => {
      const row = byCode.get(teamId, code);
      return row ? toTank(row) : undefined;
    },
    byId: (teamId, id) => {
      const row = byId.get(teamId, id);
      return row ? toTank(row) : undefined;
    },
    list: (teamId) => list.all(teamId).map(toTank),
    names: (teamId) => names.all(teamId),
    update: (teamId, id, patch, at) => {
      const current = repo.byId(teamId, id);
      if (!current) return undefined;
      const next = { ...current, ...patch };
      update.run(
        next.name,
        next.site,
        next.product,
        JSON.stringify(next.spec),
        JSON.stringify(next.settings),
        at,
        teamId,
        id,
      );
      return repo.byId(teamId, id);
    },
    rename: (teamId, id, code, at) => rename.run(code, code, at, teamId, id).changes === 1,
    remove: (teamId, id, at) => remove.run(at, teamId, id).changes === 1,
  };
  return repo;
}
