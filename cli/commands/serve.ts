/**
 * `tankrunway serve --db FILE`: the bot on every platform whose settings are in the environment (Slack,
 * Discord), with the scheduler posting digests and notices through the same adapters; the terminal chat when
 * no platform is configured. Settings are checked first: a missing or malformed one stops start-up with one
 * line (exit code 2).
 */
import { existsSync, mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { manifestYaml } from '../../adapters/slack/manifest.js';
import type { Reply } from '../../bot/replies/reply.js';
import type { DeliveryMeta } from '../../bot/schedule/scheduler.js';
import type { Store } from '../../bot/store/index.js';
import { type CliCommand, type CliIo, UsageError } from '../io.js';
import { parseServeSettings, type ServeSettings } from '../serve-settings.js';

// The platform libraries (Bolt, discord.js) and the chart renderer are loaded only when serve runs, so the
// other commands of the CLI start fast.
const loadSlack = () => import('../../adapters/slack/app.js');
const loadDiscord = () => withoutSetToJson(() => import('../../adapters/discord/discordAdapter.js'));

/**
 * vega-lite (the charts) adds Set.prototype.toJSON when it loads, and discord.js's bundled copy of
 * util.inspect fails to initialise when it finds it ("string "Set()" is not iterable", seen with
 * vega-lite 6.4 and discord.js 14.28). The CLI loads the charts first, so discord.js is loaded with the
 * property set aside for that moment and put back afterwards.
 */
async function withoutSetToJson<T>(load: () => Promise<T>): Promise<T> {
  const patched = Object.getOwnPropertyDescriptor(Set.prototype, 'toJSON');
  if (patched) Reflect.deleteProperty(Set.prototype, 'toJSON');
  try {
    return await load();
  } finally {
    if (patched) Object.defineProperty(Set.prototype, 'toJSON', patched);
  }
}

const usage =
  'usage: tankrunway serve --db FILE [--tick-seconds N] [--now ISO] | serve --slack-manifest [--public-url URL]\n' +
  'settings from the environment: SLACK_BOT_TOKEN, SLACK_SIGNING_SECRET, SLACK_APP_TOKEN, SLACK_API_URL, PORT,\n' +
  'DISCORD_TOKEN, DISCORD_APPLICATION_ID, DISCORD_API_URL, DISCORD_GUILD_ID, TANKRUNWAY_COMMAND\n' +
  '(see adapters/slack/README.md and adapters/discord/README.md)\n';

/** A missed digest is still posted this long after it was due (a restart); older ones are skipped. */
const GRACE_MINUTES = 120;

interface Running {
  deliver(team: string, channel: string, replies: Reply[], meta: DeliveryMeta): Promise<void>;
  stop(): Promise<void>;
}

/** Starts each configured platform; returns one deliver that routes by the team's platform prefix. */
async function startPlatforms(
  settings: ServeSettings,
  store: Store,
  io: CliIo,
  clock: () => number,
): Promise<Running> {
  const discordModule = settings.discord ? await loadDiscord() : undefined;
  const { createBot } = await import('../../bot/bot.js');
  const { renderChartPng } = await import('../../bot/replies/renderChart.js');
  const { tankNamesOf } = await import('../../bot/tank-lookup.js');
  const { runwayBoard } = await import('../../bot/runway-board.js');
  const bot = createBot({ store });
  const stops: (() => Promise<void>)[] = [];
  const routes = new Map<
    string,
    (channel: string, replies: Reply[], team: string, meta: DeliveryMeta) => Promise<void>
  >();
  try {
    if (settings.slack) {
      const s = settings.slack;
      const { createSlackAdapter } = await loadSlack();
      const slack = createSlackAdapter({
        bot,
        botToken: s.botToken,
        signingSecret: s.signingSecret,
        appToken: s.appToken,
        apiUrl: s.apiUrl,
        command: settings.command,
        renderChart: renderChartPng,
        home: (team, now) => [runwayBoard(store, team, now)],
        clock,
      });
      const { port } = await slack.start(settings.port);
      stops.push(() => slack.stop());
      routes.set('slack', (channel, replies, team) => slack.deliver(team, channel, replies));
      io.stderr.write(
        port === undefined
          ? `tankrunway serve: Slack connected over Socket Mode (command ${settings.command})\n`
          : `tankrunway serve: Slack listening on port ${port} at /slack/events (command ${settings.command})\n`,
      );
    }
    if (settings.discord && discordModule) {
      const d = settings.discord;
      const { createDiscordAdapter } = discordModule;
      const discord = createDiscordAdapter({
        bot,
        token: d.token,
        applicationId: d.applicationId,
        ...(d.apiUrl ? { apiUrl: d.apiUrl } : {}),
        ...(d.guildId ? { guildId: d.guildId } : {}),
        command: settings.command,
        tankNames: (team) => tankNamesOf(store.tanks.list(team)),
        renderChart: renderChartPng,
      });
      await discord.start();
      stops.push(() => discord.stop());
      routes.set('discord', (channel, replies, _team, meta) =>
        discord.deliver(channel, replies, { key: meta.key }),
      );
      io.stderr.write(`tankrunway serve: Discord connected (command ${settings.command})\n`);
    }
  } catch (error) {
    for (const stop of stops.reverse()) await stop().catch(() => undefined);
    throw error;
  }
  return {
    async deliver(team, channel, replies, meta) {
      const platform = team.slice(0, team.indexOf(':'));
      const route = routes.get(platform);
      if (!route) throw new Error(`no running adapter for ${team}`);
      await route(channel, replies, team, meta);
    },
    async stop() {
      for (const stop of stops.reverse()) await stop().catch(() => undefined);
    },
  };
}

/** Resolves on SIGINT or SIGTERM; `cancel` removes the listeners when serve ends another way. */
function waitForSignal(): { signal: Promise<string>; cancel(): void } {
  let on: (signal: string) => void = () => undefined;
  const cancel = () => {
    process.off('SIGINT', on);
    process.off('SIGTERM', on);
  };
  const signal = new Promise<string>((resolveSignal) => {
    on = (name: string) => {
      cancel();
      resolveSignal(name);
    };
    process.once('SIGINT', on);
    process.once('SIGTERM', on);
  });
  return { signal, cancel };
}

export const serveCommand: CliCommand = {
  name: 'serve',
  async run(argv, io) {
    const { values } = parseArgs({
      args: argv,
      options: {
        db: { type: 'string' },
        'tick-seconds': { type: 'string' },
        now: { type: 'string' },
        'slack-manifest': { type: 'boolean', default: false },
        'public-url': { type: 'string' },
        help: { type: 'boolean', short: 'h', default: false },
      },
      strict: true,
      allowPositionals: false,
    });
    if (values.help) {
      io.stdout.write(usage);
      return 0;
    }
    const parsed = parseServeSettings(process.env);
    if (!parsed.ok) throw new UsageError(parsed.error);
    const settings = parsed.value;

    if (values['slack-manifest']) {
      const publicUrl = values['public-url'];
      if (publicUrl !== undefined && !/^https:\/\/\S+$/.test(publicUrl)) {
        throw new UsageError('--public-url must be the https:// address Slack can reach');
      }
      io.stdout.write(manifestYaml({ command: settings.command, ...(publicUrl ? { publicUrl } : {}) }));
      return 0;
    }
    if (!values.db)
      throw new UsageError('--db FILE is required (the SQLite file of the teams; created if missing)');
    const tickSeconds = values['tick-seconds'] === undefined ? 30 : Number(values['tick-seconds']);
    if (!Number.isFinite(tickSeconds) || tickSeconds < 0.05 || tickSeconds > 3600) {
      throw new UsageError('--tick-seconds must be a number of seconds from 0.05 to 3600');
    }
    // As in `chat`: --now starts the bot's clock at another instant (demos, tests); it then runs in real time.
    let start = Date.now();
    if (values.now !== undefined) {
      start = Date.parse(values.now);
      if (!Number.isFinite(start)) throw new UsageError(`--now "${values.now}" is not an ISO 8601 instant`);
    }
    if (!settings.slack && !settings.discord) {
      io.stderr.write('tankrunway serve: no Slack or Discord settings; running the terminal chat\n');
      const { chatCommand } = await import('./chat.js');
      return chatCommand.run(['--db', values.db, ...(values.now ? ['--now', values.now] : [])], io);
    }
    const startedAt = Date.now();
    const clock = () => start + (Date.now() - startedAt);

    // Listen for the stop signal before anything starts, so a SIGTERM during start-up still stops cleanly.
    const stopSignal = waitForSignal();
    const dbPath = resolve(values.db);
    if (!existsSync(dirname(dbPath))) mkdirSync(dirname(dbPath), { recursive: true });
    const { openStore } = await import('../../bot/store/index.js');
    let store: Store;
    try {
      store = openStore(dbPath);
    } catch (error) {
      stopSignal.cancel();
      throw new UsageError(
        `cannot open ${values.db}: ${error instanceof Error ? error.message : String(error)}`,
      );
    }
    let running: Running;
    try {
      running = await startPlatforms(settings, store, io, clock);
    } catch (error) {
      stopSignal.cancel();
      store.close();
      io.stderr.write(
        `tankrunway serve: could not start: ${error instanceof Error ? error.message : String(error)}\n`,
      );
      return 1;
    }
    const { createScheduler, startLoop } = await import('../../bot/schedule/scheduler.js');
    const { digestFromStore } = await import('../../bot/schedule/digest.js');
    const scheduler = createScheduler({
      store,
      deliver: (team, channel, replies, meta) => running.deliver(team, channel, replies, meta),
      clock,
      graceMinutes: GRACE_MINUTES,
      composeDigest: digestFromStore,
      log: (event) => {
        if (event.type !== 'claimed' && event.type !== 'not-leader')
          io.stderr.write(`schedule: ${JSON.stringify(event)}\n`);
      },
    });
    const stopLoop = startLoop(scheduler, tickSeconds * 1000, (event) =>
      io.stderr.write(`schedule: ${JSON.stringify(event)}\n`),
    );
    const signal = await stopSignal.signal;
    io.stderr.write(`tankrunway serve: ${signal}, stopping\n`);
    stopLoop();
    scheduler.release();
    await running.stop();
    store.close();
    return 0;
  },
};
