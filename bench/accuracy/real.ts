// Backtest on the open real series in ../shared/data/real (read at bench time only, never copied here).
// rainwater-2m-cylinder: source and licence in its SOURCE.md (a public GPL-3.0 logger repository). Columns
// used: created_at, field2 (volume, L) and field4 (cumulative volume withdrawn, computed by the logger from
// level decreases: the only "realised use" the data offer, so it is not independent of the levels).
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { runwayTo } from '../../engine/forecast/runway.js';
import { analyzeSeries } from '../../engine/rate/index.js';
import { leastSquaresBaseline } from './baselines.js';
import type { MethodPoint } from './metrics.js';
import { median } from './metrics.js';

const DAY_MS = 86_400_000;

export interface RealBacktest {
  name: string;
  rows: number;
  /** Median absolute error of the rate against the use realised over the next 7 days, L/day, per method. */
  rateError: Record<string, number>;
  rateCompared: number;
  runout: { ahead: number; count: number; medianAbsDays: Record<string, number> }[];
}

interface Row {
  time: number;
  volume: number;
  withdrawn: number;
}

function readRainwater(path: string): Row[] {
  const lines = readFileSync(path, 'utf8').split(/\r?\n/).slice(1);
  const rows: Row[] = [];
  for (const line of lines) {
    const c = line.split(',');
    const time = Date.parse(c[0] ?? '');
    const volume = Number(c[3]);
    const withdrawn = Number(c[5]);
    if (Number.isFinite(time) && c[3] !== '' && Number.isFinite(volume) && Number.isFinite(withdrawn)) {
      rows.push({ time, volume, withdrawn });
    }
  }
  return rows.sort((a, b) => a.time - b.time);
}

/** Value of a step series (rows sorted by time) at `time`: the last row at or before it. */
function at(rows: Row[], time: number): Row | null {
  let lo = 0;
  let hi = rows.length - 1;
  if (hi < 0 || rows[0]!.time > time) return null;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (rows[mid]!.time <= time) lo = mid;
    else hi = mid - 1;
  }
  return rows[lo]!;
}

export function backtestRainwater(root: string): RealBacktest | null {
  const path = join(root, 'rainwater-2m-cylinder', 'feeds.csv');
  if (!existsSync(path)) return null;
  const rows = readRainwater(path);
  const readings = rows.map((r) => ({ time: r.time, volume: Math.max(0, r.volume) }));
  const capacity = 4700; // usable volume from SOURCE.md (about 1.36 m of a 2.10 m cylinder)
  const methods: Record<string, MethodPoint[]> = {
    estimator: analyzeSeries(readings, [], { capacity }).points,
    ls7: leastSquaresBaseline(readings, capacity, false).points,
    'ls7-no-rises': leastSquaresBaseline(readings, capacity, true).points,
  };
  const last = rows[rows.length - 1]!.time;
  const rateError: Record<string, number> = {};
  let rateCompared = 0;
  for (const [name, points] of Object.entries(methods)) {
    const errors: number[] = [];
    for (const p of points) {
      if (p.time + 7 * DAY_MS > last) break;
      const now = at(rows, p.time);
      const later = at(rows, p.time + 7 * DAY_MS);
      if (!now || !later) continue;
      errors.push(Math.abs(p.rate - (later.withdrawn - now.withdrawn) / 7));
    }
    rateError[name] = median(errors);
    rateCompared = errors.length;
  }
  // Run-out: forecasts made 7 and 3 days before the volume first fell to 1000 L, with no rain in between.
  const target = 1000;
  const crossings: number[] = [];
  for (let i = 1; i < rows.length; i++)
    if (rows[i - 1]!.volume > target && rows[i]!.volume <= target) crossings.push(rows[i]!.time);
  const runout = [7, 3].map((ahead) => {
    const medianAbsDays: Record<string, number> = {};
    let count = 0;
    for (const [name, points] of Object.entries(methods)) {
      const errors: number[] = [];
      for (const c of crossings) {
        const from = c - ahead * DAY_MS;
        const idx = points.findLastIndex((p) => p.time <= from);
        if (idx < 0) continue;
        const between = rows.filter((r) => r.time > points[idx]!.time && r.time <= c);
        const rained = between.some((r, k) => k > 0 && r.volume - between[k - 1]!.volume > 150);
        if (rained) continue;
        const runway = runwayTo(points[idx]!, { volume: target });
        errors.push(runway.runoutAt === null ? ahead * 3 : Math.abs(runway.runoutAt - c) / DAY_MS);
      }
      medianAbsDays[name] = median(errors);
      count = errors.length;
    }
    return { ahead, count, medianAbsDays };
  });
  return { name: 'rainwater-2m-cylinder', rows: rows.length, rateError, rateCompared, runout };
}
