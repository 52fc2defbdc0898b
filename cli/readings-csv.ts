// Reads the readings CSV of `tankrunway analyze` (cli-contract section 4): a header, then one reading a line.
// Bad rows are reported with their line number and skipped; the rest go on.

import type { ReadingColumns, TimedVolume } from '../engine/rate/index.js';
import { fail, ok, type Result } from '../engine/result.js';
import { parseInstant } from './iso-instant.js';

export type ReadingColumn = 'volume' | 'level' | 'percent';

export interface RowProblem {
  line: number;
  reason: string;
}

export interface ReadingsTable {
  column: ReadingColumn;
  /** Litres, sorted by time, one per instant: columns, so a long file makes no object per reading. */
  readings: ReadingColumns;
  /** Logged deliveries, litres, sorted by time. */
  deliveries: TimedVolume[];
  problems: RowProblem[];
}

/** Turns a reading in its column's unit into litres, or says why it cannot. */
export type ToLitres = (column: ReadingColumn, value: number) => Result<number>;
/** Turns a logged delivery in the volume unit into litres. */
export type DeliveredToLitres = (value: number) => number;

/** ISO 8601 instant with Z or an offset (the fast parser lives in iso-instant.ts). */
export { parseInstant } from './iso-instant.js';

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function parseNumber(text: string): number | null {
  if (text === '' || !DECIMAL.test(text)) return null;
  const n = Number(text);
  return Number.isFinite(n) ? n : null;
}

// A cell that starts and ends with a printable ASCII character other than a quote (nearly every cell) has
// nothing to trim or unquote: returned as is, without the regexes.
const plainEnd = (code: number) => code > 34 && code < 127;
const unquote = (cell: string) => {
  const n = cell.length;
  if (n > 0 && plainEnd(cell.charCodeAt(0)) && plainEnd(cell.charCodeAt(n - 1))) return cell;
  return cell
    .trim()
    .replace(/^"(.*)"$/, '$1')
    .trim();
};

/**
 * The lines of a text one at a time, as split(/\r?\n/) gives them, without an array of all of them (a year of
 * 5-minute readings is 105k lines that would all stay alive until the end of the parse).
 */
class LineReader {
  private at = 0;
  constructor(private readonly text: string) {}
  done(): boolean {
    return this.at > this.text.length;
  }
  /** At most how many lines are left (to size arrays up front). */
  countLeft(): number {
    let lines = 1;
    for (let at = this.text.indexOf('\n', this.at); at >= 0; at = this.text.indexOf('\n', at + 1)) lines++;
    return lines;
  }
  /** The next line without its "\n" or "\r\n"; '' past the end. */
  next(): string {
    const text = this.text;
    const start = this.at;
    if (start > text.length) return '';
    const newline = text.indexOf('\n', start);
    let end = newline < 0 ? text.length : newline;
    this.at = end + 1;
    if (end > start && text.charCodeAt(end - 1) === 13) end--;
    return text.slice(start, end);
  }
}

/** Cell `index` of a line of comma-separated cells, unquoted; '' when the line has fewer cells. */
function cellAt(line: string, index: number): string {
  let start = 0;
  for (let k = 0; k < index; k++) {
    const comma = line.indexOf(',', start);
    if (comma < 0) return '';
    start = comma + 1;
  }
  const end = line.indexOf(',', start);
  return unquote(end < 0 ? line.slice(start) : line.slice(start, end));
}

/** The map's readings as columns sorted by time. */
function sortedColumns(byTime: Map<number, { volume: number }>): ReadingColumns {
  const sorted = [...byTime.entries()].sort((a, b) => a[0] - b[0]);
  return {
    time: Float64Array.from(sorted, ([time]) => time),
    volume: Float64Array.from(sorted, ([, r]) => r.volume),
  };
}

/** Parses the whole CSV text; a header problem is an error, a row problem is reported and skipped. */
export function parseReadingsCsv(
  text: string,
  toLitres: ToLitres,
  deliveredToLitres: DeliveredToLitres,
): Result<ReadingsTable> {
  const lines = new LineReader(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  const header = lines
    .next()
    .split(',')
    .map((h) => unquote(h).toLowerCase());
  const timeAt = header.indexOf('time');
  if (timeAt < 0) return fail('the CSV header needs a "time" column (ISO 8601 with an offset or Z)');
  const present = (['volume', 'level', 'percent'] as const).filter((c) => header.includes(c));
  if (present.length !== 1) {
    return fail('the CSV header needs exactly one of the columns "volume", "level" or "percent"');
  }
  const column = present[0]!;
  const valueAt = header.indexOf(column);
  const deliveredAt = header.indexOf('delivered');

  const problems: RowProblem[] = [];
  // Rows in strictly increasing time (the usual file) go straight into columns sized for every line; the
  // first row that is not moves them into a map keyed by time, which finds duplicates and is sorted at the end.
  const rowsAtMost = lines.countLeft();
  const times = new Float64Array(rowsAtMost);
  const volumes = new Float64Array(rowsAtMost);
  const rowLines = new Float64Array(rowsAtMost);
  let kept = 0;
  let byTime: Map<number, { volume: number; line: number }> | null = null;
  const deliveries: TimedVolume[] = [];
  for (let line = 2; !lines.done(); line++) {
    const raw = lines.next();
    if (raw.trim() === '') continue;
    const timeText = cellAt(raw, timeAt);
    const time = parseInstant(timeText);
    if (time === null) {
      problems.push({ line, reason: `"${timeText}" is not an ISO 8601 time with an offset or Z` });
      continue;
    }
    const valueText = cellAt(raw, valueAt);
    const deliveredText = deliveredAt >= 0 ? cellAt(raw, deliveredAt) : '';
    if (valueText === '' && deliveredText === '') {
      problems.push({ line, reason: `no ${column} and no delivered volume` });
      continue;
    }
    if (deliveredText !== '') {
      const delivered = parseNumber(deliveredText);
      if (delivered === null || delivered <= 0) {
        problems.push({ line, reason: `delivered "${deliveredText}" is not a positive number` });
        continue;
      }
      deliveries.push({ time, volume: deliveredToLitres(delivered) });
      if (valueText === '') continue;
    }
    const value = parseNumber(valueText);
    if (value === null) {
      problems.push({ line, reason: `${column} "${valueText}" is not a number` });
      continue;
    }
    const litres = toLitres(column, value);
    if (!litres.ok) {
      problems.push({ line, reason: litres.error });
      continue;
    }
    if (byTime === null) {
      if (kept === 0 || time > times[kept - 1]!) {
        times[kept] = time;
        volumes[kept] = litres.value;
        rowLines[kept] = line;
        kept++;
        continue;
      }
      byTime = new Map();
      for (let k = 0; k < kept; k++) byTime.set(times[k]!, { volume: volumes[k]!, line: rowLines[k]! });
    }
    const earlier = byTime.get(time);
    if (earlier) {
      if (earlier.volume !== litres.value) {
        problems.push({
          line,
          reason: `a second reading at ${timeText} (line ${earlier.line} already has one); kept the first`,
        });
      }
      continue;
    }
    byTime.set(time, { volume: litres.value, line });
  }
  const readings =
    byTime === null
      ? { time: times.subarray(0, kept), volume: volumes.subarray(0, kept) }
      : sortedColumns(byTime);
  deliveries.sort((a, b) => a.time - b.time);
  return ok({ column, readings, deliveries, problems });
}
