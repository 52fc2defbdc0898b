/**
 * LevelChart -> SVG -> PNG with no browser: vega-lite compiles the spec, vega renders it headless to SVG,
 * resvg rasterizes the SVG. See ../shared/docs/chat-platforms.md, "Charts as images".
 */
import { Resvg } from '@resvg/resvg-js';
import * as vega from 'vega';
import { compile } from 'vega-lite';
import { levelChartSpec } from './chartSpec.js';
import type { LevelChart } from './reply.js';

/** The chart as SVG text; its <text> elements carry the title and line labels. */
export async function renderChartSvg(chart: LevelChart): Promise<string> {
  const compiled = compile(levelChartSpec(chart)).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: 'none' });
  try {
    return await view.toSVG();
  } finally {
    view.finalize();
  }
}

/**
 * The chart as a PNG at twice the SVG's size, so it stays sharp when a phone scales it. Fonts come from the
 * system (DejaVu is the family the spec asks for; resvg falls back to any sans).
 */
export async function renderChartPng(chart: LevelChart): Promise<Buffer> {
  const svg = await renderChartSvg(chart);
  const resvg = new Resvg(svg, {
    background: 'white',
    fitTo: { mode: 'zoom', value: 2 },
    font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans', sansSerifFamily: 'DejaVu Sans' },
  });
  return resvg.render().asPng();
}
