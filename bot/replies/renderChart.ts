/**
 * LevelChart -> SVG -> PNG with no browser: vega-lite compiles the spec, vega renders it headless to SVG,
 * resvg rasterizes the SVG. See ../shared/docs/chat-platforms.md, "Charts as images".
 */
import { existsSync } from 'node:fs';
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
 * The two faces the chart uses. Loading two files is much faster than scanning every system font on each
 * render; a machine without them falls back to the system's fonts.
 */
const FONT_FILES = [
  '/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf',
  '/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf',
];
let fontOptions: { fontFiles: string[]; loadSystemFonts: boolean } | undefined;

function fonts(): { fontFiles: string[]; loadSystemFonts: boolean } {
  if (!fontOptions) {
    const fontFiles = FONT_FILES.filter((f) => existsSync(f));
    fontOptions = { fontFiles, loadSystemFonts: fontFiles.length < FONT_FILES.length };
  }
  return fontOptions;
}

/**
 * The chart as a PNG at 1.5 times the SVG's size, so it stays sharp when a phone scales it. Fonts come from the
 * system (DejaVu is the family the spec asks for; resvg falls back to any sans).
 */
export async function renderChartPng(chart: LevelChart): Promise<Buffer> {
  const svg = await renderChartSvg(chart);
  const resvg = new Resvg(svg, {
    background: 'white',
    fitTo: { mode: 'zoom', value: 1.5 },
    font: { ...fonts(), defaultFontFamily: 'DejaVu Sans', sansSerifFamily: 'DejaVu Sans' },
  });
  return resvg.render().asPng();
}
