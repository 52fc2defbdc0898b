import { describe, expect, it } from 'vitest';
import { helpReply } from '../commands/help.js';
import { parseMessage } from './parse.js';
import { HELP_TOPICS } from './parseHelp.js';

/**
 * Every example the bot's help shows is a message this parser accepts (the help lives with the command
 * handlers; this keeps the two in step). The units and times topics list fragments, not messages.
 */
describe('the examples in help', () => {
  const messageTopics = HELP_TOPICS.filter((t) => t !== 'units' && t !== 'times');
  const examples = messageTopics.flatMap((topic) =>
    (helpReply(topic).table?.rows ?? []).map((row) => row[1] ?? ''),
  );

  it('has examples to check', () => {
    expect(examples.length).toBeGreaterThan(15);
  });

  it.each(examples)('%s parses', (example) => {
    const adding = /^add tank/i.test(example);
    const result = parseMessage(example, {
      now: Date.parse('2026-11-10T21:00:00Z'),
      timeZone: 'America/Chicago',
      tankNames: adding ? [] : ['T4', 'T9'],
    });
    expect(result.ok ? 'ok' : result.error).toBe('ok');
  });
});
