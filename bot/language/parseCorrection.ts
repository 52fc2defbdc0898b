import { fail, ok, type Result } from '../../engine/result.js';
import { parseUnit } from '../../engine/units/index.js';
import { readClockTime } from './clockWords.js';
import { type CommandOf, lengthUnitSchema, type ParseContext, volumeUnitSchema } from './command.js';
import { matchTankPrefix, unknownTankMessage } from './tankName.js';

const DELETE_READING =
  /^(?:delete|remove|drop|discard)\s+(?:the\s+)?(?:(.+?)(?:'s)?\s+)?(\d{1,2}(?:[:.]\d{2})?\s*(?:[ap]\.?m\.?)?)\s+(?:reading|one|entry)(?:\s+(?:of|for|on|from)\s+(.+?))?\s*$/i;

/** "delete the 7:30 reading", "delete the 7:30 reading of T4", "delete T4's 4pm reading". */
export function parseDeleteReading(
  text: string,
  context: ParseContext,
): Result<CommandOf<'delete-reading'>> | undefined {
  const m = DELETE_READING.exec(text);
  if (!m) return undefined;
  const time = readClockTime(m[2] ?? '');
  if (!time.ok) return time;
  const { hour, minute } = time.value;
  const tankText = (m[1] ?? m[3] ?? '').trim();
  if (tankText === '') return ok({ type: 'delete-reading', hour, minute, raw: text });
  const known = matchTankPrefix(tankText, context.tankNames);
  if (known?.rest !== '') return fail(unknownTankMessage(tankText, context.tankNames));
  return ok({ type: 'delete-reading', tank: known.tank, hour, minute, raw: text });
}

const UNIT_FIX =
  /^(?:that|it|this|the\s+last\s+(?:one|reading))\s+(?:was|were|should\s+have\s+been|should\s+be)\s+(?:in\s+)?(.+?)$|^(?:i\s+)?meant\s+(?:in\s+)?(.+?)$|^(?:unit|units)\s+(?:was|were|is)\s+(.+?)$/i;

/** "that was cm", "it was in inches", "I meant gal", "that was percent". */
export function parseUnitCorrection(text: string): Result<CommandOf<'correct-unit'>> | undefined {
  const m = UNIT_FIX.exec(text);
  if (!m) return undefined;
  const word = (m[1] ?? m[2] ?? m[3] ?? '').trim();
  const unit = parseUnit(word);
  if (!unit.ok) return fail(`${unit.error}. Say the unit the last reading was in, e.g. \`that was cm\`.`);
  const length = lengthUnitSchema.safeParse(unit.value.unit);
  const volume = volumeUnitSchema.safeParse(unit.value.unit);
  if (unit.value.kind === 'length' && length.success) {
    return ok({ type: 'correct-unit', unit: { kind: 'length', unit: length.data }, raw: text });
  }
  if (unit.value.kind === 'volume' && volume.success) {
    return ok({ type: 'correct-unit', unit: { kind: 'volume', unit: volume.data }, raw: text });
  }
  if (unit.value.kind === 'percent')
    return ok({ type: 'correct-unit', unit: { kind: 'percent' }, raw: text });
  return fail(
    `"${word}" is a ${unit.value.kind} unit; a reading is in a length, volume or percent unit (e.g. \`that was cm\`).`,
  );
}
