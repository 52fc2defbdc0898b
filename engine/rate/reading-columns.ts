// A series of readings as two columns (epoch ms, litres) in time order: the batch path's input. A long CSV
// parsed straight into columns makes no object per reading (3 heap objects each: the object and two boxed
// numbers), and the estimator loop reads the columns in place.
import type { TimedVolume } from './types.js';

export interface ReadingColumns {
  /** Epoch ms; as many as `volume`. */
  time: Float64Array;
  /** Litres. */
  volume: Float64Array;
}

/** The series sorted by time; an already sorted one (the usual case) is used as is, without a copy. */
export function inTimeOrder(series: readonly TimedVolume[]): readonly TimedVolume[] {
  for (let i = 1; i < series.length; i++) {
    if (series[i]!.time < series[i - 1]!.time) return [...series].sort((a, b) => a.time - b.time);
  }
  return series;
}

/** A series of readings as columns in time order. */
export function readingColumns(series: readonly TimedVolume[]): ReadingColumns {
  const sorted = inTimeOrder(series);
  const time = new Float64Array(sorted.length);
  const volume = new Float64Array(sorted.length);
  for (let i = 0; i < sorted.length; i++) {
    time[i] = sorted[i]!.time;
    volume[i] = sorted[i]!.volume;
  }
  return { time, volume };
}

/**
 * Columns in time order: sorted ones (the usual case) as they are, others through the same stable sort as
 * `inTimeOrder`. A volume column shorter than the times reads as missing volumes (suspect readings).
 */
export function columnsInTimeOrder(c: ReadingColumns): ReadingColumns {
  const { time, volume } = c;
  for (let i = 1; i < time.length; i++) {
    if (time[i]! < time[i - 1]!) {
      const order = Array.from(time.keys()).sort((a, b) => time[a]! - time[b]!);
      return {
        time: Float64Array.from(order, (k) => time[k]!),
        volume: Float64Array.from(order, (k) => volume[k] ?? Number.NaN),
      };
    }
  }
  return c;
}
