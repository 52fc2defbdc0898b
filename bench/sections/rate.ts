// Throughput of the consumption-rate estimator: batch readings per second, one incremental update, and
// `analyze` on a year of 5-minute readings, each beside a bare two-state Kalman loop (or a bare CSV parse)
// timed in the same run on the same data.
import { buildAnalyzeOutput, isoTime } from '../../cli/commands/analyze.js';
import { parseReadingsCsv } from '../../cli/readings-csv.js';
import {
  analyzeSeries,
  analyzeSeriesColumns,
  createRateEstimator,
  type TimedVolume,
} from '../../engine/rate/index.js';
import { ok } from '../../engine/result.js';
import type { BenchRow, BenchSection } from '../harness.js';

const DAY_MS = 86_400_000;
const YEAR_OF_5_MIN = 105_120;

/** A year of 5-minute readings: steady use, noise, a spike every ~700 readings, a delivery at 20%. */
function yearOfReadings(): TimedVolume[] {
  let seed = 12345;
  const uniform = () => {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
    return seed / 4294967296;
  };
  const out: TimedVolume[] = [];
  let v = 9000;
  const t0 = Date.UTC(2026, 0, 1);
  for (let i = 0; i < YEAR_OF_5_MIN; i++) {
    v -= 400 / 288;
    if (v < 2000) v += 6500;
    const spike = i % 701 === 350 ? 1500 : 0;
    out.push({ time: t0 + i * 300_000, volume: v + 25 * (uniform() - 0.5) + spike });
  }
  return out;
}

/** The baseline: a bare local-linear-trend Kalman update per reading (no events, no robustness). */
function bareKalman(times: Float64Array, volumes: Float64Array): number {
  let v = volumes[0]!;
  let r = 0;
  let p00 = 100;
  let p01 = 0;
  let p11 = 1e6;
  const q = 50;
  const R = 100;
  for (let i = 1; i < times.length; i++) {
    const dt = (times[i]! - times[i - 1]!) / DAY_MS;
    const vp = v - r * dt;
    const a00 = p00 - 2 * dt * p01 + dt * dt * p11 + (q * dt * dt * dt) / 3;
    const a01 = p01 - dt * p11 - (q * dt * dt) / 2;
    const a11 = p11 + q * dt;
    const S = a00 + R;
    const e = volumes[i]! - vp;
    const k0 = a00 / S;
    const k1 = a01 / S;
    v = vp + k0 * e;
    r += k1 * e;
    p00 = a00 * (1 - k0);
    p01 = a01 * (1 - k0);
    p11 = a11 - k1 * a01;
  }
  return v + r;
}

/** Best of several timed runs (the machine is shared): milliseconds per call. */
function bestMs(fn: () => unknown, runs: number): number {
  let best = Number.POSITIVE_INFINITY;
  for (let i = 0; i < runs; i++) {
    const start = process.hrtime.bigint();
    fn();
    best = Math.min(best, Number(process.hrtime.bigint() - start) / 1e6);
  }
  return best;
}

export const rateSection: BenchSection = {
  title: 'rate estimator (engine/rate) and analyze',
  async run(): Promise<BenchRow[]> {
    const readings = yearOfReadings();
    const times = Float64Array.from(readings, (r) => r.time);
    const volumes = Float64Array.from(readings, (r) => r.volume);
    const n = readings.length;
    const bare = {
      name: 'bare two-state Kalman loop',
      value: n / (bestMs(() => bareKalman(times, volumes), 15) / 1000),
    };
    const batch = n / (bestMs(() => analyzeSeries(readings, [], { capacity: 10_000 }), 8) / 1000);
    const columns = n / (bestMs(() => analyzeSeriesColumns(readings, [], { capacity: 10_000 }), 8) / 1000);
    const incremental = bestMs(() => {
      const estimator = createRateEstimator({ capacity: 10_000 });
      let sink = 0;
      for (let i = 0; i < n; i++) sink += estimator.addReading(times[i]!, volumes[i]!).rate;
      return sink;
    }, 8);
    const bareNs = 1e9 / bare.value;

    const csv = ['time,volume', ...readings.map((r) => `${isoTime(r.time)},${r.volume.toFixed(1)}`)].join(
      '\n',
    );
    const analyzeMs = bestMs(() => {
      const table = parseReadingsCsv(
        csv,
        (_c, v) => ok(v),
        (v) => v,
      );
      if (!table.ok) throw new Error(table.error);
      const { output } = buildAnalyzeOutput(table.value, {
        volumeUnit: 'L',
        capacity: 10_000,
        target: 0,
        filling: false,
      });
      return JSON.stringify(output).length;
    }, 3);
    const splitMs = bestMs(() => {
      let sum = 0;
      for (const line of csv.split('\n')) sum += Number(line.slice(line.indexOf(',') + 1)) || 0;
      return sum;
    }, 5);
    return [
      {
        name: 'batch analyzeSeries, readings/s (one core)',
        value: batch,
        unit: 'readings/s',
        baseline: bare,
        goal: '>= 2,000,000 readings/s, within 10x of the bare loop',
      },
      {
        name: 'batch analyzeSeriesColumns (typed arrays), readings/s (one core)',
        value: columns,
        unit: 'readings/s',
        baseline: bare,
        goal: '>= 2,000,000 readings/s, within 10x of the bare loop',
      },
      {
        name: 'incremental addReading, amortised',
        value: (incremental * 1e6) / n,
        unit: 'ns/reading',
        baseline: { name: 'bare Kalman update', value: bareNs },
        goal: '< 1000 ns',
      },
      {
        name: `analyze on ${n.toLocaleString('en-US')} rows (CSV text -> JSON text)`,
        value: analyzeMs,
        unit: 'ms',
        baseline: { name: 'split + Number() of the same CSV', value: splitMs },
        goal: '< 1000 ms',
      },
    ];
  },
};
