import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Reply } from '../../bot/replies/reply.js';
import { commandActionPrefix, escapeMrkdwn, limits, replyBlocks, toSlackMessage } from './blocks.js';

// Demo scenario (invented): Kestrel Valley Water Co-op.
const answer: Reply = {
  kind: 'answer',
  visibility: 'channel',
  headline: 'Hypo tank at Mill Creek Lift Station lasts 9 days (7-12)',
  facts: [
    { label: 'Volume', value: '310 gal (62%)' },
    { label: 'Rate', value: '12.4 gal/day (10.9-13.8)' },
  ],
  table: {
    columns: ['Tank', 'Runway'],
    rows: [
      ['T4', '9 days'],
      ['T7 <waste>', '3 days'],
    ],
  },
  actions: [{ label: 'Log a delivery', command: 'delivered 150 gal to T4', style: 'primary' }],
  caution: 'Sodium hypochlorite: wear eye protection; follow local codes & your site procedures.',
};

describe('toSlackMessage', () => {
  it('lays a reply out as header, fields, table, caution and buttons with a plain-text fallback', () => {
    const m = toSlackMessage(answer);
    expect(m.blocks.map((b) => b.type)).toEqual(['header', 'section', 'section', 'context', 'actions']);
    expect(m.text.startsWith('Hypo tank at Mill Creek Lift Station lasts 9 days (7-12)')).toBe(true);
    const json = JSON.stringify(m.blocks);
    expect(json).toContain('*Rate*\\n12.4 gal/day (10.9-13.8)');
    expect(json).toContain('T7 &lt;waste&gt;'); // mrkdwn control characters escaped
    expect(json).toContain('local codes &amp; your site');
    const actions = m.blocks.at(-1);
    expect(actions?.type === 'actions' && actions.elements[0]).toMatchObject({
      action_id: `${commandActionPrefix}0:0`,
      value: 'delivered 150 gal to T4',
      style: 'primary',
    });
  });

  it('turns a long headline into a bold section and a huge table into whole rows plus a count', () => {
    const rows = Array.from({ length: 400 }, (_, i) => [`T${i}`, `${i} days`]);
    const reply: Reply = {
      kind: 'digest',
      visibility: 'channel',
      headline: 'x'.repeat(200),
      table: { columns: ['Tank', 'Runway'], rows },
    };
    const [head, table] = replyBlocks(reply);
    expect(head?.type).toBe('section');
    const text = table?.type === 'section' ? (table.text?.text ?? '') : '';
    expect(text.length).toBeLessThanOrEqual(limits.sectionText);
    expect(text).toMatch(/_and \d+ more rows_$/);
  });

  it('escapes exactly the three mrkdwn control characters', () => {
    expect(escapeMrkdwn('a<b>&c')).toBe('a&lt;b&gt;&amp;c');
  });

  // Law: whatever the reply holds, the message stays inside Slack's limits.
  it('always fits Slack limits', () => {
    const text = fc.string({ maxLength: 300 });
    const reply = fc.record({
      kind: fc.constantFrom('answer', 'error', 'digest'),
      visibility: fc.constantFrom('channel', 'sender'),
      headline: fc.string({ maxLength: 400 }),
      facts: fc.array(fc.record({ label: text, value: text }), { maxLength: 700 }),
      table: fc.record({
        columns: fc.array(text, { maxLength: 4 }),
        rows: fc.array(fc.array(text, { maxLength: 4 }), { maxLength: 60 }),
      }),
      actions: fc.array(fc.record({ label: text, command: fc.string({ maxLength: 3000 }) }), {
        maxLength: 40,
      }),
      caution: fc.option(fc.string({ maxLength: 4000 }), { nil: undefined }),
    }) as fc.Arbitrary<Reply>;
    fc.assert(
      fc.property(reply, (r) => {
        const m = toSlackMessage(r);
        if (m.text.length > 4000 || m.blocks.length > limits.blocksPerMessage || m.blocks.length < 1)
          return false;
        for (const b of m.blocks) {
          if (b.type === 'header' && [...b.text.text].length > limits.headerText) return false;
          if (b.type === 'section' && (b.text?.text.length ?? 0) > limits.sectionText) return false;
          if (b.type === 'section' && (b.fields?.length ?? 0) > limits.fieldsPerSection) return false;
          if (b.type === 'actions' && b.elements.length > limits.buttonsPerBlock) return false;
          if (b.type === 'actions') {
            for (const e of b.elements) {
              if (
                e.type !== 'button' ||
                [...e.text.text].length > limits.buttonText ||
                (e.value?.length ?? 0) > limits.buttonValue
              )
                return false;
            }
          }
        }
        return true;
      }),
      { numRuns: 150 },
    );
  });
});
