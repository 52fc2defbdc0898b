import { fail, ok, type Result } from '../../engine/result.js';
import type { CommandOf, LengthUnitWord, ParseContext, TankSpecInput, VolumeUnitWord } from './command.js';
import { parseLength } from './measurement.js';
import { parsePastedTable } from './parseStrappingRows.js';
import { isReservedWord, isTankNameShaped } from './tankName.js';
import {
  type Dimension,
  inUnit,
  KEY_WORDS,
  readHeads,
  readLengthUnit,
  readVolumeUnit,
  SHAPE_NEEDS,
  SHAPE_WORDS,
  unknownKey,
} from './tankSpecWords.js';

const EXAMPLE = '`add tank T4 vertical-cylinder diameter=48in length=72in unit=gal`';
const TOKEN = /([A-Za-z][\w-]*)\s*=\s*(?:"([^"]*)"|'([^']*)'|(\S+))|"([^"]*)"|(\S+)/g;

/** Splits `T4 vertical diameter=48in site="Ridge Pump Station"` into words and key=value pairs. */
function tokenize(text: string): { words: string[]; pairs: [string, string][] } {
  const words: string[] = [];
  const pairs: [string, string][] = [];
  for (const m of text.matchAll(TOKEN)) {
    if (m[1] !== undefined) pairs.push([m[1].toLowerCase(), m[2] ?? m[3] ?? m[4] ?? '']);
    else words.push(m[5] ?? m[6] ?? '');
  }
  return { words, pairs };
}

/**
 * Metric volumes go with centimetre levels and US volumes with inch levels when a strapping table names
 * no level unit (common practice for tank charts).
 */
const defaultLevelUnit = (volume: VolumeUnitWord): LengthUnitWord =>
  volume === 'L' || volume === 'm3' ? 'cm' : 'in';

/**
 * `add tank T4 vertical-cylinder diameter=48in length=72in unit=gal [heads=ellipsoidal:6in,flat]
 * [product=diesel] [site="Ridge Pump Station"] [name="..."]`, or `add tank T9 strapping unit=L` with the
 * table's CSV lines on the next lines of the same message (or later, while the bot awaits them).
 */
export function parseAddTank(
  firstLine: string,
  tableLines: readonly string[],
  raw: string,
  context: ParseContext,
): Result<CommandOf<'add-tank'>> {
  const { words, pairs } = tokenize(firstLine);
  const [tank, shapeWord, ...extra] = words;
  if (!tank) return fail(`Name the tank: ${EXAMPLE}.`);
  if (!isTankNameShaped(tank)) {
    return fail(
      `"${tank}" cannot be a tank code; use letters and digits (e.g. T4 or DIESEL-1), then the shape: ${EXAMPLE}.`,
    );
  }
  if (isReservedWord(tank))
    return fail(`"${tank}" is one of the bot's own words; choose another code, e.g. T4 or GEN-1.`);
  if (context.tankNames.some((n) => n.toLowerCase() === tank.toLowerCase())) {
    return fail(`You already have a tank ${tank}; choose another code, or \`remove tank ${tank}\` first.`);
  }
  if (extra.length > 0)
    return fail(`I did not understand "${extra.join(' ')}"; write settings as key=value, e.g. ${EXAMPLE}.`);
  const values = new Map<string, string>();
  for (const [key, value] of pairs) {
    const canonical = KEY_WORDS[key];
    if (!canonical) return unknownKey(key);
    if (values.has(canonical)) return fail(`${canonical}= is given twice; give it once.`);
    values.set(canonical, value.trim());
  }
  const shapeText = shapeWord ?? values.get('shape');
  if (!shapeText)
    return fail(
      `Give the shape after the name (vertical-cylinder, horizontal-cylinder, sphere, rectangular or strapping): ${EXAMPLE}.`,
    );
  const shape = SHAPE_WORDS[shapeText.toLowerCase()];
  if (!shape) {
    return fail(
      `"${shapeText}" is not a shape I know; use vertical-cylinder, horizontal-cylinder, sphere, rectangular or strapping.`,
    );
  }
  const unitText = values.get('unit');
  if (!unitText) return fail(`Give the volume unit with unit=, e.g. unit=gal or unit=L: ${EXAMPLE}.`);
  const volumeUnit = readVolumeUnit(unitText);
  if (!volumeUnit.ok) return volumeUnit;

  const spec =
    shape === 'strapping'
      ? strappingSpec(values, volumeUnit.value)
      : dimensionSpec(shape, values, volumeUnit.value);
  if (!spec.ok) return spec;
  // Rows in the same message are the whole table; without rows the bot awaits them.
  const awaitingRows = shape === 'strapping' && tableLines.length === 0;
  if (shape === 'strapping' && tableLines.length > 0) {
    const table = parsePastedTable(tableLines, spec.value.units, values.has('level'));
    if (!table.ok) return fail(`Strapping table of ${tank}: ${table.error}`);
    if (table.value.rows.length < 2) {
      return fail('A strapping table needs at least two rows (level,volume); send the whole table.');
    }
    spec.value.units = table.value.units;
    spec.value.table = table.value.rows;
  } else if (tableLines.some((l) => l.trim() !== '')) {
    return fail(`Only a strapping tank takes table lines; send one \`add tank\` line for a ${shape}.`);
  }
  const name = values.get('name');
  const product = values.get('product');
  const site = values.get('site');
  return ok({
    type: 'add-tank',
    tank,
    spec: spec.value,
    ...(name ? { name } : {}),
    ...(product ? { product } : {}),
    ...(site ? { site } : {}),
    awaitingRows,
    raw,
  });
}

function strappingSpec(values: Map<string, string>, volume: VolumeUnitWord): Result<TankSpecInput> {
  const levelText = values.get('level');
  const length = levelText ? readLengthUnit(levelText) : ok(defaultLevelUnit(volume));
  if (!length.ok) return length;
  for (const key of ['diameter', 'length', 'width', 'height', 'heads']) {
    if (values.has(key)) return fail(`A strapping tank takes its volumes from the table; leave out ${key}=.`);
  }
  return ok({ units: { length: length.value, volume }, shape: 'strapping' });
}

function dimensionSpec(
  shape: Exclude<TankSpecInput['shape'], 'strapping'>,
  values: Map<string, string>,
  volume: VolumeUnitWord,
): Result<TankSpecInput> {
  const needs = SHAPE_NEEDS[shape];
  const missing = needs.filter((d) => !values.has(d));
  if (missing.length > 0) {
    return fail(
      `A ${shape} tank needs ${missing.map((m) => `${m}=`).join(', ')} (e.g. ${missing.map((m) => `${m}=48in`).join(' ')}).`,
    );
  }
  const dims: Partial<Record<Dimension, number>> = {};
  let unit: LengthUnitWord | undefined;
  const allowed: Dimension[] = ['diameter', 'length', 'width', 'height'];
  for (const dim of allowed) {
    const text = values.get(dim);
    if (text === undefined) continue;
    if (!needs.includes(dim))
      return fail(`A ${shape} tank takes ${needs.map((n) => `${n}=`).join(', ')}; leave out ${dim}=.`);
    const length = parseLength(text, `${dim}=`);
    if (!length.ok) return length;
    if (length.value.value <= 0)
      return fail(`${dim}= must be more than 0 (got "${text}"); give the size, e.g. ${dim}=48in.`);
    unit ??= length.value.unit;
    dims[dim] = inUnit(length.value.value, length.value.unit, unit);
  }
  const specUnit = unit ?? 'm';
  if (values.has('level')) {
    const level = readLengthUnit(values.get('level') ?? '');
    if (!level.ok) return level;
  }
  const spec: TankSpecInput = { units: { length: specUnit, volume }, shape, ...dims };
  const headsText = values.get('heads');
  if (headsText !== undefined) {
    if (shape === 'sphere' || shape === 'rectangular')
      return fail(`A ${shape} tank has no heads; leave out heads=.`);
    const heads = readHeads(headsText, () => specUnit);
    if (!heads.ok) return heads;
    spec.heads = heads.value;
  }
  return ok(spec);
}
