/**
 * Number, range, duration and date wording shared by every reply, so the console, Slack and Discord all say
 * "12.4 gal/day (10.9-13.8)" and "in 9 days, Thu 10 Dec" the same way. Pure: `now` is an argument.
 */
import { DateTime } from 'luxon';
import { civilDay } from '../../engine/refill/civilDay.js';
import { BoundedMemo } from '../bounded-memo.js';

const DAY_MS = 86_400_000;

/** A central estimate with an optional range (e.g. the ~80% range of a rate or a runway). */
export interface Estimate {
  value: number;
  low?: number;
  high?: number;
}

const MINUS = '-';

/**
 * Decimals that keep about three significant figures without inventing precision on big numbers:
 * 1234 -> 0, 412 -> 0, 12.4 -> 1, 3.27 -> 2, 0.5 -> 2, 0.046 -> 3 (capped at 3).
 */
export function sensibleDecimals(value: number): number {
  const magnitude = Math.abs(value);
  if (!Number.isFinite(magnitude) || magnitude === 0) return 0;
  const digits = Math.floor(Math.log10(magnitude));
  return digits >= -1 ? Math.min(2, Math.max(0, 2 - digits)) : 3;
}

// One formatter per number of decimals: toLocaleString builds a new Intl.NumberFormat on every call, which
// dominated composing a digest of many tanks.
const numberFormats = new Map<number, Intl.NumberFormat>();
function numberFormat(decimals: number): Intl.NumberFormat {
  let format = numberFormats.get(decimals);
  if (!format) {
    format = new Intl.NumberFormat('en-US', {
      minimumFractionDigits: decimals,
      maximumFractionDigits: decimals,
    });
    numberFormats.set(decimals, format);
  }
  return format;
}

/** "1,234", "412", "12.4", "3.27"; a non-finite value reads "?" rather than "NaN". */
export function formatNumber(value: number, decimals = sensibleDecimals(value)): string {
  if (!Number.isFinite(value)) return '?';
  const text = numberFormat(decimals).format(value);
  // -0 and tiny negatives that round to zero should not read "-0".
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

/**
 * A range's two ends at the precision of its central value, so "12.4 (10.9-13.8)" never reads "12.4 (11-14)".
 * Uses "to" when an end is negative, because "-3--1" is unreadable.
 */
function formatRange(low: number, high: number, decimals: number): string {
  const a = formatNumber(Math.min(low, high), decimals);
  const b = formatNumber(Math.max(low, high), decimals);
  if (a === b) return '';
  return Math.min(low, high) < 0 ? `${a} to ${b}` : `${a}${MINUS}${b}`;
}

function withRange(estimate: Estimate, decimals: number, unit: string): string {
  const head = `${formatNumber(estimate.value, decimals)}${unit ? ` ${unit}` : ''}`;
  if (estimate.low === undefined || estimate.high === undefined) return head;
  if (!Number.isFinite(estimate.low) || !Number.isFinite(estimate.high)) return head;
  const range = formatRange(estimate.low, estimate.high, decimals);
  return range ? `${head} (${range})` : head;
}

/** A volume in the tank's display unit: "412 gal", "1,250 L", "3.27 m3". */
export function formatVolume(value: number, unit: string): string {
  return `${formatNumber(value)} ${unit}`;
}

/** A level with its unit: "52.3 in", "1.33 m". */
export function formatLevel(value: number, unit: string): string {
  return `${formatNumber(value)} ${unit}`;
}

/** A fraction 0..1 as a percent: 0.48 -> "48%", 0.062 -> "6.2%", 0.0004 -> "0%". */
export function formatPercent(fraction: number): string {
  if (!Number.isFinite(fraction)) return '?%';
  const percent = fraction * 100;
  const decimals = Math.abs(percent) < 10 && Math.abs(percent) >= 0.05 ? 1 : 0;
  return `${formatNumber(percent, decimals)}%`;
}

/** A signed change: "+150 gal", "-8.4 gal", "no change". */
export function formatChange(value: number, unit: string): string {
  if (!Number.isFinite(value)) return `? ${unit}`;
  const text = formatNumber(Math.abs(value));
  if (Number(text.replaceAll(',', '')) === 0) return 'no change';
  return `${value > 0 ? '+' : MINUS}${text} ${unit}`;
}

/**
 * A use rate with its range: "12.4 gal/day (10.9-13.8)". The range ends share the central value's
 * precision. `per` is the time unit word (day by default).
 */
export function formatRate(rate: Estimate, unit: string, per = 'day'): string {
  const decimals = sensibleDecimals(rate.value);
  return withRange(rate, decimals, `${unit}/${per}`);
}

const HOURS_PER_DAY = 24;
/** Past this a runway is "over a year": more digits would claim a precision no forecast has. */
const LONGEST_DAYS = 365;

function plural(n: string, word: string): string {
  return `${n} ${word}${n === '1' ? '' : 's'}`;
}

/**
 * A duration given in days with its range: "9 days (7-12)", "30 hours (20-41)" under two days,
 * "over a year" past 365 days, "no end in sight" when not falling (infinite or negative).
 */
export function formatDuration(days: Estimate): string {
  const { value } = days;
  if (Number.isNaN(value)) return 'unknown';
  if (value === Number.POSITIVE_INFINITY || value < 0) return 'no end in sight';
  if (value > LONGEST_DAYS) return 'over a year';
  const inHours = value < 2;
  const scale = inHours ? HOURS_PER_DAY : 1;
  const word = inHours ? 'hour' : 'day';
  const central = formatNumber(value * scale, 0);
  const head = plural(central, word);
  if (days.low === undefined || days.high === undefined) return head;
  const low = Math.max(0, days.low) * scale;
  const high = days.high * scale;
  if (!Number.isFinite(high) || days.high > LONGEST_DAYS) return `${head} (${formatNumber(low, 0)} or more)`;
  const range = formatRange(low, high, 0);
  return range ? `${head} (${range})` : head;
}

/** Luxon needs a valid IANA zone; an unknown one falls back to UTC and says so in the text. */
function inZone(time: number, timeZone: string): { dt: DateTime; note: string } {
  const dt = DateTime.fromMillis(time, { zone: timeZone });
  if (dt.isValid) return { dt, note: '' };
  return { dt: DateTime.fromMillis(time, { zone: 'UTC' }), note: ' UTC' };
}

/** The texts of `formatDate` by local date and whether it is in the year of `now`: luxon's formatting was a
 * large part of composing a digest, whose rows show a handful of dates again and again. */
const dateTexts = new BoundedMemo<string, string>(4096);
const yearOf = (day: number) => new Date(day * DAY_MS).getUTCFullYear();

/** "Thu 10 Dec" (adds the year when it is not the year of `now`). */
export function formatDate(time: number, timeZone: string, now = time): string {
  // civilDay is luxon's local date (NaN for an unknown zone or instant, which luxon's path below words).
  const day = civilDay(time, timeZone);
  const today = civilDay(now, timeZone);
  if (!Number.isFinite(day) || !Number.isFinite(today)) return formatDateLuxon(time, timeZone, now);
  return dateTexts.get(`${day}|${yearOf(day) === yearOf(today)}`, () => formatDateLuxon(time, timeZone, now));
}

function formatDateLuxon(time: number, timeZone: string, now: number): string {
  const { dt, note } = inZone(time, timeZone);
  const { dt: today } = inZone(now, timeZone);
  const pattern = dt.year === today.year ? 'ccc d LLL' : 'ccc d LLL yyyy';
  return `${dt.toFormat(pattern, { locale: 'en-GB' })}${note}`;
}

/** "Thu 10 Dec 2026 07:30" in the team's zone (24-hour clock; unambiguous across teams). */
export function formatDateTime(time: number, timeZone: string): string {
  const { dt, note } = inZone(time, timeZone);
  return `${dt.toFormat('ccc d LLL yyyy HH:mm', { locale: 'en-GB' })}${note}`;
}

/** Whole calendar days from `now` to `time` in the zone: tomorrow is 1 even if it is 2 hours away. */
export function calendarDaysBetween(now: number, time: number, timeZone: string): number {
  const a = inZone(now, timeZone).dt.startOf('day');
  const b = inZone(time, timeZone).dt.startOf('day');
  // Only at the very ends of the representable range does a zone shift leave luxon without a date (its diff
  // then throws): count 24-hour blocks there.
  let days = Number.NaN;
  try {
    if (a.isValid && b.isValid) days = Math.round(b.diff(a, 'days').days);
  } catch {
    // luxon's diff overflows there even between two valid dates; the fallback below answers.
  }
  return Number.isFinite(days) ? days : Math.round((time - now) / DAY_MS);
}

/**
 * A date relative to now in the team's zone: "today 14:30", "tomorrow, Fri 11 Dec", "in 9 days, Thu 10 Dec",
 * "yesterday, Tue 1 Dec", "3 days ago, Sun 29 Nov". Calendar days, not 24-hour blocks, because a person plans
 * by dates.
 */
export function formatWhen(time: number, now: number, timeZone: string): string {
  if (!Number.isFinite(time)) return 'never';
  const days = calendarDaysBetween(now, time, timeZone);
  const date = formatDate(time, timeZone, now);
  if (days === 0) {
    const { dt, note } = inZone(time, timeZone);
    return `today ${dt.toFormat('HH:mm')}${note}`;
  }
  if (days === 1) return `tomorrow, ${date}`;
  if (days === -1) return `yesterday, ${date}`;
  if (days > 1) return `in ${days} days, ${date}`;
  return `${-days} days ago, ${date}`;
}

/** How old a reading is, for the basis of a forecast: "5 min ago", "3 hours ago", "2 days ago". */
export function formatAge(time: number, now: number): string {
  const minutes = Math.max(0, (now - time) / 60_000);
  if (minutes < 1) return 'just now';
  if (minutes < 60) return `${Math.round(minutes)} min ago`;
  const hours = minutes / 60;
  if (hours < 48) return `${plural(formatNumber(hours, 0), 'hour')} ago`;
  return `${plural(formatNumber(hours / 24, 0), 'day')} ago`;
}
