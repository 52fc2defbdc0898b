/**
 * INTERACTION_CREATE payloads as Discord sends them over the gateway (API v10 shapes: chat input, autocomplete,
 * modal submit, button), for a guild the client has not cached, as on a bot with only the Guilds intent and no
 * GUILD_CREATE yet.
 */
import { snowflake } from './snowflake.js';

export interface Where {
  applicationId: string;
  guildId: string;
  channelId: string;
  userId: string;
  /** When the interaction happened (its id carries it); now by default. */
  at?: number;
}

function base(where: Where, type: number, id = snowflake(where.at ?? Date.now())) {
  return {
    id,
    application_id: where.applicationId,
    type,
    token: `token-${id}`,
    version: 1,
    guild_id: where.guildId,
    channel_id: where.channelId,
    channel: { id: where.channelId, type: 0, guild_id: where.guildId, name: 'operations' },
    member: {
      user: {
        id: where.userId,
        username: `user${where.userId}`,
        discriminator: '0',
        avatar: null,
        global_name: 'Dana',
      },
      roles: [],
      permissions: '0',
      joined_at: '2026-01-05T12:00:00.000Z',
      deaf: false,
      mute: false,
      flags: 0,
      nick: null,
      avatar: null,
    },
    locale: 'en-US',
    guild_locale: 'en-US',
    app_permissions: '0',
    entitlements: [],
    authorizing_integration_owners: { '0': where.guildId },
    context: 0,
  };
}

type StringOptions = Record<string, string>;

const stringOptions = (options: StringOptions, focused?: string) =>
  Object.entries(options).map(([name, value]) => ({
    type: 3,
    name,
    value,
    ...(name === focused ? { focused: true } : {}),
  }));

export function chatInput(where: Where, command: string, sub: string, options: StringOptions = {}) {
  return {
    ...base(where, 2),
    data: {
      id: '900000000000000001',
      name: command,
      type: 1,
      options: [{ type: 1, name: sub, options: stringOptions(options) }],
    },
  };
}

export function autocomplete(
  where: Where,
  command: string,
  sub: string,
  options: StringOptions,
  focused: string,
) {
  return {
    ...base(where, 4),
    data: {
      id: '900000000000000001',
      name: command,
      type: 1,
      options: [{ type: 1, name: sub, options: stringOptions(options, focused) }],
    },
  };
}

export function modalSubmit(where: Where, customId: string, fields: StringOptions) {
  return {
    ...base(where, 5),
    data: {
      custom_id: customId,
      components: Object.entries(fields).map(([id, value]) => ({
        type: 1,
        components: [{ type: 4, custom_id: id, value }],
      })),
    },
  };
}

export function buttonClick(where: Where, customId: string) {
  return {
    ...base(where, 3),
    message: {
      id: snowflake(Date.now() - 1000),
      channel_id: where.channelId,
      type: 0,
      content: '',
      author: {
        id: where.applicationId,
        username: 'tank-runway',
        discriminator: '0',
        avatar: null,
        bot: true,
      },
      embeds: [],
      attachments: [],
      mentions: [],
      mention_roles: [],
      pinned: false,
      tts: false,
      mention_everyone: false,
      timestamp: new Date().toISOString(),
      edited_timestamp: null,
      flags: 0,
      components: [],
    },
    data: { custom_id: customId, component_type: 2 },
  };
}
