import { describe, expect, it } from 'vitest';
import { resolvePastTime, resolveStatedTime, splitStatedTime } from './statedTime.js';

const at = (text: string, now: string, timeZone: string) => {
  const result = resolveStatedTime(text, { now: Date.parse(now), timeZone });
  if (!result.ok) throw new Error(result.error);
  return new Date(result.value.at).toISOString();
};

describe('splitStatedTime', () => {
  it.each([
    ['60in at 7:30', '60in', 'at 7:30'],
    [`5' 2" yesterday 4pm`, `5' 2"`, 'yesterday 4pm'],
    ['410 gal 2026-11-02 07:30', '410 gal', '2026-11-02 07:30'],
    ['60 in on monday 8am', '60 in', 'on monday 8am'],
    ['ullage 14in 2 hours ago', 'ullage 14in', '2 hours ago'],
    ['48%', '48%', undefined],
  ])('%s', (text, body, timeText) => {
    expect(splitStatedTime(text)).toEqual(timeText === undefined ? { body } : { body, timeText });
  });
});

/**
 * Daylight-saving days, from memory of the rules (US: DST ends the first Sunday of November, 2026-11-01,
 * 02:00 CDT -> 01:00 CST; EU: summer time starts the last Sunday of March, 2026-03-29, 02:00 CET -> 03:00
 * CEST), as kept in the IANA tz database that luxon reads through Intl.
 */
describe('times in words in the team zone, across daylight-saving days', () => {
  it('America/Chicago around the end of DST on 2026-11-01', () => {
    const now = '2026-11-02T15:00:00Z'; // Monday 09:00 CST
    expect(at('yesterday 4pm', now, 'America/Chicago')).toBe('2026-11-01T22:00:00.000Z'); // CST, UTC-6
    expect(at('at 2026-11-01 00:30', now, 'America/Chicago')).toBe('2026-11-01T05:30:00.000Z'); // CDT, UTC-5
    expect(at('at 2026-11-01 03:00', now, 'America/Chicago')).toBe('2026-11-01T09:00:00.000Z'); // CST
    expect(at('2026-10-31 16:00', now, 'America/Chicago')).toBe('2026-10-31T21:00:00.000Z'); // CDT
    // 01:30 happens twice that night; bot/schedule's one rule takes the first (CDT).
    expect(at('at 2026-11-01 01:30', now, 'America/Chicago')).toBe('2026-11-01T06:30:00.000Z');
  });

  it('Europe/Berlin around the start of summer time on 2026-03-29', () => {
    const now = '2026-03-30T08:00:00Z'; // Monday 10:00 CEST
    expect(at('yesterday 4pm', now, 'Europe/Berlin')).toBe('2026-03-29T14:00:00.000Z'); // CEST, UTC+2
    expect(at('at 2026-03-29 01:30', now, 'Europe/Berlin')).toBe('2026-03-29T00:30:00.000Z'); // CET, UTC+1
    expect(at('at 2026-03-29 04:00', now, 'Europe/Berlin')).toBe('2026-03-29T02:00:00.000Z'); // CEST
    // 02:30 does not exist that night; bot/schedule's one rule moves it to the first valid minute, 03:00 CEST.
    expect(at('at 2026-03-29 02:30', now, 'Europe/Berlin')).toBe('2026-03-29T01:00:00.000Z');
  });

  it('the same words mean different instants in different team zones', () => {
    const now = '2026-11-10T15:00:00Z';
    expect(at('at 7:30', now, 'America/Chicago')).toBe('2026-11-10T13:30:00.000Z');
    expect(at('at 7:30', now, 'Europe/Berlin')).toBe('2026-11-10T06:30:00.000Z');
    expect(at('at 7:30', now, 'Asia/Kolkata')).toBe('2026-11-10T02:00:00.000Z'); // UTC+5:30, no DST
  });

  it('an explicit zone or offset in the words wins over the team zone', () => {
    const now = '2026-11-10T15:00:00Z';
    expect(at('at 2026-11-02 07:30 UTC', now, 'America/Chicago')).toBe('2026-11-02T07:30:00.000Z');
    expect(at('2026-11-02T07:30-05:00', now, 'Europe/Berlin')).toBe('2026-11-02T12:30:00.000Z');
    // Europe/Berlin is on CET (UTC+1) in November.
    expect(at('at 2026-11-02 07:30 Europe/Berlin', now, 'America/Chicago')).toBe('2026-11-02T06:30:00.000Z');
  });

  it('refuses a time still to come, a time without the time of day, a range and an unknown team zone', () => {
    const context = { now: Date.parse('2026-11-10T15:00:00Z'), timeZone: 'America/Chicago' };
    const error = (text: string, ctx = context) => {
      const result = resolvePastTime(text, ctx);
      return result.ok ? 'parsed' : result.error;
    };
    expect(error('at 11pm')).toMatch(/still to come/);
    expect(error('yesterday')).toMatch(/time of day/);
    expect(error('from 7 to 9am')).toMatch(/range|could not read/);
    expect(error('at 7:30', { ...context, timeZone: 'Mars/Olympus' })).toMatch(/set time zone/);
    expect(error('at 7:31')).toBe('parsed');
    expect(error(`at ${'at '.repeat(40)}7:30`)).toMatch(/too long for a time/);
  });
});
