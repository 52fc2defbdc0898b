/**
 * One Discord test world: a temporary SQLite store, the real bot, the local gateway and REST stand-ins, and
 * the adapter logged in to them. `interact` sends an interaction over the gateway and returns what the
 * client answered on REST.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createDiscordAdapter, type DiscordAdapter } from '../../adapters/discord/discordAdapter.js';
import { type Bot, createBot } from '../../bot/bot.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { tankNamesOf } from '../../bot/tank-lookup.js';
import { type GatewayStandIn, startGatewayStandIn } from './gatewayStandIn.js';
import type { Where } from './interactionPayloads.js';
import { type RecordedCall, type RestStandIn, startRestStandIn } from './restStandIn.js';

export const APP = '700000000000000001';
export const GUILD = '710000000000000002';
export const CHANNEL = '730000000000000004';
export const COMMAND = 'tankrunway';
export const TEAM = `discord:${GUILD}`;
export const where: Where = {
  applicationId: APP,
  guildId: GUILD,
  channelId: CHANNEL,
  userId: '740000000000000005',
};

export interface Embed {
  title?: string;
  description?: string;
  fields?: { name: string; value: string }[];
  image?: { url: string };
}
export interface Callback {
  type: number;
  data?: {
    embeds?: Embed[];
    flags?: number;
    custom_id?: string;
    choices?: { name: string; value: string }[];
  };
}

export interface World {
  store: Store;
  gateway: GatewayStandIn;
  rest: RestStandIn;
  adapter: DiscordAdapter;
  logged: string[];
  interact(payload: { id: string; token: string }): Promise<{ callback: Callback; edit?: RecordedCall }>;
  stop(): Promise<void>;
}

/** The first embed of a recorded message call (an edit, follow-up or channel post). */
export const embedOf = (call: RecordedCall | undefined): Embed | undefined =>
  (call?.body as { embeds?: Embed[] } | undefined)?.embeds?.[0];

/** Polls a condition that another party (the client) will make true. */
export async function until(condition: () => boolean, timeoutMs = 5_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!condition()) {
    if (Date.now() > deadline) throw new Error('condition not met in time');
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

export async function startWorld(
  options: { wrapBot?: (bot: Bot) => Bot; deferAfterMs?: number } = {},
): Promise<World> {
  const dir = mkdtempSync(join(tmpdir(), 'tankrunway-discord-'));
  const store = openStore(join(dir, 'bot.sqlite'));
  const realBot = createBot({ store });
  const gateway = await startGatewayStandIn({ applicationId: APP });
  const rest = await startRestStandIn({ gatewayUrl: gateway.url, applicationId: APP });
  const logged: string[] = [];
  const adapter = createDiscordAdapter({
    token: 'stand-in.bot.token',
    applicationId: APP,
    apiUrl: rest.apiUrl,
    command: `/${COMMAND}`,
    guildId: GUILD,
    bot: options.wrapBot ? options.wrapBot(realBot) : realBot,
    tankNames: (team) => tankNamesOf(store.tanks.list(team)),
    log: (line) => logged.push(line),
    ...(options.deferAfterMs !== undefined ? { deferAfterMs: options.deferAfterMs } : {}),
  });
  await adapter.start();

  return {
    store,
    gateway,
    rest,
    adapter,
    logged,
    async interact(payload) {
      gateway.dispatch('INTERACTION_CREATE', payload);
      const call = await rest.waitFor(
        (c) => c.path === `/interactions/${payload.id}/${payload.token}/callback`,
      );
      const callback = call.body as Callback;
      if (callback.type !== 5) return { callback };
      const edit = await rest.waitFor(
        (c) =>
          c.path.startsWith(`/webhooks/${APP}/${payload.token}`) &&
          (c.method === 'PATCH' || (c.method === 'POST' && c.path === `/webhooks/${APP}/${payload.token}`)),
      );
      return { callback, edit };
    },
    async stop() {
      await adapter.stop();
      await gateway.close();
      await rest.close();
      store.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
