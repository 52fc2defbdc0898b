import { fail, ok, type Result } from '../../engine/result.js';
import type { CommandOf, Measurement, ParseContext, StatedTime } from './command.js';
import { parseMeasurement, parseVolume } from './measurement.js';
import { resolvePastTime, splitStatedTime } from './statedTime.js';
import { matchTankPrefix, unknownTankMessage } from './tankName.js';
import { DELIVERY_VERBS } from './words.js';

const TICKET =
  /\s(?:ticket|tkt|invoice|bol)\s*(?:no\.?|number|#)?\s*[:#]?\s*([A-Za-z0-9][A-Za-z0-9-]{0,63})(?=\s|$)/i;
const LEVEL_AFTER =
  /\s(?:level\s+after|after\s+level|level\s+now|level|now\s+at|reads?\s+after)\s*[:=]?\s+(?=[\d.]|ullage\b)/i;
const VERB = DELIVERY_VERBS.map((v) => v.replace(/\s+/g, '\\s+')).join('|');
const DELIVERED_TO = new RegExp(`^(?:${VERB})\\s+(.+?)\\s+(?:to|into|for)\\s+(.+)$`, 'i');
const TANK_FIRST = new RegExp(`^(?:${VERB})\\s+(?:(?:to|into|for)\\s+)?(.+)$`, 'i');

export const DELIVERY_WORDS = new RegExp(`^(?:${VERB})\\b`, 'i');

interface Extras {
  body: string;
  ticket?: string;
  levelAfter?: Measurement;
  time?: StatedTime;
}

/** Pulls the optional parts (ticket, level after, time) out of a delivery message, in any order. */
function extractExtras(text: string, context: ParseContext): Result<Extras> {
  let body = ` ${text}`;
  const extras: Omit<Extras, 'body'> = {};
  const ticket = TICKET.exec(body);
  if (ticket) {
    extras.ticket = ticket[1];
    body = body.slice(0, ticket.index) + body.slice(ticket.index + ticket[0].length);
  }
  const after = LEVEL_AFTER.exec(body);
  if (after) {
    const tail = body.slice(after.index + after[0].length);
    const { body: levelText, timeText } = splitStatedTime(tail);
    const level = parseMeasurement(levelText);
    if (!level.ok) return fail(`The level after the delivery: ${level.error}`);
    if (level.value.kind === 'volume') {
      return fail(
        'The level after a delivery is a level (e.g. `level after 61in` or `level after 80%`), not a volume.',
      );
    }
    extras.levelAfter = level.value;
    body = `${body.slice(0, after.index)} ${timeText ?? ''}`;
  }
  const { body: core, timeText } = splitStatedTime(body.trim());
  if (timeText !== undefined) {
    const time = resolvePastTime(timeText, context);
    if (!time.ok) return time;
    extras.time = time.value;
  }
  return ok({ body: core, ...extras });
}

function build(tank: string, volumeText: string, extras: Extras, raw: string): Result<CommandOf<'delivery'>> {
  const volume = parseVolume(volumeText.trim(), 'the delivered volume');
  if (!volume.ok) return fail(`${volume.error} Write a delivery like \`delivered 150 gal to ${tank}\`.`);
  if (volume.value.value === 0)
    return fail('A delivery of 0 adds nothing; give the volume delivered, e.g. 150 gal.');
  const { body: _body, ...rest } = extras;
  return ok({ type: 'delivery', tank, volume: volume.value, ...rest, raw });
}

/** "delivered 150 gal to T4 [ticket 8812] [level after 61in] [at 10:00]". */
export function parseDeliveredTo(text: string, context: ParseContext): Result<CommandOf<'delivery'>> {
  const extras = extractExtras(text, context);
  if (!extras.ok) return extras;
  const match = DELIVERED_TO.exec(extras.value.body);
  // "delivered to T4 150 gal", "delivery T4 150 gal": the tank first.
  const tankFirst = TANK_FIRST.exec(extras.value.body);
  const known = matchTankPrefix(tankFirst?.[1] ?? '', context.tankNames);
  if (known && known.rest !== '' && /^[\d.]/.test(known.rest))
    return build(known.tank, known.rest, extras.value, text);
  if (!match) {
    return fail(
      'Write a delivery like `delivered 150 gal to T4`, optionally with `ticket 8812`, `level after 61in` and a time.',
    );
  }
  const tankText = (match[2] ?? '').trim();
  const tank = matchTankPrefix(tankText, context.tankNames);
  if (tank?.rest !== '') return fail(unknownTankMessage(tankText, context.tankNames));
  return build(tank.tank, match[1] ?? '', extras.value, text);
}

/** After a tank name: "+400 gal ..." or "delivered 400 gal ...". */
export function parseTankDelivery(
  tank: string,
  rest: string,
  raw: string,
  context: ParseContext,
): Result<CommandOf<'delivery'>> {
  const extras = extractExtras(rest, context);
  if (!extras.ok) return extras;
  const volumeText = extras.value.body.replace(/^\+\s*/, '').replace(DELIVERY_WORDS, '');
  return build(tank, volumeText, extras.value, raw);
}
