import fc from 'fast-check';
import { DateTime } from 'luxon';
import { afterEach, describe, expect, it } from 'vitest';
import { resolveStatedTime } from './statedTime.js';

const ZONES = [
  'America/Chicago',
  'Europe/Berlin',
  'Australia/Sydney',
  'Asia/Kolkata',
  'America/St_Johns',
  'UTC',
];
const systemZone = process.env.TZ;

/**
 * Laws of times in words, checked with luxon (which reads the IANA tz database through Intl) as the
 * independent clock: "yesterday H:MM" is H:MM on the day before, on the team's calendar, whatever zone the
 * server runs in. Hours are kept away from 01:00-03:59, where DST changes skip or repeat wall-clock times.
 */
describe('times in words: laws', () => {
  afterEach(() => {
    if (systemZone === undefined) delete process.env.TZ;
    else process.env.TZ = systemZone;
  });

  it('"yesterday H:MM" is that wall-clock time on the previous local date, on any server zone', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: Date.parse('2020-01-01T00:00:00Z'), max: Date.parse('2035-01-01T00:00:00Z') }),
        fc.constantFrom(...ZONES),
        fc.constantFrom('UTC', 'America/New_York', 'Europe/London', 'Pacific/Auckland'),
        fc.integer({ min: 4, max: 23 }),
        fc.integer({ min: 0, max: 59 }),
        (now, zone, serverZone, hour, minute) => {
          process.env.TZ = serverZone;
          const clock = `${hour}:${String(minute).padStart(2, '0')}`;
          const result = resolveStatedTime(`yesterday ${clock}`, { now, timeZone: zone });
          expect(result.ok).toBe(true);
          if (!result.ok) return;
          const got = DateTime.fromMillis(result.value.at, { zone });
          const expectedDay = DateTime.fromMillis(now, { zone }).minus({ days: 1 });
          expect([got.year, got.month, got.day, got.hour, got.minute]).toEqual([
            expectedDay.year,
            expectedDay.month,
            expectedDay.day,
            hour,
            minute,
          ]);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('a full date and time is read the same on any server zone', () => {
    fc.assert(
      fc.property(
        fc.date({
          min: new Date('2020-01-01T00:00:00Z'),
          max: new Date('2035-01-01T00:00:00Z'),
          noInvalidDate: true,
        }),
        fc.constantFrom(...ZONES),
        fc.constantFrom('UTC', 'America/New_York', 'Pacific/Auckland'),
        (date, zone, serverZone) => {
          const local = DateTime.fromJSDate(date, { zone }).set({ second: 0, millisecond: 0 });
          if (local.hour >= 1 && local.hour < 4) return;
          process.env.TZ = serverZone;
          const text = `at ${local.toFormat('yyyy-LL-dd HH:mm')}`;
          const result = resolveStatedTime(text, { now: Date.parse('2036-01-01T00:00:00Z'), timeZone: zone });
          expect(result.ok ? result.value.at : result.error).toBe(local.toMillis());
        },
      ),
      { numRuns: 300 },
    );
  });
});
