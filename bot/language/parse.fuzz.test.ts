import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { AwaitingStep, ParseContext } from './command.js';
import { commandSchema } from './command.js';
import { exampleContext, SAYS_WHAT_TO_FIX } from './exampleContext.js';
import { INTERNAL_PARSE_ERROR, parseMessage } from './parse.js';

/** Every answer is a valid command or an error a person can act on; nothing throws, nothing trips the guard. */
function checkAnswer(text: string, context: ParseContext): void {
  const result = parseMessage(text, context);
  if (result.ok) {
    expect(commandSchema.safeParse(result.value).success).toBe(true);
    return;
  }
  expect(result.error).not.toBe(INTERNAL_PARSE_ERROR);
  expect(result.error.trim().length).toBeGreaterThan(10);
  expect(result.error).toMatch(SAYS_WHAT_TO_FIX);
}

const awaiting = fc.constantFrom<AwaitingStep | undefined>(
  undefined,
  'strapping-rows',
  'setup-answer',
  'confirm-suspect',
);
const context = fc.record({
  awaiting,
  timeZone: fc.constantFrom('America/Chicago', 'Europe/Berlin', 'Asia/Kolkata', 'UTC', 'Not/AZone'),
  now: fc.integer({ min: Date.parse('2000-01-01T00:00:00Z'), max: Date.parse('2040-01-01T00:00:00Z') }),
});
const withContext = (c: {
  awaiting: AwaitingStep | undefined;
  timeZone: string;
  now: number;
}): ParseContext => ({
  ...exampleContext,
  ...c,
});

/** Pieces of the language, so the fuzz reaches deep into each parser instead of stopping at the first word. */
const piece = fc.oneof(
  fc.constantFrom(
    'T4',
    't4',
    'T5',
    'North Yard 2',
    'GEN-1',
    '?',
    '+',
    'add tank',
    'set',
    'delivered',
    'to',
    'ticket',
    'level after',
    'ullage',
    'at',
    'yesterday',
    'how long does',
    'last',
    'which tanks run low',
    'this week',
    'delete the',
    'reading',
    'that was',
    'undo',
    'help',
    'digest',
    'threshold',
    'lead time',
    'business days',
    'cutoff',
    'delivery days',
    'time zone',
    'heads=',
    'diameter=',
    'length=',
    'unit=',
    'strapping',
    'vertical-cylinder',
    'done',
    'yes',
    'no',
    '"',
    "'",
    ',',
    ';',
    '=',
    ':',
    '%',
    'in',
    'gal',
    'L',
    'cm',
    'ft',
    'm3',
    'bbl',
    'pm',
    'am',
    '\n',
    '7:30',
    '2026-11-02',
    'UTC',
    '+01:00',
    '-',
    '.',
    'e9',
    '1e400',
    'NaN',
    'Infinity',
    '0x1F',
    '\u0000',
    '\u202E',
    '🛢️',
  ),
  fc.double({ noNaN: false }).map(String),
  fc.integer({ min: -100, max: 100_000 }).map(String),
  fc.string({ maxLength: 6 }),
);
const sentence = fc.array(piece, { maxLength: 12 }).map((parts) => parts.join(' '));

describe('fuzzing the language', () => {
  it('answers any string with a command or an error that says what to fix', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200, unit: 'grapheme' }), context, (text, c) =>
        checkAnswer(text, withContext(c)),
      ),
      { numRuns: 400 },
    );
  });

  it('answers messages built from the language`s own words the same way', () => {
    fc.assert(
      fc.property(sentence, context, (text, c) => checkAnswer(text, withContext(c))),
      { numRuns: 1500 },
    );
  });

  it('answers very long and odd messages without trouble', () => {
    for (const text of [
      'x'.repeat(20_001),
      `T4 ${'9'.repeat(5000)}in`,
      `add tank T5 strapping unit=L\n${'1,2\n'.repeat(3000)}`,
      '\u0000',
      '\n\n\n',
    ]) {
      checkAnswer(text, exampleContext);
    }
  });

  // A law: a level typed as a number and a unit comes back as that number and unit, at any time of day given.
  it('keeps the value and unit of a reading exactly as typed', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e6, noNaN: true, noDefaultInfinity: true }),
        fc.constantFrom('in', 'cm', 'mm', 'm', 'ft', 'gal', 'L', 'bbl', '%'),
        fc.integer({ min: 0, max: 23 }),
        fc.integer({ min: 0, max: 59 }),
        (value, unit, hour, minute) => {
          const number = String(Number(value.toFixed(3)));
          if (unit === '%' && Number(number) > 100) return;
          const time = `at 2026-11-02 ${String(hour).padStart(2, '0')}:${String(minute).padStart(2, '0')}`;
          const result = parseMessage(`T4 ${number}${unit} ${time}`, exampleContext);
          expect(result.ok).toBe(true);
          if (!result.ok || result.value.type !== 'reading') return;
          const m = result.value.measurement;
          const got =
            m.kind === 'percent' ? m.percent : m.kind === 'volume' ? m.volume.value : m.length.value;
          expect(got).toBe(Number(number));
          // 2026-11-02 is on CST (UTC-6) in America/Chicago.
          expect(result.value.time?.at).toBe(Date.UTC(2026, 10, 2, hour + 6, minute));
        },
      ),
      { numRuns: 300 },
    );
  });

  // A law: a near-miss of a known tank name is caught and the right name suggested.
  it('suggests the tank a one-letter typo was meant for', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('GEN-1', 'North Yard 2'),
        fc.nat(),
        fc.constantFrom('x', 'q', 'z'),
        (name, at, letter) => {
          const i = at % name.length;
          if (name[i] === ' ') return;
          const typo = name.slice(0, i) + letter + name.slice(i + 1);
          const result = parseMessage(`${typo}?`, {
            ...exampleContext,
            tankNames: ['GEN-1', 'North Yard 2'],
          });
          expect(result.ok).toBe(false);
          if (!result.ok) expect(result.error).toContain(`Did you mean ${name}?`);
        },
      ),
      { numRuns: 100 },
    );
  });

  // A law: spacing and the case of the tank name do not change what a message means (only its raw text).
  it('reads the same command through extra spaces and any case of the tank name', () => {
    const forms = fc.constantFrom(
      'T4 60in at 2026-11-02 07:30',
      'delivered 150 gal to T4 ticket 8812',
      'T4 ullage 14in yesterday 4pm',
      'set T4 threshold 20%',
      'how long does T4 last?',
      'delete the 7:30 reading of T4',
    );
    const stripRaw = (value: unknown): unknown =>
      JSON.parse(JSON.stringify(value, (k, v) => (k === 'raw' ? undefined : v)));
    fc.assert(
      fc.property(
        forms,
        fc.array(fc.integer({ min: 1, max: 4 }), { minLength: 12, maxLength: 12 }),
        fc.boolean(),
        (text, gaps, lower) => {
          const words = text.split(' ');
          const spaced = words
            .map((w, i) => (lower && w.startsWith('T4') ? w.toLowerCase() : w) + ' '.repeat(gaps[i] ?? 1))
            .join('');
          const a = parseMessage(text, exampleContext);
          const b = parseMessage(`  ${spaced}`, exampleContext);
          expect(a.ok && b.ok).toBe(true);
          if (a.ok && b.ok) expect(stripRaw(b.value)).toEqual(stripRaw(a.value));
        },
      ),
      { numRuns: 200 },
    );
  });
});
