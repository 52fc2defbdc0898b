// Strapping (calibration) tables from CSV text: "level_in,volume_gal" then one row a line.
import { fail, ok, type Result } from '../result.js';
import { type LengthUnit, parseUnit, type VolumeUnit } from '../units/index.js';
import { parseTankSpec, type TankSpec } from './spec.js';

export interface StrappingUnits {
  length?: LengthUnit;
  volume?: VolumeUnit;
}

/** "level_in", "level (in)", "level [in]", "level" -> the unit after the column name, if any. */
function headerUnit(cell: string, name: 'level' | 'volume'): Result<string | null> {
  const match = new RegExp(
    `^\\s*${name}\\s*(?:[_:]\\s*|\\(\\s*|\\[\\s*)?([^)\\]]*?)\\s*[)\\]]?\\s*$`,
    'i',
  ).exec(cell);
  if (!match)
    return fail(
      `the header should name the columns ${name === 'level' ? 'level' : 'volume'} (e.g. level_in,volume_gal), not "${cell.trim()}"`,
    );
  return ok(match[1] ? match[1] : null);
}

function unitFrom<K extends 'length' | 'volume'>(
  word: string | null,
  given: LengthUnit | VolumeUnit | undefined,
  kind: K,
): Result<K extends 'length' ? LengthUnit : VolumeUnit> {
  type U = K extends 'length' ? LengthUnit : VolumeUnit;
  if (word === null) {
    if (given === undefined)
      return fail(`the ${kind} unit is missing: write it in the header (level_in,volume_gal) or give it`);
    return ok(given as U);
  }
  const parsed = parseUnit(word);
  if (!parsed.ok) return parsed;
  if (parsed.value.kind !== kind) return fail(`"${word}" is not a ${kind} unit`);
  const unit = parsed.value.unit as U;
  if (given !== undefined && given !== unit) return fail(`the header says ${unit} but ${given} was given`);
  return ok(unit);
}

/**
 * Reads a strapping table: a header, then `level,volume` rows (blank lines and lines starting with # are
 * skipped; a number may use thousands commas only when the cell is quoted). Checks: at least two rows,
 * levels strictly increasing, volumes never decreasing. Errors name the line.
 */
export function parseStrappingCsv(
  text: string,
  units: StrappingUnits = {},
): Result<Extract<TankSpec, { shape: 'strapping' }>> {
  const lines = text.split(/\r?\n/).map((line, i) => ({ line: line.trim(), number: i + 1 }));
  const content = lines.filter(({ line }) => line !== '' && !line.startsWith('#'));
  const header = content.shift();
  if (!header)
    return fail('the strapping table is empty: give a header (level_in,volume_gal) and at least two rows');
  const cells = header.line.split(/[,;\t]/);
  if (cells.length !== 2)
    return fail(`line ${header.number}: the header needs two columns, level and volume`);
  const levelWord = headerUnit(cells[0] ?? '', 'level');
  if (!levelWord.ok) return fail(`line ${header.number}: ${levelWord.error}`);
  const volumeWord = headerUnit(cells[1] ?? '', 'volume');
  if (!volumeWord.ok) return fail(`line ${header.number}: ${volumeWord.error}`);
  const length = unitFrom(levelWord.value, units.length, 'length');
  if (!length.ok) return fail(`line ${header.number}: ${length.error}`);
  const volume = unitFrom(volumeWord.value, units.volume, 'volume');
  if (!volume.ok) return fail(`line ${header.number}: ${volume.error}`);

  const table: [number, number][] = [];
  for (const { line, number } of content) {
    const row = line.split(/[,;\t]/).map((c) => c.trim());
    const values = row.map((c) => (/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(c) ? Number(c) : Number.NaN));
    if (row.length !== 2 || values.some((v) => !Number.isFinite(v)))
      return fail(`line ${number}: "${line}" is not two numbers (level, volume)`);
    const [level, vol] = values as [number, number];
    const prev = table[table.length - 1];
    if (level < 0 || vol < 0) return fail(`line ${number}: levels and volumes cannot be negative`);
    if (prev && level <= prev[0])
      return fail(`line ${number}: level ${level} does not increase (previous ${prev[0]})`);
    if (prev && vol < prev[1]) return fail(`line ${number}: volume ${vol} is below the previous ${prev[1]}`);
    table.push([level, vol]);
  }
  if (table.length < 2) return fail('a strapping table needs at least two rows');
  const spec = parseTankSpec({
    units: { length: length.value, volume: volume.value },
    shape: 'strapping',
    table,
  });
  if (!spec.ok) return spec;
  return ok(spec.value as Extract<TankSpec, { shape: 'strapping' }>);
}
