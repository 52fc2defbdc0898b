// One end-to-end session: the real adapter and the real bot on a temporary SQLite store, with helpers that
// send what Slack sends. Names are from our invented demo scenario (Kestrel Valley Water Co-op).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';
import { createBot } from '../../bot/bot.js';
import { runwayBoard } from '../../bot/runway-board.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { type SlackHarness, startSlackHarness } from './harness.js';
import type { ResponsePost } from './web-api-standin.js';

export const addHypo =
  'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal product="sodium hypochlorite" site="Mill Creek Lift Station"';

export const mention = (team: string, channel: string, ts: string, text: string) => ({
  type: 'app_mention',
  user: 'U0ANA',
  team,
  channel,
  ts,
  event_ts: ts,
  text: `<@U0BOT> ${text}`,
});

export interface SlackE2e {
  h: SlackHarness;
  store: Store;
  /** Sends a slash command and waits for its reply on the response_url. */
  say(team: string, text: string, channel?: string): Promise<ResponsePost>;
  /** Every live reading of a team (held ones too). */
  readingsOf(team: string): ReturnType<Store['readings']['forTank']>;
  close(): Promise<void>;
}

export async function openSlackE2e(prefix: string): Promise<SlackE2e> {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  const store = openStore(join(dir, 'slack.sqlite'));
  const h = await startSlackHarness({
    bot: createBot({ store }),
    home: (team, now) => [runwayBoard(store, team, now)],
  });
  h.api.users.set('U0ANA', { tz: 'America/Chicago' });
  let seq = 0;
  return {
    h,
    store,
    async say(team, text, channel = 'C0MILL') {
      seq += 1;
      const id = `say-${seq}`;
      const res = await h.command({ team, channel, user: 'U0ANA', text, id });
      expect(res.status).toBe(200);
      return h.api.waitFor(() => h.api.responses.find((r) => r.id === id));
    },
    readingsOf: (team) =>
      store.tanks.list(team).flatMap((t) => store.readings.forTank(team, t.id, { includeHeld: true })),
    async close() {
      await h.close();
      store.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
