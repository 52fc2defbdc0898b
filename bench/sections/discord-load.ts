// 200 slash-command readings from 20 guilds at once through the real Discord adapter, real bot and a temporary
// SQLite store; the baseline is the same 200 interactions answered by a bare discord.js client that replies at
// once without the bot, timed in the same run. The gateway and REST stand-ins run in a child process, as
// Discord does, so their work does not queue behind the bot's. The figure is the time from the gateway
// dispatch to the interaction's first callback reaching REST (Discord allows 3 s).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Client, Events, GatewayIntentBits } from 'discord.js';
import { createDiscordAdapter } from '../../adapters/discord/discordAdapter.js';
import { createBot } from '../../bot/bot.js';
import { openStore } from '../../bot/store/index.js';
import { tankNamesOf } from '../../bot/tank-lookup.js';
import { APP, COMMAND, until } from '../../test/discord/harness.js';
import { chatInput, type Where } from '../../test/discord/interactionPayloads.js';
import { type StandInProcess, startStandInProcess } from '../../test/discord/standInProcess.js';
import { type BenchSection, percentile } from '../harness.js';

const GUILDS = 20;
const PER_GUILD = 10;

const guild = (g: number): Where => ({
  applicationId: APP,
  guildId: String(800_000_000_000_000_000n + BigInt(g)),
  channelId: String(810_000_000_000_000_000n + BigInt(g)),
  userId: String(820_000_000_000_000_000n + BigInt(g)),
});

function readings(): ReturnType<typeof chatInput>[] {
  const out: ReturnType<typeof chatInput>[] = [];
  for (let i = 0; i < PER_GUILD; i++) {
    for (let g = 0; g < GUILDS; g++) {
      const when = `2026-11-${String(i + 1).padStart(2, '0')} 07:30`;
      out.push(chatInput(guild(g), COMMAND, 'log', { tank: 'T4', reading: `${60 - i}in`, when }));
    }
  }
  return out;
}

/** Dispatches every payload at once; returns dispatch -> first callback latencies in ms. */
async function fire(standIns: StandInProcess, payloads: { id: string; token: string }[]): Promise<number[]> {
  const sentAt = new Map<string, number>();
  for (const p of payloads) {
    sentAt.set(p.id, Date.now());
    standIns.dispatch('INTERACTION_CREATE', p);
  }
  const firstCallback = new Map<string, number>();
  await until(() => {
    for (const c of standIns.calls) {
      const id = /^\/interactions\/(\d+)\//.exec(c.path)?.[1];
      if (id && !c.limited && !firstCallback.has(id)) firstCallback.set(id, c.at);
    }
    return payloads.every((p) => firstCallback.has(p.id));
  }, 120_000);
  return payloads.map((p) => (firstCallback.get(p.id) ?? 0) - (sentAt.get(p.id) ?? 0));
}

async function login(client: Client): Promise<void> {
  const ready = new Promise<void>((resolve) => client.once(Events.ClientReady, () => resolve()));
  await client.login('stand-in.bot.token');
  await ready;
}

async function bareBaseline(): Promise<number[]> {
  const standIns = await startStandInProcess(APP);
  const client = new Client({ intents: [GatewayIntentBits.Guilds], rest: { api: standIns.apiUrl } });
  client.on(Events.Error, () => {});
  client.on(Events.InteractionCreate, (interaction) => {
    if (interaction.isChatInputCommand()) interaction.reply({ content: 'ok' }).catch(() => {});
  });
  try {
    await login(client);
    return await fire(standIns, readings());
  } finally {
    await client.destroy();
    await standIns.stop();
  }
}

export const discordLoadSection: BenchSection = {
  title: `Discord: ${GUILDS * PER_GUILD} slash-command readings from ${GUILDS} guilds at once`,
  async run() {
    const baseline = await bareBaseline();
    const dir = mkdtempSync(join(tmpdir(), 'tankrunway-discord-load-'));
    const store = openStore(join(dir, 'load.sqlite'));
    const bot = createBot({ store });
    const standIns = await startStandInProcess(APP);
    const adapter = createDiscordAdapter({
      token: 'stand-in.bot.token',
      applicationId: APP,
      apiUrl: standIns.apiUrl,
      command: COMMAND,
      bot,
      tankNames: (team) => tankNamesOf(store.tanks.list(team)),
      log: () => {},
    });
    try {
      await adapter.start();
      // One tank per guild, set up through the bot (Kestrel Valley Water Co-op demo data, invented).
      for (let g = 0; g < GUILDS; g++) {
        const w = guild(g);
        await bot.handle({
          team: `discord:${w.guildId}`,
          channel: w.channelId,
          user: w.userId,
          text: 'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal product=water site="North Yard"',
          receivedAt: Date.now(),
        });
      }
      const payloads = readings();
      const load = await fire(standIns, payloads);
      const storedReadings = () => {
        let stored = 0;
        for (let g = 0; g < GUILDS; g++) {
          const team = `discord:${guild(g).guildId}`;
          const tank = store.tanks.byCode(team, 'T4');
          stored += tank ? store.readings.forTank(team, tank.id, { includeHeld: true }).length : 0;
        }
        return stored;
      };
      // Deferred ones are answered (and stored) after their acknowledgement: wait for all, then check each once.
      await until(() => storedReadings() >= payloads.length, 120_000).catch(() => undefined);
      if (storedReadings() !== payloads.length) {
        throw new Error(`stored ${storedReadings()} readings for ${payloads.length} interactions`);
      }
      const base = (p: number) => ({ name: `bare discord.js reply p${p}`, value: percentile(baseline, p) });
      return [
        {
          name: 'dispatch -> first callback, p50',
          value: percentile(load, 50),
          unit: 'ms',
          baseline: base(50),
        },
        {
          name: 'dispatch -> first callback, p99',
          value: percentile(load, 99),
          unit: 'ms',
          baseline: base(99),
          goal: '< 3,000 ms',
        },
      ];
    } finally {
      await adapter.stop();
      await standIns.stop();
      store.close();
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
