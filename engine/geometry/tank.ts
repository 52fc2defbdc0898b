// The Tank: a validated specification with level <-> volume in metres and litres.
import { fail, ok, type Result } from '../result.js';
import { fromLitres, fromMetres } from '../units/index.js';
import { brentRoot } from './numeric.js';
import { type ShapeModel, shapeModel } from './shapes.js';
import { parseTankSpec, type TankSpec } from './spec.js';

export interface Tank {
  readonly spec: TankSpec;
  /** Metres. */
  readonly fullHeight: number;
  /** Litres. */
  readonly capacity: number;
  /** Litres at a level in metres; the fast path, with no range check (keep 0 <= level <= fullHeight). */
  volumeAt(levelMetres: number): number;
  /** Metres at a volume in litres, to 1e-9 of the full height; volumes outside [V(0), capacity] clamp. */
  levelAt(volumeLitres: number): number;
}

// Levels at which the volume is tabulated once per tank, so each inverse starts from a tight bracket.
const BRACKETS = 64;

/** Validates a tank JSON value and builds its Tank; the error says what to fix. */
export function buildTank(input: unknown): Result<Tank> {
  const spec = parseTankSpec(input);
  if (!spec.ok) return spec;
  const model = shapeModel(spec.value);
  if (!(model.fullHeight > 0)) return fail('tank: the full height must be above zero');
  return ok(tankFromModel(spec.value, model));
}

function tankFromModel(spec: TankSpec, model: ShapeModel): Tank {
  const H = model.fullHeight;
  const volumeAt = (h: number) => model.volumeM3(h) * 1000;
  const levels = [
    ...new Set([0, ...model.joins, ...Array.from({ length: BRACKETS + 1 }, (_, i) => (H * i) / BRACKETS)]),
  ]
    .filter((h) => h >= 0 && h <= H)
    .sort((x, y) => x - y);
  const volumes = levels.map(volumeAt);
  const capacity = volumes[volumes.length - 1]!;
  const bottom = volumes[0]!;
  const xtol = 1e-12 * H;
  const levelAt = (v: number): number => {
    if (!(v > bottom)) return 0;
    if (v >= capacity) return H;
    // The first tabulated level whose volume reaches v (a flat stretch resolves to its lowest level).
    let lo = 0;
    let hi = volumes.length - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (volumes[mid]! < v) lo = mid;
      else hi = mid;
    }
    if (volumes[hi] === v) return levels[hi]!;
    return brentRoot((h) => volumeAt(h) - v, levels[lo]!, levels[hi]!, xtol);
  };
  return { spec, fullHeight: H, capacity, volumeAt, levelAt };
}

const fmt = (x: number) => Number(x.toPrecision(6)).toString();

/** Litres at a level in metres; below 0 or above the full height is an error naming the range. */
export function volumeAtLevel(tank: Tank, levelMetres: number): Result<number> {
  if (!Number.isFinite(levelMetres)) return fail('the level must be a number');
  const unit = tank.spec.units.length;
  const H = tank.fullHeight;
  const slack = 1e-12 * H;
  if (levelMetres < -slack || levelMetres > H + slack) {
    const shown = fmt(fromMetres(levelMetres, unit));
    return fail(
      `level ${shown} ${unit} is outside this tank: it must be between 0 and ${fmt(fromMetres(H, unit))} ${unit}`,
    );
  }
  return ok(tank.volumeAt(Math.min(H, Math.max(0, levelMetres))));
}

/** Metres at a volume in litres; a negative volume or one above capacity is an error naming the range. */
export function levelAtVolume(tank: Tank, volumeLitres: number): Result<number> {
  if (!Number.isFinite(volumeLitres)) return fail('the volume must be a number');
  const unit = tank.spec.units.volume;
  const cap = tank.capacity;
  const slack = 1e-12 * cap;
  if (volumeLitres < -slack || volumeLitres > cap + slack) {
    const shown = fmt(fromLitres(volumeLitres, unit));
    return fail(
      `volume ${shown} ${unit} does not fit this tank: it holds 0 to ${fmt(fromLitres(cap, unit))} ${unit}`,
    );
  }
  return ok(tank.levelAt(volumeLitres));
}
