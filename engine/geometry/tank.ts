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
  /** Metres: 0, or the first level of a strapping table (below it the table says nothing). */
  readonly lowestLevel: number;
  /** Litres at a level in metres; the fast path, with no range check (keep 0 <= level <= fullHeight). */
  volumeAt(levelMetres: number): number;
  /** Metres at a volume in litres, to 1e-9 of the full height; volumes outside [V(0), capacity] clamp. */
  levelAt(volumeLitres: number): number;
}

// Levels at which the volume is tabulated once per tank, so each inverse starts from a tight bracket.
const BRACKETS = 512;

// Tanks are immutable and building one costs up to a few milliseconds (a numerically integrated head is
// tabulated once), while callers such as the bot rebuild the same few tanks for every message: keep the
// most recent ones, keyed by their JSON.
const CACHE_SIZE = 64;
const recent = new Map<string, Result<Tank>>();

/** Validates a tank JSON value and builds its Tank; the error says what to fix. */
export function buildTank(input: unknown): Result<Tank> {
  let key: string | undefined;
  try {
    key = JSON.stringify(input);
  } catch {
    key = undefined; // cyclic or BigInt input: not cacheable, and validation will refuse it anyway
  }
  const cached = key === undefined ? undefined : recent.get(key);
  if (cached) return cached;
  const built = buildTankUncached(input);
  if (key !== undefined && built.ok) {
    recent.set(key, built);
    if (recent.size > CACHE_SIZE) recent.delete(recent.keys().next().value as string);
  }
  return built;
}

function buildTankUncached(input: unknown): Result<Tank> {
  const spec = parseTankSpec(input);
  if (!spec.ok) return spec;
  const model = shapeModel(spec.value);
  if (!(model.fullHeight > 0)) return fail('tank: the full height must be above zero');
  const tank = tankFromModel(spec.value, model);
  if (!(Number.isFinite(tank.capacity) && tank.capacity > 0 && Number.isFinite(tank.fullHeight)))
    return fail('tank: these dimensions give no usable volume; check the numbers and their unit');
  return ok(tank);
}

function tankFromModel(spec: TankSpec, model: ShapeModel): Tank {
  const H = model.fullHeight;
  const floor = model.lowestLevel ?? 0;
  const volumeAt = (h: number) => model.volumeM3(h) * 1000;
  const levels = [
    ...new Set([0, ...model.joins, ...Array.from({ length: BRACKETS + 1 }, (_, i) => (H * i) / BRACKETS)]),
  ]
    .filter((h) => h >= floor && h <= H)
    .sort((x, y) => x - y);
  const volumes = levels.map(volumeAt);
  const capacity = volumes[volumes.length - 1]!;
  const bottom = volumes[0]!;
  const xtol = 1e-10 * H;
  const levelAt = (v: number): number => {
    if (!(v > bottom)) return floor;
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
    return brentRoot(
      (h) => volumeAt(h) - v,
      levels[lo]!,
      levels[hi]!,
      xtol,
      volumes[lo]! - v,
      volumes[hi]! - v,
    );
  };
  // Shared from the cache, so nobody may change it underneath another caller.
  return { spec: deepFreeze(spec), fullHeight: H, capacity, lowestLevel: floor, volumeAt, levelAt };
}

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object') {
    for (const inner of Object.values(value)) deepFreeze(inner);
    Object.freeze(value);
  }
  return value;
}

const fmt = (x: number) => Number(x.toPrecision(6)).toString();

/** Litres at a level in metres; below the lowest level or above the full height is an error naming the range. */
export function volumeAtLevel(tank: Tank, levelMetres: number): Result<number> {
  if (!Number.isFinite(levelMetres)) return fail('the level must be a number');
  const unit = tank.spec.units.length;
  const H = tank.fullHeight;
  const floor = tank.lowestLevel;
  // A level a hair outside (unit conversions, a full height computed elsewhere) is the end itself.
  const slack = 1e-9 * H;
  if (levelMetres < floor - slack || levelMetres > H + slack) {
    const shown = fmt(fromMetres(levelMetres, unit));
    const range = `between ${fmt(fromMetres(floor, unit))} and ${fmt(fromMetres(H, unit))} ${unit}`;
    const where = tank.spec.shape === 'strapping' ? 'outside the strapping table' : 'outside this tank';
    return fail(`level ${shown} ${unit} is ${where}: it must be ${range}`);
  }
  return ok(tank.volumeAt(Math.min(H, Math.max(floor, levelMetres))));
}

/** Metres at a volume in litres; a volume the tank (or its table) cannot hold is an error naming the range. */
export function levelAtVolume(tank: Tank, volumeLitres: number): Result<number> {
  if (!Number.isFinite(volumeLitres)) return fail('the volume must be a number');
  const unit = tank.spec.units.volume;
  const cap = tank.capacity;
  const bottom = tank.volumeAt(tank.lowestLevel);
  // A capacity computed elsewhere agrees with ours to about 1e-7 (the reference volumes' own accuracy):
  // a volume that much above it is full, not an error.
  const slack = 1e-7 * cap;
  if (volumeLitres < bottom - slack || volumeLitres > cap + slack) {
    const shown = fmt(fromLitres(volumeLitres, unit));
    const range = `${fmt(fromLitres(bottom, unit))} to ${fmt(fromLitres(cap, unit))} ${unit}`;
    const where =
      tank.spec.shape === 'strapping' ? 'is outside the strapping table' : 'does not fit this tank';
    return fail(`volume ${shown} ${unit} ${where}: it holds ${range}`);
  }
  return ok(tank.levelAt(volumeLitres));
}
