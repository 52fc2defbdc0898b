import { describe, expect, it } from 'vitest';
import { chartRows, thresholdLabel } from './chartSpec.js';
import { renderChartSvg } from './renderChart.js';
import type { LevelChart } from './reply.js';

const day = 86_400_000;
const start = Date.UTC(2026, 9, 1, 15, 0);

/** Demo data of our own invention: the North Yard backwash waste tank, filling ~100 gal a day, emptied twice. */
function wasteChart(): LevelChart {
  const history = Array.from({ length: 30 }, (_, i) => ({
    time: start + i * day,
    volume: 300 + 100 * (i % 12),
  }));
  return {
    title: 'BW-1 Backwash waste tank',
    volumeUnit: 'gal',
    history,
    forecast: [],
    deliveries: [{ time: start + 11.5 * day, volume: 1100 }],
    detected: [{ time: start + 23.5 * day, volume: 1100 }],
    threshold: 2873,
    capacity: 3600,
    timeZone: 'America/Denver',
    filling: true,
  };
}

describe('chart labels of a filling (waste) tank', () => {
  it('labels a pick-up as taken away and the line as the pick-up level', async () => {
    const chart = wasteChart();
    expect(thresholdLabel(chart)).toBe('Pick-up level 2,873 gal');
    const labels = chartRows(chart).deliveries.map((d) => d.label);
    expect(labels[0]).toEqual(['pick-up', '1,100 gal']);
    expect(labels.flat().join(' ')).not.toContain('+');
    const svg = await renderChartSvg(chart);
    expect(svg).toContain('Pick-up level 2,873 gal');
    expect(svg).not.toContain('Reorder');
  });

  it('marks every pick-up the readings show, also one nobody logged', () => {
    const rows = chartRows(wasteChart());
    expect(rows.deliveries).toHaveLength(2);
    expect(rows.deliveries[1]?.label).toEqual(['pick-up', '1,100 gal', 'not logged']);
  });

  it('an emptying tank keeps "+volume" deliveries and the reorder line', () => {
    const chart: LevelChart = { ...wasteChart(), filling: false, title: 'FERRIC-1' };
    expect(thresholdLabel(chart)).toBe('Reorder 2,873 gal');
    expect(chartRows(chart).deliveries.map((d) => d.label)).toEqual([
      ['+1,100 gal'],
      ['+1,100 gal', 'not logged'],
    ]);
  });
});
