import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { chartRows, MAX_LINE_POINTS, thinSeries, toWallClock } from './chartSpec.js';
import { renderChartPng, renderChartSvg } from './renderChart.js';
import type { LevelChart } from './reply.js';

const day = 86_400_000;
const start = Date.UTC(2026, 10, 2, 13, 30);

/** Demo data of our own invention: a diesel day tank at Ridge Pump Station using about 12 gal a day. */
function demoChart(): LevelChart {
  const history = Array.from({ length: 14 }, (_, i) => ({
    time: start + i * day,
    volume: 470 - 12 * i + (i >= 7 ? 150 : 0),
  }));
  const lastTime = start + 13 * day;
  const forecast = Array.from({ length: 10 }, (_, i) => ({
    time: lastTime + (i + 1) * day,
    volume: 464 - 12.4 * (i + 1),
    low: 464 - 13.8 * (i + 1),
    high: 464 - 10.9 * (i + 1),
  }));
  return {
    title: 'T4 Ridge Pump Station (demo)',
    volumeUnit: 'gal',
    history,
    forecast,
    deliveries: [{ time: start + 6.5 * day, volume: 150 }],
    threshold: 120,
    capacity: 564,
    timeZone: 'America/Chicago',
  };
}

/** PNG signature and IHDR width/height, per the PNG specification (W3C PNG, 2nd ed., sections 5.2 and 11.2.2). */
function pngSize(png: Buffer): { width: number; height: number } {
  expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  expect(png.subarray(12, 16).toString('ascii')).toBe('IHDR');
  return { width: png.readUInt32BE(16), height: png.readUInt32BE(20) };
}

describe('renderChartPng', () => {
  it('renders a PNG big enough to read on a phone', async () => {
    const png = await renderChartPng(demoChart());
    const { width, height } = pngSize(png);
    expect(width).toBeGreaterThanOrEqual(1200);
    expect(height).toBeGreaterThanOrEqual(700);
    expect(width).toBeLessThanOrEqual(2400);
    expect(png.length).toBeGreaterThan(10_000);
  });

  it('draws the title, the threshold, the capacity and the delivery as text in the SVG', async () => {
    const svg = await renderChartSvg(demoChart());
    expect(svg).toContain('T4 Ridge Pump Station (demo)');
    expect(svg).toContain('Reorder 120 gal');
    expect(svg).toContain('Full 564 gal');
    expect(svg).toContain('+150 gal');
  });

  it('labels the time axis in the team zone', async () => {
    // 2 Nov 02:00 UTC is still 1 Nov in Chicago (UTC-5 then): the first tick label must be a November 1 date.
    const chart: LevelChart = {
      ...demoChart(),
      history: [
        { time: Date.UTC(2026, 10, 2, 2, 0), volume: 400 },
        { time: Date.UTC(2026, 10, 2, 4, 59), volume: 390 },
      ],
      forecast: [],
      deliveries: [],
    };
    const svg = await renderChartSvg(chart);
    expect(svg).toMatch(/>1 Nov \d\d:\d\d</);
    expect(svg).not.toMatch(/>2 Nov/);
  });

  it('renders an empty chart and drops broken points instead of failing', async () => {
    const empty: LevelChart = {
      title: 'T9 (new)',
      volumeUnit: 'L',
      history: [],
      forecast: [],
      deliveries: [],
      timeZone: 'UTC',
    };
    pngSize(await renderChartPng(empty));
    expect(await renderChartSvg(empty)).toContain('No readings yet');
    const broken: LevelChart = {
      ...demoChart(),
      history: [
        { time: start, volume: Number.NaN },
        { time: start + day, volume: 300 },
      ],
      threshold: Number.POSITIVE_INFINITY,
      timeZone: 'Not/AZone',
    };
    pngSize(await renderChartPng(broken));
    expect(chartRows(broken).history).toHaveLength(1);
  });
});

describe('odd charts', () => {
  it.each([
    ['one reading', { history: [{ time: start, volume: 300 }], forecast: [], deliveries: [] }],
    [
      'forecast only',
      { history: [], forecast: [{ time: start, volume: 300, low: 280, high: 320 }], deliveries: [] },
    ],
    [
      'a delivery with no readings',
      { history: [], forecast: [], deliveries: [{ time: start, volume: 150 }] },
    ],
    [
      'huge volumes',
      {
        history: [
          { time: start, volume: 4e9 },
          { time: start + day, volume: 3.9e9 },
        ],
        forecast: [],
        deliveries: [],
      },
    ],
    [
      'negative volumes',
      {
        history: [
          { time: start, volume: -5 },
          { time: start + day, volume: 10 },
        ],
        forecast: [],
        deliveries: [],
      },
    ],
    [
      'readings out of order',
      {
        history: [
          { time: start + day, volume: 10 },
          { time: start, volume: 20 },
        ],
        forecast: [],
        deliveries: [],
      },
    ],
  ])('renders %s', async (_name, parts) => {
    const chart: LevelChart = { ...demoChart(), ...parts } as LevelChart;
    const { width } = pngSize(await renderChartPng(chart));
    expect(width).toBeGreaterThan(500);
  });
});

describe('toWallClock', () => {
  it('shifts an instant by the zone offset of that instant, across DST', () => {
    // Offsets from the IANA tz database (via luxon): Chicago is UTC-5 in summer, UTC-6 in winter.
    const summer = Date.UTC(2026, 6, 1, 12);
    const winter = Date.UTC(2026, 11, 1, 12);
    expect(toWallClock(summer, 'America/Chicago')).toBe(summer - 5 * 3_600_000);
    expect(toWallClock(winter, 'America/Chicago')).toBe(winter - 6 * 3_600_000);
    expect(toWallClock(winter, 'Not/AZone')).toBe(winter);
  });
});

describe('thinSeries', () => {
  it('thins three years of hourly readings to a phone-sized line that keeps the extremes and both ends', () => {
    const hourly = Array.from({ length: 3 * 365 * 24 }, (_, i) => ({
      t: i * 3_600_000,
      v: i === 9000 ? 800 : 500 - (i % 700),
    }));
    const thin = thinSeries(hourly);
    expect(thin.length).toBeLessThanOrEqual(MAX_LINE_POINTS + 2);
    expect(thin[0]).toBe(hourly[0]);
    expect(thin[thin.length - 1]).toBe(hourly[hourly.length - 1]);
    expect(Math.max(...thin.map((p) => p.v))).toBe(800);
    expect(Math.min(...thin.map((p) => p.v))).toBe(Math.min(...hourly.map((p) => p.v)));
  });

  it('keeps time order and never invents a point (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -1000, max: 1000 }), { maxLength: 3000 }),
        fc.integer({ min: 2, max: 700 }),
        (values, max) => {
          const points = values.map((v, i) => ({ t: i, v }));
          const thin = thinSeries(points, max);
          expect(thin.length).toBeLessThanOrEqual(
            Math.max(points.length <= max ? points.length : max + 2, 0),
          );
          for (let i = 1; i < thin.length; i++) expect((thin[i]?.t ?? 0) > (thin[i - 1]?.t ?? 0)).toBe(true);
          for (const p of thin) expect(points).toContain(p);
        },
      ),
      { numRuns: 50 },
    );
  });
});
