// `tankrunway analyze READINGS.csv`: the consumption rate, runway and events of a readings series
// (cli-contract section 4). `buildAnalyzeOutput` is the one place the JSON is assembled, so options such as a
// refill plan can add their part there.
import { readFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { runwayTo } from '../../engine/forecast/runway.js';
import { buildTank, type Tank, volumeAtLevel } from '../../engine/geometry/index.js';
import { analyzeSeriesColumns, pointsOf, type SeriesColumns } from '../../engine/rate/index.js';
import { fail, ok, type Result } from '../../engine/result.js';
import { fromLitres, isVolumeUnit, toLitres, toMetres, type VolumeUnit } from '../../engine/units/index.js';
import { type CliCommand, type CliIo, UsageError } from '../io.js';
import { createInstantFormatter } from '../iso-instant.js';
import { parseReadingsCsv, type ReadingColumn, type ReadingsTable } from '../readings-csv.js';
import { refillOption, refillSummary } from '../refill-option.js';

export const analyzeArgOptions = {
  tank: { type: 'string' },
  'volume-unit': { type: 'string' },
  capacity: { type: 'string' },
  target: { type: 'string' },
  'target-percent': { type: 'string' },
  filling: { type: 'boolean', default: false },
  plan: { type: 'string' },
  now: { type: 'string' },
  json: { type: 'boolean', default: false },
  help: { type: 'boolean', short: 'h', default: false },
} as const;

export interface AnalyzeOptions {
  volumeUnit: VolumeUnit;
  /** Litres, from the tank or --capacity. */
  capacity: number | null;
  /** Litres: the runway runs down to it (up to it on a filling tank); null = no runway. */
  target: number | null;
  /** A filling tank (rises are use, drops are pick-ups); null = tell from the data (see isFillingSeries). */
  filling: boolean | null;
  /** True when no --target or --target-percent was given: empty (or full, on a filling tank). */
  targetDefaulted?: boolean;
}

export interface AnalyzePoint {
  time: string;
  volume: number;
  rate: number;
  rateLow: number;
  rateHigh: number;
  runwayDays: number | null;
  runwayDaysLow: number | null;
  runwayDaysHigh: number | null;
  runoutAt: string | null;
}

export interface AnalyzeOutput {
  volumeUnit: VolumeUnit;
  /** Whether the tank was analysed as filling (given by --filling, or told from the data). */
  filling: boolean;
  points: AnalyzePoint[];
  events: { type: string; start: string; end: string; volume: number; logged: boolean }[];
  changes: { at: string; from: number; to: number }[];
  suspect: { time: string; reason: string }[];
}

/** ISO 8601 in UTC, without a ".000" when the instant is on a whole second. */
export const isoTime = createInstantFormatter();
/** Run-out instants to the second: finer would claim a precision the forecast does not have. */
const toSecond = (ms: number) => Math.round(ms / 1000) * 1000;
/** 10 ** d for d = 0..22 (all exact), so the hot `tidy` looks a power up instead of computing it. */
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, d) => 10 ** d);
/** Rounds to about 8 significant digits, cheaply (toPrecision is slow over 100k points). */
const tidy = (x: number): number => {
  if (x === 0 || !Number.isFinite(x)) return x;
  const digits = 7 - Math.floor(Math.log10(Math.abs(x)));
  if (digits <= 0 || digits > 22) return x;
  const f = POWERS_OF_TEN[digits]!;
  return Math.round(x * f) / f;
};

/**
 * A tank whose trusted rate is negative (rising) at most points past the first fifth of the series is a
 * filling tank (waste, produced water): its drops are pick-ups and its runway runs to full.
 */
export function isFillingSeries(analysis: SeriesColumns): boolean {
  let trusted = 0;
  let rising = 0;
  for (let i = Math.floor(analysis.length / 5); i < analysis.length; i++) {
    if (analysis.suspect[i]) continue;
    trusted++;
    if (analysis.rate[i]! < 0) rising++;
  }
  if (trusted < 3) return false;
  return rising > 0.6 * trusted;
}

/** The analysis JSON from readings already in litres: points, events, changes and suspect readings. */
export function buildAnalyzeOutput(
  table: Pick<ReadingsTable, 'readings' | 'deliveries'>,
  options: AnalyzeOptions,
) {
  const run = (filling: boolean) =>
    analyzeSeriesColumns(table.readings, table.deliveries, {
      filling,
      ...(options.capacity !== null ? { capacity: options.capacity } : {}),
    });
  let filling = options.filling === true;
  let analysis = run(filling);
  if (options.filling === null && isFillingSeries(analysis)) {
    filling = true;
    analysis = run(true);
  }
  // The runway of a filling tank runs to full only when asked for with --filling; one found filling from the
  // data keeps the contract's default (to empty: none while it rises) unless a target was given.
  const toFull = options.filling === true ? options.capacity : null;
  const target = filling && options.targetDefaulted ? toFull : options.target;
  const resolved: AnalyzeOptions = { ...options, filling, target };
  return { analysis, output: outputFrom(analysis, resolved), options: resolved };
}

function outputFrom(analysis: SeriesColumns, options: AnalyzeOptions): AnalyzeOutput {
  const unit = options.volumeUnit;
  const out = (litres: number) => tidy(fromLitres(litres, unit));
  const days = (d: number | null) => (d === null ? null : tidy(d));
  const runwayOptions = { filling: options.filling === true };
  const target = options.target === null ? null : { volume: options.target };
  const points: AnalyzePoint[] = new Array(analysis.length);
  const p = { time: 0, volume: 0, rate: 0, rateLow: 0, rateHigh: 0 };
  // One formatter per column, so each keeps its own day cached (run-out instants lie days ahead).
  const timeText = createInstantFormatter();
  const runoutText = createInstantFormatter();
  for (let i = 0; i < analysis.length; i++) {
    p.time = analysis.time[i]!;
    p.volume = analysis.volume[i]!;
    p.rate = analysis.rate[i]!;
    p.rateLow = analysis.rateLow[i]!;
    p.rateHigh = analysis.rateHigh[i]!;
    const runway =
      target === null
        ? { days: null, daysLow: null, daysHigh: null, runoutAt: null }
        : runwayTo(p, target, runwayOptions);
    points[i] = {
      time: timeText(p.time),
      volume: out(p.volume),
      rate: out(p.rate),
      rateLow: out(p.rateLow),
      rateHigh: out(p.rateHigh),
      runwayDays: days(runway.days),
      runwayDaysLow: days(runway.daysLow),
      runwayDaysHigh: days(runway.daysHigh),
      runoutAt: runway.runoutAt === null ? null : runoutText(toSecond(runway.runoutAt)),
    };
  }
  // Readings still waiting for confirmation at the end are untrusted too.
  const trailing: { time: number; reason: string }[] = [];
  for (let i = analysis.length - 1; i >= 0 && analysis.suspect[i] !== undefined; i--) {
    trailing.unshift({ time: analysis.time[i]!, reason: analysis.suspect[i]! });
  }
  return {
    volumeUnit: unit,
    filling: options.filling === true,
    points,
    events: analysis.events.map((e) => ({
      type: e.type,
      start: isoTime(toSecond(e.start)),
      end: isoTime(toSecond(e.end)),
      volume: out(e.volume),
      logged: e.logged,
    })),
    changes: analysis.changes.map((c) => ({ at: isoTime(c.at), from: out(c.from), to: out(c.to) })),
    suspect: [...analysis.suspects, ...trailing].map((s) => ({ time: isoTime(s.time), reason: s.reason })),
  };
}

function positiveNumber(text: string | undefined, option: string): number | undefined {
  if (text === undefined) return undefined;
  const n = Number(text);
  if (text.trim() === '' || !Number.isFinite(n) || n < 0) {
    throw new UsageError(`--${option} "${text}" must be a number of zero or more`);
  }
  return n;
}

async function readTank(path: string): Promise<Tank> {
  let json: unknown;
  try {
    json = JSON.parse(await readFile(path, 'utf8'));
  } catch (error) {
    throw new UsageError(
      `cannot read the tank file ${path}: ${error instanceof Error ? error.message : String(error)}`,
    );
  }
  const tank = buildTank(json);
  if (!tank.ok) throw new UsageError(`tank file ${path}: ${tank.error}`);
  return tank.value;
}

type ArgValues = {
  tank?: string;
  'volume-unit'?: string;
  capacity?: string;
  target?: string;
  'target-percent'?: string;
  filling?: boolean;
};

/** Options from the command line (and the tank file); throws UsageError for what the user must fix. */
export function resolveAnalyzeOptions(values: ArgValues, tank: Tank | null): AnalyzeOptions {
  const unitText = values['volume-unit'];
  if (unitText !== undefined && !isVolumeUnit(unitText)) {
    throw new UsageError(`--volume-unit "${unitText}" is not one of L, m3, gal, impgal, bbl, ft3, in3`);
  }
  const volumeUnit: VolumeUnit = unitText ?? tank?.spec.units.volume ?? 'L';
  const capacityGiven = positiveNumber(values.capacity, 'capacity');
  const capacity =
    capacityGiven !== undefined ? toLitres(capacityGiven, volumeUnit) : (tank?.capacity ?? null);
  if (capacity !== null && !(capacity > 0)) throw new UsageError('--capacity must be above zero');
  // Without --filling the data tell whether the tank fills (isFillingSeries).
  const filling = values.filling === true ? true : null;
  const targetGiven = positiveNumber(values.target, 'target');
  const percent = positiveNumber(values['target-percent'], 'target-percent');
  if (targetGiven !== undefined && percent !== undefined) {
    throw new UsageError('give --target or --target-percent, not both');
  }
  let target: number | null = filling ? capacity : 0;
  if (targetGiven !== undefined) target = toLitres(targetGiven, volumeUnit);
  if (percent !== undefined) {
    if (capacity === null) throw new UsageError('--target-percent needs --capacity or --tank');
    if (percent > 100) throw new UsageError('--target-percent must be between 0 and 100');
    target = (capacity * percent) / 100;
  }
  return {
    volumeUnit,
    capacity,
    target,
    filling,
    targetDefaulted: targetGiven === undefined && percent === undefined,
  };
}

/** Converts a reading in its column into litres for this tank and these options. */
export function readingConverter(tank: Tank | null, options: AnalyzeOptions) {
  return (column: ReadingColumn, value: number): Result<number> => {
    if (value < 0) return fail(`${column} ${value} is below zero`);
    if (column === 'volume') return ok(toLitres(value, options.volumeUnit));
    if (column === 'percent') {
      if (value > 100) return fail(`percent ${value} is above 100`);
      return ok(((options.capacity ?? 0) * value) / 100);
    }
    if (!tank) return fail('a level needs --tank');
    return volumeAtLevel(tank, toMetres(value, tank.spec.units.length));
  };
}

/** Reads the arguments and the CSV; reports skipped rows on stderr. Shared with options built on analyze. */
export async function loadAnalysisInput(argv: string[], io: CliIo) {
  const { values, positionals } = parseArgs({
    args: argv,
    options: analyzeArgOptions,
    allowPositionals: true,
  });
  if (positionals.length !== 1)
    throw new UsageError('give one readings CSV file: tankrunway analyze READINGS.csv');
  const tank = values.tank !== undefined ? await readTank(values.tank) : null;
  const options = resolveAnalyzeOptions(values, tank);
  const file = positionals[0]!;
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (error) {
    throw new UsageError(`cannot read ${file}: ${error instanceof Error ? error.message : String(error)}`);
  }
  const table = parseReadingsCsv(text, readingConverter(tank, options), (v) =>
    toLitres(v, options.volumeUnit),
  );
  if (!table.ok) throw new UsageError(`${file}: ${table.error}`);
  if (table.value.column === 'level' && !tank) throw new UsageError('a "level" column needs --tank FILE');
  if (table.value.column === 'percent' && options.capacity === null) {
    throw new UsageError('a "percent" column needs --tank FILE or --capacity');
  }
  for (const p of table.value.problems) io.stderr.write(`${file}:${p.line}: skipped: ${p.reason}\n`);
  return { values, options, table: table.value };
}

function summary(output: AnalyzeOutput): string {
  const last = output.points[output.points.length - 1];
  if (!last) return 'no valid readings\n';
  const u = output.volumeUnit;
  const runway =
    last.runwayDays === null
      ? 'no runway (not emptying toward the target)'
      : `runway ${last.runwayDays.toFixed(1)} days (${last.runwayDaysLow?.toFixed(1) ?? '?'}-${last.runwayDaysHigh?.toFixed(1) ?? 'open'})`;
  return [
    `${output.points.length} readings to ${last.time}: volume ${last.volume.toFixed(1)} ${u}`,
    `rate ${last.rate.toFixed(2)} ${u}/day (${last.rateLow.toFixed(2)} to ${last.rateHigh.toFixed(2)}, ~80%)`,
    runway,
    `${output.events.length} events, ${output.suspect.length} suspect readings`,
    '',
  ].join('\n');
}

export const analyzeCommand: CliCommand = {
  name: 'analyze',
  async run(argv, io) {
    if (argv.includes('--help') || argv.includes('-h')) {
      io.stdout.write(
        'usage: tankrunway analyze READINGS.csv [--tank FILE] [--volume-unit U] [--capacity N] [--target N | --target-percent P] [--filling] [--plan SETTINGS.json [--now ISO]] [--json]\n',
      );
      return 0;
    }
    const { values, options, table } = await loadAnalysisInput(argv, io);
    const { analysis, output, options: resolved } = buildAnalyzeOutput(table, options);
    const refill = await refillOption(
      values,
      { ...resolved, filling: resolved.filling === true },
      // RatePoint objects only when a refill plan needs them.
      values.plan === undefined ? [] : pointsOf(analysis),
    );
    const full = refill ? { ...output, refill } : output;
    io.stdout.write(values.json ? `${JSON.stringify(full)}\n` : summary(output) + refillSummary(refill));
    return 0;
  },
};
