/**
 * Reply -> Block Kit message. The Reply model is the bot's; this file only lays it out within Slack's limits
 * (chat-platforms.md: text under 4,000 characters, 50 blocks a message, a `text` fallback always; Block Kit
 * reference: header text 150, section text 3,000, 10 fields of 2,000, button text 75 and value 2,000, context
 * 10 elements, actions 25 elements).
 */
import type { types } from '@slack/bolt';
import { tableToText, toPlainText } from '../../bot/replies/plainText.js';
import type { Action, Fact, Reply, Table } from '../../bot/replies/reply.js';

type KnownBlock = types.KnownBlock;

export const limits = {
  text: 3_900,
  blocksPerMessage: 50,
  headerText: 150,
  sectionText: 3_000,
  fieldsPerSection: 10,
  fieldText: 2_000,
  buttonText: 75,
  buttonValue: 2_000,
  buttonsPerBlock: 25,
} as const;

/** Every button we render carries this prefix; its value is a message in the bot's language. */
export const commandActionPrefix = 'tankrunway:cmd:';

export interface SlackMessage {
  text: string;
  blocks: KnownBlock[];
}

/** Slack's mrkdwn treats &, < and > as control characters. */
export function escapeMrkdwn(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function clip(text: string, max: number): string {
  const chars = [...text];
  return chars.length <= max ? text : `${chars.slice(0, max - 1).join('')}…`;
}

function headlineBlock(headline: string): KnownBlock {
  const clean = headline.replace(/\s+/g, ' ').trim() || ' ';
  if ([...clean].length <= limits.headerText)
    return { type: 'header', text: { type: 'plain_text', text: clean } };
  return {
    type: 'section',
    text: { type: 'mrkdwn', text: `*${escapeMrkdwn(clip(clean, limits.sectionText - 2))}*` },
  };
}

function factBlocks(facts: Fact[], budget: number): KnownBlock[] {
  const blocks: KnownBlock[] = [];
  for (let i = 0; i < facts.length && blocks.length < budget; i += limits.fieldsPerSection) {
    const fields = facts.slice(i, i + limits.fieldsPerSection).map((f) => ({
      type: 'mrkdwn' as const,
      text: clip(`*${escapeMrkdwn(f.label)}*\n${escapeMrkdwn(f.value)}`, limits.fieldText),
    }));
    blocks.push({ type: 'section', fields });
  }
  return blocks;
}

/** The table as a code block (Slack has no table block for bots), whole rows only, with a count of the rest. */
export function tableBlock(table: Table): KnownBlock {
  const lines = tableToText(table).map(escapeMrkdwn);
  const fence = '```';
  const room = limits.sectionText - 2 * fence.length - 40; // 40: the "and N more rows" note
  const kept: string[] = [];
  let size = 0;
  for (const line of lines) {
    if (size + line.length + 1 > room) break;
    kept.push(line);
    size += line.length + 1;
  }
  const dropped = lines.length - kept.length;
  const more = dropped > 0 ? `\n_and ${dropped} more row${dropped === 1 ? '' : 's'}_` : '';
  return { type: 'section', text: { type: 'mrkdwn', text: `${fence}${kept.join('\n')}${fence}${more}` } };
}

function cautionBlock(caution: string): KnownBlock {
  return {
    type: 'context',
    elements: [{ type: 'mrkdwn', text: clip(`:warning: ${escapeMrkdwn(caution)}`, limits.sectionText) }],
  };
}

function actionsBlock(actions: Action[], key: string): KnownBlock {
  return {
    type: 'actions',
    elements: actions.slice(0, limits.buttonsPerBlock).map((a, i) => ({
      type: 'button' as const,
      action_id: `${commandActionPrefix}${key}:${i}`,
      text: { type: 'plain_text' as const, text: clip(a.label.trim() || a.command, limits.buttonText) },
      value: clip(a.command, limits.buttonValue),
      ...(a.style ? { style: a.style } : {}),
    })),
  };
}

/** The blocks of one reply, at most `budget` of them (facts give way first, the headline never). */
export function replyBlocks(reply: Reply, budget: number = limits.blocksPerMessage, key = '0'): KnownBlock[] {
  const head = headlineBlock(reply.headline);
  const tail: KnownBlock[] = [];
  if (reply.table && (reply.table.rows.length > 0 || reply.table.columns.length > 0))
    tail.push(tableBlock(reply.table));
  if (reply.caution?.trim()) tail.push(cautionBlock(reply.caution));
  if (reply.actions && reply.actions.length > 0) tail.push(actionsBlock(reply.actions, key));
  const room = Math.max(0, budget - 1 - tail.length);
  const facts = reply.facts && reply.facts.length > 0 ? factBlocks(reply.facts, room) : [];
  return [head, ...facts, ...tail].slice(0, Math.max(1, budget));
}

/** One reply as one Slack message: blocks plus the plain-text fallback for notifications and screen readers. */
export function toSlackMessage(reply: Reply): SlackMessage {
  return { text: clip(toPlainText(reply), limits.text), blocks: replyBlocks(reply) };
}
