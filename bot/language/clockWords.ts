import { fail, ok, type Result } from '../../engine/result.js';
import { DAY_SETS, WEEKDAYS } from './words.js';

/** "tue,thu", "mon-fri", "weekdays", "tuesday and thursday" -> ISO weekdays (1 = Monday), sorted, unique. */
export function readWeekdays(text: string): Result<number[]> {
  const t = text.trim().toLowerCase();
  const set = DAY_SETS[t];
  if (set) return ok([...set]);
  const days = new Set<number>();
  for (const part of t.split(/\s*(?:,|\/|\band\b|&|\s)\s*/).filter((p) => p !== '')) {
    const range = /^([a-z]+)-([a-z]+)$/.exec(part);
    if (range) {
      const from = WEEKDAYS[range[1] ?? ''];
      const to = WEEKDAYS[range[2] ?? ''];
      if (!from || !to) return fail(`"${part}" is not a range of days; write it like mon-fri.`);
      for (let d = from; ; d = (d % 7) + 1) {
        days.add(d);
        if (d === to) break;
      }
      continue;
    }
    const day = WEEKDAYS[part];
    if (!day) return fail(`"${part}" is not a day; write days like mon,wed,fri or weekdays.`);
    days.add(day);
  }
  if (days.size === 0) return fail('Give at least one day, e.g. tue,thu or weekdays.');
  return ok([...days].sort((a, b) => a - b));
}

export interface ClockTime {
  hour: number;
  minute: number;
}

/** "7", "7am", "07:00", "4:30 pm", "7.30", "noon", "midnight" -> a time of day on the 24-hour clock. */
export function readClockTime(text: string): Result<ClockTime> {
  const t = text.trim().toLowerCase();
  if (t === 'noon' || t === 'midday') return ok({ hour: 12, minute: 0 });
  if (t === 'midnight') return ok({ hour: 0, minute: 0 });
  const m = /^(\d{1,2})(?:[:.](\d{2}))?\s*(?:([ap])\.?m?\.?)?$/.exec(t);
  let hour = Number(m?.[1]);
  const minute = Number(m?.[2] ?? 0);
  const half = m?.[3];
  if (half && (hour < 1 || hour > 12)) hour = Number.NaN;
  if (half === 'p' && hour < 12) hour += 12;
  if (half === 'a' && hour === 12) hour = 0;
  if (!m || !(hour >= 0 && hour <= 23) || minute > 59) {
    return fail(`"${text.trim()}" is not a time of day; write it like 07:00, 7:30, 4pm or noon.`);
  }
  return ok({ hour, minute });
}

/** "07:00" from a time of day. */
export const formatClock = ({ hour, minute }: ClockTime): string =>
  `${String(hour).padStart(2, '0')}:${String(minute).padStart(2, '0')}`;

/** "12", "noon", "14:00", "2pm" -> an hour of the day 0-23 (minutes must be :00). */
export function readHourOfDay(text: string): Result<number> {
  const time = readClockTime(text);
  if (!time.ok) return fail(`"${text.trim()}" is not an hour of the day; write it like 14:00, 2pm or noon.`);
  if (time.value.minute !== 0)
    return fail(`"${text.trim()}" is not an hour; give a whole hour like 14:00 or 2pm.`);
  return ok(time.value.hour);
}

/**
 * "8-12", "8am to noon", "13:00-midnight" -> whole local hours [from, to) with from < to; an end of
 * midnight (0) means the end of the day (24), so a window reaching midnight can be said plainly.
 */
export function readHourRange(text: string): Result<[number, number]> {
  const parts = text.trim().split(/\s*(?:-|–|\bto\b|\buntil\b|\btill\b)\s*/i);
  if (parts.length !== 2 || parts.some((p) => p === ''))
    return fail(`"${text.trim()}" is not two whole hours; write it like 8-12, 8am to noon or 13:00-17:00.`);
  const from = readHourOfDay(parts[0] ?? '');
  if (!from.ok) return from;
  const to = readHourOfDay(parts[1] ?? '');
  if (!to.ok) return to;
  const end = to.value === 0 ? 24 : to.value;
  if (end <= from.value)
    return fail(`The window must close after it opens, the same day: "${text.trim()}" does not.`);
  return ok([from.value, end]);
}
