/**
 * The Discord adapter: a gateway client (no inbound port), the slash command registered by bulk PUT, and
 * channel posts for the scheduler's digests and notices. discord.js's REST client keeps per-route rate-limit
 * buckets and waits out 429s, so one busy channel never holds up another guild's replies.
 */
import { createHash, randomBytes } from 'node:crypto';
import { Client, Events, GatewayIntentBits, Routes } from 'discord.js';
import type { Bot } from '../../bot/bot.js';
import type { Reply } from '../../bot/replies/reply.js';
import { commandDefinition, commandNameFrom } from './commandDefinition.js';
import { createInteractionHandler } from './interactions.js';
import { type ChartRenderer, toDiscordMessages } from './messages.js';

export interface DiscordAdapterOptions {
  token: string;
  applicationId: string;
  /** REST base such as "http://127.0.0.1:PORT/api"; the platform's own when absent. */
  apiUrl?: string;
  /** The slash command, with or without its slash (TANKRUNWAY_COMMAND). */
  command: string;
  /** Register the command in this guild only (development: instant); globally when absent (production). */
  guildId?: string;
  bot: Bot;
  tankNames: (team: string) => string[] | Promise<string[]>;
  renderChart?: ChartRenderer;
  deferAfterMs?: number;
  log?: (line: string) => void;
}

export interface DiscordAdapter {
  readonly client: Client;
  /** Logs in, waits for READY, registers the command. */
  start(): Promise<void>;
  stop(): Promise<void>;
  registerCommands(): Promise<void>;
  /**
   * Posts replies to a channel. `key` (stable across retries of one post) becomes the messages' nonces with
   * enforce_nonce, so a retried digest is not posted twice.
   */
  deliver(channelId: string, replies: readonly Reply[], meta?: { key?: string }): Promise<void>;
}

/** Discord nonces are at most 25 characters: a hash of the post key and the message's place in it. */
export function nonceFor(key: string | undefined, index: number): string {
  if (key === undefined) return randomBytes(12).toString('hex').slice(0, 25);
  return createHash('sha256').update(`${key}#${index}`).digest('base64url').slice(0, 25);
}

export function createDiscordAdapter(options: DiscordAdapterOptions): DiscordAdapter {
  const commandName = commandNameFrom(options.command);
  if (!commandName) {
    throw new Error(
      `"${options.command}" cannot be a Discord command: use 1-32 lowercase letters, digits, - or _.`,
    );
  }
  const log = options.log ?? ((line: string) => process.stderr.write(`discord: ${line}\n`));
  const client = new Client({
    intents: [GatewayIntentBits.Guilds],
    ...(options.apiUrl ? { rest: { api: options.apiUrl } } : {}),
  });
  // An unhandled 'error' event would end the process; the gateway reconnects on its own.
  client.on(Events.Error, (error) => log(`client error: ${error.message}`));
  client.on(
    Events.InteractionCreate,
    createInteractionHandler({
      bot: options.bot,
      tankNames: options.tankNames,
      commandName,
      log,
      ...(options.renderChart ? { renderChart: options.renderChart } : {}),
      ...(options.deferAfterMs !== undefined ? { deferAfterMs: options.deferAfterMs } : {}),
    }),
  );

  async function registerCommands(): Promise<void> {
    const route = options.guildId
      ? Routes.applicationGuildCommands(options.applicationId, options.guildId)
      : Routes.applicationCommands(options.applicationId);
    await client.rest.put(route, { body: commandDefinition(commandName as string) });
  }

  return {
    client,
    async start() {
      const ready = new Promise<void>((resolve) => client.once(Events.ClientReady, () => resolve()));
      await client.login(options.token);
      await ready;
      await registerCommands();
    },
    async stop() {
      await client.destroy();
    },
    registerCommands,
    async deliver(channelId, replies, meta) {
      const messages = await toDiscordMessages(replies, options.renderChart, (e) =>
        log(`chart failed: ${String(e)}`),
      );
      for (const [i, m] of messages.entries()) {
        await client.rest.post(Routes.channelMessages(channelId), {
          body: {
            embeds: m.embeds,
            components: m.components,
            attachments: m.files.map((f, id) => ({ id, filename: f.name, description: f.description })),
            nonce: nonceFor(meta?.key, i),
            enforce_nonce: true,
          },
          files: m.files.map((f) => ({ name: f.name, data: f.attachment, contentType: 'image/png' })),
        });
      }
    },
  };
}
