// Shared helpers for `npm run bench`: every figure is printed beside a baseline timed in the same run.
import os from 'node:os';

export interface BenchRow {
  /** What was measured, e.g. "horizontal-cylinder ellipsoidal: level->volume". */
  name: string;
  /** The measured figure. */
  value: number;
  /** Its unit, e.g. "ops/s", "ms p99". */
  unit: string;
  /** The baseline timed in the same run, and what it is. */
  baseline?: { name: string; value: number };
  /** A goal from the issue, for the reader: e.g. ">= 1e6 ops/s". */
  goal?: string;
}

export interface BenchSection {
  title: string;
  run(): Promise<BenchRow[]>;
}

/** Calls `fn` in growing batches until `minMs` has passed; returns calls per second. */
export function opsPerSecond(fn: (i: number) => unknown, minMs = 300): number {
  let sink = 0;
  let n = 1;
  for (;;) {
    const start = process.hrtime.bigint();
    for (let i = 0; i < n; i++) {
      const r = fn(i);
      if (typeof r === 'number') sink += r;
    }
    const ms = Number(process.hrtime.bigint() - start) / 1e6;
    if (ms >= minMs) {
      if (sink === Number.NEGATIVE_INFINITY) console.log(sink); // keeps the work observable
      return (n / ms) * 1000;
    }
    n *= ms < minMs / 10 ? 10 : 2;
  }
}

/** Percentile of a sample (nearest rank). */
export function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[rank] ?? Number.NaN;
}

export function machineNote(): string {
  const cpu = os.cpus()[0]?.model ?? 'unknown CPU';
  return `${cpu}, ${os.cpus().length} cores, ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}, ${os.platform()} ${os.arch()}`;
}

export function formatRow(row: BenchRow): string {
  const fmt = (v: number) => (Math.abs(v) >= 1000 ? Math.round(v).toLocaleString('en-US') : v.toPrecision(4));
  let line = `  ${row.name}: ${fmt(row.value)} ${row.unit}`;
  if (row.baseline) {
    line += `  (${(row.value / row.baseline.value).toFixed(2)}x ${row.baseline.name} = ${fmt(row.baseline.value)} ${row.unit})`;
  }
  if (row.goal) line += `  [goal ${row.goal}]`;
  return line;
}
