import { DateTime } from 'luxon';
import { fail, ok, type Result } from '../../engine/result.js';
import type { CommandOf, ParseContext } from './command.js';
import { matchTankPrefix, unknownTankMessage } from './tankName.js';
import { checkTeamZone } from './teamZone.js';

const HOW_LONG =
  /^how\s+long\s+(?:does|will|would|can|is|for)?\s*(.+?)(?:\s+(?:last|go|run|keep\s+going|good\s+for|hold\s+out))?\s*\??$/i;
const WHEN_EMPTY =
  /^when\s+(?:does|will|do|is)\s+(.+?)\s+(?:run\s+(?:out|dry|low)|empty|go\s+(?:dry|empty)|need\s+(?:a\s+)?(?:refill|order|delivery))\s*\??$/i;
const HOW_MUCH =
  /^how\s+much\s+(?:is\s+|do\s+we\s+have\s+)?(?:left\s+)?(?:in\s+)?(.+?)(?:\s+(?:left|now))?\s*\??$/i;
const STATUS_OF = /^(?:status|level|show|runway|how\s+is|how's)\s+(?:of\s+)?(.+?)\s*\??$/i;
const RUNNING_LOW =
  /^(?:(?:which|what)\s+(?:tanks?\s+)?(?:will\s+|are\s+|is\s+|do\s+|does\s+)?(?:runs?|running|go(?:es)?|get(?:s)?|getting)\s+low|(?:running\s+)?low|who(?:'s|\s+is)?\s+(?:running\s+)?low|anything\s+(?:running\s+)?low|(?:what|which\s+tanks?)\s+(?:needs?|to|should\s+(?:i|we))\s+(?:order(?:ing)?|refill(?:ing)?|top\s+up))\b\s*(.*?)\s*\??$/i;

/** A question about one tank: "how long does T4 last?", "when does T4 run out?", "status T4". */
export function parseTankQuestion(
  text: string,
  context: ParseContext,
): Result<CommandOf<'tank-question'>> | undefined {
  const match = HOW_LONG.exec(text) ?? HOW_MUCH.exec(text) ?? WHEN_EMPTY.exec(text) ?? STATUS_OF.exec(text);
  if (!match) return undefined;
  const words = (match[1] ?? '').replace(/^(?:the\s+)?(?:tank\s+)?/i, '').trim();
  const known = matchTankPrefix(words, context.tankNames);
  if (known && known.rest === '') return ok({ type: 'tank-question', tank: known.tank });
  return fail(unknownTankMessage(words, context.tankNames));
}

const DAY_MS = 86_400_000;

/** "this week", "today", "tomorrow", "next week", "this month", "next 10 days", "in 3 days" -> an instant. */
export function resolveWindow(
  words: string,
  context: ParseContext,
): Result<{ until: number; window: string }> {
  const zone = checkTeamZone(context.timeZone);
  if (!zone.ok) return fail(`The team's time zone is not usable: ${zone.error}`);
  const local = DateTime.fromMillis(context.now, { zone: context.timeZone });
  const w = words
    .toLowerCase()
    .replace(/^(?:by|before|within|over|during|for)\s+/, '')
    .replace(/^the\s+/, '')
    .trim();
  const fixed: Record<string, () => DateTime> = {
    '': () => local.plus({ days: 7 }),
    today: () => local.endOf('day'),
    tonight: () => local.endOf('day'),
    tomorrow: () => local.plus({ days: 1 }).endOf('day'),
    'this week': () => local.endOf('week'),
    'next week': () => local.plus({ weeks: 1 }).endOf('week'),
    'this month': () => local.endOf('month'),
    'next month': () => local.plus({ months: 1 }).endOf('month'),
    'this weekend': () => local.endOf('week'),
  };
  const known = fixed[w];
  if (known) return ok({ until: known().toMillis(), window: w === '' ? 'the next 7 days' : w });
  const days = /^(?:next|in|coming)?\s*(\d{1,3})\s*(?:days?|d)$/.exec(w);
  const weeks = /^(?:next|in|coming)?\s*(\d{1,2})\s*(?:weeks?|wk)$/.exec(w);
  if (days) return ok({ until: context.now + Number(days[1]) * DAY_MS, window: `the next ${days[1]} days` });
  if (weeks)
    return ok({ until: context.now + Number(weeks[1]) * 7 * DAY_MS, window: `the next ${weeks[1]} weeks` });
  return fail(
    `I could not read the window "${words}"; ask like \`which tanks run low this week?\`, \`... today\`, \`... tomorrow\` or \`... in 10 days\`.`,
  );
}

/** "which tanks run low this week?", "what runs low tomorrow", "low in 10 days". */
export function parseRunningLow(
  text: string,
  context: ParseContext,
): Result<CommandOf<'running-low'>> | undefined {
  const match = RUNNING_LOW.exec(text);
  if (!match) return undefined;
  const window = resolveWindow(match[1] ?? '', context);
  if (!window.ok) return window;
  return ok({ type: 'running-low', ...window.value });
}
