/**
 * One interaction in, the bot's replies out. Translation only: options, forms and buttons become a message
 * in the bot's language, `bot.handle` answers it (team `discord:<guild>`, deduplicated on the interaction
 * id), and the replies go back as embeds. Discord kills the token 3 s after an interaction unless something
 * was sent, so a slow answer or one with a chart is deferred first.
 */
import {
  type AutocompleteInteraction,
  type ChatInputCommandInteraction,
  type Interaction,
  MessageFlags,
  type RepliableInteraction,
} from 'discord.js';
import type { Bot } from '../../bot/bot.js';
import type { Reply } from '../../bot/replies/reply.js';
import { actionCommand } from './embed.js';
import { type ChartRenderer, type DiscordMessage, needsChart, toDiscordMessages } from './messages.js';
import { messageFor, type Options, setupMessage } from './messageText.js';
import { oneAtATime } from './oneAtATime.js';
import { readSetupForm, SETUP_MODAL_ID, setupModal } from './setupModal.js';

export interface InteractionDeps {
  bot: Bot;
  /** The team's tank codes and names for autocomplete (a bot-level lookup; adapters never read the store). */
  tankNames: (team: string) => string[] | Promise<string[]>;
  commandName: string;
  renderChart?: ChartRenderer;
  /** Defer when the bot has not answered by then; well inside Discord's 3 s. */
  deferAfterMs?: number;
  log: (line: string) => void;
}

/** Whether the interaction was answered with "thinking...", and for whom. */
type Deferred = 'no' | 'public' | 'private';

export const teamOf = (guildId: string) => `discord:${guildId}`;

const errorReply = (headline: string): Reply => ({ kind: 'error', visibility: 'sender', headline });

/** Every string option of the chosen subcommand, by name. */
function subcommandOptions(interaction: ChatInputCommandInteraction): Options {
  const options: Record<string, string> = {};
  for (const option of interaction.options.data[0]?.options ?? []) {
    if (typeof option.value === 'string') options[option.name] = option.value;
  }
  return options;
}

const ZONES = Intl.supportedValuesOf('timeZone');

/** Up to 25 choices: names that start with what was typed first, then names that contain it. */
export function suggest(all: readonly string[], typed: string): string[] {
  const t = typed.trim().toLowerCase();
  const starts = all.filter((n) => n.toLowerCase().startsWith(t));
  const contains = all.filter((n) => !n.toLowerCase().startsWith(t) && n.toLowerCase().includes(t));
  return [...new Set([...starts, ...contains])].slice(0, 25);
}

export function createInteractionHandler(deps: InteractionDeps): (interaction: Interaction) => Promise<void> {
  const deferAfterMs = deps.deferAfterMs ?? 1500;
  /** Interactions being answered now; one arriving while others are, is deferred at once. */
  let inFlight = 0;
  const botTurns = oneAtATime();

  /**
   * Sends the messages: the first as the interaction's response (or the edit of its deferred response), the
   * rest as follow-ups. A sender-only first message after a public "thinking..." replaces it privately, so an
   * error is never shown to the whole channel.
   */
  async function send(interaction: RepliableInteraction, messages: DiscordMessage[], deferred: Deferred) {
    for (const [i, m] of messages.entries()) {
      const payload = { embeds: m.embeds, files: m.files, components: m.components };
      const flagged = m.ephemeral ? { ...payload, flags: MessageFlags.Ephemeral as const } : payload;
      if (i > 0 || deferred === 'no') {
        await (i === 0 ? interaction.reply(flagged) : interaction.followUp(flagged));
      } else if (m.ephemeral && deferred === 'public') {
        await interaction.deleteReply();
        await interaction.followUp(flagged);
      } else {
        await interaction.editReply(payload);
      }
    }
  }

  /** Runs one message through the bot and answers the interaction with its replies. */
  async function answer(interaction: RepliableInteraction, text: string): Promise<void> {
    const guildId = interaction.guildId;
    if (!guildId) {
      await send(
        interaction,
        await toDiscordMessages([
          errorReply('Use this command in a server channel: each server is one team.'),
        ]),
        'no',
      );
      return;
    }
    const request = {
      team: teamOf(guildId),
      channel: interaction.channelId ?? 'unknown',
      user: interaction.user.id,
      userName:
        interaction.member && 'displayName' in interaction.member
          ? interaction.member.displayName
          : interaction.user.displayName,
      text,
      // The interaction's own time (from its id), so a replay resolves "at 7:30" exactly as the first did.
      receivedAt: interaction.createdTimestamp,
      dedupeKey: interaction.id,
    };
    let deferred: Deferred = 'no';
    // The bot's work runs on this one thread: in a burst, later interactions wait for earlier ones and no
    // timer can fire meanwhile. So when others are in flight, acknowledge first, then queue for the bot. If
    // that acknowledgement fails, the person sees the interaction fail and sends it again: nothing is stored
    // for this one, so the retry is not a duplicate.
    const busy = inFlight > 0;
    inFlight++;
    let replies: Reply[];
    try {
      if (busy) {
        await interaction.deferReply();
        deferred = 'public';
      }
      const handling = botTurns.run(() => deps.bot.handle(request));
      if (deferred === 'no') {
        let timer: NodeJS.Timeout | undefined;
        const late = new Promise<'late'>((resolve) => {
          timer = setTimeout(() => resolve('late'), deferAfterMs);
        });
        const first = await Promise.race([handling, late]);
        clearTimeout(timer);
        if (first === 'late') {
          // Most replies are for the channel; a private one then replaces "thinking..." (see send).
          await interaction.deferReply();
          deferred = 'public';
        }
      }
      replies = await handling;
    } finally {
      inFlight--;
    }
    if (replies.length === 0) replies.push({ kind: 'notice', visibility: 'sender', headline: 'Done.' });
    if (deferred === 'no' && needsChart(replies)) {
      const ephemeral = replies[0]?.visibility === 'sender';
      await interaction.deferReply(ephemeral ? { flags: MessageFlags.Ephemeral } : {});
      deferred = ephemeral ? 'private' : 'public';
    }
    const messages = await toDiscordMessages(replies, deps.renderChart, (e) =>
      deps.log(`chart failed: ${String(e)}`),
    );
    await send(interaction, messages, deferred);
  }

  async function refuse(interaction: RepliableInteraction, problem: string): Promise<void> {
    await send(interaction, await toDiscordMessages([errorReply(problem)]), 'no');
  }

  async function autocomplete(interaction: AutocompleteInteraction): Promise<void> {
    const focused = interaction.options.getFocused(true);
    const typed = String(focused.value ?? '');
    let names: string[] = [];
    if (focused.name === 'zone') names = suggest(ZONES, typed);
    else if (focused.name === 'tank' && interaction.guildId) {
      names = suggest(await deps.tankNames(teamOf(interaction.guildId)), typed);
    }
    await interaction.respond(names.map((n) => ({ name: n.slice(0, 100), value: n.slice(0, 100) })));
  }

  async function chatInput(interaction: ChatInputCommandInteraction): Promise<void> {
    const sub = interaction.options.getSubcommand(false) ?? 'help';
    if (sub === 'setup') {
      await interaction.showModal(setupModal());
      return;
    }
    const text = messageFor(sub, subcommandOptions(interaction));
    if (!text.ok) return refuse(interaction, text.error);
    await answer(interaction, text.value);
  }

  return async (interaction) => {
    try {
      if (interaction.isAutocomplete()) {
        if (interaction.commandName === deps.commandName) await autocomplete(interaction);
      } else if (interaction.isChatInputCommand()) {
        if (interaction.commandName === deps.commandName) await chatInput(interaction);
      } else if (interaction.isModalSubmit()) {
        if (interaction.customId !== SETUP_MODAL_ID) return;
        const text = setupMessage(readSetupForm(interaction));
        await (text.ok ? answer(interaction, text.value) : refuse(interaction, text.error));
      } else if (interaction.isButton()) {
        const command = actionCommand(interaction.customId);
        if (command) await answer(interaction, command);
      }
    } catch (error) {
      // An expired token or a platform error: log it; one failed interaction never stops the adapter.
      deps.log(
        `interaction ${interaction.id} failed: ${error instanceof Error ? error.message : String(error)}`,
      );
    }
  };
}
