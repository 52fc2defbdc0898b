import { z } from 'zod';
import { fail, ok, type Result } from '../engine/result.js';

/**
 * Settings of `tankrunway serve`, read from the environment. Each platform starts only when its settings are
 * present; a half-configured platform is an error rather than silently skipped, so a typo never leaves a team
 * without its bot.
 */
export interface SlackSettings {
  botToken: string;
  /** Needed by the HTTP receiver; Socket Mode does not sign requests. */
  signingSecret?: string;
  /** Socket Mode when present. */
  appToken?: string;
  /** Web API base, ending in `/`; the platform's own when absent. */
  apiUrl?: string;
}

export interface DiscordSettings {
  token: string;
  applicationId: string;
  apiUrl?: string;
  /** Registers the command in this one server (instant, for development) instead of globally. */
  guildId?: string;
}

export interface ServeSettings {
  port: number;
  /** The slash command, with its slash, e.g. "/tank". */
  command: string;
  slack?: SlackSettings;
  discord?: DiscordSettings;
}

/**
 * The default command name, as the operators asked for. Slack has one command namespace per workspace: where
 * "/tank" clashes with another app's, set TANKRUNWAY_COMMAND (e.g. "/tankrunway"); the manifest follows it.
 */
export const defaultCommand = '/tank';

const optionalText = z
  .string()
  .optional()
  .transform((v) => (v === undefined || v.trim() === '' ? undefined : v.trim()));
const url = (name: string) =>
  optionalText.refine(
    (v) => v === undefined || /^https?:\/\/[^\s]+$/.test(v),
    `${name} must be an http(s) URL`,
  );

const envSchema = z.object({
  PORT: optionalText
    .refine((v) => v === undefined || /^\d{1,5}$/.test(v), 'PORT must be a whole number from 0 to 65535')
    .transform((v) => (v === undefined ? 3000 : Number(v)))
    .refine((v) => v <= 65535, 'PORT must be a whole number from 0 to 65535'),
  TANKRUNWAY_COMMAND: optionalText
    .transform((v) => (v === undefined ? defaultCommand : v.startsWith('/') ? v : `/${v}`))
    // Slack allows 32 characters with the slash; Discord lowercase letters, digits, - and _ (chat-platforms.md).
    .refine(
      (v) => /^\/[a-z0-9_-]{1,31}$/.test(v),
      'TANKRUNWAY_COMMAND must be 1-31 lowercase letters, digits, - or _',
    ),
  SLACK_BOT_TOKEN: optionalText.refine(
    (v) => v === undefined || /^xoxb-\S+$/.test(v),
    'SLACK_BOT_TOKEN must be a bot token starting with xoxb-',
  ),
  SLACK_SIGNING_SECRET: optionalText.refine(
    (v) => v === undefined || /^[A-Za-z0-9]{8,}$/.test(v),
    'SLACK_SIGNING_SECRET must be the signing secret from the app settings (letters and digits)',
  ),
  SLACK_APP_TOKEN: optionalText.refine(
    (v) => v === undefined || /^xapp-\S+$/.test(v),
    'SLACK_APP_TOKEN must be an app-level token starting with xapp-',
  ),
  SLACK_API_URL: url('SLACK_API_URL'),
  DISCORD_TOKEN: optionalText.refine(
    (v) => v === undefined || !/\s/.test(v),
    'DISCORD_TOKEN must not contain spaces',
  ),
  DISCORD_APPLICATION_ID: optionalText.refine(
    (v) => v === undefined || /^\d{5,25}$/.test(v),
    'DISCORD_APPLICATION_ID must be the numeric application id',
  ),
  DISCORD_API_URL: url('DISCORD_API_URL'),
  DISCORD_GUILD_ID: optionalText.refine(
    (v) => v === undefined || /^\d{5,25}$/.test(v),
    'DISCORD_GUILD_ID must be the numeric id of the development server',
  ),
});

/** Reads serve's settings; the error is one line naming the setting to fix. */
export function parseServeSettings(env: Record<string, string | undefined>): Result<ServeSettings> {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return fail(issue?.message ?? 'invalid settings');
  }
  const e = parsed.data;
  const settings: ServeSettings = { port: e.PORT, command: e.TANKRUNWAY_COMMAND };

  const anySlack = e.SLACK_BOT_TOKEN ?? e.SLACK_SIGNING_SECRET ?? e.SLACK_APP_TOKEN ?? e.SLACK_API_URL;
  if (anySlack !== undefined) {
    if (e.SLACK_BOT_TOKEN === undefined)
      return fail('SLACK_BOT_TOKEN is missing: Slack settings are set without it');
    if (e.SLACK_APP_TOKEN === undefined && e.SLACK_SIGNING_SECRET === undefined) {
      return fail(
        'SLACK_SIGNING_SECRET is missing: the HTTP receiver needs it (or set SLACK_APP_TOKEN for Socket Mode)',
      );
    }
    settings.slack = {
      botToken: e.SLACK_BOT_TOKEN,
      signingSecret: e.SLACK_SIGNING_SECRET,
      appToken: e.SLACK_APP_TOKEN,
      apiUrl: e.SLACK_API_URL === undefined ? undefined : withTrailingSlash(e.SLACK_API_URL),
    };
  }

  const anyDiscord = e.DISCORD_TOKEN ?? e.DISCORD_APPLICATION_ID ?? e.DISCORD_API_URL ?? e.DISCORD_GUILD_ID;
  if (anyDiscord !== undefined) {
    if (e.DISCORD_TOKEN === undefined)
      return fail('DISCORD_TOKEN is missing: Discord settings are set without it');
    if (e.DISCORD_APPLICATION_ID === undefined) {
      return fail('DISCORD_APPLICATION_ID is missing: Discord needs it to register the command');
    }
    settings.discord = {
      token: e.DISCORD_TOKEN,
      applicationId: e.DISCORD_APPLICATION_ID,
      apiUrl: e.DISCORD_API_URL,
      ...(e.DISCORD_GUILD_ID === undefined ? {} : { guildId: e.DISCORD_GUILD_ID }),
    };
  }
  return ok(settings);
}

// The Web API client joins method names onto the base, so the base must end with a slash.
const withTrailingSlash = (u: string) => (u.endsWith('/') ? u : `${u}/`);
