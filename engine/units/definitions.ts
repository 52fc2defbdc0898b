/**
 * Exact unit definitions, each as a factor to the engine's base unit (metres, litres, seconds).
 * Source: NIST SP 811 (2008) appendix B and NIST Handbook 44 appendix C:
 * 1 in = 2.54 cm exactly, 1 ft = 12 in, 1 US gal = 231 in^3 exactly, 1 imperial gal = 4.54609 L exactly,
 * 1 barrel (petroleum) = 42 US gal.
 */
export type LengthUnit = 'mm' | 'cm' | 'm' | 'in' | 'ft';
export type VolumeUnit = 'L' | 'm3' | 'gal' | 'impgal' | 'bbl' | 'ft3' | 'in3';
export type TimeUnit = 's' | 'min' | 'h' | 'd';

const INCH_M = 0.0254;
const CUBIC_INCH_L = 2.54 ** 3 / 1000; // 16.387064 cm^3 expressed in litres
const US_GALLON_L = 231 * CUBIC_INCH_L; // 3.785411784 L

export const METRES_PER: Readonly<Record<LengthUnit, number>> = {
  mm: 0.001,
  cm: 0.01,
  m: 1,
  in: INCH_M,
  ft: 12 * INCH_M,
};

export const LITRES_PER: Readonly<Record<VolumeUnit, number>> = {
  L: 1,
  m3: 1000,
  gal: US_GALLON_L,
  impgal: 4.54609,
  bbl: 42 * US_GALLON_L,
  ft3: 1728 * CUBIC_INCH_L,
  in3: CUBIC_INCH_L,
};

export const SECONDS_PER: Readonly<Record<TimeUnit, number>> = { s: 1, min: 60, h: 3600, d: 86400 };

export const LENGTH_UNITS = Object.keys(METRES_PER) as LengthUnit[];
export const VOLUME_UNITS = Object.keys(LITRES_PER) as VolumeUnit[];
export const TIME_UNITS = Object.keys(SECONDS_PER) as TimeUnit[];

export const isLengthUnit = (u: string): u is LengthUnit => Object.hasOwn(METRES_PER, u);
export const isVolumeUnit = (u: string): u is VolumeUnit => Object.hasOwn(LITRES_PER, u);
export const isTimeUnit = (u: string): u is TimeUnit => Object.hasOwn(SECONDS_PER, u);

export const toMetres = (value: number, unit: LengthUnit): number => value * METRES_PER[unit];
export const fromMetres = (metres: number, unit: LengthUnit): number => metres / METRES_PER[unit];
export const toLitres = (value: number, unit: VolumeUnit): number => value * LITRES_PER[unit];
export const fromLitres = (litres: number, unit: VolumeUnit): number => litres / LITRES_PER[unit];
export const toSeconds = (value: number, unit: TimeUnit): number => value * SECONDS_PER[unit];

/** A flow written as volume per time, e.g. "gal/min"; base unit litres per day (positive = outflow). */
export interface FlowUnit {
  volume: VolumeUnit;
  time: TimeUnit;
}

export const toLitresPerDay = (value: number, unit: FlowUnit): number =>
  (toLitres(value, unit.volume) * SECONDS_PER.d) / SECONDS_PER[unit.time];
export const fromLitresPerDay = (litresPerDay: number, unit: FlowUnit): number =>
  fromLitres((litresPerDay * SECONDS_PER[unit.time]) / SECONDS_PER.d, unit.volume);
