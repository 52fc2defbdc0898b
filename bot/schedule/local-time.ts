/**
 * Local wall-clock times -> UTC instants, with one rule for the two kinds of daylight-saving trouble.
 *
 * Rule (luxon alone is not consistent here: for a repeated time it picks the first occurrence in some zones
 * and the second in others, and it moves a missing time forward by the size of the gap):
 * - a local time that does not exist (the spring change skips it, e.g. 02:30 in America/Chicago on
 *   2026-03-08) maps to the next valid minute, the first minute after the gap (03:00 local, the change itself);
 * - a local time that exists twice (the autumn change repeats it) maps to its first occurrence.
 * So a scheduled local time fires exactly once on every local date.
 */
import { DateTime, IANAZone } from 'luxon';
import { fail, ok, type Result } from '../../engine/result.js';

export interface LocalDate {
  year: number;
  month: number;
  day: number;
}

export interface WallTime {
  hour: number;
  minute: number;
}

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;

export function checkTimeZone(zone: string): Result<string> {
  return IANAZone.isValidZone(zone)
    ? ok(zone)
    : fail(`"${zone}" is not a time zone I know; use an IANA name such as America/Chicago or Europe/Berlin.`);
}

/** Parses "07:00" or "7:30" (24-hour clock). */
export function parseWallTime(text: string): Result<WallTime> {
  const match = /^\s*(\d{1,2}):(\d{2})\s*$/.exec(text);
  const hour = Number(match?.[1]);
  const minute = Number(match?.[2]);
  if (!match || hour > 23 || minute > 59) {
    return fail(`"${text}" is not a time of day; write it on the 24-hour clock, e.g. 07:00 or 16:30.`);
  }
  return ok({ hour, minute });
}

/** The offset (minutes east of UTC) the zone uses at an instant. */
function offsetAt(instant: number, zone: string): number {
  return DateTime.fromMillis(instant, { zone }).offset;
}

function wallMatches(instant: number, zone: string, date: LocalDate, time: WallTime): boolean {
  const local = DateTime.fromMillis(instant, { zone });
  return (
    local.year === date.year &&
    local.month === date.month &&
    local.day === date.day &&
    local.hour === time.hour &&
    local.minute === time.minute
  );
}

/**
 * The UTC instant (epoch ms) of a local date and time in a zone, by the rule at the top of this file.
 * The zone must be valid (see checkTimeZone).
 */
export function instantOfLocal(date: LocalDate, time: WallTime, zone: string): number {
  const wall = Date.UTC(date.year, date.month - 1, date.day, time.hour, time.minute);
  // Real zones change offset at most once in any 28 hours, so the offsets 14 h either side cover the day.
  const before = offsetAt(wall - 14 * HOUR, zone);
  const after = offsetAt(wall + 14 * HOUR, zone);
  const candidates = [...new Set([before, after])]
    .map((offset) => wall - offset * MINUTE)
    .filter((instant) => wallMatches(instant, zone, date, time));
  if (candidates.length > 0) return Math.min(...candidates);
  // In the gap: find the first minute that uses the new offset (binary search over whole minutes).
  let lo = Math.floor((wall - 14 * HOUR) / MINUTE);
  let hi = Math.ceil((wall + 14 * HOUR) / MINUTE);
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (offsetAt(mid * MINUTE, zone) === after) hi = mid;
    else lo = mid;
  }
  return hi * MINUTE;
}

/** The local calendar date of an instant in a zone. */
export function localDateOf(instant: number, zone: string): LocalDate {
  const local = DateTime.fromMillis(instant, { zone });
  return { year: local.year, month: local.month, day: local.day };
}

/** The local date `days` later (or earlier when negative), by the calendar, not by 24-hour steps. */
export function addLocalDays(date: LocalDate, days: number): LocalDate {
  const moved = DateTime.fromObject(date, { zone: 'UTC' }).plus({ days });
  return { year: moved.year, month: moved.month, day: moved.day };
}

/** ISO weekday of a local date: 1 = Monday ... 7 = Sunday. */
export function isoWeekday(date: LocalDate): number {
  return DateTime.fromObject(date, { zone: 'UTC' }).weekday;
}

/** "2026-03-08": the key a digest is claimed under. */
export function formatLocalDate(date: LocalDate): string {
  const pad = (n: number, width: number) => String(n).padStart(width, '0');
  return `${pad(date.year, 4)}-${pad(date.month, 2)}-${pad(date.day, 2)}`;
}
