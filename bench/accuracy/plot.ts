// Line charts for docs/accuracy/: vega-lite spec -> SVG with vega (no browser) -> PNG with resvg.
import { Resvg } from '@resvg/resvg-js';
import * as vega from 'vega';
import * as vl from 'vega-lite';

export interface Series {
  name: string;
  points: { x: number; y: number }[];
}

export async function lineChartPng(
  title: string,
  xTitle: string,
  yTitle: string,
  series: Series[],
): Promise<Buffer> {
  const values = series.flatMap((s) => s.points.map((p) => ({ series: s.name, x: p.x, y: p.y })));
  const spec: vl.TopLevelSpec = {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    title,
    width: 720,
    height: 260,
    data: { values },
    mark: { type: 'line', strokeWidth: 1.2 },
    encoding: {
      x: { field: 'x', type: 'quantitative', title: xTitle },
      y: { field: 'y', type: 'quantitative', title: yTitle },
      color: { field: 'series', type: 'nominal', title: null },
    },
  };
  const view = new vega.View(vega.parse(vl.compile(spec).spec), { renderer: 'none' });
  const svg = await view.toSVG();
  view.finalize();
  return new Resvg(svg, { font: { loadSystemFonts: true }, background: 'white' }).render().asPng();
}

/** Every k-th point, so a chart of a long series stays light. */
export function thin<T>(items: T[], max = 1500): T[] {
  const k = Math.max(1, Math.ceil(items.length / max));
  return items.filter((_, i) => i % k === 0);
}
