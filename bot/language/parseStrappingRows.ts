import { parseStrappingCsv } from '../../engine/geometry/index.js';
import { fail, ok, type Result } from '../../engine/result.js';
import { fromLitres, fromMetres, toLitres, toMetres } from '../../engine/units/index.js';
import type { LengthUnitWord, VolumeUnitWord } from './command.js';
import { readQuantity } from './measurement.js';
import { DONE_WORDS } from './words.js';

export type StrappingRow = [number, number];

const CELL_SPLIT = /\s*[,;\t]\s*|\s{2,}|\s+(?=[\d.])/;
const ROW_HINT = 'write each row as `level,volume`, e.g. `10,52.5`, levels rising';

const round = (n: number): number => Number(n.toPrecision(12));

/** A cell: a bare number (in the table's unit) or a number with a unit, converted to the table's unit. */
function readCell(
  cell: string,
  kind: 'length' | 'volume',
  unit: LengthUnitWord | VolumeUnitWord | undefined,
): Result<number> {
  const bare = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/.test(cell) ? Number(cell) : undefined;
  if (bare !== undefined) return Number.isFinite(bare) ? ok(bare) : fail(`"${cell}" is not a number`);
  if (unit === undefined) return fail(`"${cell}": give bare numbers in the table's units`);
  const quantity = readQuantity(cell);
  if (!quantity.ok) return fail(`"${cell}": ${quantity.error}`);
  const q = quantity.value;
  if (q.kind !== kind) return fail(`"${cell}" is not a ${kind}`);
  if (kind === 'length') {
    return ok(round(fromMetres(toMetres(q.value, q.unit as LengthUnitWord), unit as LengthUnitWord)));
  }
  return ok(round(fromLitres(toLitres(q.value, q.unit as VolumeUnitWord), unit as VolumeUnitWord)));
}

/** A first line of words, not numbers: the table's header ("level,volume", "level_in,volume_gal"). */
const isHeader = (line: string): boolean =>
  /^\p{L}/u.test(line.trim()) && !DONE_WORDS.has(line.trim().toLowerCase());

/**
 * Rows of a strapping table as CSV lines ("level,volume"; commas, semicolons or tabs), with no header.
 * `done` on its own line ends the table. Without `units` (rows sent later,
 * while the bot awaits them) cells must be bare numbers in the table's units.
 */
export function parseStrappingLines(
  lines: readonly string[],
  units?: { length: LengthUnitWord; volume: VolumeUnitWord },
  previousLevel = Number.NEGATIVE_INFINITY,
): Result<{ rows: StrappingRow[]; done: boolean }> {
  const rows: StrappingRow[] = [];
  let done = false;
  let last = previousLevel;
  for (const [index, original] of lines.entries()) {
    const line = original.trim();
    if (line === '') continue;
    if (DONE_WORDS.has(line.toLowerCase().replace(/[.!]$/, ''))) {
      done = true;
      continue;
    }
    if (done) return fail(`Line ${index + 1} ("${line}") comes after "done"; send more rows before "done".`);
    const cells = line.split(CELL_SPLIT).filter((c) => c !== '');
    if (cells.length !== 2) return fail(`Line ${index + 1} ("${line}") should have two values; ${ROW_HINT}.`);
    const level = readCell(cells[0] ?? '', 'length', units?.length);
    const volume = readCell(cells[1] ?? '', 'volume', units?.volume);
    if (!level.ok) return fail(`Line ${index + 1}, level ${level.error}; ${ROW_HINT}.`);
    if (!volume.ok) return fail(`Line ${index + 1}, volume ${volume.error}; ${ROW_HINT}.`);
    if (level.value < 0 || volume.value < 0)
      return fail(`Line ${index + 1} ("${line}") has a negative value; check the row.`);
    if (level.value <= last) {
      return fail(
        `Line ${index + 1} ("${line}"): levels must rise from row to row; check the order of the table.`,
      );
    }
    const previousVolume = rows.at(-1)?.[1];
    if (previousVolume !== undefined && volume.value < previousVolume) {
      return fail(`Line ${index + 1} ("${line}"): the volume falls while the level rises; check the row.`);
    }
    rows.push([level.value, volume.value]);
    last = level.value;
  }
  return ok({ rows, done });
}

/**
 * A table pasted under `add tank NAME strapping`. With a header line, engine/geometry's strapping CSV reader
 * reads it (the header may name the units, "level_in,volume_gal", and must agree with unit= and level=);
 * without one, the rows are read here, where a cell may carry its own unit. A closing `done` is allowed.
 */
export function parsePastedTable(
  lines: readonly string[],
  units: { length: LengthUnitWord; volume: VolumeUnitWord },
  levelUnitGiven: boolean,
): Result<{ units: { length: LengthUnitWord; volume: VolumeUnitWord }; rows: StrappingRow[] }> {
  const content = lines.map((l) => l.trim()).filter((l) => l !== '');
  const [first] = content;
  if (first === undefined || !isHeader(first)) {
    const rows = parseStrappingLines(content, units);
    return rows.ok ? ok({ units, rows: rows.value.rows }) : rows;
  }
  const last = content.at(-1) ?? '';
  const body = DONE_WORDS.has(last.toLowerCase()) ? content.slice(0, -1) : content;
  const bareLevel = /^\s*level\s*$/i.test(first.split(/[,;\t]/)[0] ?? '');
  const table = parseStrappingCsv(body.join('\n'), {
    volume: units.volume,
    ...(levelUnitGiven || bareLevel ? { length: units.length } : {}),
  });
  if (!table.ok)
    return fail(`${table.error}; write the header like \`level_cm,volume_L\`, then one row a line.`);
  return ok({ units: table.value.units, rows: table.value.table });
}
