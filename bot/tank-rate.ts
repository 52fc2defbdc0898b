import { buildTank, type Tank as TankGeometry } from '../engine/geometry/index.js';
import {
  createRateEstimator,
  RATE_STATE_VERSION,
  type RateEstimator,
  type RatePoint,
  restoreRateEstimator,
  type TankEvent,
  type TimedVolume,
} from '../engine/rate/index.js';
import { isVolumeUnit, toLitres } from '../engine/units/index.js';
import { BoundedMemo } from './bounded-memo.js';
import { readingLitres } from './reading-volume.js';
import type { Store } from './store/index.js';
import type { RateCacheEntry } from './store/rate-cache.js';
import type { SeriesReading } from './store/readings.js';
import { storeReads, type TankReads } from './store/team-reads.js';
import type { Delivery, Tank } from './store/types.js';

/**
 * The rate estimator's side of a tank's status: built shapes reused, raw input turned into litres, and the
 * estimator resumed from the store's rate cache.
 */

export interface Series {
  readings: (TimedVolume & { row: SeriesReading })[];
  deliveries: TimedVolume[];
  skipped: number;
}

/** Built tanks by their stored spec: building tabulates the shape, and a question should not pay for it. */
const geometries = new BoundedMemo<string, ReturnType<typeof buildTank>>(512);

/**
 * A spec's JSON text, kept per frozen spec object (the store shares one between the tanks that repeat it;
 * an object that can still change is stringified each time).
 */
const specTexts = new WeakMap<object, string>();

function specText(spec: unknown): string | undefined {
  if (typeof spec !== 'object' || spec === null || !Object.isFrozen(spec)) return JSON.stringify(spec);
  let text = specTexts.get(spec);
  if (text === undefined) {
    text = JSON.stringify(spec);
    specTexts.set(spec, text);
  }
  return text;
}

export function geometryOf(spec: unknown): ReturnType<typeof buildTank> {
  return geometries.get(specText(spec) ?? 'undefined', () => buildTank(spec));
}

/** Raw readings and deliveries to litres with the tank's current shape; readings it cannot hold are skipped. */
export function seriesOf(
  geometry: TankGeometry,
  readings: readonly SeriesReading[],
  deliveries: readonly Delivery[],
): Series {
  const out: Series = { readings: [], deliveries: [], skipped: 0 };
  for (const row of readings) {
    const litres = readingLitres(geometry, row);
    if (litres.ok) out.readings.push({ time: row.time, volume: litres.value, row });
    else out.skipped++;
  }
  for (const d of deliveries) {
    if (isVolumeUnit(d.unit)) out.deliveries.push({ time: d.time, volume: toLitres(d.volume, d.unit) });
  }
  return out;
}

export interface RateResult {
  events: readonly TankEvent[];
  /** The point of the newest reading, and the newest trusted one (a suspect reading must not move figures). */
  latest: RatePoint | null;
  trusted: RatePoint | null;
  readings: number;
  skipped: number;
}

/**
 * The rate estimator over every reading and delivery of the tank, resumed from the cached state when the
 * cache is still valid (the store's triggers drop it on any change back in time), fed in the order of
 * engine/rate `analyzeSeries` (a delivery at or before a reading's instant goes first), so the result is
 * the batch result. The state after the newest reading is cached again; later deliveries are not. With
 * nothing new to feed, the cache's summary answers and the state is not read at all.
 */
export function rateOf(
  store: Store,
  teamId: string,
  tank: Tank,
  geometry: TankGeometry,
  filling: boolean,
  /** Where the reads come from: the store one query at a time, or a team's prefetch (the same answers). */
  reads: TankReads = storeReads(store, teamId),
): RateResult {
  // JSON.stringify([tank.spec, filling]), without stringifying a shared spec again.
  const specKey = `[${specText(tank.spec) ?? 'null'},${filling}]`;
  const cached = reads.rateCache(tank.id);
  // A cache from another engine version, or for another shape, is not used.
  const cache =
    cached?.specKey === specKey && cached.summary.version === RATE_STATE_VERSION ? cached : undefined;
  if (cache) {
    const rows = reads.series(tank.id, cache.asOfTime);
    const fresh = seriesOf(geometry, rows, reads.deliveries(tank.id, cache.asOfTime + 1));
    if (fresh.readings.length === 0 && fresh.deliveries.length === 0) {
      const { latest, trusted } = cache.points;
      return {
        events: cache.summary.events,
        latest,
        trusted: trusted ?? latest,
        readings: cache.readings,
        skipped: cache.skipped + fresh.skipped,
      };
    }
    // A state that does not parse (a damaged file) is rebuilt from every reading below.
    const state = store.rateCache.state(teamId, tank.id);
    if (state) return feed(store, teamId, tank.id, specKey, restoreRateEstimator(state), cache, rows, fresh);
  }
  const rows = reads.series(tank.id, Number.MIN_SAFE_INTEGER);
  const fresh = seriesOf(geometry, rows, reads.deliveries(tank.id, Number.MIN_SAFE_INTEGER + 1));
  const estimator = createRateEstimator({ capacity: geometry.capacity, filling });
  return feed(store, teamId, tank.id, specKey, estimator, undefined, rows, fresh);
}

/** Feeds the readings and deliveries after the cache (all of them without one) and keeps the new state. */
function feed(
  store: Store,
  teamId: string,
  tankId: number,
  specKey: string,
  estimator: RateEstimator,
  cache: RateCacheEntry | undefined,
  rows: readonly SeriesReading[],
  fresh: Series,
): RateResult {
  let latest = cache?.points.latest ?? null;
  let trusted = cache?.points.trusted ?? null;
  let d = 0;
  for (const r of fresh.readings) {
    while (d < fresh.deliveries.length && fresh.deliveries[d]!.time <= r.time) {
      estimator.addDelivery(fresh.deliveries[d]!.time, fresh.deliveries[d]!.volume);
      d++;
    }
    latest = estimator.addReading(r.time, r.volume);
    if (!latest.suspect) trusted = latest;
  }
  const readings = (cache?.readings ?? 0) + fresh.readings.length;
  const skipped = (cache?.skipped ?? 0) + fresh.skipped;
  const newest = fresh.readings[fresh.readings.length - 1];
  if (newest) {
    // Rows after the newest converted reading were all skipped, and the next call reads them again (it
    // resumes after `newest`): the cached count leaves them out, or they would be counted twice.
    let skippedAfter = 0;
    for (let i = rows.length - 1; i >= 0 && rows[i]!.time > newest.time; i--) skippedAfter++;
    store.rateCache.put(teamId, tankId, {
      asOfTime: newest.time,
      readings,
      skipped: skipped - skippedAfter,
      specKey,
      state: estimator.toJSON(),
      points: { latest, trusted },
    });
  }
  for (; d < fresh.deliveries.length; d++) {
    estimator.addDelivery(fresh.deliveries[d]!.time, fresh.deliveries[d]!.volume);
  }
  return { events: estimator.events, latest, trusted: trusted ?? latest, readings, skipped };
}
