import fc from 'fast-check';
import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import {
  addLocalDays,
  checkTimeZone,
  formatLocalDate,
  instantOfLocal,
  isoWeekday,
  type LocalDate,
  localDateOf,
  parseWallTime,
} from './local-time.js';

// Daylight-saving dates below come from the IANA time zone database as Node's ICU ships it; the rules they
// follow (US: second Sunday of March / first Sunday of November; EU: last Sunday of March / October at
// 01:00 UTC; New South Wales: first Sunday of October / April) are quoted from memory.
const iso = (instant: number) => new Date(instant).toISOString();
const d = (text: string): LocalDate => {
  const [year, month, day] = text.split('-').map(Number) as [number, number, number];
  return { year, month, day };
};

describe('instantOfLocal', () => {
  it('maps an ordinary local time with the offset of that day', () => {
    expect(iso(instantOfLocal(d('2026-03-07'), { hour: 7, minute: 0 }, 'America/Chicago'))).toBe(
      '2026-03-07T13:00:00.000Z',
    );
    expect(iso(instantOfLocal(d('2026-03-09'), { hour: 7, minute: 0 }, 'America/Chicago'))).toBe(
      '2026-03-09T12:00:00.000Z',
    );
  });

  it.each([
    ['America/Chicago', '2026-03-08', '2026-03-08T08:00:00.000Z'],
    ['Europe/Berlin', '2026-03-29', '2026-03-29T01:00:00.000Z'],
    ['Australia/Sydney', '2026-10-04', '2026-10-03T16:00:00.000Z'],
  ])(
    'a time skipped by the spring change in %s maps to the first minute after the gap',
    (zone, date, want) => {
      const instant = instantOfLocal(d(date), { hour: 2, minute: 30 }, zone);
      expect(iso(instant)).toBe(want);
      expect(DateTime.fromMillis(instant, { zone }).toFormat('HH:mm')).toBe('03:00');
    },
  );

  it.each([
    ['America/Chicago', '2026-11-01', 1, '2026-11-01T06:30:00.000Z'],
    ['Europe/Berlin', '2026-10-25', 2, '2026-10-25T00:30:00.000Z'],
    ['Australia/Sydney', '2026-04-05', 2, '2026-04-04T15:30:00.000Z'],
  ])('a time repeated by the autumn change in %s maps to its first occurrence', (zone, date, hour, want) => {
    expect(iso(instantOfLocal(d(date), { hour, minute: 30 }, zone))).toBe(want);
  });

  it('is the earliest instant whose local time on that date reaches the wall time (property)', () => {
    const zones = ['America/Chicago', 'Europe/Berlin', 'Australia/Sydney', 'America/Santiago', 'UTC'];
    fc.assert(
      fc.property(
        fc.constantFrom(...zones),
        fc.integer({ min: 0, max: 729 }),
        fc.integer({ min: 0, max: 23 }),
        fc.integer({ min: 0, max: 59 }),
        (zone, dayIndex, hour, minute) => {
          const date = addLocalDays(d('2026-01-01'), dayIndex);
          const instant = instantOfLocal(date, { hour, minute }, zone);
          const wanted = hour * 60 + minute;
          const at = DateTime.fromMillis(instant, { zone });
          const before = DateTime.fromMillis(instant - 60_000, { zone });
          expect(formatLocalDate(localDateOf(instant, zone))).toBe(formatLocalDate(date));
          expect(at.hour * 60 + at.minute).toBeGreaterThanOrEqual(wanted);
          const beforeReached =
            before.day === at.day && before.month === at.month && before.hour * 60 + before.minute >= wanted;
          expect(beforeReached).toBe(false);
        },
      ),
      { numRuns: 400 },
    );
  });
});

describe('calendar helpers', () => {
  it('steps local dates by the calendar across months and years', () => {
    expect(formatLocalDate(addLocalDays(d('2026-12-31'), 1))).toBe('2027-01-01');
    expect(formatLocalDate(addLocalDays(d('2026-03-01'), -1))).toBe('2026-02-28');
  });

  it('gives ISO weekdays (2026-03-08 was a Sunday)', () => {
    expect(isoWeekday(d('2026-03-08'))).toBe(7);
    expect(isoWeekday(d('2026-03-09'))).toBe(1);
  });

  it('accepts 24-hour times and rejects others with a fix', () => {
    expect(parseWallTime('7:05')).toEqual({ ok: true, value: { hour: 7, minute: 5 } });
    const bad = parseWallTime('25:00');
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error).toMatch(/24-hour clock/);
    expect(parseWallTime('seven').ok).toBe(false);
  });

  it('rejects an unknown zone with a fix', () => {
    expect(checkTimeZone('Europe/Berlin').ok).toBe(true);
    const bad = checkTimeZone('Mars/Olympus');
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error).toMatch(/IANA/);
  });
});
