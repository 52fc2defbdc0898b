import { describe, expect, it } from 'vitest';
import { formatClock, readClockTime, readHourOfDay, readWeekdays } from './clockWords.js';

describe('clock words', () => {
  it.each([
    ['7', 7, 0],
    ['7am', 7, 0],
    ['07:00', 7, 0],
    ['4:30 pm', 16, 30],
    ['7.30', 7, 30],
    ['12am', 0, 0],
    ['12pm', 12, 0],
    ['noon', 12, 0],
    ['midnight', 0, 0],
    ['23:59', 23, 59],
  ])('%s is %i:%i', (text, hour, minute) => {
    expect(readClockTime(text)).toEqual({ ok: true, value: { hour, minute } });
  });

  it.each(['24:00', '13pm', '7:60', 'seven', '', '0am'])('%s is not a time of day', (text) => {
    const result = readClockTime(text);
    expect(result.ok).toBe(false);
  });

  it('formats on the 24-hour clock and takes only whole hours as an hour', () => {
    expect(formatClock({ hour: 7, minute: 5 })).toBe('07:05');
    expect(readHourOfDay('2pm')).toEqual({ ok: true, value: 14 });
    expect(readHourOfDay('14:30').ok).toBe(false);
  });

  it.each([
    ['tue,thu', [2, 4]],
    ['Tuesday and Thursday', [2, 4]],
    ['mon-fri', [1, 2, 3, 4, 5]],
    ['fri-mon', [1, 5, 6, 7]],
    ['weekdays', [1, 2, 3, 4, 5]],
    ['daily', [1, 2, 3, 4, 5, 6, 7]],
    ['sun/sat', [6, 7]],
  ])('%s are ISO weekdays %j', (text, days) => {
    expect(readWeekdays(text)).toEqual({ ok: true, value: days });
  });

  it('refuses a word that is not a day', () => {
    const result = readWeekdays('tue,someday');
    expect(result.ok ? '' : result.error).toMatch(/"someday" is not a day/);
  });
});
