// The local calendar date of an instant, fast. luxon finds a zone's offset through Intl (tens of microseconds
// a call); a digest asks for the dates of thousands of deadlines, most within a few hundred hours of each other.
// A zone's offset changes only at its transitions, and no zone has two within one hour (from memory of the
// IANA tz database: transitions are months apart, at least weeks), so when the offset at the start and at the
// end of an hour agree it holds for the whole hour; that offset is kept per zone and hour. An hour holding
// a transition, or an offset of a fraction of a minute (old local mean times), goes to luxon every time.
import { DateTime } from 'luxon';

const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;
const MINUTE_MS = 60_000;

/** Offset in minutes per zone and hour, or NaN where it is not one whole-minute value all hour. */
const hourOffsets = new Map<string, Map<number, number>>();
let hourOffsetsKept = 0;
const MAX_ENTRIES = 16_384;

/** The local date of an instant, exactly as luxon gives it, as days since 1970-01-01. */
export function civilDayLuxon(ms: number, timeZone: string): number {
  const t = DateTime.fromMillis(ms, { zone: timeZone });
  return Date.UTC(t.year, t.month - 1, t.day) / DAY_MS;
}

function offsetOfHour(hour: number, timeZone: string): number {
  let zone = hourOffsets.get(timeZone);
  const known = zone?.get(hour);
  if (known !== undefined) return known;
  if (hourOffsetsKept >= MAX_ENTRIES) {
    hourOffsets.clear();
    hourOffsetsKept = 0;
    zone = undefined;
  }
  if (!zone) {
    zone = new Map();
    hourOffsets.set(timeZone, zone);
  }
  const start = DateTime.fromMillis(hour * HOUR_MS, { zone: timeZone }).offset;
  const end = DateTime.fromMillis((hour + 1) * HOUR_MS - 1, { zone: timeZone }).offset;
  const offset = start === end && Number.isInteger(start) ? start : Number.NaN;
  zone.set(hour, offset);
  hourOffsetsKept++;
  return offset;
}

/** The local date of an instant in `timeZone` (days since 1970-01-01); NaN for an unknown zone, as luxon. */
export function civilDay(ms: number, timeZone: string): number {
  // Deadlines carry fractions of a millisecond. Date (and so luxon) truncates them, which is the floor used
  // here for instants after 1970; before 1970 truncation rounds up, so those go to luxon.
  if (!(Number.isSafeInteger(ms) || (ms >= 0 && ms <= Number.MAX_SAFE_INTEGER))) {
    return civilDayLuxon(ms, timeZone);
  }
  const offset = offsetOfHour(Math.floor(ms / HOUR_MS), timeZone);
  if (Number.isNaN(offset)) return civilDayLuxon(ms, timeZone);
  return Math.floor((ms + offset * MINUTE_MS) / DAY_MS);
}
