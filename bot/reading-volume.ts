import type { Tank } from '../engine/geometry/index.js';
import { fail, ok, type Result } from '../engine/result.js';
import {
  fromLitres,
  fromMetres,
  isLengthUnit,
  isVolumeUnit,
  toLitres,
  toMetres,
} from '../engine/units/index.js';
import { formatNumber } from './replies/format.js';
import type { ReadingKind } from './store/types.js';

export interface RawMeasurement {
  kind: ReadingKind;
  value: number;
  unit: string;
}

/** A hair of slack so a level typed at the exact full height, rounded in a unit conversion, is not refused. */
const EDGE = 1e-9;

/**
 * The litres a reading stands for, recomputed from the value and unit as typed and the tank's current shape
 * (so correcting a shape corrects all history). A level outside the tank is an error a person can fix.
 */
export function readingLitres(tank: Tank, m: RawMeasurement): Result<number> {
  const units = tank.spec.units;
  if (!Number.isFinite(m.value) || m.value < 0)
    return fail(`A reading must be a number of zero or more, not ${m.value}.`);
  if (m.kind === 'percent') {
    if (m.value > 100 + EDGE)
      return fail(`${formatNumber(m.value)}% is more than full: a percent reading is 0 to 100.`);
    return ok((Math.min(m.value, 100) / 100) * tank.capacity);
  }
  if (m.kind === 'volume') {
    if (!isVolumeUnit(m.unit))
      return fail(`"${m.unit}" is not a volume unit I know; use L, m3, gal, impgal, bbl or ft3.`);
    const litres = toLitres(m.value, m.unit);
    if (litres > tank.capacity * (1 + 1e-6)) {
      const cap = fromLitres(tank.capacity, units.volume);
      return fail(
        `${formatNumber(m.value)} ${m.unit} is more than the tank holds (${formatNumber(cap)} ${units.volume}); check the number and unit.`,
      );
    }
    return ok(litres);
  }
  if (!isLengthUnit(m.unit)) return fail(`"${m.unit}" is not a length unit I know; use mm, cm, m, in or ft.`);
  const metres = toMetres(m.value, m.unit);
  if (metres > tank.fullHeight * (1 + EDGE) + EDGE) {
    const height = fromMetres(tank.fullHeight, units.length);
    const what = m.kind === 'ullage' ? 'An ullage (space above the liquid) of' : 'A level of';
    return fail(
      `${what} ${formatNumber(m.value)} ${m.unit} is more than the tank's full height of ${formatNumber(height)} ${units.length}; check the number and the unit.`,
    );
  }
  const level = m.kind === 'ullage' ? tank.fullHeight - metres : metres;
  return ok(tank.volumeAt(Math.min(Math.max(level, 0), tank.fullHeight)));
}

/** The level in metres a reading stands for, when it was given as a level or ullage. */
export function readingLevelMetres(tank: Tank, m: RawMeasurement): number | undefined {
  if ((m.kind !== 'level' && m.kind !== 'ullage') || !isLengthUnit(m.unit)) return undefined;
  const metres = toMetres(m.value, m.unit);
  return m.kind === 'ullage' ? tank.fullHeight - metres : metres;
}
