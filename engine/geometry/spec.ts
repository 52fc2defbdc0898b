import { z } from 'zod';
import { fail, ok, type Result } from '../result.js';
import { LENGTH_UNITS, type LengthUnit, parseUnit, VOLUME_UNITS, type VolumeUnit } from '../units/index.js';
import { torisphericalDepth } from './heads.js';

/** The tank JSON of the CLI contract (section 1); every length in `units.length`. */
export type HeadType = 'flat' | 'conical' | 'ellipsoidal' | 'spherical' | 'torispherical' | 'guppy';
export interface HeadSpec {
  type: HeadType;
  /** How far the head reaches beyond the straight shell; derived from f and k for torispherical. */
  depth?: number | undefined;
  /** Torispherical: dish (crown) radius = f * diameter. */
  f?: number | undefined;
  /** Torispherical: knuckle radius = k * diameter. */
  k?: number | undefined;
  /** Vertical bottom only: the head is pushed up into the tank. */
  inward?: boolean | undefined;
}
export interface TankUnits {
  length: LengthUnit;
  volume: VolumeUnit;
}
export type TankSpec =
  | {
      units: TankUnits;
      shape: 'vertical-cylinder' | 'horizontal-cylinder';
      diameter: number;
      length: number;
      heads?: (HeadSpec | null)[] | undefined;
    }
  | { units: TankUnits; shape: 'sphere'; diameter: number }
  | { units: TankUnits; shape: 'rectangular'; width: number; length: number; height: number }
  | { units: TankUnits; shape: 'strapping'; table: [number, number][] };

const positive = z.number().finite().positive();
const nonNegative = z.number().finite().nonnegative();

const headSchema = z.strictObject({
  type: z.enum(['flat', 'conical', 'ellipsoidal', 'spherical', 'torispherical', 'guppy']),
  depth: nonNegative.optional(),
  f: positive.optional(),
  k: positive.optional(),
  inward: z.boolean().optional(),
});
/** "litres", "liters", "l", "inches"... become their unit id, so a tank file may use the words people write. */
const unitWord = (kind: 'length' | 'volume') => (word: unknown) => {
  if (typeof word !== 'string') return word;
  const parsed = parseUnit(word);
  return parsed.ok && parsed.value.kind === kind ? parsed.value.unit : word;
};
const unitsSchema = z.strictObject({
  length: z.preprocess(unitWord('length'), z.enum(LENGTH_UNITS)),
  volume: z.preprocess(unitWord('volume'), z.enum(VOLUME_UNITS)),
});
const base = { units: unitsSchema };

const cylinderSchema = z.strictObject({
  ...base,
  shape: z.enum(['vertical-cylinder', 'horizontal-cylinder']),
  diameter: positive,
  length: nonNegative,
  heads: z.array(headSchema.nullable()).max(2).optional(),
});
const sphereSchema = z.strictObject({ ...base, shape: z.literal('sphere'), diameter: positive });
const boxSchema = z.strictObject({
  ...base,
  shape: z.literal('rectangular'),
  width: positive,
  length: positive,
  height: positive,
});
const strappingSchema = z.strictObject({
  ...base,
  shape: z.literal('strapping'),
  table: z.array(z.tuple([z.number().finite(), z.number().finite()])).min(2),
});

/** Shape rules zod cannot say per field: head depths that fit, torispherical f/k, table order. */
function checkShape(spec: TankSpec, ctx: z.RefinementCtx): void {
  const issue = (path: (string | number)[], message: string) =>
    ctx.addIssue({ code: 'custom', path, message });
  if (spec.shape === 'strapping') {
    spec.table.forEach(([level, volume], i) => {
      const prev = spec.table[i - 1];
      if (level < 0 || volume < 0) issue(['table', i], 'levels and volumes must not be negative');
      if (prev && level <= prev[0])
        issue(['table', i], `levels must increase row by row (${level} after ${prev[0]})`);
      if (prev && volume < prev[1])
        issue(['table', i], `volumes must not decrease (${volume} after ${prev[1]})`);
    });
    return;
  }
  if (spec.shape !== 'vertical-cylinder' && spec.shape !== 'horizontal-cylinder') return;
  const radius = spec.diameter / 2;
  (spec.heads ?? []).forEach((head, i) => {
    if (!head || head.type === 'flat') return;
    const path = ['heads', i];
    const where = spec.shape === 'vertical-cylinder' ? (i === 0 ? 'bottom' : 'top') : `end ${i + 1}`;
    if (head.type === 'torispherical') {
      if (head.f === undefined || head.k === undefined)
        issue(
          path,
          `the ${where} torispherical head needs f (dish radius / diameter) and k (knuckle radius / diameter)`,
        );
      else if (!(head.k <= 0.5 && head.f >= 0.5 && head.k < head.f))
        issue(
          path,
          `the ${where} torispherical head needs 0 < k <= 0.5 and f >= 0.5 (got f=${head.f}, k=${head.k})`,
        );
    } else if (head.depth === undefined) {
      // A depth of 0 is a flat end (as the reference data write it); a missing depth is a mistake.
      issue(path, `the ${where} ${head.type} head needs its depth in ${spec.units.length}`);
    } else if (head.type === 'spherical' && head.depth > radius * (1 + 1e-9)) {
      issue(path, `a spherical head's depth cannot exceed the radius (${radius} ${spec.units.length})`);
    }
    if (head.type === 'guppy' && spec.shape === 'vertical-cylinder')
      issue(path, 'guppy heads exist only on horizontal tanks');
    if (head.inward && !(spec.shape === 'vertical-cylinder' && i === 0))
      issue(path, 'only the bottom head of a vertical tank can be inward');
    const reach =
      head.type === 'torispherical' && head.f && head.k
        ? torisphericalDepth(spec.diameter, head.f, head.k)
        : head.depth;
    if (head.inward && (reach ?? 0) > spec.length)
      issue(
        path,
        `the inward bottom reaches ${reach} ${spec.units.length} up, above the shell (length ${spec.length})`,
      );
  });
}

export const tankSpecSchema: z.ZodType<TankSpec> = z
  .discriminatedUnion('shape', [cylinderSchema, sphereSchema, boxSchema, strappingSchema])
  .superRefine(checkShape) as z.ZodType<TankSpec>;

const SHAPES = 'vertical-cylinder, horizontal-cylinder, sphere, rectangular, strapping';

/** Turns zod's issues into one sentence a person can act on. */
function describeIssue(issue: z.core.$ZodIssue, input: unknown): string {
  const path = issue.path.join('.');
  const lengthUnit =
    typeof input === 'object' && input && 'units' in input
      ? ((input as { units?: { length?: unknown } }).units?.length ?? '')
      : '';
  const unitWords = typeof lengthUnit === 'string' && lengthUnit ? ` of ${lengthUnit}` : '';
  switch (issue.code) {
    case 'invalid_union':
      if (path === '' || path === 'shape') return `shape must be one of ${SHAPES}`;
      return `${path} is not valid`;
    case 'invalid_value':
      if (path === 'units.length') return `units.length must be one of ${LENGTH_UNITS.join(', ')}`;
      if (path === 'units.volume') return `units.volume must be one of ${VOLUME_UNITS.join(', ')}`;
      if (path === 'shape') return `shape must be one of ${SHAPES}`;
      return `${path} must be one of ${issue.values.map(String).join(', ')}`;
    case 'invalid_type':
      if (path === 'units')
        return `units is missing: give {"length": "m", "volume": "L"} (or in, ft, gal...)`;
      if (path === 'shape' || path === '') return `shape must be one of ${SHAPES}`;
      if (issue.expected === 'number') return `${path} must be a positive number${unitWords}`;
      return `${path} is missing or not a ${issue.expected}`;
    case 'too_small':
      if (path === 'table') return 'a strapping table needs at least two rows [level, volume]';
      return `${path} must be a positive number${unitWords}`;
    case 'unrecognized_keys':
      return `${path ? `${path}: ` : ''}unknown key${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => `"${k}"`).join(', ')}`;
    default:
      return path ? `${path}: ${issue.message}` : issue.message;
  }
}

/** Validates a tank JSON value; the error names the first problem and how to fix it. */
export function parseTankSpec(input: unknown): Result<TankSpec> {
  const parsed = tankSpecSchema.safeParse(input);
  if (parsed.success) return ok(parsed.data);
  const first = parsed.error.issues[0];
  return fail(`tank: ${first ? describeIssue(first, input) : 'not a valid tank description'}`);
}
