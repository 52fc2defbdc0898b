import { describe, expect, it } from 'vitest';
import { useBotSession } from '../test/support/bot-session.js';

const TEAM = 'console:kestrel';
const session = useBotSession({ team: TEAM, start: '2026-11-09T16:00:00Z' });
const { say } = session;

describe('guided setup: the tank code', () => {
  // "tanks", "summary" and "overview" are words the bot answers itself; as a tank code they would be shadowed.
  it.each(['tanks', 'summary', 'overview'])(
    'refuses the bot word "%s" at the code step and asks again',
    async (word) => {
      await say('add tank');
      const [reply] = await say(word);
      expect(reply?.kind).toBe('question');
      expect(reply?.headline).toMatch(/one of the bot's own words/);
      expect(reply?.headline).toMatch(/short code/);
      // Still at the code step: a good code moves on to the shape.
      const [next] = await say('W2');
      expect(next?.headline).toMatch(/Which shape/);
      expect(session.store.tanks.list(TEAM)).toEqual([]);
    },
  );
});
