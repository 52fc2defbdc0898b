// The load of the issue (200 signed slash commands from 20 teams at once) through the real adapter, bot and a
// temporary SQLite store. Timing belongs to `npm run bench`; this checks only that nothing is lost or doubled.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBot } from '../../bot/bot.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { type SlackHarness, startSlackHarness } from './harness.js';
import { fireLoad, loadCommands, loadTeams, setUpLoadTeams } from './load-driver.js';

let dir: string;
let store: Store;
let h: SlackHarness;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'tankrunway-slack-load-'));
  store = openStore(join(dir, 'load.sqlite'));
  h = await startSlackHarness({ bot: createBot({ store }) });
});
afterAll(async () => {
  await h.close();
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('200 slash commands from 20 teams at once', () => {
  it('acks every one, stores every reading once in its own team, and delivers every reply', async () => {
    const teams = loadTeams(20);
    await setUpLoadTeams(createBot({ store }), teams, 10, Date.now());
    const commands = loadCommands(teams, 10);
    const result = await fireLoad(h.eventsUrl, h.api, commands);

    expect(result.statuses.every((s) => s === 200)).toBe(true);
    for (const team of teams) {
      const tanks = store.tanks.list(`slack:${team}`);
      expect(tanks).toHaveLength(10);
      for (const tank of tanks) {
        expect(store.readings.forTank(`slack:${team}`, tank.id, { includeHeld: true })).toHaveLength(1);
      }
    }
    // One reply per command, each to its own response_url, confirmed for the channel.
    expect(h.api.responses).toHaveLength(200);
    expect(new Set(h.api.responses.map((r) => r.id)).size).toBe(200);
    expect(h.api.responses.every((r) => r.body.response_type === 'in_channel')).toBe(true);
  });
});
