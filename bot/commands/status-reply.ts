import { cautionFor, gaugeFirstNote } from '../replies/cautions.js';
import {
  calendarDaysBetween,
  formatAge,
  formatDate,
  formatDateTime,
  formatDuration,
  formatNumber,
  formatRate,
  formatVolume,
  formatWhen,
} from '../replies/format.js';
import type { Fact, LevelChart } from '../replies/reply.js';
import { volumeText } from '../shown-volume.js';
import type { TankStatus } from '../tank-status.js';

const DAY_MS = 86_400_000;

/** "Thu 26 Nov (in 17 days)"; today, tomorrow and yesterday as the shared wording says them. */
export function dateFromNow(time: number, now: number, timeZone: string): string {
  const days = calendarDaysBetween(now, time, timeZone);
  if (Math.abs(days) <= 1) return formatWhen(time, now, timeZone);
  return `${formatDate(time, timeZone, now)} (${days > 0 ? `in ${days} days` : `${-days} days ago`})`;
}

/** One reading gives a volume but no rate yet. */
const hasRate = (s: TankStatus): boolean => s.rate !== undefined && s.readingCount >= 2;

/** "12.4 gal/day (10.9-13.8), from 5 readings over 7 days"; a filling tank says "rising". */
export function rateText(s: TankStatus): string {
  if (!s.rate || !hasRate(s)) return 'needs a second reading';
  const { value, low, high, readings, days } = s.rate;
  const basis = `from ${readings} reading${readings === 1 ? '' : 's'} over ${formatNumber(days, days < 10 ? 1 : 0)} days`;
  const what = s.filling ? 'rising ' : '';
  return `${what}${formatRate({ value, low, high }, s.volumeUnit)}, ${basis}`;
}

function targetWords(s: TankStatus): string {
  const r = s.runway!;
  if (r.target === 'threshold') {
    // A filling tank's threshold is where a pick-up is due: the chart calls its line the same.
    const name = s.filling ? 'pick-up level' : 'threshold';
    return `to the ${name} (${formatVolume(r.targetVolume, s.volumeUnit)})`;
  }
  return r.target === 'full' ? 'to the safe fill level' : 'to empty';
}

/** The target is reached already: at the last trusted reading, or since then by the forecast. */
export function runwayIsOver(s: TankStatus, now: number): boolean {
  const r = s.runway;
  if (!r || !hasRate(s) || r.days === null || r.at === null) return false;
  return r.days <= 0 || r.at <= now;
}

/** "at or below the threshold (600 L) now"; "empty now by the forecast" when no reading has shown it yet. */
function overText(s: TankStatus): string {
  const r = s.runway!;
  const where =
    r.target === 'threshold'
      ? s.filling
        ? `at or above the pick-up level (${formatVolume(r.targetVolume, s.volumeUnit)})`
        : `at or below the threshold (${formatVolume(r.targetVolume, s.volumeUnit)})`
      : r.target === 'full'
        ? 'at the safe fill level'
        : 'empty';
  const reached = s.rate && (s.filling ? s.rate.volume >= r.targetVolume : s.rate.volume <= r.targetVolume);
  return `over: ${where} now${reached ? '' : ' by the forecast; a reading will confirm it'}`;
}

/** "order now" / "book a pick-up now": the verdict a headline adds to a runway that is over. */
export function verdictText(s: TankStatus): string | undefined {
  const p = s.refill;
  if (!p || !hasRate(s)) return undefined;
  const what = p.mode === 'pick-up' ? 'book a pick-up' : 'order';
  return p.verdict === 'order-now' ? `${what} now` : undefined;
}

/** "9 days (7-12) to empty, Thu 10 Dec". */
export function runwayText(s: TankStatus, now: number, timeZone: string): string {
  const r = s.runway;
  if (!r || !hasRate(s)) return 'needs a second reading';
  if (r.days === null || r.at === null) {
    return s.filling ? 'not rising: no pick-up in sight' : 'not falling: no end in sight';
  }
  // A date in the past must never read as an event to come.
  if (runwayIsOver(s, now)) return overText(s);
  const duration = formatDuration({
    value: r.days,
    ...(r.low !== null ? { low: r.low } : {}),
    high: r.high ?? Number.POSITIVE_INFINITY,
  });
  return `${duration} ${targetWords(s)}, ${formatDate(r.at, timeZone, now)}`;
}

/** The refill suggestion in one line: what to do and by when, and how much. */
export function refillText(s: TankStatus, now: number, timeZone: string): string | undefined {
  const p = s.refill;
  if (!p || !hasRate(s)) return s.refillProblem;
  const what = p.mode === 'pick-up' ? 'book a pick-up' : 'order';
  const amount =
    p.quantity === null
      ? ''
      : p.mode === 'pick-up'
        ? `, about ${formatVolume(p.quantity, s.volumeUnit)} to take`
        : `, about ${formatVolume(p.quantity, s.volumeUnit)} to reach the safe fill level`;
  const basis = p.thresholdIsDefault
    ? ' (default threshold 20%; set your own with `set TANK threshold ...`)'
    : '';
  // Common practice: the quantity comes from the forecast, so the crew gauges the tank before it is moved.
  const gauge = p.quantity === null ? '' : `; ${gaugeFirstNote(p.mode === 'pick-up' ? 'pick-up' : 'order')}`;
  if (p.verdict === 'order-now') return `${what} now${amount}${basis}${gauge}`;
  if (p.orderBy === null) return `no ${p.mode === 'pick-up' ? 'pick-up' : 'order'} needed at this rate`;
  const when = dateFromNow(p.orderBy, now, timeZone);
  if (p.verdict === 'order-by') return `${what} by ${when}${amount}${basis}${gauge}`;
  return `nothing needed yet; ${what} by ${when}`;
}

/** The facts of a question's answer, in reading order. */
export function statusFacts(s: TankStatus, now: number, timeZone: string): Fact[] {
  if (s.problem) return [{ label: 'Problem', value: s.problem }];
  const facts: Fact[] = [{ label: 'Volume', value: volumeText(s) }];
  if (s.latest?.level !== undefined)
    facts.push({
      label: 'Level',
      // The level is the latest reading's: say so when that reading is not the volume shown.
      value: `${formatNumber(s.latest.level)} ${s.lengthUnit}${s.latest.suspect && s.rate ? ' (latest reading, not confirmed yet)' : ''}`,
    });
  facts.push({ label: s.filling ? 'Filling' : 'Use', value: rateText(s) });
  facts.push({ label: 'Runway', value: runwayText(s, now, timeZone) });
  const refill = refillText(s, now, timeZone);
  if (refill) facts.push({ label: s.filling ? 'Pick-up' : 'Refill', value: refill });
  if (s.latest) {
    facts.push({
      label: 'Last reading',
      value: `${formatAge(s.latest.time, now)} (${formatDateTime(s.latest.time, timeZone)}, "${s.latest.rawText}")`,
    });
  }
  if (s.latest?.suspect) {
    facts.push({
      label: 'Unconfirmed',
      value: `the latest reading does not fit the forecast (${s.latest.suspect}); use, runway and refill rest on the readings before it until the next reading confirms it`,
    });
  }
  if (s.skipped > 0) {
    facts.push({ label: 'Left out', value: `${s.skipped} reading(s) the tank's current shape cannot hold` });
  }
  return facts;
}

/** Product caution, plus the overfill wording when the latest reading is above the safe fill level. */
export function statusCaution(
  s: TankStatus,
  situation: 'reading' | 'delivery' = 'reading',
): string | undefined {
  return cautionFor(s.tank.product ?? undefined, s.overSafeFill ? 'overfill' : situation);
}

/** Chart data: history, the forecast with its range to the runway's end, deliveries, threshold, capacity. */
export function levelChart(s: TankStatus, timeZone: string, demo = false): LevelChart {
  const chart: LevelChart = {
    title: `${s.tank.code}${s.tank.name !== s.tank.code ? ` ${s.tank.name}` : ''}${demo ? ' (DEMO DATA)' : ''}`,
    volumeUnit: s.volumeUnit,
    history: s.history,
    forecast: forecastOf(s),
    deliveries: s.deliveries,
    detected: detectedRefills(s),
    filling: s.filling,
    capacity: s.capacity,
    timeZone,
  };
  if (s.threshold !== undefined) chart.threshold = s.threshold;
  else if (s.refill) chart.threshold = s.refill.thresholdVolume;
  return chart;
}

/**
 * Refills the estimator found in the readings that nobody logged (a pick-up on a filling tank, a delivery on
 * an emptying one), within the chart's history, so every refill on the chart has its marker.
 */
function detectedRefills(s: TankStatus): { time: number; volume: number }[] {
  const from = s.history[0]?.time ?? Number.POSITIVE_INFINITY;
  const kind = s.filling ? 'pickup' : 'delivery';
  return (
    s.events
      .filter((e) => !e.logged && e.type === kind && e.start >= from)
      // Somewhere between the two readings around the drop: mark the middle.
      .map((e) => ({ time: (e.start + e.end) / 2, volume: e.volume }))
  );
}

function forecastOf(s: TankStatus): LevelChart['forecast'] {
  const rate = s.rate;
  if (!rate) return [];
  const runwayDays = s.runway?.high ?? s.runway?.days ?? 14;
  const horizon = Math.min(90, Math.max(3, runwayDays + (s.latest ? s.latest.ageMs / DAY_MS : 0)));
  const sign = s.filling ? 1 : -1;
  const clamp = (v: number) => Math.min(s.capacity, Math.max(0, v));
  const steps = 24;
  return Array.from({ length: steps + 1 }, (_, i) => {
    const days = (horizon * i) / steps;
    const a = rate.volume + sign * rate.low * days;
    const b = rate.volume + sign * rate.high * days;
    return {
      time: rate.at + days * DAY_MS,
      volume: clamp(rate.volume + sign * rate.value * days),
      low: clamp(Math.min(a, b)),
      high: clamp(Math.max(a, b)),
    };
  });
}
