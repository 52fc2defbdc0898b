// Tank geometry: the tank JSON, level <-> volume for every shape, and the helpers operators use.

export { type ChartRow, calibrationChart, MAX_CHART_ROWS } from './calibration-chart.js';
export { type Head, resolveHead, torisphericalDepth } from './heads.js';
export {
  DEFAULT_SAFE_FILL_PERCENT,
  deadStockVolume,
  levelFromUllage,
  SAFE_FILL_CAUTION,
  type SafeFill,
  safeFill,
  usableVolume,
} from './operating-limits.js';
export {
  type HeadSpec,
  type HeadType,
  parseTankSpec,
  type TankSpec,
  type TankUnits,
  tankSpecSchema,
} from './spec.js';
export { parseStrappingCsv, type StrappingUnits } from './strapping-csv.js';
export { buildTank, levelAtVolume, type Tank, volumeAtLevel } from './tank.js';
