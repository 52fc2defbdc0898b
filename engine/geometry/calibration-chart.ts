// A calibration chart from a geometry: level -> volume at a chosen step, for printing beside the tank.
import { fail, ok, type Result } from '../result.js';
import { fromLitres, fromMetres, toMetres } from '../units/index.js';
import type { Tank } from './tank.js';

export interface ChartRow {
  /** In the tank's length unit. */
  level: number;
  /** In the tank's volume unit. */
  volume: number;
}

export const MAX_CHART_ROWS = 20_000;

/** Rows from the lowest level up to full at `step` (tank length units); the last row is always the full height. */
export function calibrationChart(tank: Tank, step: number): Result<ChartRow[]> {
  const { length, volume } = tank.spec.units;
  if (!Number.isFinite(step) || step <= 0) return fail(`the step must be a positive number of ${length}`);
  const start = fromMetres(tank.lowestLevel, length);
  const top = fromMetres(tank.fullHeight, length);
  const count = Math.floor((top - start) / step + 1e-9);
  if (count + 2 > MAX_CHART_ROWS)
    return fail(`a step of ${step} ${length} gives more than ${MAX_CHART_ROWS} rows; choose a larger step`);
  const rows: ChartRow[] = [];
  for (let i = 0; i <= count; i++) {
    // Multiply rather than accumulate, so row 100 is exactly 100 steps up.
    const level = Number((start + i * step).toPrecision(12));
    rows.push({
      level,
      volume: fromLitres(tank.volumeAt(Math.min(tank.fullHeight, toMetres(level, length))), volume),
    });
  }
  if ((rows[rows.length - 1]?.level ?? Number.NaN) < top * (1 - 1e-12))
    rows.push({ level: top, volume: fromLitres(tank.capacity, volume) });
  return ok(rows);
}
