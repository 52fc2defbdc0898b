// What a reply costs to draw: the level chart PNG (vega-lite -> vega SVG -> resvg) for a long hourly history
// against a two-week chart timed in the same run, and the text/embed rendering of a 200-tank overview against
// plain JSON serialization of the same reply.
import { replyEmbed } from '../../adapters/discord/embed.js';
import { toPlainText } from '../../bot/replies/plainText.js';
import { renderChartPng } from '../../bot/replies/renderChart.js';
import type { LevelChart, Reply } from '../../bot/replies/reply.js';
import { type BenchSection, opsPerSecond, percentile } from '../harness.js';

const HOUR = 3_600_000;
const START = Date.UTC(2024, 0, 1);

/** Invented demo series: a diesel tank used ~12 gal/day with a delivery every three weeks. */
function chart(hours: number, stepHours: number): LevelChart {
  const history = Array.from({ length: Math.floor(hours / stepHours) }, (_, i) => {
    const h = i * stepHours;
    return { time: START + h * HOUR, volume: 520 - ((h / 24) % 21) * 12 + Math.sin(h) * 2 };
  });
  const last = history[history.length - 1] ?? { time: START, volume: 500 };
  const forecast = Array.from({ length: 15 }, (_, d) => ({
    time: last.time + d * 24 * HOUR,
    volume: last.volume - 12.4 * d,
    low: last.volume - 13.8 * d,
    high: last.volume - 10.9 * d,
  }));
  return {
    title: 'T4 Ridge Pump Station (demo)',
    volumeUnit: 'gal',
    history,
    forecast,
    deliveries: [],
    threshold: 120,
    capacity: 564,
    timeZone: 'America/Chicago',
  };
}

async function medianMs(fn: () => Promise<unknown>, runs: number): Promise<number> {
  await fn(); // the first chart loads fonts and compiles; a bot process pays that once
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = process.hrtime.bigint();
    await fn();
    times.push(Number(process.hrtime.bigint() - start) / 1e6);
  }
  return percentile(times, 50);
}

function overview(tanks: number): Reply {
  const rows = Array.from({ length: tanks }, (_, i) => [
    `T${i}`,
    'North Yard',
    `${(i * 7) % 100}%`,
    `${i % 40} days (${i % 30}-${(i % 40) + 5})`,
    i % 9 === 0 ? 'order today' : '',
  ]);
  return {
    kind: 'answer',
    visibility: 'channel',
    headline: `All ${tanks} tanks by runway`,
    table: { columns: ['Tank', 'Site', 'Level', 'Runway', 'Action'], rows },
  };
}

export const chartsSection: BenchSection = {
  title: 'replies: chart PNG and text/embed rendering',
  async run() {
    const twoWeeks = chart(14 * 24, 24);
    const threeYears = chart(3 * 365 * 24, 1);
    const baseChart = await medianMs(() => renderChartPng(twoWeeks), 8);
    const longChart = await medianMs(() => renderChartPng(threeYears), 8);
    const reply = overview(200);
    const json = opsPerSecond(() => JSON.stringify(reply).length, 200);
    const text = opsPerSecond(() => toPlainText(reply).length, 200);
    const embed = opsPerSecond(() => (replyEmbed(reply).description ?? '').length, 200);
    const jsonName = 'JSON.stringify of the same reply';
    return [
      {
        name: 'chart PNG, 3 years of hourly readings (thinned), median',
        value: longChart,
        unit: 'ms',
        baseline: { name: 'chart PNG, 14 daily readings', value: baseChart },
        goal: 'well inside 3 s with the reply deferred',
      },
      {
        name: 'toPlainText, 200-tank overview',
        value: text,
        unit: 'ops/s',
        baseline: { name: jsonName, value: json },
      },
      {
        name: 'Discord embed, 200-tank overview',
        value: embed,
        unit: 'ops/s',
        baseline: { name: jsonName, value: json },
      },
    ];
  },
};
