/**
 * Reply -> a Discord message: one embed (headline as title, facts as fields, the table as a code block, the
 * caution as the last field), the chart as an attached PNG shown in the embed, and the reply's actions as
 * buttons. Kept inside Discord's embed limits (chat-platforms.md) by trimming, never by failing.
 */
import {
  type APIActionRowComponent,
  type APIButtonComponent,
  type APIEmbed,
  ButtonStyle,
  ComponentType,
} from 'discord.js';
import { tableToText } from '../../bot/replies/plainText.js';
import type { Reply, ReplyKind } from '../../bot/replies/reply.js';

/** Our own colours per kind of reply (the chart's blue for answers). */
export const KIND_COLORS: Record<ReplyKind, number> = {
  confirmation: 0x2f855a,
  answer: 0x1f5fa8,
  question: 0xb7791f,
  error: 0xc0262d,
  help: 0x6b7280,
  digest: 0x0f766e,
  notice: 0xd9730d,
};

/** Discord's embed limits (discord.com developer docs, "Embed Limits"; the same figures in chat-platforms.md). */
export const LIMITS = {
  title: 256,
  description: 4096,
  fields: 25,
  fieldName: 256,
  fieldValue: 1024,
  total: 6000,
};

/** Prefix of a button's custom id; the rest is a message in the bot's language. */
export const ACTION_PREFIX = 'tr:';
const CUSTOM_ID_MAX = 100;

/** At most `max` UTF-16 units (the stricter count), cut between code points so no emoji is split. */
export function truncate(text: string, max: number): string {
  if (text.length <= max) return text;
  let kept = '';
  for (const char of text) {
    if (kept.length + char.length > max - 1) break;
    kept += char;
  }
  return `${kept}…`;
}

/**
 * Wider than this, a code block wraps into a jumble on a phone (Discord's mobile code blocks show roughly
 * 40-60 monospace characters; from memory), so a wide table becomes one line per row instead.
 */
export const MAX_CODE_WIDTH = 56;

/** Markdown characters in a cell would turn into formatting outside a code block. */
const escapeMarkdown = (text: string) => text.replace(/([\\*_`~|[\]])/g, '\\$1');

function rowLines(reply: Reply): string[] {
  const rows = reply.table?.rows ?? [];
  return rows.map((row) => {
    const [first = '', ...rest] = row.map((c) => c.trim()).filter((c) => c !== '');
    return [`**${escapeMarkdown(first)}**`, ...rest.map(escapeMarkdown)].join(' · ');
  });
}

/** The table as a code block (or, when too wide, a line per row) that fits `budget` characters. */
function tableBlock(reply: Reply, budget: number): string {
  if (!reply.table) return '';
  const [header = '', rule = '', ...rows] = tableToText(reply.table);
  const wide = Math.max(...[header, ...rows].map((l) => [...l].length)) > MAX_CODE_WIDTH;
  const lines = wide ? rowLines(reply) : rows;
  const wrap = (shown: string[], more: number) => {
    const body = wide
      ? shown.join('\n')
      : `\`\`\`\n${[header, rule, ...shown].join('\n').replaceAll('```', "'''")}\n\`\`\``;
    return `${body}${more > 0 ? `\n…and ${more} more` : ''}`;
  };
  const fits = (n: number) => wrap(lines.slice(0, n), lines.length - n).length <= budget;
  // The most rows that fit: a binary search, since a long table would take one wrap per row otherwise.
  let [low, high] = [0, lines.length];
  while (low < high) {
    const mid = Math.ceil((low + high) / 2);
    if (fits(mid)) low = mid;
    else high = mid - 1;
  }
  const block = wrap(lines.slice(0, low), lines.length - low);
  return block.length <= budget ? block : '';
}

function embedSize(embed: APIEmbed): number {
  const fields = (embed.fields ?? []).reduce((n, f) => n + f.name.length + f.value.length, 0);
  return (
    (embed.title?.length ?? 0) + (embed.description?.length ?? 0) + fields + (embed.footer?.text.length ?? 0)
  );
}

/**
 * The embed of one reply. `chartName` is the attachment's file name when a chart PNG goes with it.
 */
export function replyEmbed(reply: Reply, chartName?: string): APIEmbed {
  const [firstLine = '', ...moreLines] = reply.headline.split('\n');
  const title = firstLine.trim() || '(no headline)';
  const intro = [title.length > LIMITS.title ? title : '', ...moreLines].filter(Boolean).join('\n').trim();
  const caution = reply.caution
    ? { name: 'Caution', value: truncate(reply.caution, LIMITS.fieldValue), inline: false }
    : undefined;
  // The caution is kept whatever else must go; facts fill what is left of the total, in order.
  let budget =
    LIMITS.total -
    Math.min(title.length, LIMITS.title) -
    (caution ? caution.name.length + caution.value.length : 0);
  const fields: { name: string; value: string; inline: boolean }[] = [];
  for (const f of (reply.facts ?? []).slice(0, LIMITS.fields - 1)) {
    const field = {
      name: truncate(f.label || '-', LIMITS.fieldName),
      value: truncate(f.value || '-', LIMITS.fieldValue),
      inline: f.value.length <= 40,
    };
    if (field.name.length + field.value.length > budget) break;
    budget -= field.name.length + field.value.length;
    fields.push(field);
  }
  if (caution) fields.push(caution);
  const embed: APIEmbed = {
    title: truncate(title, LIMITS.title),
    color: KIND_COLORS[reply.kind] ?? KIND_COLORS.notice,
  };
  if (fields.length > 0) embed.fields = fields;
  if (chartName) embed.image = { url: `attachment://${chartName}` };
  const room = Math.min(LIMITS.description, LIMITS.total - embedSize(embed) - 2);
  const introText = truncate(intro, Math.max(0, Math.min(room, LIMITS.description)));
  const table = tableBlock(reply, room - introText.length - 2);
  const description = [introText, table].filter(Boolean).join('\n\n');
  if (description) embed.description = description;
  return embed;
}

/** The reply's actions as buttons (five to a row); an action too long for a custom id is left out. */
export function actionRows(reply: Reply): APIActionRowComponent<APIButtonComponent>[] {
  const buttons: APIButtonComponent[] = (reply.actions ?? [])
    .filter((a) => (ACTION_PREFIX + a.command).length <= CUSTOM_ID_MAX)
    .slice(0, 25)
    .map((a) => ({
      type: ComponentType.Button,
      style:
        a.style === 'danger'
          ? ButtonStyle.Danger
          : a.style === 'primary'
            ? ButtonStyle.Primary
            : ButtonStyle.Secondary,
      label: truncate(a.label || a.command, 80),
      custom_id: ACTION_PREFIX + a.command,
    }));
  const rows: APIActionRowComponent<APIButtonComponent>[] = [];
  for (let i = 0; i < buttons.length; i += 5) {
    rows.push({ type: ComponentType.ActionRow, components: buttons.slice(i, i + 5) });
  }
  return rows;
}

/** The message text behind a button, or undefined when the custom id is not ours. */
export function actionCommand(customId: string): string | undefined {
  return customId.startsWith(ACTION_PREFIX) ? customId.slice(ACTION_PREFIX.length) : undefined;
}
