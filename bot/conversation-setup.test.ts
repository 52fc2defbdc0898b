import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { type Bot, createBot } from './bot.js';
import type { Reply } from './replies/reply.js';
import { openStore, type Store } from './store/index.js';

const TEAM = 'console:kestrel';
let dir: string;
let store: Store;
let bot: Bot;
let clock: number;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tr-setup-'));
  store = openStore(join(dir, 'bot.sqlite'));
  bot = createBot({ store });
  clock = Date.parse('2026-11-09T16:00:00Z');
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

function say(text: string): Promise<Reply[]> {
  clock += 1000;
  return bot.handle({ team: TEAM, channel: 'c1', user: 'ann', text, receivedAt: clock });
}

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
      expect(store.tanks.list(TEAM)).toEqual([]);
    },
  );
});
