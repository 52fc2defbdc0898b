/**
 * The level chart as a vega-lite spec: measured history (solid), forecast (dashed) with its range (shaded),
 * deliveries (pick-ups of a filling tank) marked, the reorder threshold (pick-up level) and the capacity drawn. Sized and lettered for a phone screen:
 * big fonts, few ticks, labels on the lines instead of a legend.
 */
import { DateTime } from 'luxon';
import type { TopLevelSpec } from 'vega-lite';
import { formatVolume } from './format.js';
import type { LevelChart } from './reply.js';

/** Our own palette (colour-blind-safe pairs: blue/orange, plus red for the line not to cross). */
export const CHART_COLORS = {
  history: '#1f5fa8',
  forecast: '#d9730d',
  band: '#f5c48a',
  threshold: '#c0262d',
  capacity: '#6b7280',
  delivery: '#13795b',
} as const;

export const CHART_SIZE = { width: 760, height: 430 } as const;
const FONT = 'DejaVu Sans';

/**
 * vega formats times in UTC or the process's zone, never in an arbitrary one, so each instant is shifted to
 * the team's wall-clock time and drawn on a UTC scale: "07:30 in Chicago" then reads 07:30 on the axis.
 */
export function toWallClock(time: number, timeZone: string): number {
  const dt = DateTime.fromMillis(time, { zone: timeZone });
  const offsetMinutes = dt.isValid ? dt.offset : 0;
  return time + offsetMinutes * 60_000;
}

const finite = (...values: (number | undefined)[]) =>
  values.every((v) => v === undefined || Number.isFinite(v));

interface Point {
  t: number;
  v: number;
}
interface BandPoint extends Point {
  lo: number;
  hi: number;
}

/** Past this many points a line carries more points than a phone has pixels across. */
export const MAX_LINE_POINTS = 600;

/**
 * Thins a time-ordered series to at most `max` points by keeping each bucket's lowest and highest point in
 * time order, so a delivery's jump and the lowest level still show; short series pass through unchanged.
 */
export function thinSeries<T extends { t: number; v: number }>(
  points: readonly T[],
  max = MAX_LINE_POINTS,
): T[] {
  if (points.length <= max) return [...points];
  const buckets = Math.max(1, Math.floor(max / 2));
  const size = points.length / buckets;
  const kept: T[] = [];
  for (let b = 0; b < buckets; b++) {
    const slice = points.slice(Math.floor(b * size), Math.floor((b + 1) * size));
    if (slice.length === 0) continue;
    let lo = slice[0] as T;
    let hi = slice[0] as T;
    for (const p of slice) {
      if (p.v < lo.v) lo = p;
      if (p.v > hi.v) hi = p;
    }
    if (lo === hi) kept.push(lo);
    else kept.push(...(lo.t <= hi.t ? [lo, hi] : [hi, lo]));
  }
  const first = points[0] as T;
  const last = points[points.length - 1] as T;
  if (kept[0] !== first) kept.unshift(first);
  if (kept[kept.length - 1] !== last) kept.push(last);
  return kept;
}

/** Rows for each layer, in wall-clock time, dropping points a broken input made non-finite. */
export function chartRows(chart: LevelChart) {
  const t = (time: number) => toWallClock(time, chart.timeZone);
  // Thin on UTC instants first: the zone lookup per point is the slow part, and the shift keeps the order.
  const history: Point[] = thinSeries(
    chart.history
      .filter((p) => finite(p.time, p.volume))
      .map((p) => ({ t: p.time, v: p.volume }))
      .sort((a, b) => a.t - b.t),
  ).map((p) => ({ t: t(p.t), v: p.v }));
  const forecast: BandPoint[] = thinSeries(
    chart.forecast
      .filter((p) => finite(p.time, p.volume, p.low, p.high))
      .map((p) => ({ t: p.time, v: p.volume, lo: p.low, hi: p.high }))
      .sort((a, b) => a.t - b.t),
  ).map((p) => ({ ...p, t: t(p.t) }));
  // The forecast starts where the measured line ends, so the two read as one line that turns dashed.
  const last = history[history.length - 1];
  const first = forecast[0];
  if (last && first && last.t < first.t) forecast.unshift({ t: last.t, v: last.v, lo: last.v, hi: last.v });
  // Each marker's label is lines of text (vega draws an array as lines), short enough not to run into the next.
  const label = (volume: number, logged: boolean): string[] => {
    const amount = formatVolume(volume, chart.volumeUnit);
    const what = chart.filling ? ['pick-up', amount] : [`+${amount}`];
    return logged ? what : [...what, 'not logged'];
  };
  const marker = (logged: boolean) => (d: { time: number; volume: number }) =>
    finite(d.time, d.volume) ? [{ t: t(d.time), label: label(d.volume, logged) }] : [];
  const deliveries: { t: number; label: string[] }[] = [
    ...chart.deliveries.flatMap(marker(true)),
    ...(chart.detected ?? []).flatMap(marker(false)),
  ].sort((a, b) => a.t - b.t);
  return { history, forecast, deliveries };
}

/** A horizontal reference line with its label at the left end, above the line. */
function referenceLine(value: number, label: string, color: string, dash: number[]) {
  return {
    data: { values: [{ y: value, label }] },
    layer: [
      {
        mark: { type: 'rule', color, strokeWidth: 3, strokeDash: dash },
        encoding: { y: { field: 'y', type: 'quantitative' } },
      },
      {
        mark: {
          type: 'text',
          color,
          align: 'left',
          baseline: 'bottom',
          dx: 6,
          dy: -4,
          fontSize: 22,
          fontWeight: 'bold',
          x: 0,
        },
        encoding: { y: { field: 'y', type: 'quantitative' }, text: { field: 'label' } },
      },
    ],
  };
}

/** Labels of the reference lines, also used by tests to find them in the SVG. */
export function thresholdLabel(chart: LevelChart): string | undefined {
  return chart.threshold === undefined || !Number.isFinite(chart.threshold)
    ? undefined
    : `${chart.filling ? 'Pick-up level' : 'Reorder'} ${formatVolume(chart.threshold, chart.volumeUnit)}`;
}

export function capacityLabel(chart: LevelChart): string | undefined {
  return chart.capacity === undefined || !Number.isFinite(chart.capacity)
    ? undefined
    : `Full ${formatVolume(chart.capacity, chart.volumeUnit)}`;
}

/** Dates for spans of days; clock times (with the day) when everything falls within two days. */
function timeFormat(rows: ReturnType<typeof chartRows>): string {
  const times = [...rows.history, ...rows.forecast, ...rows.deliveries].map((r) => r.t);
  if (times.length === 0) return '%-d %b';
  const span = Math.max(...times) - Math.min(...times);
  return span < 2 * 86_400_000 ? '%-d %b %H:%M' : '%-d %b';
}

const LABEL_LINE_HEIGHT = 20;

const x = { field: 't', type: 'temporal', scale: { type: 'utc' }, title: null } as const;

export function levelChartSpec(chart: LevelChart): TopLevelSpec {
  const rows = chartRows(chart);
  const y = { field: 'v', type: 'quantitative', title: chart.volumeUnit } as const;
  const layers: unknown[] = [];
  if (rows.forecast.length > 0) {
    layers.push(
      {
        data: { values: rows.forecast },
        mark: { type: 'area', color: CHART_COLORS.band, opacity: 0.55 },
        encoding: {
          x,
          y: { field: 'lo', type: 'quantitative', title: chart.volumeUnit },
          y2: { field: 'hi' },
        },
      },
      {
        data: { values: rows.forecast },
        mark: { type: 'line', color: CHART_COLORS.forecast, strokeWidth: 4, strokeDash: [10, 7] },
        encoding: { x, y },
      },
    );
  }
  if (rows.history.length > 0) {
    layers.push({
      data: { values: rows.history },
      mark: { type: 'line', color: CHART_COLORS.history, strokeWidth: 4, point: rows.history.length <= 40 },
      encoding: { x, y },
    });
  }
  for (const delivery of rows.deliveries) {
    layers.push({
      data: { values: [delivery] },
      layer: [
        {
          mark: { type: 'rule', color: CHART_COLORS.delivery, strokeWidth: 2, opacity: 0.8 },
          encoding: { x },
        },
        {
          mark: {
            type: 'text',
            color: CHART_COLORS.delivery,
            fontSize: 18,
            fontWeight: 'bold',
            align: 'left',
            baseline: 'bottom',
            dx: 6,
            // At the foot of the plot: deliveries sit in the measured part, where the level is high, so the
            // foot is clear there, and the reference-line labels stay at the top-left. Lines run downwards
            // from `y`, so a label of several lines starts higher to end at the same foot.
            lineHeight: LABEL_LINE_HEIGHT,
            y: CHART_SIZE.height - 8 - (delivery.label.length - 1) * LABEL_LINE_HEIGHT,
          },
          encoding: { x, text: { field: 'label' } },
        },
      ],
    });
  }
  const threshold = thresholdLabel(chart);
  if (threshold && chart.threshold !== undefined) {
    layers.push(referenceLine(chart.threshold, threshold, CHART_COLORS.threshold, [12, 6]));
  }
  const capacity = capacityLabel(chart);
  if (capacity && chart.capacity !== undefined) {
    layers.push(referenceLine(chart.capacity, capacity, CHART_COLORS.capacity, [4, 4]));
  }
  if (layers.length === 0) {
    layers.push({
      data: { values: [{ label: 'No readings yet' }] },
      mark: { type: 'text', fontSize: 26 },
      encoding: { text: { field: 'label' } },
    });
  }
  const spec = {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: CHART_SIZE.width,
    height: CHART_SIZE.height,
    padding: 16,
    background: 'white',
    title: {
      text: chart.title,
      subtitle: 'measured (solid) · forecast (dashed) · likely range (shaded)',
      fontSize: 30,
      subtitleFontSize: 19,
      subtitleColor: '#444',
      anchor: 'start',
      offset: 14,
    },
    // Volumes start at zero so a half-empty tank looks half empty.
    resolve: { scale: { y: 'shared' } },
    layer: layers,
    config: {
      font: FONT,
      view: { stroke: null },
      axis: {
        labelFontSize: 22,
        titleFontSize: 22,
        grid: true,
        gridColor: '#e5e7eb',
        tickCount: 4,
        labelColor: '#222',
        titleColor: '#222',
      },
      axisX: {
        format: timeFormat(rows),
        formatType: 'utc',
        labelAngle: 0,
        tickCount: 4,
        labelOverlap: true,
        labelLimit: 400,
      },
      axisY: { titleAngle: 0, titleAlign: 'left', titleY: -14, titleX: -10, labelOverlap: true },
    },
  };
  return spec as unknown as TopLevelSpec;
}
