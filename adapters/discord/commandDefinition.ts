/**
 * The bot's language as one Discord slash command with subcommands. Each subcommand's options are the
 * pieces of one message in the language; `say` carries any message whole, so nothing the console accepts
 * is out of reach here.
 */
import {
  ApplicationCommandOptionType,
  ApplicationCommandType,
  ApplicationIntegrationType,
  InteractionContextType,
  type RESTPutAPIApplicationCommandsJSONBody,
} from 'discord.js';
import { helpTopicSchema } from '../../bot/language/command.js';

/** Subcommand names, in the order people see them. */
export const SUBCOMMANDS = [
  'log',
  'delivery',
  'ask',
  'list',
  'setup',
  'settings',
  'timezone',
  'help',
  'say',
] as const;
export type Subcommand = (typeof SUBCOMMANDS)[number];

/** Help topics the bot knows: the language's own list, so a new topic shows up here too. */
export const HELP_TOPICS: readonly string[] = helpTopicSchema.options;

/** Windows offered for "which tanks run low ...?"; each is a phrase the language reads. */
export const LOW_WINDOWS = ['today', 'tomorrow', 'this week', 'next week', 'in 14 days'];

// Discord: `^[-_\p{L}\p{N}]{1,32}$`, lowercase (chat-platforms.md).
const COMMAND_NAME = /^[-_\p{Ll}\p{N}]{1,32}$/u;

/** "/tankrunway" or "tankrunway" -> "tankrunway"; undefined when Discord would refuse the name. */
export function commandNameFrom(setting: string): string | undefined {
  const name = setting.trim().replace(/^\//, '');
  return COMMAND_NAME.test(name) ? name : undefined;
}

const S = ApplicationCommandOptionType.String;
const tankOption = (required: boolean, description = 'Tank code or name') => ({
  type: S,
  name: 'tank',
  description,
  required,
  autocomplete: true,
  max_length: 64,
});
const whenOption = {
  type: S,
  name: 'when',
  description: 'When, if not now: "7:30", "yesterday 4pm", "2026-11-02 07:30" (team time zone)',
  required: false,
  max_length: 60,
};

/** The command body for a bulk PUT of application commands (guild or global). */
export function commandDefinition(name: string): RESTPutAPIApplicationCommandsJSONBody {
  const sub = (subName: Subcommand, description: string, options: object[] = []) => ({
    type: ApplicationCommandOptionType.Subcommand,
    name: subName,
    description,
    options,
  });
  return [
    {
      type: ApplicationCommandType.ChatInput,
      name,
      description: 'Tank levels, how long they last, and when to order',
      // Teams are servers: the command lives in servers only, never in DMs.
      contexts: [InteractionContextType.Guild],
      integration_types: [ApplicationIntegrationType.GuildInstall],
      options: [
        sub('log', 'Log a reading: a level, percent, ullage or volume', [
          tankOption(true),
          {
            type: S,
            name: 'reading',
            description: 'e.g. 52.3in, 5\' 2", 48%, ullage 14in, 410 gal',
            required: true,
            max_length: 60,
          },
          whenOption,
        ]),
        sub('delivery', 'Log a delivery', [
          tankOption(true),
          {
            type: S,
            name: 'amount',
            description: 'Delivered volume, e.g. 400 gal',
            required: true,
            max_length: 40,
          },
          { type: S, name: 'ticket', description: 'Ticket number', required: false, max_length: 64 },
          whenOption,
          {
            type: S,
            name: 'level_after',
            description: 'Level read after the delivery, e.g. 61in',
            required: false,
            max_length: 40,
          },
        ]),
        sub('ask', 'How much is left, how fast it goes, when to order', [tankOption(true)]),
        sub('list', 'Every tank by runway, or those running low', [
          {
            type: S,
            name: 'running_low',
            description: 'Only tanks whose runway ends within',
            required: false,
            choices: LOW_WINDOWS.map((w) => ({ name: w, value: w })),
          },
        ]),
        sub('setup', 'Add a tank (admins): opens a form'),
        sub('settings', 'Change a setting (admins)', [
          {
            type: S,
            name: 'setting',
            description:
              'e.g. threshold 20%, lead time 3 business days, safe fill 90%, digest 07:00 weekdays here',
            required: true,
            max_length: 200,
          },
          tankOption(false, 'The tank it applies to; leave empty for team settings'),
        ]),
        sub('timezone', "Set the team's time zone (Discord does not tell bots yours)", [
          {
            type: S,
            name: 'zone',
            description: 'e.g. America/Chicago',
            required: true,
            autocomplete: true,
            max_length: 64,
          },
        ]),
        sub('help', 'Examples of everything the bot understands', [
          {
            type: S,
            name: 'topic',
            description: 'Only this topic',
            required: false,
            choices: HELP_TOPICS.map((t) => ({ name: t, value: t })),
          },
        ]),
        sub('say', 'Any message in the bot language, e.g. "T4 52.3in at 7:30" or "undo"', [
          { type: S, name: 'message', description: 'The message', required: true, max_length: 4000 },
        ]),
      ],
    },
  ] as RESTPutAPIApplicationCommandsJSONBody;
}
