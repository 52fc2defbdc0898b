/**
 * The Slack adapter: Bolt with the HTTP receiver (signed requests to /slack/events) or Socket Mode (when an
 * app-level token is given). It only translates: Slack team T123 is our team `slack:T123`, every message goes
 * to `bot.handle`, and the replies come back through the outbox.
 */
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { App, HTTPReceiver, type Logger, LogLevel, SocketModeReceiver, type webApi } from '@slack/bolt';
import type { Bot } from '../../bot/bot.js';
import type { Reply } from '../../bot/replies/reply.js';
import type { SlackContext } from './context.js';
import { listenForActions } from './listeners/actions.js';
import { listenForCommand } from './listeners/command.js';
import { listenForHome } from './listeners/home.js';
import { listenForMentions } from './listeners/mention.js';
import { listenForViews } from './listeners/views.js';
import { type ChartRenderer, createOutbox } from './outbox.js';
import { rejectFutureRequests } from './request-guard.js';
import { createTeamClients } from './team-clients.js';
import { slackTeamId } from './to-request.js';
import { createTurns } from './turns.js';
import { createUserZones } from './user-zones.js';

export interface SlackAdapterOptions {
  bot: Bot;
  botToken: string;
  /** Required for the HTTP receiver. */
  signingSecret?: string;
  /** Socket Mode when present. */
  appToken?: string;
  /** Web API base ending in `/api/`; the platform's when absent. */
  apiUrl?: string;
  /** The slash command with its slash, e.g. "/tankrunway". */
  command: string;
  renderChart: ChartRenderer;
  /**
   * The App Home board of a team (`slack:T123`): its tanks by runway. The composition root builds it from
   * bot/runway-board; without it the home tab shows the bot's answer to `status`.
   */
  home?: (team: string, now: number) => Reply[] | Promise<Reply[]>;
  /** Retry policy of every Web API client; the library's default retries for about 30 minutes. */
  retryConfig?: webApi.RetryOptions;
  /** Socket Mode: how long without a pong before the client reconnects (the library's default is 5 s). */
  socketPingTimeoutMs?: number;
  logLevel?: LogLevel;
  logger?: Logger;
  clock?: () => number;
}

export interface SlackAdapter {
  /** HTTP mode listens on `port` (0 for an ephemeral one) and returns it; Socket Mode connects out. */
  start(port: number, host?: string): Promise<{ port?: number }>;
  stop(): Promise<void>;
  /** For the scheduler: posts digests and notices to a channel of a Slack team (`slack:T123`). */
  deliver(team: string, channel: string, replies: Reply[]): Promise<void>;
}

export function createSlackAdapter(options: SlackAdapterOptions): SlackAdapter {
  const clock = options.clock ?? Date.now;
  const logLevel = options.logLevel ?? LogLevel.INFO;
  const clients = createTeamClients({
    token: options.botToken,
    apiUrl: options.apiUrl,
    retryConfig: options.retryConfig,
    logger: options.logger,
    logLevel,
  });
  const clientOptions = clients.options;

  let receiver: HTTPReceiver | SocketModeReceiver;
  if (options.appToken) {
    // A hand-built SocketModeReceiver does not inherit the App's client options (chat-platforms.md).
    receiver = new SocketModeReceiver({
      appToken: options.appToken,
      installerOptions: { clientOptions },
      ...(options.socketPingTimeoutMs ? { clientPingTimeout: options.socketPingTimeoutMs } : {}),
      logLevel,
      ...(options.logger ? { logger: options.logger } : {}),
    });
  } else {
    if (!options.signingSecret) throw new Error('the Slack HTTP receiver needs a signing secret');
    const http = new HTTPReceiver({
      signingSecret: options.signingSecret,
      logLevel,
      ...(options.logger ? { logger: options.logger } : {}),
    });
    // Signatures are judged on the real clock, whatever clock the bot is given.
    http.requestListener = rejectFutureRequests(http.requestListener);
    receiver = http;
  }

  const app = new App({
    token: options.botToken,
    receiver,
    clientOptions,
    logLevel,
    ...(options.logger ? { logger: options.logger } : {}),
  });
  // The zone lookup fails fast (interactive client): a reply never waits on it; the team's zone stands in.
  const zones = createUserZones(async (_teamId, user) => {
    const info = await clients.interactive.users.info({ user });
    return info.user?.tz;
  }, clock);
  const outbox = createOutbox(clients, options.renderChart, app.logger);
  const takeTurn = createTurns();
  const bot: Bot = { handle: (request) => takeTurn(() => options.bot.handle(request)) };
  const ctx: SlackContext = { bot, clients, zones, outbox, logger: app.logger, clock, home: options.home };

  listenForCommand(app, ctx, options.command);
  listenForMentions(app, ctx);
  listenForActions(app, ctx);
  listenForViews(app, ctx);
  listenForHome(app, ctx);
  app.error(async (error) => {
    // Listener failures are logged; the person already got an ack, and the bot replies to its own errors.
    app.logger.error(`slack: ${error.message}`);
  });

  return {
    async start(port, host) {
      if (receiver instanceof SocketModeReceiver) {
        await app.start();
        return {};
      }
      const server = (await app.start({ port, ...(host ? { host } : {}) })) as Server;
      return { port: (server.address() as AddressInfo).port };
    },
    async stop() {
      await app.stop();
    },
    async deliver(team, channel, replies) {
      const teamId = slackTeamId(team);
      if (!teamId) throw new Error(`not a Slack team: ${team}`);
      await outbox.send({ teamId, channel }, replies);
    },
  };
}
