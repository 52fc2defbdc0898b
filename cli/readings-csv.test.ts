import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { ReadingColumns } from '../engine/rate/index.js';
import { ok } from '../engine/result.js';
import { parseInstant, parseReadingsCsv } from './readings-csv.js';

const asLitres = (_c: string, v: number) => ok(v);
const same = (v: number) => v;
/** The parsed columns as one { time, volume } per reading, to compare with expected rows. */
const readingRows = (c: ReadingColumns) => Array.from(c.time, (time, i) => ({ time, volume: c.volume[i] }));

describe('parseReadingsCsv', () => {
  it('sorts rows, keeps one reading per instant, and reports conflicting duplicates', () => {
    const text = [
      'Time,Volume,Delivered',
      '2026-01-03T00:00:00Z,80,',
      '2026-01-01T00:00:00Z,100,',
      '2026-01-01T00:00:00Z,100,',
      '2026-01-01T00:00:00Z,95,',
      '2026-01-02T06:00:00Z,,40',
      '',
    ].join('\r\n');
    const table = parseReadingsCsv(text, asLitres, same);
    expect(table.ok).toBe(true);
    if (!table.ok) return;
    expect(Array.from(table.value.readings.volume)).toEqual([100, 80]);
    expect(table.value.deliveries).toEqual([{ time: Date.UTC(2026, 0, 2, 6), volume: 40 }]);
    expect(table.value.problems).toEqual([
      { line: 5, reason: expect.stringMatching(/second reading.*line 3/) },
    ]);
  });

  it('reports each bad row with its line and reason', () => {
    const text = [
      'time,volume,delivered',
      '2026-01-01T00:00:00,10,',
      '2026-01-01T00:00:00Z,,',
      '2026-01-01T00:00:00Z,1e999,',
      '2026-01-01T00:00:00Z,,-4',
      '2026-13-01T00:00:00Z,5,',
    ].join('\n');
    const table = parseReadingsCsv(text, asLitres, same);
    if (!table.ok) throw new Error(table.error);
    expect(table.value.problems.map((p) => p.line)).toEqual([2, 3, 4, 5, 6]);
    expect(readingRows(table.value.readings)).toEqual([]);
  });

  it('refuses a header with no reading column', () => {
    expect(parseReadingsCsv('time,temp\n', asLitres, same).ok).toBe(false);
    expect(parseReadingsCsv('when,volume\n', asLitres, same).ok).toBe(false);
  });

  it('reads offsets, Z and fractions of a second (ISO 8601)', () => {
    expect(parseInstant('2026-01-01T01:00:00+01:00')).toBe(Date.UTC(2026, 0, 1));
    expect(parseInstant('2026-01-01T00:00:00.5Z')).toBe(Date.UTC(2026, 0, 1) + 500);
    expect(parseInstant('2026-01-01T00:00-0130')).toBe(Date.UTC(2026, 0, 1, 1, 30));
    expect(parseInstant('yesterday')).toBeNull();
  });
});

describe('parseReadingsCsv on any row order', () => {
  // The in-order fast path and the map must agree: a shuffled file gives the sorted readings, one per
  // instant (the first row's value wins), and a duplicate with another value is reported at its own line.
  it('gives the same readings and problems as the rows sorted by time', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ hour: fc.nat(30), value: fc.nat(5) }), { maxLength: 40 }), (rows) => {
        const iso = (h: number) => new Date(Date.UTC(2026, 0, 1, h)).toISOString();
        const text = ['time,volume', ...rows.map((r) => `${iso(r.hour)},${r.value}`)].join('\n');
        const table = parseReadingsCsv(text, asLitres, same);
        if (!table.ok) throw new Error(table.error);
        const first = new Map<number, { value: number; line: number }>();
        const problems: number[] = [];
        rows.forEach((r, i) => {
          const seen = first.get(r.hour);
          if (!seen) first.set(r.hour, { value: r.value, line: i + 2 });
          else if (seen.value !== r.value) problems.push(i + 2);
        });
        const expected = [...first.entries()]
          .sort((a, b) => a[0] - b[0])
          .map(([h, r]) => ({ time: Date.UTC(2026, 0, 1, h), volume: r.value }));
        expect(readingRows(table.value.readings)).toEqual(expected);
        expect(table.value.problems.map((p) => p.line)).toEqual(problems);
      }),
    );
  });
});
