/**
 * What a digest says about a team's tanks, section by section, each a list of short lines, computed from
 * `tankStatus` (bot/tank-status.ts) and never from the engine directly. Pure: `now` is an argument.
 */
import { DateTime } from 'luxon';
import { BoundedMemo } from '../bounded-memo.js';
import { formatChange, formatDate, formatDuration, formatPercent, formatWhen } from '../replies/format.js';
import type { TankStatus } from '../tank-status.js';

const HOUR = 3_600_000;

/** "T4" or "T4 Ridge diesel": the code people type, with the name when it says more. */
export function tankLabel(status: TankStatus): string {
  const { code, name } = status.tank;
  return name && name.toLowerCase() !== code.toLowerCase() ? `${code} ${name}` : code;
}

/** Tanks with a runway first, shortest first (ties by code); those without one after, by code. */
export function byRunway(statuses: readonly TankStatus[]): TankStatus[] {
  const days = (s: TankStatus) => s.runway?.days ?? Number.POSITIVE_INFINITY;
  return [...statuses].sort((a, b) => days(a) - days(b) || a.tank.code.localeCompare(b.tank.code));
}

/** The runway table's row for one tank: tank, site, level, runway (with its range), what to do. */
export function runwayRow(
  status: TankStatus,
  now: number,
  zone: string,
  endOfDay = endOfLocalDay(now, zone),
): string[] {
  const level = status.latest ? formatPercent(status.latest.fraction) : '-';
  const r = status.runway;
  const runway =
    status.problem !== undefined
      ? 'cannot compute'
      : r?.days === null || r?.days === undefined
        ? 'no estimate yet'
        : formatDuration({
            value: r.days,
            ...(r.low !== null ? { low: r.low } : {}),
            ...(r.high !== null ? { high: r.high } : {}),
          });
  return [tankLabel(status), status.tank.site ?? '', level, runway, actionWord(status, now, zone, endOfDay)];
}

function actionWord(status: TankStatus, now: number, zone: string, endOfDay: number): string {
  const plan = status.refill;
  if (!plan || plan.verdict === 'no-order-needed') return '';
  const verb = plan.mode === 'pick-up' ? 'pick-up' : 'order';
  if (plan.verdict === 'order-now' || (plan.orderBy !== null && plan.orderBy <= endOfDay)) {
    return `${verb} today`;
  }
  return plan.orderBy === null ? '' : `${verb} by ${formatDate(plan.orderBy, zone, now)}`;
}

/** The last few answers by zone and instant: a scheduler tick composes every due team's digest at one `now`. */
const endsOfDay = new BoundedMemo<string, number>(64);

export function endOfLocalDay(now: number, zone: string): number {
  return endsOfDay.get(`${zone}|${now}`, () => DateTime.fromMillis(now, { zone }).endOf('day').toMillis());
}

/** Tanks whose plan says order (or book a pick-up) today: the order is due now or before midnight local. */
export function dueToday(
  statuses: readonly TankStatus[],
  now: number,
  zone: string,
  end = endOfLocalDay(now, zone),
): TankStatus[] {
  return statuses.filter((s) => {
    const plan = s.refill;
    return (
      plan !== undefined && (plan.verdict === 'order-now' || (plan.orderBy !== null && plan.orderBy <= end))
    );
  });
}

/** How many of a tank's newest readings the digest looks at (for the usual interval between readings). */
export const DIGEST_HISTORY_READINGS = 11;

/** The median gap between the tank's last readings (up to 10 gaps), or undefined with fewer than 3 readings. */
export function usualInterval(status: TankStatus): number | undefined {
  const times = status.history.slice(-DIGEST_HISTORY_READINGS).map((h) => h.time);
  if (times.length < 3) return undefined;
  const gaps = times
    .slice(1)
    .map((t, i) => t - times[i]!)
    .sort((a, b) => a - b);
  const mid = Math.floor(gaps.length / 2);
  return gaps.length % 2 === 1 ? gaps[mid]! : (gaps[mid - 1]! + gaps[mid]!) / 2;
}

/** Days without a reading after which any tank is overdue (and gets the daily stale reminder). */
export const DEFAULT_STALE_DAYS = 3;

/**
 * Overdue: the last reading is older than 1.5 times the tank's usual interval and at least an hour past it
 * (our own rule, so a daily reading taken at 08:00 is not overdue at a 07:00 digest, and a 15-minute sensor
 * is not overdue after one late sample), or older than `staleDays` whatever the interval. A tank with no
 * reading at all is listed too.
 */
export function overdueLines(
  statuses: readonly TankStatus[],
  now: number,
  staleDays = DEFAULT_STALE_DAYS,
): string[] {
  const lines: { age: number; text: string }[] = [];
  for (const s of statuses) {
    if (!s.latest) {
      if (s.problem === undefined)
        lines.push({ age: Number.POSITIVE_INFINITY, text: `${tankLabel(s)}: no readings yet` });
      continue;
    }
    const usual = usualInterval(s);
    const age = now - s.latest.time;
    const late = usual !== undefined && usual > 0 && age > Math.max(1.5 * usual, usual + HOUR);
    if (!late && age < staleDays * 24 * HOUR) continue;
    const habit = usual !== undefined && usual > 0 ? ` (usually every ${ageWords(usual)})` : '';
    lines.push({ age, text: `${tankLabel(s)}: last read ${ageWords(age)} ago${habit}` });
  }
  return lines.sort((a, b) => b.age - a.age).map((l) => l.text);
}

function ageWords(ms: number): string {
  const hours = ms / HOUR;
  if (hours < 1.5) return `${Math.max(1, Math.round(ms / 60_000))} min`;
  if (hours < 48) return `${Math.round(hours)} hours`;
  return `${Math.round(hours / 24)} days`;
}

/** Deliveries (and pick-ups) that ended after `since`, newest first, saying which were found but not logged. */
export function deliveryLines(
  statuses: readonly TankStatus[],
  since: number,
  now: number,
  zone: string,
): string[] {
  const lines: { end: number; text: string }[] = [];
  for (const s of statuses) {
    for (const e of s.events) {
      if (e.end <= since || e.end > now || (e.type !== 'delivery' && e.type !== 'pickup')) continue;
      const amount = formatChange(e.type === 'delivery' ? e.volume : -e.volume, s.volumeUnit);
      const note = e.logged ? '' : ' (found in the readings, not logged)';
      lines.push({ end: e.end, text: `${tankLabel(s)} ${amount}, ${formatWhen(e.end, now, zone)}${note}` });
    }
  }
  return lines.sort((a, b) => b.end - a.end).map((l) => l.text);
}

/** Withdrawals nobody logged since `since`: a possible leak or theft, worth a look. Largest first. */
export function dropLines(
  statuses: readonly TankStatus[],
  since: number,
  now: number,
  zone: string,
): string[] {
  const lines: { volume: number; text: string }[] = [];
  for (const s of statuses) {
    for (const e of s.events) {
      if (e.type !== 'withdrawal' || e.logged || e.end <= since || e.end > now) continue;
      const amount = formatChange(-Math.abs(e.volume), s.volumeUnit);
      lines.push({
        volume: Math.abs(e.volume),
        text: `${tankLabel(s)} ${amount}, ${formatWhen(e.start, now, zone)}`,
      });
    }
  }
  return lines.sort((a, b) => b.volume - a.volume).map((l) => l.text);
}

/** Tanks whose latest reading is above the safe fill level, and tanks whose figures cannot be computed. */
export function problemLines(statuses: readonly TankStatus[]): string[] {
  const lines: string[] = [];
  for (const s of statuses) {
    if (s.problem !== undefined) lines.push(s.problem);
    else if (s.overSafeFill && s.latest) {
      lines.push(`${tankLabel(s)} is at ${formatPercent(s.latest.fraction)}, above its safe fill level`);
    }
  }
  return lines;
}
