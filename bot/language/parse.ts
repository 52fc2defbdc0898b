import { closest, distance } from 'fastest-levenshtein';
import { fail, ok, type Result } from '../../engine/result.js';
import { type Command, commandSchema, type ParseContext } from './command.js';
import { parseAddTank } from './parseAddTank.js';
import { parseDeleteReading, parseUnitCorrection } from './parseCorrection.js';
import { DELIVERY_WORDS, parseDeliveredTo, parseTankDelivery } from './parseDelivery.js';
import { parseHelp } from './parseHelp.js';
import { parseRunningLow, parseTankQuestion } from './parseQuestion.js';
import { parseReading } from './parseReading.js';
import { parseSet } from './parseSetting.js';
import { parseStrappingLines } from './parseStrappingRows.js';
import {
  isReservedWord,
  isTankNameShaped,
  matchTankPrefix,
  typedTankPrefix,
  unknownTankMessage,
} from './tankName.js';
import {
  CANCEL_WORDS,
  COMMAND_EXAMPLES,
  COMMAND_WORDS,
  DELIVERY_VERBS,
  DIGEST_NOW_WORDS,
  DONE_WORDS,
  NO_WORDS,
  OVERVIEW_WORDS,
  ULLAGE_WORDS,
  UNDO_WORDS,
  YES_WORDS,
} from './words.js';

/** Longer than any command a person types; a strapping table may be long, one command line is not. */
const MAX_MESSAGE_CHARS = 20_000;
const MAX_LINE_CHARS = 400;
const TRY = 'Log a reading like `T4 60in`, ask `T4?`, or send `help` for examples.';
/** Said only if a parser threw, which the fuzz tests check never happens. */
export const INTERNAL_PARSE_ERROR =
  'Something in that message tripped me up; please rephrase it, or send `help` for examples.';

/** Typographic quotes and spaces from phones and word processors, made plain. */
function normalise(text: string): string {
  return text
    .replace(/[\u2018\u2019\u2032]/g, "'")
    .replace(/[\u201C\u201D\u2033]/g, '"')
    .replace(/[\u00A0\u2007\u202F]/g, ' ')
    .replace(/\r\n?/g, '\n');
}

/** The one entry: a message's text -> a zod-checked Command, or an error that says what to fix. */
export function parseMessage(text: string, context: ParseContext): Result<Command> {
  let parsed: Result<Command>;
  try {
    parsed = route(typeof text === 'string' ? text : '', context);
  } catch {
    return fail(INTERNAL_PARSE_ERROR);
  }
  if (!parsed.ok) return parsed;
  const checked = commandSchema.safeParse(parsed.value);
  if (!checked.success) {
    const issue = checked.error.issues[0];
    return fail(
      `Part of that message is out of range (${issue?.path.join('.') || 'value'}: ${issue?.message ?? 'invalid'}); check the numbers and send it again.`,
    );
  }
  return ok(checked.data);
}

function route(text: string, context: ParseContext): Result<Command> {
  if (text.length > MAX_MESSAGE_CHARS)
    return fail(`That message is too long (${text.length} characters); send at most ${MAX_MESSAGE_CHARS}.`);
  // Table lines keep their tabs (a pasted spreadsheet); the command line has its spaces made single.
  const lines = normalise(text)
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l !== '');
  const [firstLine, ...more] = lines;
  if (firstLine === undefined) return fail(`The message is empty. ${TRY}`);
  const first = firstLine.replace(/\s+/g, ' ');
  const word = first.toLowerCase().replace(/[.!]+$/, '');

  if (context.awaiting === 'setup-answer') {
    if (CANCEL_WORDS.has(word)) return ok({ type: 'cancel' });
    const help = parseHelp(first);
    if (help && lines.length === 1) return help;
    return ok({ type: 'setup-answer', text: lines.join('\n') });
  }
  if (context.awaiting === 'strapping-rows') {
    if (CANCEL_WORDS.has(word)) return ok({ type: 'cancel' });
    if (/^[\d.+-]/.test(first) || DONE_WORDS.has(word)) return strappingRows(lines);
    // A header pasted with the rows: plain "level,volume" is skipped; one naming units cannot be checked here.
    if (/^level\s*[,;\t]\s*volume$/i.test(firstLine))
      return more.length > 0 ? strappingRows(more) : ok({ type: 'strapping-rows', rows: [], done: false });
    if (/^level\S*\s*[,;\t]\s*volume/i.test(firstLine)) {
      return fail(
        'Leave out the header: send the rows as bare numbers in the units given with `add tank` (one `level,volume` a line), then `done`.',
      );
    }
  }
  if (first.length > MAX_LINE_CHARS)
    return fail(`That line is too long; one command is at most ${MAX_LINE_CHARS} characters. ${TRY}`);
  if (/^(?:add|new|create)\s+tank\b/i.test(first)) {
    const rest = first.replace(/^(?:add|new|create)\s+tank\b/i, '').trim();
    if (rest === '' && more.length === 0) return ok({ type: 'add-tank-guided' });
    return parseAddTank(rest, more, lines.join('\n'), context);
  }
  if (more.length > 0) {
    return fail(
      `Send one command per message (this one has ${lines.length} lines); only \`add tank NAME strapping\` takes table lines after it.`,
    );
  }
  return routeLine(first, word, context);
}

function strappingRows(lines: readonly string[]): Result<Command> {
  const table = parseStrappingLines(lines);
  if (!table.ok) return fail(`${table.error} Or send \`done\` to finish, \`cancel\` to stop.`);
  return ok({ type: 'strapping-rows', rows: table.value.rows, done: table.value.done });
}

function routeLine(line: string, word: string, context: ParseContext): Result<Command> {
  // A known tank name followed by a reading, a delivery or a question wins over a command word it starts
  // with ("delivery-1 60in" is tank delivery-1).
  const known = matchTankPrefix(line, context.tankNames);
  if (known && (known.rest === '' || AFTER_TANK.test(known.rest)))
    return afterTank(known.tank, known.rest, line, context);

  const help = parseHelp(line);
  if (help) return help;
  if (UNDO_WORDS.has(word)) return ok({ type: 'undo' });
  if (YES_WORDS.has(word)) return ok({ type: 'confirm', answer: true });
  if (NO_WORDS.has(word)) return ok({ type: 'confirm', answer: false });
  if (CANCEL_WORDS.has(word)) return ok({ type: 'cancel' });
  if (DONE_WORDS.has(word)) return ok({ type: 'strapping-rows', rows: [], done: true });
  if (DIGEST_NOW_WORDS.has(word)) return ok({ type: 'digest-now' });
  if (OVERVIEW_WORDS.has(word.replace(/\s*\?$/, ''))) return ok({ type: 'overview' });

  const tankAction = /^(remove|delete|drop)\s+tank\s+(.+)$/i.exec(line);
  if (tankAction) return knownTank(tankAction[2] ?? '', context, (tank) => ({ type: 'remove-tank', tank }));
  if (/^rename\b/i.test(line)) return parseRename(line, context);
  if (/^set\b/i.test(line)) return parseSet(line, context);

  const special =
    parseDeleteReading(line, context) ??
    parseUnitCorrection(line) ??
    (DELIVERY_WORDS.test(line) ? parseDeliveredTo(line, context) : undefined) ??
    parseRunningLow(line, context) ??
    parseTankQuestion(line, context);
  if (special) return special;

  if (known) return afterTank(known.tank, known.rest, line, context);
  return notUnderstood(line, context);
}

/** The start of what may follow a tank name: a number, `+`, `?`, `:`, or a word of a reading or delivery. */
const AFTER_TANK = new RegExp(
  `^(?:[\\d.+?:=]|(?:${[...ULLAGE_WORDS, 'status', 'runway', 'level', 'is', 'reads?', 'at\\s+[\\d.]'].join('|')})\\b|(?:${DELIVERY_VERBS.join('|')})\\b)`,
  'i',
);

/** What follows a known tank name: "?", "+400 gal", "delivered 400 gal", "60in", "ullage 14in". */
function afterTank(tank: string, rest: string, line: string, context: ParseContext): Result<Command> {
  const r = rest.toLowerCase();
  if (r === '' || /^(?:\?|status\??|runway\??|level\?)$/.test(r)) {
    return r === ''
      ? fail(`What about ${tank}? Log a reading like \`${tank} 60in\`, or ask \`${tank}?\`.`)
      : ok({ type: 'tank-question', tank });
  }
  if (rest.startsWith('+') || DELIVERY_WORDS.test(rest)) return parseTankDelivery(tank, rest, line, context);
  return parseReading(tank, rest, line, context);
}

function knownTank(text: string, context: ParseContext, build: (tank: string) => Command): Result<Command> {
  const name = text.trim().replace(/\?$/, '');
  const known = matchTankPrefix(name, context.tankNames);
  if (known?.rest !== '') return fail(unknownTankMessage(name, context.tankNames));
  return ok(build(known.tank));
}

/** "rename tank T4 to GEN-1", "rename T4 GEN-1". */
function parseRename(line: string, context: ParseContext): Result<Command> {
  const m = /^rename\s+(?:tank\s+)?(.+?)\s+(?:to\s+|as\s+|->\s*)?(\S+)$/i.exec(line);
  if (!m) return fail('Write it like `rename tank T4 to GEN-1`.');
  const newName = m[2] ?? '';
  if (!isTankNameShaped(newName) || isReservedWord(newName)) {
    return fail(
      `"${newName}" cannot be a tank code; use letters and digits, e.g. \`rename tank T4 to GEN-1\`.`,
    );
  }
  const renamed = knownTank(m[1] ?? '', context, (tank) => ({ type: 'rename-tank', tank, newName }));
  const taken = context.tankNames.find((n) => n.toLowerCase() === newName.toLowerCase());
  if (renamed.ok && taken) return fail(`There is already a tank ${taken}; choose another name.`);
  return renamed;
}

const shorten = (line: string): string => (line.length > 60 ? `${line.slice(0, 60)}…` : line);

/** Neither a command nor a known tank: suggest the nearest command word or tank name. */
function notUnderstood(line: string, context: ParseContext): Result<Command> {
  const m = /^([^\s?+]+)\s*(.*)$/.exec(line);
  const first = (m?.[1] ?? line).slice(0, 64);
  const rest = (m?.[2] ?? '').trim();
  const lower = first.toLowerCase();
  const looksLikeReading =
    /^[\d.+?]/.test(rest) ||
    ULLAGE_WORDS.has(rest.split(' ')[0]?.toLowerCase() ?? '') ||
    (rest === '' && line.endsWith('?'));
  if (looksLikeReading && isTankNameShaped(first)) return fail(unknownTankMessage(first, context.tankNames));
  const nearCommand = closest(lower, COMMAND_WORDS);
  if (
    /^\p{L}+$/u.test(lower) &&
    lower.length >= 2 &&
    distance(lower, nearCommand) <= (lower.length > 5 ? 2 : 1)
  ) {
    const example = COMMAND_EXAMPLES[nearCommand] ?? 'help';
    const lead =
      lower === nearCommand ? `I could not follow "${shorten(line)}".` : `I did not understand "${first}".`;
    return fail(`${lead} Did you mean \`${example}\`? Send \`help\` for more examples.`);
  }
  const typed = typedTankPrefix(line, context.tankNames);
  if (typed !== undefined) return fail(unknownTankMessage(typed, context.tankNames));
  const shown = shorten(line);
  return fail(`I did not understand "${shown}". ${TRY}`);
}
