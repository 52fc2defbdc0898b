// The fast paths against the built-in Date (the Date Time String Format of ECMA-262,
// as V8 implements Date.parse and Date.prototype.toISOString): same answers on random instants and strings.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createInstantFormatter, parseInstant, parseInstantSlow } from './iso-instant.js';

const reference = (ms: number) => {
  const text = new Date(ms).toISOString();
  return text.endsWith('.000Z') ? `${text.slice(0, -5)}Z` : text;
};

const pad = (n: number, width: number) => String(n).padStart(width, '0');

/** ISO-like strings, valid and not: every field may be out of range, shapes vary. */
const isoLike = fc
  .record({
    year: fc.integer({ min: 0, max: 9999 }),
    month: fc.integer({ min: 0, max: 13 }),
    day: fc.integer({ min: 0, max: 32 }),
    hour: fc.integer({ min: 0, max: 25 }),
    minute: fc.integer({ min: 0, max: 61 }),
    second: fc.option(fc.integer({ min: 0, max: 61 }), { nil: undefined }),
    fraction: fc.option(fc.stringMatching(/^\d{1,5}$/), { nil: undefined }),
    sep: fc.constantFrom('T', 't', ' '),
    zone: fc.oneof(
      fc.constantFrom('Z', 'z', ''),
      fc
        .record({
          sign: fc.constantFrom('+', '-'),
          h: fc.integer({ min: 0, max: 25 }),
          m: fc.integer({ min: 0, max: 61 }),
          colon: fc.constantFrom(':', '', null),
        })
        .map(({ sign, h, m, colon }) => `${sign}${pad(h, 2)}${colon === null ? '' : `${colon}${pad(m, 2)}`}`),
    ),
  })
  .map(
    (f) =>
      `${pad(f.year, 4)}-${pad(f.month, 2)}-${pad(f.day, 2)}${f.sep}${pad(f.hour, 2)}:${pad(f.minute, 2)}` +
      `${f.second === undefined ? '' : `:${pad(f.second, 2)}${f.fraction === undefined ? '' : `.${f.fraction}`}`}${f.zone}`,
  );

describe('parseInstant', () => {
  it('agrees with the Date.parse reference on ISO-like strings, valid or not', () => {
    fc.assert(
      fc.property(isoLike, (text) => {
        expect(parseInstant(text)).toBe(parseInstantSlow(text));
      }),
      { numRuns: 3000 },
    );
  });

  it('agrees with the reference on any string, and on the text of any instant', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 30 }), (text) => {
        expect(parseInstant(text)).toBe(parseInstantSlow(text));
      }),
    );
    fc.assert(
      fc.property(fc.integer({ min: -30e12, max: 250e12 }), (ms) => {
        const text = new Date(ms).toISOString();
        expect(parseInstant(text)).toBe(ms);
        expect(parseInstant(text)).toBe(parseInstantSlow(text));
      }),
      { numRuns: 2000 },
    );
  });

  it('reads offsets and fractions (worked examples)', () => {
    expect(parseInstant('2026-01-01T01:00:00+01:00')).toBe(Date.UTC(2026, 0, 1));
    expect(parseInstant('2026-03-08T23:30:00-05:30')).toBe(Date.UTC(2026, 2, 9, 5, 0));
    expect(parseInstant('2026-01-01T00:00:00.250Z')).toBe(Date.UTC(2026, 0, 1) + 250);
    expect(parseInstant('2026-02-30T00:00:00Z')).toBe(parseInstantSlow('2026-02-30T00:00:00Z'));
    expect(parseInstant('2026-01-01T00:00:60Z')).toBeNull();
  });
});

describe('createInstantFormatter', () => {
  it('formats like toISOString without ".000", across days and in any order', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.oneof(
            fc.integer({ min: -62_000_000_000_000, max: 253_402_300_799_999 }),
            fc.integer({ min: 1_767_225_600_000, max: 1_767_225_600_000 + 3 * 86_400_000 }),
            fc.double({ min: -1e13, max: 1e13, noNaN: true }),
          ),
          { maxLength: 40 },
        ),
        (instants) => {
          const format = createInstantFormatter();
          for (const ms of instants) expect(format(ms)).toBe(reference(ms));
        },
      ),
      { numRuns: 500 },
    );
  });

  it('formats extended years and refuses a non-instant as toISOString does', () => {
    const format = createInstantFormatter();
    expect(format(Date.UTC(10_000, 0, 1))).toBe(reference(Date.UTC(10_000, 0, 1)));
    expect(format(-62_198_755_200_000 - 86_400_000)).toBe(reference(-62_198_755_200_000 - 86_400_000));
    expect(() => format(Number.NaN)).toThrow(RangeError);
  });
});
