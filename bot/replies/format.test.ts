import fc from 'fast-check';
import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import {
  calendarDaysBetween,
  formatAge,
  formatChange,
  formatDate,
  formatDateTime,
  formatDuration,
  formatNumber,
  formatPercent,
  formatRate,
  formatVolume,
  formatWhen,
} from './format.js';

const zone = 'America/Chicago';
const at = (iso: string, z = zone) => DateTime.fromISO(iso, { zone: z }).toMillis();

describe('numbers and volumes', () => {
  it('keeps about three significant figures without inventing precision', () => {
    expect(formatVolume(1234.4, 'gal')).toBe('1,234 gal');
    expect(formatVolume(412.37, 'gal')).toBe('412 gal');
    expect(formatVolume(12.44, 'gal')).toBe('12.4 gal');
    expect(formatVolume(3.271, 'm3')).toBe('3.27 m3');
    expect(formatVolume(0, 'L')).toBe('0 L');
  });

  it('never prints NaN or -0', () => {
    expect(formatNumber(Number.NaN)).toBe('?');
    expect(formatNumber(-0.0001, 1)).toBe('0.0');
    expect(formatNumber(-0)).toBe('0');
  });

  it('formats percent from a fraction', () => {
    expect(formatPercent(0.48)).toBe('48%');
    expect(formatPercent(0.062)).toBe('6.2%');
    expect(formatPercent(1)).toBe('100%');
    expect(formatPercent(0)).toBe('0%');
  });

  it('formats signed changes', () => {
    expect(formatChange(150, 'gal')).toBe('+150 gal');
    expect(formatChange(-8.43, 'gal')).toBe('-8.43 gal');
    expect(formatChange(0.0001, 'gal')).toBe('no change');
  });
});

describe('rates and durations with their range', () => {
  it('gives a rate with its range at the same precision', () => {
    expect(formatRate({ value: 12.41, low: 10.93, high: 13.77 }, 'gal')).toBe('12.4 gal/day (10.9-13.8)');
    expect(formatRate({ value: 412 }, 'L')).toBe('412 L/day');
    expect(formatRate({ value: 2, low: 2, high: 2 }, 'L', 'hour')).toBe('2.00 L/hour');
  });

  it('uses "to" for a range that crosses zero', () => {
    expect(formatRate({ value: 0.5, low: -1.2, high: 2.2 }, 'gal')).toBe('0.50 gal/day (-1.20 to 2.20)');
  });

  it('gives durations in days, hours under two days, and bounds very long ones', () => {
    expect(formatDuration({ value: 9.3, low: 7.2, high: 12.4 })).toBe('9 days (7-12)');
    expect(formatDuration({ value: 1.25, low: 0.8, high: 1.7 })).toBe('30 hours (19-41)');
    expect(formatDuration({ value: 1 / 24 })).toBe('1 hour');
    expect(formatDuration({ value: 400 })).toBe('over a year');
    expect(formatDuration({ value: 200, low: 150, high: Number.POSITIVE_INFINITY })).toBe(
      '200 days (150 or more)',
    );
    expect(formatDuration({ value: Number.POSITIVE_INFINITY })).toBe('no end in sight');
    expect(formatDuration({ value: Number.NaN })).toBe('unknown');
  });

  it('never throws and never prints NaN for any estimate (property)', () => {
    const num = fc.double({ noNaN: false });
    fc.assert(
      fc.property(num, num, num, (value, low, high) => {
        for (const text of [formatDuration({ value, low, high }), formatRate({ value, low, high }, 'gal')]) {
          expect(text).not.toMatch(/NaN|undefined/);
          expect(text.length).toBeGreaterThan(0);
        }
      }),
    );
  });
});

describe('dates in the team zone', () => {
  const now = at('2026-12-01T09:00');

  it('says relative calendar days and the date', () => {
    expect(formatWhen(at('2026-12-10T15:00'), now, zone)).toBe('in 9 days, Thu 10 Dec');
    expect(formatWhen(at('2026-12-02T01:00'), now, zone)).toBe('tomorrow, Wed 2 Dec');
    expect(formatWhen(at('2026-12-01T14:30'), now, zone)).toBe('today 14:30');
    expect(formatWhen(at('2026-11-30T23:00'), now, zone)).toBe('yesterday, Mon 30 Nov');
    expect(formatWhen(at('2026-11-28T08:00'), now, zone)).toBe('3 days ago, Sat 28 Nov');
    expect(formatWhen(at('2027-01-05T08:00'), now, zone)).toBe('in 35 days, Tue 5 Jan 2027');
  });

  it('counts calendar days in the team zone, not in UTC', () => {
    // 2026-12-02 03:00 UTC is still 1 Dec in Chicago (UTC-6), so it is "today" there.
    const t = Date.UTC(2026, 11, 2, 3, 0);
    expect(calendarDaysBetween(now, t, zone)).toBe(0);
    expect(calendarDaysBetween(now, t, 'Europe/Berlin')).toBe(1);
  });

  it('counts a DST day as one calendar day', () => {
    // US DST ended on Sun 1 Nov 2026 (a 25-hour day in Chicago): common practice, from memory.
    expect(calendarDaysBetween(at('2026-10-31T12:00'), at('2026-11-02T12:00'), zone)).toBe(2);
  });

  it('formats a full date-time and falls back to UTC for an unknown zone', () => {
    expect(formatDateTime(at('2026-11-02T07:30'), zone)).toBe('Mon 2 Nov 2026 07:30');
    expect(formatDateTime(Date.UTC(2026, 10, 2, 7, 30), 'Not/AZone')).toBe('Mon 2 Nov 2026 07:30 UTC');
    expect(formatDate(at('2026-11-02T07:30'), zone, now)).toBe('Mon 2 Nov');
  });

  it('never throws or prints "Invalid" for any instant and zone (property)', () => {
    const zones = fc.oneof(
      fc.constantFrom('UTC', 'America/Chicago', 'Asia/Kolkata', 'Pacific/Chatham'),
      fc.string(),
    );
    const instant = fc.integer({ min: -8.64e15, max: 8.64e15 });
    fc.assert(
      fc.property(instant, instant, zones, (time, now, z) => {
        for (const text of [
          formatWhen(time, now, z),
          formatDateTime(time, z),
          formatDate(time, z, now),
          formatAge(time, now),
        ]) {
          expect(text).not.toMatch(/Invalid|NaN|undefined/);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('never throws at the very ends of the representable range, in a zone ahead of UTC', () => {
    // ±8.64e15 ms is the range of an ECMAScript time value (ECMA-262, "Time Values and Time Range").
    for (const [time, now] of [
      [8.64e15, 0],
      [8.64e15 - 36e6, 8.64e15],
    ] as const) {
      for (const zone of ['Asia/Kolkata', 'Pacific/Chatham']) {
        expect(formatWhen(time, now, zone)).not.toMatch(/Invalid|NaN|undefined/);
      }
    }
  });

  it('says how old a reading is', () => {
    expect(formatAge(now - 20_000, now)).toBe('just now');
    expect(formatAge(now - 5 * 60_000, now)).toBe('5 min ago');
    expect(formatAge(now - 3_600_000, now)).toBe('1 hour ago');
    expect(formatAge(now - 3 * 86_400_000, now)).toBe('3 days ago');
  });
});
