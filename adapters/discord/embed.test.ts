import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Reply } from '../../bot/replies/reply.js';
import { ACTION_PREFIX, actionCommand, actionRows, KIND_COLORS, LIMITS, replyEmbed } from './embed.js';

const answer: Reply = {
  kind: 'answer',
  visibility: 'channel',
  headline: 'T4: 412 gal, about 9 days left',
  facts: [
    { label: 'Volume', value: '412 gal (48%)' },
    { label: 'Use rate', value: '12.4 gal/day (10.9-13.8)' },
  ],
  table: { columns: ['Tank', 'Runway'], rows: [['T4', '9 days']] },
  caution: 'Fuel is flammable. Follow local codes.',
  actions: [
    { label: 'Undo', command: 'undo', style: 'danger' },
    { label: 'Ask', command: 'T4?' },
  ],
};

const size = (e: ReturnType<typeof replyEmbed>) =>
  (e.title?.length ?? 0) +
  (e.description?.length ?? 0) +
  (e.fields ?? []).reduce((n, f) => n + f.name.length + f.value.length, 0);

describe('replyEmbed', () => {
  it('maps headline, facts, table, caution and chart', () => {
    const e = replyEmbed(answer, 'level-chart-1.png');
    expect(e.title).toBe('T4: 412 gal, about 9 days left');
    expect(e.color).toBe(KIND_COLORS.answer);
    expect(e.fields?.map((f) => f.name)).toEqual(['Volume', 'Use rate', 'Caution']);
    expect(e.description).toBe('```\nTank  Runway\n----  ------\nT4    9 days\n```');
    expect(e.image).toEqual({ url: 'attachment://level-chart-1.png' });
  });

  it('stays within Discord embed limits for a huge reply', () => {
    const huge: Reply = {
      kind: 'digest',
      visibility: 'channel',
      headline: 'x'.repeat(400),
      facts: Array.from({ length: 40 }, (_, i) => ({ label: `L${i}`.repeat(100), value: 'v'.repeat(2000) })),
      table: {
        columns: ['Tank', 'Runway'],
        rows: Array.from({ length: 500 }, (_, i) => [`T${i}`, `${i} days`]),
      },
    };
    const e = replyEmbed(huge);
    expect(e.title?.length).toBeLessThanOrEqual(LIMITS.title);
    expect(e.fields?.length).toBeLessThanOrEqual(LIMITS.fields);
    for (const f of e.fields ?? []) {
      expect(f.name.length).toBeLessThanOrEqual(LIMITS.fieldName);
      expect(f.value.length).toBeLessThanOrEqual(LIMITS.fieldValue);
    }
    expect(e.description?.length ?? 0).toBeLessThanOrEqual(LIMITS.description);
    expect(size(e)).toBeLessThanOrEqual(LIMITS.total);
  });

  it('shows as many table rows as fit and says how many are left out', () => {
    const long: Reply = {
      kind: 'answer',
      visibility: 'channel',
      headline: 'All tanks',
      table: {
        columns: ['Tank', 'Runway'],
        rows: Array.from({ length: 600 }, (_, i) => [`T${i}`, `${i} days`]),
      },
    };
    const e = replyEmbed(long);
    expect(e.description).toMatch(/…and \d+ more$/);
    expect(e.description?.length).toBeLessThanOrEqual(LIMITS.description);
  });
});

describe('wide tables', () => {
  it('become one line per row, first cell bold, markdown in cells escaped', () => {
    const wide: Reply = {
      kind: 'answer',
      visibility: 'channel',
      headline: 'All tanks',
      table: {
        columns: ['Tank', 'Site', 'Level', 'Runway', 'Action'],
        rows: [
          ['T4', 'Ridge Pump Station', '85%', '27 hours (0-103)', 'order today'],
          ['NY_1', 'North Yard', '40%', '9 days (7-12)', '*check*'],
        ],
      },
    };
    expect(replyEmbed(wide).description).toBe(
      [
        '**T4** · Ridge Pump Station · 85% · 27 hours (0-103) · order today',
        '**NY\\_1** · North Yard · 40% · 9 days (7-12) · \\*check\\*',
      ].join('\n'),
    );
  });
});

describe('action buttons', () => {
  it('become buttons whose custom id carries the command', () => {
    const [row] = actionRows(answer);
    expect(row?.components.map((b) => ('custom_id' in b ? b.custom_id : ''))).toEqual([
      `${ACTION_PREFIX}undo`,
      `${ACTION_PREFIX}T4?`,
    ]);
    expect(actionCommand(`${ACTION_PREFIX}T4?`)).toBe('T4?');
    expect(actionCommand('someone-else')).toBeUndefined();
  });

  it('puts five to a row and leaves out a command too long for a custom id', () => {
    const many: Reply = {
      ...answer,
      actions: [
        ...Array.from({ length: 7 }, (_, i) => ({ label: `a${i}`, command: `T${i}?` })),
        { label: 'long', command: 'x'.repeat(120) },
      ],
    };
    expect(actionRows(many).map((r) => r.components.length)).toEqual([5, 2]);
  });
});

describe('any reply (property)', () => {
  const text = fc.string({ maxLength: 3000, unit: 'binary' });
  const reply = fc.record({
    kind: fc.constantFrom('confirmation', 'answer', 'question', 'error', 'help', 'digest', 'notice' as const),
    visibility: fc.constantFrom('channel', 'sender' as const),
    headline: text,
    facts: fc.array(fc.record({ label: fc.string({ maxLength: 300 }), value: text }), { maxLength: 30 }),
    table: fc.record({
      columns: fc.array(fc.string({ maxLength: 40 }), { maxLength: 6 }),
      rows: fc.array(fc.array(fc.string({ maxLength: 80 }), { maxLength: 6 }), { maxLength: 80 }),
    }),
    caution: fc.option(text, { nil: undefined }),
    actions: fc.array(fc.record({ label: fc.string(), command: fc.string({ maxLength: 120 }) }), {
      maxLength: 30,
    }),
  });

  it('becomes an embed within every Discord limit, never throwing', () => {
    fc.assert(
      fc.property(reply, (r) => {
        const e = replyEmbed(r as Reply);
        expect(e.title?.length ?? 0).toBeLessThanOrEqual(LIMITS.title);
        expect(e.description?.length ?? 0).toBeLessThanOrEqual(LIMITS.description);
        expect(e.fields?.length ?? 0).toBeLessThanOrEqual(LIMITS.fields);
        for (const f of e.fields ?? []) expect(f.value.length).toBeLessThanOrEqual(LIMITS.fieldValue);
        expect(size(e)).toBeLessThanOrEqual(LIMITS.total);
        if (r.caution) expect(e.fields?.some((f) => f.name === 'Caution')).toBe(true);
        const rows = actionRows(r as Reply);
        expect(rows.length).toBeLessThanOrEqual(5);
        for (const row of rows)
          for (const b of row.components) expect('custom_id' in b && b.custom_id.length <= 100).toBe(true);
      }),
      { numRuns: 150 },
    );
  });
});
