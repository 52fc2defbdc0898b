// The replies part in one import: the model, its plain-text form, wording helpers, cautions and the chart.
export * from './cautions.js';
export * from './format.js';
export { repliesToPlainText, toPlainText } from './plainText.js';
export { renderChartPng, renderChartSvg } from './renderChart.js';
export type * from './reply.js';
