// What operators read and set beside the geometry: ullage gauging, the safe-fill limit, dead stock.
import { fail, ok, type Result } from '../result.js';
import { fromMetres } from '../units/index.js';
import { levelAtVolume, type Tank, volumeAtLevel } from './tank.js';

/** 90% of capacity is a common default fill limit for tanks of liquids (common practice). */
export const DEFAULT_SAFE_FILL_PERCENT = 90;

export const SAFE_FILL_CAUTION =
  'Fill limit: 90% of capacity is a common default only. Fuels, LPG/propane and chemicals have their own ' +
  "fill limits and overfill protection under local codes and the supplier's practice; those come first.";

/**
 * Level from an ullage (outage) reading: the distance measured down from a reference point at the top to the
 * liquid. level = reference height - ullage (common practice). The reference height defaults to the tank's
 * full height; a gauge hatch above the top is given explicitly. All in metres.
 */
export function levelFromUllage(
  tank: Tank,
  ullageMetres: number,
  referenceHeightMetres = tank.fullHeight,
): Result<number> {
  const unit = tank.spec.units.length;
  const show = (m: number) => `${Number(fromMetres(m, unit).toPrecision(6))} ${unit}`;
  if (!Number.isFinite(ullageMetres) || ullageMetres < 0)
    return fail('the ullage must be a distance of zero or more');
  if (!Number.isFinite(referenceHeightMetres) || referenceHeightMetres <= 0)
    return fail('the reference height must be above zero');
  const level = referenceHeightMetres - ullageMetres;
  if (level < 0)
    return fail(
      `an ullage of ${show(ullageMetres)} is deeper than the reference height ${show(referenceHeightMetres)}`,
    );
  if (level > tank.fullHeight * (1 + 1e-12))
    return fail(
      `an ullage of ${show(ullageMetres)} puts the level above the tank's full height ${show(tank.fullHeight)}`,
    );
  return ok(Math.min(level, tank.fullHeight));
}

export interface SafeFill {
  percent: number;
  /** Litres. */
  volume: number;
  /** Metres. */
  level: number;
  caution: string;
}

/** The safe-fill volume and level for a percent of capacity (default 90%, common practice). */
export function safeFill(tank: Tank, percent = DEFAULT_SAFE_FILL_PERCENT): Result<SafeFill> {
  if (!Number.isFinite(percent) || percent <= 0 || percent > 100)
    return fail('the safe-fill limit must be a percent above 0 and at most 100');
  const volume = (tank.capacity * percent) / 100;
  const level = levelAtVolume(tank, volume);
  if (!level.ok) return level;
  return ok({ percent, volume, level: level.value, caution: SAFE_FILL_CAUTION });
}

/** Dead stock: the volume below the outlet, which the pump cannot draw (litres; outlet level in metres). */
export function deadStockVolume(tank: Tank, outletLevelMetres: number): Result<number> {
  const v = volumeAtLevel(tank, outletLevelMetres);
  return v.ok ? v : fail(`outlet height: ${v.error}`);
}

/** The volume that can be drawn: what is in the tank less the dead stock, never below zero (litres). */
export const usableVolume = (volumeLitres: number, deadStockLitres: number): number =>
  Math.max(0, volumeLitres - deadStockLitres);
