import { describe, expect, it } from 'vitest';
import { toPlainText } from '../replies/plainText.js';
import { helpReply } from './help.js';

describe('help reply order', () => {
  it('reads headline, then the table of examples, then the pointer to more topics', () => {
    const text = toPlainText(helpReply());
    const headline = text.indexOf('tank-runway logs tank readings');
    const table = text.indexOf('T4 60in');
    const more = text.indexOf('help units');
    expect(headline).toBe(0);
    expect(table).toBeGreaterThan(headline);
    expect(more).toBeGreaterThan(table);
    // "Examples:" announces the table: nothing else may stand between them.
    const firstLines = text.split('\n').slice(0, 4).join('\n');
    expect(firstLines).toMatch(/Examples:\n\n\s+message/);
  });

  it('offers each further topic as a one-tap follow-up in the bot language', () => {
    const reply = helpReply();
    expect(reply.actions?.map((a) => a.command)).toEqual([
      'help units',
      'help times',
      'help settings',
      'help corrections',
    ]);
  });

  it('a topic page has no pointer to itself', () => {
    expect(helpReply('units').actions ?? []).toEqual([]);
  });
});
