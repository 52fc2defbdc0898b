import { runwayTo } from '../engine/forecast/runway.js';
import type { Tank as TankGeometry } from '../engine/geometry/index.js';
import type { RatePoint, TankEventType } from '../engine/rate/index.js';
import { forecastOf, mapPlanVolumes, planRefillWith, type RefillPlan } from '../engine/refill/planRefill.js';
import { parseRefillSettings, type RefillSettings } from '../engine/refill/settings.js';
import type { Result } from '../engine/result.js';
import { fromLitres, fromMetres, type VolumeUnit } from '../engine/units/index.js';
import { readingLevelMetres } from './reading-volume.js';
import type { Store } from './store/index.js';
import type { RateCacheEntry } from './store/rate-cache.js';
import { storeReads, type TankReads } from './store/team-reads.js';
import type { Tank } from './store/types.js';
import { geometryOf, rateOf, seriesOf } from './tank-rate.js';

const DAY_MS = 86_400_000;

/** A figure with its ~80% range, in the tank's display units. */
export interface Ranged {
  value: number;
  low: number;
  high: number;
}

/** Everything a reply or a digest says about one tank, computed in one place from the raw readings. */
export interface TankStatus {
  tank: Tank;
  /** The tank's own units (`units.length`, `units.volume` of its specification). */
  lengthUnit: string;
  volumeUnit: string;
  filling: boolean;
  capacity: number;
  fullHeight: number;
  latest?: {
    readingId: number;
    time: number;
    /** As computed from the reading itself (not smoothed), display unit. */
    volume: number;
    /** 0..1 of capacity. */
    fraction: number;
    /** Level in the display length unit, when the reading gave a level or ullage. */
    level?: number;
    ageMs: number;
    rawText: string;
    /** The rate estimator did not trust this reading (a typo, unit slip or spike): why. */
    suspect?: string;
  };
  /** The reading before the latest one, for "change since last reading". */
  previous?: { time: number; volume: number };
  /**
   * Use per day (positive while emptying; a filling tank's rise is positive too), with its basis, and the
   * smoothed volume at the reading it rests on (the forecast starts there).
   */
  rate?: Ranged & { readings: number; days: number; at: number; volume: number };
  /** Time to the target from `now`, in days, and the date it is reached. */
  runway?: {
    target: 'empty' | 'full' | 'threshold';
    targetVolume: number;
    days: number | null;
    low: number | null;
    high: number | null;
    at: number | null;
  };
  threshold?: number;
  /** engine/refill's plan with volumes in the display unit; absent before two readings or when it cannot plan. */
  refill?: RefillPlan & { thresholdIsDefault: boolean };
  /** Why no refill plan could be made, when there are readings but no plan. */
  refillProblem?: string;
  safeFill: number;
  overSafeFill: boolean;
  events: { type: TankEventType; start: number; end: number; volume: number; logged: boolean }[];
  /** How many readings the figures rest on (all history, not only the chart's window). */
  readingCount: number;
  /**
   * Confirmed readings of the last 120 days (at most the newest 720) as volumes in the display unit, in
   * time order: the chart's history.
   */
  history: { time: number; volume: number }[];
  deliveries: { time: number; volume: number }[];
  /** Readings left out because the current shape cannot hold them (e.g. after a shape correction). */
  skipped: number;
  /** Why no figures could be computed (an invalid stored specification), if so. */
  problem?: string;
}

/** Litres to a display unit: one function per unit, made once (a status converts a few dozen figures). */
const converters = new Map<VolumeUnit, (litres: number) => number>();
function showIn(unit: VolumeUnit): (litres: number) => number {
  let show = converters.get(unit);
  if (!show) {
    show = (litres: number) => fromLitres(litres, unit);
    converters.set(unit, show);
  }
  return show;
}

/** The newest `limit` readings after `since` and the deliveries after it, in litres. */
function recentOf(geometry: TankGeometry, reads: TankReads, tankId: number, since: number, limit: number) {
  return seriesOf(geometry, reads.recentSeries(tankId, since, limit), reads.deliveries(tankId, since + 1));
}

/** Common practice for liquids that expand: fill no higher than 90% unless the tank says otherwise. */
const DEFAULT_SAFE_FILL_PERCENT = 90;

function thresholdLitres(tank: Tank, geometry: TankGeometry): number | undefined {
  const t = tank.settings.threshold;
  if (!t) return undefined;
  if ('percent' in t) return (t.percent / 100) * geometry.capacity;
  if ('volume' in t) return t.volume;
  return undefined;
}

/** The status of one tank of one team at `now`. */
export function tankStatus(
  store: Store,
  teamId: string,
  tankId: number,
  now: number,
  /**
   * `historyLimit`: at most this many readings of `history` (and `deliveries` from its first): a digest needs a
   * few. `known`: the tank's row and the team's zone when the caller read them in the same transaction, and
   * optionally the team's reads prefetched in it (`teamReads`), which answer as the store would.
   */
  options: { historyLimit?: number; known?: { tank: Tank; timeZone: string; reads?: TankReads } } = {},
): TankStatus | undefined {
  const tank = options.known?.tank.id === tankId ? options.known.tank : store.tanks.byId(teamId, tankId);
  if (!tank) return undefined;
  const built = geometryOf(tank.spec);
  const filling = tank.settings.filling === true;
  if (!built.ok) {
    return {
      tank,
      lengthUnit: '',
      volumeUnit: '',
      filling,
      capacity: Number.NaN,
      fullHeight: Number.NaN,
      safeFill: Number.NaN,
      overSafeFill: false,
      events: [],
      readingCount: 0,
      history: [],
      deliveries: [],
      skipped: 0,
      problem: `${tank.code}'s stored shape is not valid (${built.error}); an admin can add it again with the right dimensions.`,
    };
  }
  const geometry = built.value;
  const { length: lengthUnit, volume: volumeUnit } = geometry.spec.units;
  const show = showIn(volumeUnit);
  const reads = options.known?.reads ?? storeReads(store, teamId);
  const rate = rateOf(store, teamId, tank, geometry, filling, reads);
  const latestRow = reads.latest(tankId);
  // The chart and "change since" need only recent readings; the rate state carries the rest.
  const since = (latestRow?.time ?? now) - HISTORY_WINDOW_MS;
  const limit = options.historyLimit ?? HISTORY_LIMIT;
  let asked = limit;
  let recent = recentOf(geometry, reads, tankId, since, asked);
  // Readings the shape cannot hold leave a short history fewer readings than asked: ask for as many more,
  // until there are enough or no more (a few more stay within what a team's prefetch holds).
  while (
    recent.readings.length < limit &&
    recent.readings.length + recent.skipped === asked &&
    asked < HISTORY_LIMIT
  ) {
    asked = Math.min(HISTORY_LIMIT, limit + recent.skipped);
    recent = recentOf(geometry, reads, tankId, since, asked);
  }
  const safeFillLitres =
    ((tank.settings.safeFillPercent ?? DEFAULT_SAFE_FILL_PERCENT) / 100) * geometry.capacity;
  const threshold = thresholdLitres(tank, geometry);

  const status: TankStatus = {
    tank,
    lengthUnit,
    volumeUnit,
    filling,
    capacity: show(geometry.capacity),
    fullHeight: fromMetres(geometry.fullHeight, lengthUnit),
    safeFill: show(safeFillLitres),
    overSafeFill: false,
    events: rate.events.map((e) => ({ ...e, volume: show(e.volume) })),
    readingCount: rate.readings,
    history: recent.readings.map((r) => ({ time: r.time, volume: show(r.volume) })),
    // Deliveries from where the history starts, so the chart marks none before its first reading.
    deliveries: recent.deliveries
      .filter((d) => d.time >= (recent.readings[0]?.time ?? since))
      .map((d) => ({ time: d.time, volume: show(d.volume) })),
    skipped: rate.skipped,
    ...(threshold !== undefined ? { threshold: show(threshold) } : {}),
  };

  const lastIndex = recent.readings.length - 1;
  const last = recent.readings[lastIndex];
  const point = rate.latest;
  if (!last || !point) return status;
  const level = readingLevelMetres(geometry, last.row);
  status.latest = {
    readingId: last.row.id,
    time: last.time,
    volume: show(last.volume),
    fraction: last.volume / geometry.capacity,
    ...(level !== undefined ? { level: fromMetres(level, lengthUnit) } : {}),
    ageMs: now - last.time,
    rawText:
      (last.row.id === latestRow?.id ? latestRow : store.readings.byId(teamId, last.row.id))?.rawText ?? '',
    ...(point.suspect && point.time === last.time ? { suspect: point.suspect } : {}),
  };
  status.overSafeFill = last.volume > safeFillLitres * (1 + 1e-9);
  const before = recent.readings[lastIndex - 1];
  if (before) status.previous = { time: before.time, volume: show(before.volume) };
  const trusted =
    rate.trusted && withLaterDeliveries(rate.trusted, recent.deliveries, filling, geometry.capacity);
  if (trusted) {
    const sign = filling ? -1 : 1;
    status.rate = {
      value: show(sign * trusted.rate),
      low: show(Math.min(sign * trusted.rateLow, sign * trusted.rateHigh)),
      high: show(Math.max(sign * trusted.rateLow, sign * trusted.rateHigh)),
      readings: trusted.readings,
      days: trusted.basisDays,
      at: trusted.time,
      volume: show(trusted.volume),
    };
    status.runway = runwayFrom(trusted, geometry.capacity, safeFillLitres, threshold, filling, now, show);
    const timeZone = options.known?.timeZone ?? store.teams.get(teamId)?.timeZone ?? 'UTC';
    const plan = refillPlan(tank, trusted, geometry.capacity, filling, Math.max(now, trusted.time), timeZone);
    if (plan.ok) {
      status.refill = Object.assign(mapPlanVolumes(plan.value, show), {
        thresholdIsDefault: !tank.settings.threshold,
      });
    } else status.refillProblem = plan.error;
  }
  return status;
}

/**
 * The estimator takes a logged delivery (a pick-up on a filling tank) into its volume only at the next
 * reading; until then the runway and the refill plan count it from the newest trusted point, as the volume
 * it adds (or takes) at once, so logging a delivery moves the runway straight away.
 */
function withLaterDeliveries(
  point: RatePoint,
  deliveries: readonly { time: number; volume: number }[],
  filling: boolean,
  capacity: number,
): RatePoint {
  let added = 0;
  for (const d of deliveries) if (d.time > point.time) added += d.volume;
  if (added === 0) return point;
  const volume = filling ? point.volume - added : point.volume + added;
  return { ...point, volume: Math.min(capacity, Math.max(0, volume)) };
}

/** Thresholds when a tank has none of its own: order at 20% of capacity, or book a pick-up before the safe fill. */
const DEFAULT_THRESHOLD_PERCENT = 20;

/**
 * A tank's refill settings validated, with the default threshold and the team's zone filled in; kept per
 * settings object and zone (the store shares one frozen object between tanks with the same settings), since
 * validating took longer than planning.
 */
const checkedSettings = new WeakMap<object, Map<string, Result<RefillSettings>>>();

function refillSettingsOf(tank: Tank, filling: boolean, timeZone: string): Result<RefillSettings> {
  const shared = Object.isFrozen(tank.settings);
  let byZone = shared ? checkedSettings.get(tank.settings) : undefined;
  const known = byZone?.get(timeZone);
  if (known) return known;
  const { filling: _filling, ...settings } = tank.settings;
  const threshold = settings.threshold ?? {
    percent: filling ? (settings.safeFillPercent ?? DEFAULT_SAFE_FILL_PERCENT) : DEFAULT_THRESHOLD_PERCENT,
  };
  const checked = parseRefillSettings({ ...settings, threshold, timeZone });
  if (shared) {
    if (!byZone) {
      byZone = new Map();
      checkedSettings.set(tank.settings, byZone);
    }
    byZone.set(timeZone, checked);
  }
  return checked;
}

function refillPlan(
  tank: Tank,
  point: RatePoint,
  capacity: number,
  filling: boolean,
  now: number,
  timeZone: string,
): Result<RefillPlan> {
  const settings = refillSettingsOf(tank, filling, timeZone);
  if (!settings.ok) return settings;
  return planRefillWith(
    {
      now,
      ...forecastOf(point),
      capacity,
      filling,
    },
    settings.value,
  );
}

/**
 * The earliest delivery instant a status of these tanks asks for, given their rate-cache entries and newest
 * readings: what a team's prefetch must cover (a tank with no cache asks for all of its deliveries).
 */
export function deliveriesAskedFrom(
  tankIds: readonly number[],
  caches: ReadonlyMap<number, RateCacheEntry>,
  latest: ReadonlyMap<number, { time: number }>,
  now: number,
): number {
  let from = Number.MAX_SAFE_INTEGER;
  for (const id of tankIds) {
    const cache = caches.get(id);
    const recent = (latest.get(id)?.time ?? now) - HISTORY_WINDOW_MS;
    from = Math.min(from, (cache ? cache.asOfTime : Number.MIN_SAFE_INTEGER) + 1, recent + 1);
  }
  return from;
}

/** How far back the chart's history and the "change since" reach, from the newest reading. */
const HISTORY_WINDOW_MS = 120 * DAY_MS;
/** ...and at most this many readings: a month of an hourly sensor, more than a phone's chart can show. */
const HISTORY_LIMIT = 720;

function runwayFrom(
  point: RatePoint,
  capacity: number,
  safeFill: number,
  threshold: number | undefined,
  filling: boolean,
  now: number,
  show: (litres: number) => number,
): TankStatus['runway'] {
  const target = threshold !== undefined ? 'threshold' : filling ? 'full' : 'empty';
  const targetVolume = threshold ?? (filling ? Math.min(capacity, safeFill) : 0);
  const r = runwayTo(point, { volume: targetVolume }, { filling, capacity });
  // The engine counts from the reading; a person asks "from now".
  const elapsed = Math.max(0, (now - point.time) / DAY_MS);
  return {
    target,
    targetVolume: show(targetVolume),
    days: daysFromNow(r.days, elapsed),
    low: daysFromNow(r.daysLow, elapsed),
    high: daysFromNow(r.daysHigh, elapsed),
    at: r.runoutAt,
  };
}

const daysFromNow = (days: number | null, elapsed: number) =>
  days === null ? null : Math.max(0, days - elapsed);
