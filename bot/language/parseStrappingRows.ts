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

const isHeader = (line: string): boolean => /^[^\d.+-]/.test(line.trim()) && !/^\d/.test(line.trim());

/**
 * Lines of a strapping table pasted as CSV ("level,volume"; commas, semicolons or tabs). A first line of
 * words is a header and skipped. `done` on its own line ends the table. Without `units` (rows sent later,
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
    if (index === 0 && rows.length === 0 && isHeader(line)) continue;
    const cells = line.split(CELL_SPLIT).filter((c) => c !== '');
    if (cells.length !== 2) return fail(`Line ${index + 1} ("${line}") should have two values; ${ROW_HINT}.`);
    const level = readCell(cells[0] ?? '', 'length', units?.length);
    const volume = readCell(cells[1] ?? '', 'volume', units?.volume);
    if (!level.ok) return fail(`Line ${index + 1}, level ${level.error}; ${ROW_HINT}.`);
    if (!volume.ok) return fail(`Line ${index + 1}, volume ${volume.error}; ${ROW_HINT}.`);
    if (level.value < 0 || volume.value < 0)
      return fail(`Line ${index + 1} ("${line}") has a negative value.`);
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

/** True when a line reads as a table row (two numbers), so a pasted table is recognised. */
export const looksLikeStrappingRow = (line: string): boolean =>
  /^\s*[+-]?[\d.]+\s*[a-z"'%³]*\s*[,;\t ]\s*[+-]?[\d.,]+\s*[a-z³]*\s*$/i.test(line);
