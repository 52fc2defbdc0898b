import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { civilDay, civilDayLuxon } from './civilDay.js';

// Reference: luxon's own DateTime (zone rules from the IANA tz database through Intl), the library the
// delivery calendar used before this fast path; the fast path must give its answer for every instant.
const ZONES = [
  'UTC',
  'America/Chicago',
  'Europe/Berlin',
  'Australia/Sydney',
  'Australia/Lord_Howe', // half-hour daylight saving
  'Asia/Kathmandu', // +05:45
  'Pacific/Chatham', // +12:45 / +13:45
  'America/St_Johns', // -03:30 / -02:30
  'Pacific/Apia', // skipped a whole day at the end of 2011
  'Africa/Casablanca', // daylight saving suspended each Ramadan
];
const HOUR = 3_600_000;

// Daylight-saving changes of 2026, as UTC instants (from memory; the test only needs instants near them).
const TRANSITIONS = [
  Date.parse('2026-03-08T08:00:00Z'), // America/Chicago spring
  Date.parse('2026-11-01T07:00:00Z'), // America/Chicago autumn
  Date.parse('2026-03-29T01:00:00Z'), // Europe/Berlin spring
  Date.parse('2026-10-25T01:00:00Z'), // Europe/Berlin autumn
  Date.parse('2026-04-04T16:00:00Z'), // Australia/Sydney autumn
  Date.parse('2026-10-03T16:00:00Z'), // Australia/Sydney spring
  Date.parse('2011-12-30T10:00:00Z'), // Pacific/Apia's skipped day
];

describe('civilDay', () => {
  it('gives luxon’s local date for any instant from 1850 to 2150 in any zone', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: Date.parse('1850-01-01T00:00:00Z'), max: Date.parse('2150-01-01T00:00:00Z') }),
        fc.constantFrom(...ZONES),
        (ms, zone) => {
          expect(civilDay(ms, zone)).toBe(civilDayLuxon(ms, zone));
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('gives luxon’s local date for instants with fractions of a millisecond (computed deadlines)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -5e12, max: 5e12, noNaN: true }),
        fc.constantFrom(...ZONES),
        (ms, zone) => {
          expect(civilDay(ms, zone)).toBe(civilDayLuxon(ms, zone));
        },
      ),
      { numRuns: 2000 },
    );
    for (const at of TRANSITIONS) {
      for (const zone of ZONES) {
        for (const d of [-0.5, 0.25, -HOUR - 0.5, HOUR - 0.5]) {
          expect(civilDay(at + d, zone)).toBe(civilDayLuxon(at + d, zone));
          expect(civilDay(-at + d, zone)).toBe(civilDayLuxon(-at + d, zone));
        }
      }
    }
  });

  it('gives luxon’s local date to the millisecond around daylight-saving changes and midnights', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...TRANSITIONS),
        fc.integer({ min: -30 * HOUR, max: 30 * HOUR }),
        fc.constantFrom(...ZONES),
        (at, delta, zone) => {
          expect(civilDay(at + delta, zone)).toBe(civilDayLuxon(at + delta, zone));
        },
      ),
      { numRuns: 3000 },
    );
    for (const at of TRANSITIONS) {
      for (const zone of ZONES) {
        for (const d of [-HOUR - 1, -HOUR, -1, 0, 1, HOUR - 1, HOUR]) {
          expect(civilDay(at + d, zone)).toBe(civilDayLuxon(at + d, zone));
        }
      }
    }
  });

  it('answers NaN for an unknown zone and a non-finite instant, as luxon does, without throwing', () => {
    expect(civilDay(0, 'Mars/Olympus_Mons')).toBeNaN();
    expect(civilDay(Number.NaN, 'UTC')).toBeNaN();
  });
});
