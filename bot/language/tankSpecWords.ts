import { closest } from 'fastest-levenshtein';
import { fail, ok, type Result } from '../../engine/result.js';
import { fromMetres, parseUnit, toMetres } from '../../engine/units/index.js';
import {
  headTypeSchema,
  type LengthUnitWord,
  type Shape,
  type TankSpecInput,
  type VolumeUnitWord,
  volumeUnitSchema,
} from './command.js';
import { parseLength } from './measurement.js';

/** Shape words people type -> the shape of the tank specification (cli-contract section 1). */
export const SHAPE_WORDS: Readonly<Record<string, Shape>> = {
  'vertical-cylinder': 'vertical-cylinder',
  vertical: 'vertical-cylinder',
  'vertical-cyl': 'vertical-cylinder',
  upright: 'vertical-cylinder',
  'horizontal-cylinder': 'horizontal-cylinder',
  horizontal: 'horizontal-cylinder',
  'horizontal-cyl': 'horizontal-cylinder',
  sphere: 'sphere',
  spherical: 'sphere',
  rectangular: 'rectangular',
  box: 'rectangular',
  rectangle: 'rectangular',
  strapping: 'strapping',
  table: 'strapping',
  chart: 'strapping',
};

/** The dimensions each shape needs. */
export const SHAPE_NEEDS: Readonly<Record<Shape, readonly ('diameter' | 'length' | 'width' | 'height')[]>> = {
  'vertical-cylinder': ['diameter', 'length'],
  'horizontal-cylinder': ['diameter', 'length'],
  sphere: ['diameter'],
  rectangular: ['width', 'length', 'height'],
  strapping: [],
};

export type Dimension = 'diameter' | 'length' | 'width' | 'height';

/** Key words -> the key they stand for. */
export const KEY_WORDS: Readonly<Record<string, string>> = {
  shape: 'shape',
  diameter: 'diameter',
  dia: 'diameter',
  d: 'diameter',
  length: 'length',
  len: 'length',
  l: 'length',
  width: 'width',
  w: 'width',
  height: 'height',
  h: 'height',
  heads: 'heads',
  head: 'heads',
  ends: 'heads',
  unit: 'unit',
  units: 'unit',
  volume: 'unit',
  level: 'level',
  'level-unit': 'level',
  levelunit: 'level',
  'length-unit': 'level',
  name: 'name',
  product: 'product',
  site: 'site',
};

export function unknownKey(key: string): { ok: false; error: string } {
  const near = closest(key.toLowerCase(), Object.keys(KEY_WORDS));
  return fail(
    `"${key}" is not a tank key I know; did you mean ${near}=? Keys: shape, diameter, length, width, height, heads, unit, level, name, product, site.`,
  );
}

export function readVolumeUnit(word: string): Result<VolumeUnitWord> {
  const unit = parseUnit(word);
  if (!unit.ok) return fail(`unit=${word}: ${unit.error}.`);
  const volume = volumeUnitSchema.safeParse(unit.value.unit);
  if (unit.value.kind !== 'volume' || !volume.success) {
    return fail(
      `unit=${word} is not a volume unit; unit= is the volume unit (gal, L, bbl, m3); levels take theirs from the dimensions or level=cm.`,
    );
  }
  return ok(volume.data);
}

export function readLengthUnit(word: string): Result<LengthUnitWord> {
  const unit = parseUnit(word);
  if (!unit.ok || unit.value.kind !== 'length')
    return fail(`level=${word} is not a length unit; write in, ft, cm, mm or m.`);
  return ok(unit.value.unit);
}

const round = (n: number): number => Number(n.toPrecision(12));
/** A length in another unit, expressed in the spec's one length unit. */
export const inUnit = (value: number, from: LengthUnitWord, to: LengthUnitWord): number =>
  from === to ? value : round(fromMetres(toMetres(value, from), to));

type Head = NonNullable<TankSpecInput['heads']>[number];

/**
 * `heads=ellipsoidal:6in,flat` -> [first, second]; one head given means both ends alike. A head is
 * `type[:depth][:inward]`; torispherical takes `f=1:k=0.06` (dish and knuckle radius as fractions of the diameter).
 */
export function readHeads(text: string, unit: () => LengthUnitWord): Result<Head[]> {
  const heads: Head[] = [];
  const parts = text.split(',').map((p) => p.trim());
  if (parts.length > 2 || parts.some((p) => p === '')) {
    return fail(`heads=${text}: give one or two heads, e.g. heads=ellipsoidal:6in,flat.`);
  }
  for (const part of parts) {
    const [typeWord = '', ...options] = part.split(':').map((o) => o.trim());
    const type = headTypeSchema.safeParse(typeWord.toLowerCase());
    if (!type.success) {
      return fail(
        `"${typeWord}" is not a head type; use flat, conical, ellipsoidal, spherical, torispherical or guppy.`,
      );
    }
    const head: Head = { type: type.data };
    for (const option of options) {
      const param = /^([fk])\s*=\s*([\d.]+)$/i.exec(option);
      if (option.toLowerCase() === 'inward') head.inward = true;
      else if (param) {
        const value = Number(param[2]);
        if (!(value > 0))
          return fail(`heads: ${option} must be a positive number; write it like f=1:k=0.06.`);
        if ((param[1] ?? '').toLowerCase() === 'f') head.f = value;
        else head.k = value;
      } else {
        const depth = parseLength(option, 'a head depth');
        if (!depth.ok) return depth;
        head.depth = inUnit(depth.value.value, depth.value.unit, unit());
      }
    }
    heads.push(head);
  }
  return ok(heads.length === 1 && heads[0] ? [heads[0], { ...heads[0] }] : heads);
}
