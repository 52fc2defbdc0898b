// 200 signed slash commands from 20 simulated teams at once against the real Slack adapter, real bot and a
// temporary SQLite store; the baseline is the same 200 requests to a Bolt app whose handler only acks,
// timed in the same run.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createBot } from '../../bot/bot.js';
import { openStore } from '../../bot/store/index.js';
import { startSlackHarness } from '../../test/slack/harness.js';
import {
  fireAcksOnly,
  fireLoad,
  loadCommands,
  loadTeams,
  setUpLoadTeams,
  startBareBolt,
} from '../../test/slack/load-driver.js';
import { type BenchSection, percentile } from '../harness.js';

const TEAMS = 20;
const TANKS = 10;

export const slackLoadSection: BenchSection = {
  title: `Slack: ${TEAMS * TANKS} signed slash commands from ${TEAMS} teams at once`,
  async run() {
    const dir = mkdtempSync(join(tmpdir(), 'tankrunway-slack-load-'));
    const store = openStore(join(dir, 'load.sqlite'));
    const bot = createBot({ store });
    const h = await startSlackHarness({ bot });
    try {
      const teams = loadTeams(TEAMS);
      await setUpLoadTeams(bot, teams, TANKS, Date.now());
      const commands = loadCommands(teams, TANKS);
      const bare = await startBareBolt(h.api);
      // Baseline first, then the real load; a warm-up round of each is not counted.
      await fireAcksOnly(bare.eventsUrl, commands.slice(0, 20), h.api.responseUrl);
      const baseline = await fireAcksOnly(bare.eventsUrl, commands, h.api.responseUrl);
      await bare.stop();
      const load = await fireLoad(h.eventsUrl, h.api, commands);
      const base = (p: number) => ({ name: `bare Bolt ack p${p}`, value: percentile(baseline, p) });
      return [
        { name: 'ack p50', value: percentile(load.ackMs, 50), unit: 'ms', baseline: base(50) },
        {
          name: 'ack p99',
          value: percentile(load.ackMs, 99),
          unit: 'ms',
          baseline: base(99),
          goal: '< 3000 ms (Slack)',
        },
        {
          name: 'all replies delivered',
          value: load.allRepliedMs,
          unit: 'ms',
          baseline: { name: 'bare Bolt all acks', value: Math.max(...baseline) },
        },
      ];
    } finally {
      await h.close();
      store.close();
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
