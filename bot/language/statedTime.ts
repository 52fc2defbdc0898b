import * as chrono from 'chrono-node';
import { DateTime } from 'luxon';
import { fail, ok, type Result } from '../../engine/result.js';
import { instantOfLocal } from '../schedule/local-time.js';
import type { StatedTime } from './command.js';
import { checkTeamZone } from './teamZone.js';

/**
 * Where a time in words starts inside a message ("... at 7:30", "... yesterday 4pm", "... 2026-11-02 07:30").
 * The words before it are the reading or delivery, the words from it on are the time.
 */
const TIME_MARKER =
  /\s(?=(?:at|on|@)\s|(?:yesterday|today|tonight|this\s+(?:morning|afternoon|evening)|last\s+(?:night|evening))\b|\d{4}-\d{2}-\d{2}|(?:mon|tue|wed|thu|fri|sat|sun)[a-z]*\b|\d+\s*(?:minutes?|mins?|hours?|hrs?|h|days?)\s+ago\b|\d{1,2}:\d{2}\b|\d{1,2}(?:[.:]\d{2})?\s*[ap]\.?m\b)/i;

/** Splits "60in at 7:30" into the body "60in" and the time words "at 7:30" (if any). */
export function splitStatedTime(text: string): { body: string; timeText?: string } {
  const match = TIME_MARKER.exec(` ${text}`);
  const trailing = /[\s,;]+$/;
  if (!match) return { body: text.trim().replace(trailing, '') };
  const at = match.index; // index in the padded text = index of the space before the marker in `text` + 1
  return { body: text.slice(0, at).replace(trailing, ''), timeText: text.slice(at).trim() };
}

/** Little words around a time that carry no meaning of their own. */
const FILLER = /\b(?:at|on|around|about|approx)\b|@|,/gi;

const HOW_TO_WRITE = 'write it like `at 7:30`, `yesterday 4pm` or `at 2026-11-02 07:30`';

const MAX_TIME_CHARS = 80;

export interface TimeContext {
  now: number;
  timeZone: string;
}

/**
 * A time in words -> an instant. Without a zone or offset in the words it is a wall-clock time in the
 * team's zone (DST handled by bot/schedule's one rule); an explicit zone or offset wins.
 */
export function resolveStatedTime(raw: string, context: TimeContext): Result<StatedTime> {
  // Real time phrases are short; a long run of words is not one, and the date library is slow on it.
  if (raw.length > MAX_TIME_CHARS)
    return fail(`"${raw.slice(0, 40)}…" is too long for a time; ${HOW_TO_WRITE}.`);
  // A zone named in the words ("at 07:30 Europe/Berlin") wins over the team's.
  const named = /\s((?:[A-Za-z_]+\/)+[A-Za-z_+-]+)$/.exec(raw);
  if (named?.[1] && checkTeamZone(named[1]).ok) {
    const inZone = resolveInZone(raw.slice(0, named.index), { ...context, timeZone: named[1] });
    return inZone.ok ? ok({ at: inZone.value.at, raw }) : inZone;
  }
  return resolveInZone(raw, context);
}

function resolveInZone(raw: string, context: TimeContext): Result<StatedTime> {
  const zone = checkTeamZone(context.timeZone);
  if (!zone.ok)
    return fail(
      `The team's time zone is not usable: ${zone.error} Set it with \`set time zone America/Chicago\`.`,
    );
  const offset = DateTime.fromMillis(context.now, { zone: context.timeZone }).offset;
  const results = chrono.parse(raw, { instant: new Date(context.now), timezone: offset });
  const first = results[0];
  if (results.length !== 1 || !first) return fail(`I could not read the time "${raw}"; ${HOW_TO_WRITE}.`);
  const leftover = (raw.slice(0, first.index) + raw.slice(first.index + first.text.length)).replace(
    FILLER,
    '',
  );
  if (leftover.trim() !== '') {
    return fail(`I could not read "${leftover.trim()}" in the time "${raw}"; ${HOW_TO_WRITE}.`);
  }
  if (first.end) return fail(`"${raw}" is a range; give one time, e.g. \`at 7:30\`.`);
  const start = first.start;
  // "yesterday", "on monday", "last night" name a day or a part of it, not when the gauge was read.
  if (!start.isCertain('hour') && !/\bago\b/i.test(raw)) {
    return fail(`"${raw}" does not say the time of day; add it, e.g. \`yesterday 4pm\` or \`monday 7:30\`.`);
  }
  const at = start.isCertain('timezoneOffset')
    ? start.date().getTime()
    : instantOfLocal(
        { year: start.get('year') ?? 0, month: start.get('month') ?? 0, day: start.get('day') ?? 0 },
        { hour: start.get('hour') ?? 0, minute: start.get('minute') ?? 0 },
        context.timeZone,
      ) +
      (start.get('second') ?? 0) * 1000;
  if (!Number.isFinite(at)) return fail(`I could not read the time "${raw}"; ${HOW_TO_WRITE}.`);
  return ok({ at, raw });
}

/** Clocks on phones and servers differ a little; a reading this far ahead of "now" is still accepted. */
const FUTURE_SLACK_MS = 10 * 60_000;

/** A time a reading or delivery happened: it must not be in the future. */
export function resolvePastTime(raw: string, context: TimeContext): Result<StatedTime> {
  const stated = resolveStatedTime(raw, context);
  if (!stated.ok) return stated;
  if (stated.value.at > context.now + FUTURE_SLACK_MS) {
    const when = DateTime.fromMillis(stated.value.at, { zone: context.timeZone }).toFormat(
      'yyyy-LL-dd HH:mm',
    );
    return fail(
      `"${raw}" means ${when} (${context.timeZone}), which is still to come; give a past time, e.g. \`yesterday 7:30\` or a full date.`,
    );
  }
  return stated;
}
