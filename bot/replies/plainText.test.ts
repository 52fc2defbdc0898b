import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { repliesToPlainText, tableToText, toPlainText } from './plainText.js';
import type { Reply } from './reply.js';

const answer: Reply = {
  kind: 'answer',
  visibility: 'channel',
  headline: 'T4 (Ridge Pump Station): 412 gal, about 9 days left',
  facts: [
    { label: 'Volume', value: '412 gal (48%)' },
    { label: 'Use rate', value: '12.4 gal/day (10.9-13.8)' },
    { label: 'Runway', value: '9 days (7-12), to the threshold in 9 days, Thu 10 Dec' },
  ],
  caution: 'Fuel is flammable. Follow local codes and your licensed supplier or safety officer.',
  actions: [{ label: 'Undo', command: 'undo' }],
};

describe('toPlainText', () => {
  it('puts the headline first, aligns facts, then caution and next steps, with no markup', () => {
    expect(toPlainText(answer)).toBe(
      [
        'T4 (Ridge Pump Station): 412 gal, about 9 days left',
        '',
        'Volume:    412 gal (48%)',
        'Use rate:  12.4 gal/day (10.9-13.8)',
        'Runway:    9 days (7-12), to the threshold in 9 days, Thu 10 Dec',
        '',
        'Caution: Fuel is flammable. Follow local codes and your licensed supplier or safety officer.',
        '',
        'Next: "undo"',
      ].join('\n'),
    );
    expect(toPlainText(answer)).not.toMatch(/[*_`<>]/);
  });

  it('prints a headline-only reply as one line', () => {
    expect(toPlainText({ kind: 'error', visibility: 'sender', headline: 'No tank called T5.' })).toBe(
      'No tank called T5.',
    );
  });

  it('folds newlines inside facts so the columns stay aligned', () => {
    const text = toPlainText({
      kind: 'answer',
      visibility: 'channel',
      headline: 'x',
      facts: [{ label: 'Note', value: 'two\nlines' }],
    });
    expect(text).toBe('x\n\nNote:  two lines');
  });

  it('joins several replies with a blank line', () => {
    const a: Reply = { kind: 'notice', visibility: 'channel', headline: 'a' };
    expect(repliesToPlainText([a, a])).toBe('a\n\na');
  });
});

describe('tableToText', () => {
  it('left-aligns words and right-aligns numbers under a rule', () => {
    const lines = tableToText({
      columns: ['Tank', 'Volume', 'Runway'],
      rows: [
        ['T4', '412 gal', '9 days'],
        ['North Yard diesel', '1,250 gal', 'over a year'],
        ['T9', '88 L', '2 days'],
      ],
    });
    expect(lines).toEqual([
      'Tank                  Volume  Runway',
      '-----------------  ---------  -----------',
      'T4                   412 gal  9 days',
      'North Yard diesel  1,250 gal  over a year',
      'T9                      88 L  2 days',
    ]);
  });

  it('copes with ragged rows, leaves out blank rows, and an empty table', () => {
    expect(tableToText({ columns: ['A'], rows: [['1', 'extra'], [], [' ', '']] })).toEqual([
      'A',
      '-  -----',
      '1  extra',
    ]);
    expect(tableToText({ columns: [], rows: [] })).toEqual(['', '']);
  });
});

describe('toPlainText on any reply (property)', () => {
  it('never throws, starts with the headline and keeps every table row on one line', () => {
    const cell = fc.string({ maxLength: 30, unit: 'binary' });
    fc.assert(
      fc.property(
        fc.string({ minLength: 1, maxLength: 80 }).filter((h) => h.trim() !== '' && !h.includes('\n')),
        fc.array(fc.array(cell, { maxLength: 5 }), { maxLength: 20 }),
        fc.array(fc.record({ label: cell, value: cell }), { maxLength: 8 }),
        (headline, rows, facts) => {
          const text = toPlainText({
            kind: 'answer',
            visibility: 'channel',
            headline,
            facts,
            table: { columns: ['Tank', 'Runway'], rows },
          });
          expect(text.startsWith(headline.trimEnd())).toBe(true);
          const tableLines = text.split('\n\n').at(-1)?.split('\n') ?? [];
          expect(tableLines.length).toBe(rows.filter((r) => r.some((c) => c.trim() !== '')).length + 2);
        },
      ),
      { numRuns: 150 },
    );
  });
});
