// Tank geometry: the tank JSON, level <-> volume for every shape, and the helpers operators use.
export { type Head, resolveHead, torisphericalDepth } from './heads.js';
export {
  type HeadSpec,
  type HeadType,
  parseTankSpec,
  type TankSpec,
  type TankUnits,
  tankSpecSchema,
} from './spec.js';
export { buildTank, levelAtVolume, type Tank, volumeAtLevel } from './tank.js';
