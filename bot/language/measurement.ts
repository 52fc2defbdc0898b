import { fail, ok, type Result } from '../../engine/result.js';
import { parseQuantity } from '../../engine/units/index.js';
import { type Length, lengthUnitSchema, type Measurement, type Volume, volumeUnitSchema } from './command.js';
import { ULLAGE_WORDS } from './words.js';

/**
 * engine/units `parseQuantity`, after two spellings it does not take yet: a cubic unit written with a plain
 * 3 ("0.5 m3", "12 ft3", the ids of the tank specification) and an abbreviation point ("60 in.").
 */
export function readQuantity(text: string): ReturnType<typeof parseQuantity> {
  const cleaned = text
    .trim()
    .replace(/(?<![A-Za-z])(m|ft|in)3(?![\w³])/gi, '$1³')
    .replace(/(\p{L})\.$/u, '$1');
  return parseQuantity(cleaned);
}

const READING_FORMS = 'e.g. `60in`, `5\' 2"`, `48%`, `410 gal` or `ullage 14in`';

/** A length as typed ("60in", "5' 2\"", "1.2 m"), never negative. */
export function parseLength(text: string, what = 'a level'): Result<Length> {
  const quantity = readQuantity(text);
  if (!quantity.ok)
    return fail(`I could not read ${what} "${text}": ${quantity.error}; write it like 60in or 1.5 m.`);
  const unit = lengthUnitSchema.safeParse(quantity.value.unit);
  if (quantity.value.kind !== 'length' || !unit.success) {
    return fail(`"${text}" is not a length; ${what} needs a length unit such as in, ft, cm or m.`);
  }
  return nonNegative(quantity.value.value, text, what, (value) => ({ value, unit: unit.data, raw: text }));
}

/** A volume as typed ("410 gal", "1,550 L"), never negative. */
export function parseVolume(text: string, what = 'a volume'): Result<Volume> {
  const quantity = readQuantity(text);
  if (!quantity.ok)
    return fail(`I could not read ${what} "${text}": ${quantity.error}; write it like 150 gal or 600 L.`);
  const unit = volumeUnitSchema.safeParse(quantity.value.unit);
  if (quantity.value.kind !== 'volume' || !unit.success) {
    return fail(`"${text}" is not a volume; ${what} needs a volume unit such as gal, L, bbl or m3.`);
  }
  return nonNegative(quantity.value.value, text, what, (value) => ({ value, unit: unit.data, raw: text }));
}

function nonNegative<T>(value: number, text: string, what: string, build: (v: number) => T): Result<T> {
  if (!Number.isFinite(value))
    return fail(`"${text}" is not a number I can use for ${what}; give a plain number like 60in.`);
  if (value < 0) return fail(`${what} cannot be negative ("${text}"); give the number as measured.`);
  return ok(build(value));
}

/** Percent in "48%", "48 percent": 0 to 100. */
export function parsePercent(text: string, what = 'a percent'): Result<number> {
  const quantity = readQuantity(text);
  if (!quantity.ok || quantity.value.kind !== 'percent') {
    return fail(`I could not read ${what} "${text}"; write it like 48%.`);
  }
  const { value } = quantity.value;
  if (!Number.isFinite(value) || value < 0 || value > 100) {
    return fail(`${what} must be between 0% and 100% ("${text}"); check the gauge and send it again.`);
  }
  return ok(value);
}

/** What a reading measured: "60in" (level), "ullage 14in", "48%", "410 gal". */
export function parseMeasurement(text: string): Result<Measurement> {
  const trimmed = text.trim();
  if (trimmed === '') return fail(`The reading has no number; give one with its unit, ${READING_FORMS}.`);
  const ullage = /^(\p{L}+)\s*[:=]?\s*(.*)$/u.exec(trimmed);
  if (ullage && ULLAGE_WORDS.has((ullage[1] ?? '').toLowerCase())) {
    const length = parseLength(ullage[2] ?? '', 'the ullage');
    return length.ok ? ok({ kind: 'ullage', length: length.value }) : length;
  }
  const quantity = readQuantity(trimmed);
  if (!quantity.ok)
    return fail(`I could not read the reading "${trimmed}": ${quantity.error}; ${READING_FORMS}.`);
  switch (quantity.value.kind) {
    case 'length': {
      const length = parseLength(trimmed, 'the level');
      return length.ok ? ok({ kind: 'level', length: length.value }) : length;
    }
    case 'volume': {
      const volume = parseVolume(trimmed, 'the volume');
      return volume.ok ? ok({ kind: 'volume', volume: volume.value }) : volume;
    }
    case 'percent': {
      const percent = parsePercent(trimmed, 'the level');
      return percent.ok ? ok({ kind: 'percent', percent: percent.value, raw: trimmed }) : percent;
    }
    default:
      return fail(`"${trimmed}" is a ${quantity.value.kind}, not a reading; ${READING_FORMS}.`);
  }
}
