import type Database from 'better-sqlite3';
import { type DeliveryDbRow, toDelivery } from './deliveries.js';
import type { Store } from './open-store.js';
import {
  RATE_CACHE_COLUMNS,
  type RateCacheDbRow,
  type RateCacheEntry,
  RECENT_KEPT,
  rateCacheEntryOf,
} from './rate-cache.js';
import { type ReadingDbRow, type SeriesReading, toReading } from './readings.js';
import type { Delivery, Reading } from './types.js';

/**
 * The per-tank reads of a tank's status. `storeReads` asks the store one query at a time; `teamReads` reads a
 * whole team in a few set-based queries first and answers from them, so a digest of 50 tanks runs five
 * queries rather than 250; a tank's newest readings come from its rate-cache summary (and the readings after
 * it), read only for tanks without one. Each answer is the one the store would give in the same
 * transaction: where the prefetch does not cover a question (another `since`, a longer limit), it asks the
 * store.
 */
export interface TankReads {
  rateCache(tankId: number): RateCacheEntry | undefined;
  /** As `readings.series`. */
  series(tankId: number, since: number): SeriesReading[];
  /** As `readings.recentSeries`. */
  recentSeries(tankId: number, since: number, limit: number): SeriesReading[];
  /** As `readings.latest` with no `at`. */
  latest(tankId: number): Reading | undefined;
  /** As `deliveries.forTank` with `since`. */
  deliveries(tankId: number, since: number): Delivery[];
}

export function storeReads(store: Store, teamId: string): TankReads {
  return {
    rateCache: (tankId) => store.rateCache.get(teamId, tankId),
    series: (tankId, since) => store.readings.series(teamId, tankId, since),
    recentSeries: (tankId, since, limit) => store.readings.recentSeries(teamId, tankId, since, limit),
    latest: (tankId) => store.readings.latest(teamId, tankId),
    deliveries: (tankId, since) => store.deliveries.forTank(teamId, tankId, { since }),
  };
}

type SeriesRow = SeriesReading & { tank_id: number };
type CacheRow = RateCacheDbRow & { tank_id: number };
type SeriesTuple = [number, number, number, SeriesReading['kind'], number, string];

const seriesRowOf = ([tank_id, id, time, kind, value, unit]: SeriesTuple): SeriesRow => ({
  tank_id,
  id,
  time,
  kind,
  value,
  unit,
});

/**
 * Readings after each tank's cached state: what the rate estimator still has to be fed, whole (the newest of
 * them is the tank's latest reading). CROSS JOIN keeps the cache rows outside: SQLite otherwise walked all of
 * the team's readings (five times slower at 30 a tank); the cache side is read from its as-of index alone.
 */
export const SINCE_CACHE_SQL = `SELECT r.* FROM rate_cache c CROSS JOIN readings r INDEXED BY readings_series
    ON r.team_id = c.team_id AND r.tank_id = c.tank_id AND r.deleted_at IS NULL AND r.status = 'ok'
      AND r.time > c.as_of_time
  WHERE c.team_id = ? ORDER BY r.tank_id, r.time, r.id`;

function statementsOf(db: Database.Database) {
  // Tanks with no summary to answer their newest readings from: no rate-cache row, or one without a summary.
  const unsummarized = `SELECT t.team_id, t.id FROM tanks t LEFT JOIN rate_cache c ON c.team_id = t.team_id
       AND c.tank_id = t.id WHERE t.team_id = @team AND c.summary IS NULL`;
  return {
    rateCache: db.prepare<[string], CacheRow>(
      `SELECT tank_id, ${RATE_CACHE_COLUMNS} FROM rate_cache WHERE team_id = ?`,
    ),
    sinceCache: db.prepare<[string], ReadingDbRow>(SINCE_CACHE_SQL),
    // The newest `limit` live confirmed readings of every tank of the team without a summary (a removed one
    // too, as the store answers for it), newest first: a bounded index walk per tank (a window function over
    // all rows would read a dense sensor's whole history, and was slower here).
    // Rows as arrays (`raw`): a third faster than objects at 550 a team; seriesRowOf names them.
    newest: db
      .prepare<[{ team: string; limit: number }], SeriesTuple>(
        `SELECT r.tank_id, r.id, r.time, r.kind, r.value, r.unit FROM (${unsummarized}) t JOIN readings r ON r.id IN (
         SELECT id FROM readings INDEXED BY readings_series
         WHERE team_id = t.team_id AND tank_id = t.id AND deleted_at IS NULL AND status = 'ok'
         ORDER BY time DESC, id DESC LIMIT @limit)
       ORDER BY r.tank_id, r.time DESC, r.id DESC`,
      )
      .raw(true),
    // Their newest one whole (its raw text is shown), as `readings.latest`.
    latest: db.prepare<[{ team: string }], ReadingDbRow>(
      `SELECT r.* FROM (${unsummarized}) t JOIN readings r ON r.id = (
         SELECT id FROM readings INDEXED BY readings_series
         WHERE team_id = t.team_id AND tank_id = t.id AND deleted_at IS NULL AND status = 'ok'
         ORDER BY time DESC, id DESC LIMIT 1)`,
    ),
    deliveries: db.prepare<[string, number], DeliveryDbRow>(
      `SELECT * FROM deliveries WHERE team_id = ? AND deleted_at IS NULL AND time >= ?
       ORDER BY tank_id, time, id`,
    ),
  };
}

const statements = new WeakMap<Database.Database, ReturnType<typeof statementsOf>>();

function groupBy<T extends { tank_id: number }>(rows: readonly T[]): Map<number, T[]> {
  const out = new Map<number, T[]>();
  for (const row of rows) {
    const list = out.get(row.tank_id);
    if (list) list.push(row);
    else out.set(row.tank_id, [row]);
  }
  return out;
}

const seriesOfRow = ({ id, time, kind, value, unit }: SeriesReading): SeriesReading => ({
  id,
  time,
  kind,
  value,
  unit,
});

/** A tank's newest readings, newest first; `complete` when there are no older ones. */
interface Newest {
  rows: SeriesReading[];
  complete: boolean;
}

/**
 * A team's reads prefetched: every rate-cache row, the readings after each, the newest readings of every tank
 * (from its summary and the readings after it, or `newestLimit` of them read for tanks without one) and the
 * deliveries from `deliveriesFrom(caches, latest)` (the earliest instant any tank will ask about). Call it
 * inside the transaction the statuses are read in. Given `tankIds`, the tanks the caller will ask about, the
 * two queries for tanks without a summary run only when one of those has none (the usual morning: all have
 * one); another tank's newest readings are then asked of the store.
 */
export function teamReads(
  store: Store,
  teamId: string,
  newestLimit: number,
  deliveriesFrom: (
    caches: ReadonlyMap<number, RateCacheEntry>,
    latest: ReadonlyMap<number, Reading>,
  ) => number,
  tankIds?: readonly number[],
): TankReads {
  let s = statements.get(store.db);
  if (!s) {
    s = statementsOf(store.db);
    statements.set(store.db, s);
  }
  const fallback = storeReads(store, teamId);
  const caches = new Map<number, RateCacheEntry>();
  // Tanks whose newest readings the queries below leave out (a summary is stored, even a damaged one).
  const summarized = new Set<number>();
  for (const row of s.rateCache.all(teamId)) {
    if (row.summary !== null) summarized.add(row.tank_id);
    const entry = rateCacheEntryOf(row, teamId, row.tank_id);
    if (entry) caches.set(row.tank_id, entry);
  }
  const sinceCache = groupBy(s.sinceCache.all(teamId));
  const newest = new Map<number, Newest>();
  const latest = new Map<number, Reading>();
  for (const [tankId, entry] of caches) {
    const after = sinceCache.get(tankId) ?? [];
    const { recent, latest: kept } = entry.summary;
    const rows: SeriesReading[] = [];
    for (let i = after.length - 1; i >= 0; i--) rows.push(seriesOfRow(after[i]!));
    rows.push(...recent);
    newest.set(tankId, { rows, complete: recent.length < RECENT_KEPT });
    const last = after[after.length - 1];
    const whole = last ? toReading(last) : kept;
    if (whole) latest.set(tankId, whole);
  }
  // Every tank without a summary is in these two queries' answers (those with no readings as none).
  const unsummarizedRead = tankIds === undefined || tankIds.some((id) => !caches.has(id));
  if (unsummarizedRead) {
    const rows = s.newest.all({ team: teamId, limit: newestLimit }).map(seriesRowOf);
    for (const [tankId, tankRows] of groupBy(rows)) {
      newest.set(tankId, { rows: tankRows.map(seriesOfRow), complete: tankRows.length < newestLimit });
    }
    for (const row of s.latest.all({ team: teamId })) latest.set(row.tank_id, toReading(row));
  }
  // A tank the prefetch does not answer for: a damaged summary, or none when the queries above were skipped.
  const unknown = (tankId: number) => !caches.has(tankId) && (summarized.has(tankId) || !unsummarizedRead);
  const from = deliveriesFrom(caches, latest);
  const deliveries = groupBy(s.deliveries.all(teamId, from));

  return {
    rateCache: (tankId) => caches.get(tankId),
    series: (tankId, since) => {
      const cache = caches.get(tankId);
      if (cache?.asOfTime !== since) return fallback.series(tankId, since);
      return (sinceCache.get(tankId) ?? []).map(seriesOfRow);
    },
    recentSeries: (tankId, since, limit) => {
      if (unknown(tankId)) return fallback.recentSeries(tankId, since, limit);
      const known = newest.get(tankId) ?? { rows: [], complete: true };
      // Newest first, so those after `since` are a prefix of the newest: the query's answer, reversed.
      const rows = known.rows.filter((r) => r.time > since).slice(0, limit);
      if (rows.length < limit && !known.complete && rows.length === known.rows.length) {
        return fallback.recentSeries(tankId, since, limit);
      }
      // The rows are this prefetch's own copies (of the summary, or of the query's rows): no copy again.
      return rows.reverse();
    },
    latest: (tankId) => (unknown(tankId) ? fallback.latest(tankId) : latest.get(tankId)),
    deliveries: (tankId, since) => {
      if (since < from) return fallback.deliveries(tankId, since);
      return (deliveries.get(tankId) ?? []).filter((d) => d.time >= since).map(toDelivery);
    },
  };
}
