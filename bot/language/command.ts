import { z } from 'zod';

/**
 * The Command union: what the bot understood from one message. The parser builds it, zod checks it, and
 * the command handlers (bot/commands) act on it. Every field a handler needs is resolved here (times are
 * epoch ms UTC, tank names are the team's own spelling), and the text as typed is kept beside each value so
 * the store can keep raw input.
 */

/** Length and volume units of the tank specification (cli-contract section 1). */
export const lengthUnitSchema = z.enum(['mm', 'cm', 'm', 'in', 'ft']);
export const volumeUnitSchema = z.enum(['L', 'm3', 'gal', 'impgal', 'bbl', 'ft3', 'in3']);
export type LengthUnitWord = z.infer<typeof lengthUnitSchema>;
export type VolumeUnitWord = z.infer<typeof volumeUnitSchema>;

const finite = z.number().finite();
const nonNegative = finite.nonnegative();

/** A length as typed: `5' 2"` becomes value 62, unit 'in', raw `5' 2"`. */
export const lengthSchema = z.object({ value: nonNegative, unit: lengthUnitSchema, raw: z.string() });
/** A volume as typed: `410 gal`. */
export const volumeSchema = z.object({ value: nonNegative, unit: volumeUnitSchema, raw: z.string() });
export type Length = z.infer<typeof lengthSchema>;
export type Volume = z.infer<typeof volumeSchema>;

/** What a reading measured: the level from the bottom, the empty space from the top, a percent, or a volume. */
export const measurementSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('level'), length: lengthSchema }),
  z.object({ kind: z.literal('ullage'), length: lengthSchema }),
  z.object({ kind: z.literal('percent'), percent: nonNegative, raw: z.string() }),
  z.object({ kind: z.literal('volume'), volume: volumeSchema }),
]);
export type Measurement = z.infer<typeof measurementSchema>;

/** A time the person gave in words, resolved to an instant; absent means "when the message arrived". */
export const statedTimeSchema = z.object({ at: z.number().int(), raw: z.string() });
export type StatedTime = z.infer<typeof statedTimeSchema>;

/** A tank name as the team spells it (matched case-insensitively against the team's names and codes). */
const tankName = z.string().min(1).max(64);

export const readingSchema = z.object({
  type: z.literal('reading'),
  tank: tankName,
  measurement: measurementSchema,
  time: statedTimeSchema.optional(),
  raw: z.string(),
});

export const deliverySchema = z.object({
  type: z.literal('delivery'),
  tank: tankName,
  volume: volumeSchema,
  ticket: z.string().min(1).max(64).optional(),
  /** The level read right after the delivery, if the person gave it. */
  levelAfter: measurementSchema.optional(),
  time: statedTimeSchema.optional(),
  raw: z.string(),
});

/** `T4?`, `how long does T4 last?`, `status T4`. */
export const tankQuestionSchema = z.object({ type: z.literal('tank-question'), tank: tankName });
/** `which tanks run low this week?`: tanks whose runway ends before `until`. */
export const runningLowSchema = z.object({
  type: z.literal('running-low'),
  until: z.number().int(),
  window: z.string(),
});
/** `all`, `status`: every tank of the team. */
export const overviewSchema = z.object({ type: z.literal('overview') });

export const headTypeSchema = z.enum([
  'flat',
  'conical',
  'ellipsoidal',
  'spherical',
  'torispherical',
  'guppy',
]);
export const headSchema = z.object({
  type: headTypeSchema,
  /** In the spec's length unit (`units.length`). */
  depth: nonNegative.optional(),
  f: finite.positive().optional(),
  k: finite.positive().optional(),
  inward: z.boolean().optional(),
});
export const shapeSchema = z.enum([
  'vertical-cylinder',
  'horizontal-cylinder',
  'sphere',
  'rectangular',
  'strapping',
]);
export type Shape = z.infer<typeof shapeSchema>;

/** A strapping table row: [level in units.length, volume in units.volume]. */
export const strappingRowSchema = z.tuple([nonNegative, nonNegative]);

/**
 * The tank specification in the shape of cli-contract section 1 (every dimension converted to the one
 * `units.length`), ready for engine/geometry `tankSpecSchema` / `buildTank`.
 */
export const tankSpecInputSchema = z.object({
  units: z.object({ length: lengthUnitSchema, volume: volumeUnitSchema }),
  shape: shapeSchema,
  diameter: finite.positive().optional(),
  length: finite.positive().optional(),
  width: finite.positive().optional(),
  height: finite.positive().optional(),
  heads: z.array(headSchema).max(2).optional(),
  table: z.array(strappingRowSchema).optional(),
});
export type TankSpecInput = z.infer<typeof tankSpecInputSchema>;

export const addTankSchema = z.object({
  type: z.literal('add-tank'),
  tank: tankName,
  spec: tankSpecInputSchema,
  /** A longer display name (`name="Generator day tank"`); `tank` is the short code. */
  name: z.string().min(1).max(128).optional(),
  product: z.string().min(1).optional(),
  site: z.string().min(1).optional(),
  /** A strapping tank sent without rows: the bot should now await 'strapping-rows'. */
  awaitingRows: z.boolean(),
  raw: z.string(),
});
/** `add tank` alone: the bot starts a guided exchange and keeps its state. */
export const addTankGuidedSchema = z.object({ type: z.literal('add-tank-guided') });
/** CSV lines sent while awaiting 'strapping-rows'; `done` ends the table. */
export const strappingRowsSchema = z.object({
  type: z.literal('strapping-rows'),
  rows: z.array(strappingRowSchema),
  done: z.boolean(),
});
/** Any answer while awaiting 'setup-answer'; the guided exchange interprets it for its current question. */
export const setupAnswerSchema = z.object({ type: z.literal('setup-answer'), text: z.string() });
/** `cancel` during a guided exchange or a strapping table. */
export const cancelSchema = z.object({ type: z.literal('cancel') });
export const removeTankSchema = z.object({ type: z.literal('remove-tank'), tank: tankName });
export const renameTankSchema = z.object({
  type: z.literal('rename-tank'),
  tank: tankName,
  newName: tankName,
});

export const thresholdSchema = z.union([
  z.object({ percent: finite.min(0).max(100) }),
  z.object({ volume: volumeSchema }),
  z.object({ runwayDays: nonNegative }),
]);

/** One setting; `scope` says whether it belongs to a tank or to the whole team. */
export const settingSchema = z.discriminatedUnion('key', [
  z.object({ key: z.literal('threshold'), threshold: thresholdSchema }),
  z.object({
    key: z.literal('lead-time'),
    days: nonNegative,
    businessDays: z.boolean(),
    /** Given with the lead time: `set T4 lead time 3 business days cutoff 14:00`. */
    cutoffHour: z.number().int().min(0).max(23).optional(),
  }),
  /** An order placed after this local hour counts from the next day. */
  z.object({ key: z.literal('order-cutoff'), hour: z.number().int().min(0).max(23) }),
  /** ISO weekdays, 1 = Monday. */
  z.object({ key: z.literal('delivery-days'), weekdays: z.array(z.number().int().min(1).max(7)).min(1) }),
  /** Local whole hours [from, to) a delivery arrives within on its day; to = 24 is the end of the day. */
  z.object({
    key: z.literal('delivery-hours'),
    from: z.number().int().min(0).max(23),
    to: z.number().int().min(1).max(24),
  }),
  z.object({ key: z.literal('minimum-order'), volume: volumeSchema }),
  z.object({ key: z.literal('order-increment'), volume: volumeSchema }),
  z.object({ key: z.literal('safe-fill'), percent: finite.gt(0).max(100) }),
  z.object({ key: z.literal('product'), product: z.string().min(1).max(64) }),
  z.object({ key: z.literal('site'), site: z.string().min(1).max(128) }),
  z.object({ key: z.literal('time-zone'), timeZone: z.string().min(1) }),
  z.object({
    key: z.literal('digest'),
    /** Local time of day, 24-hour "HH:MM" in the team's zone. */
    time: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/),
    /** ISO weekdays the digest goes out on. */
    weekdays: z.array(z.number().int().min(1).max(7)).min(1),
    /** 'here' = the channel the message came from. */
    channel: z.string().min(1),
  }),
  z.object({ key: z.literal('digest-off') }),
]);
export type Setting = z.infer<typeof settingSchema>;
export type SettingKey = Setting['key'];

/** Keys that belong to the team rather than one tank. */
export const teamSettingKeys: readonly SettingKey[] = ['time-zone', 'digest', 'digest-off'];

export const setSchema = z.object({
  type: z.literal('set'),
  /** Absent for team settings (time zone, digest). */
  tank: tankName.optional(),
  setting: settingSchema,
  raw: z.string(),
});

export const undoSchema = z.object({ type: z.literal('undo') });
/** `delete the 7:30 reading [of T4]`: the latest reading at that local clock time (the tank's, or any). */
export const deleteReadingSchema = z.object({
  type: z.literal('delete-reading'),
  tank: tankName.optional(),
  hour: z.number().int().min(0).max(23),
  minute: z.number().int().min(0).max(59),
  raw: z.string(),
});
/** `that was cm`: the last reading's number stands, its unit was this one. */
export const correctUnitSchema = z.object({
  type: z.literal('correct-unit'),
  unit: z.union([
    z.object({ kind: z.literal('length'), unit: lengthUnitSchema }),
    z.object({ kind: z.literal('volume'), unit: volumeUnitSchema }),
    z.object({ kind: z.literal('percent') }),
  ]),
  raw: z.string(),
});
/** `yes` / `no` to "did you mean ...?" about a suspect reading. */
export const confirmSchema = z.object({ type: z.literal('confirm'), answer: z.boolean() });
export const digestNowSchema = z.object({ type: z.literal('digest-now') });

export const helpTopicSchema = z.enum([
  'readings',
  'deliveries',
  'questions',
  'setup',
  'settings',
  'corrections',
  'units',
  'times',
]);
export type HelpTopic = z.infer<typeof helpTopicSchema>;
export const helpSchema = z.object({ type: z.literal('help'), topic: helpTopicSchema.optional() });

export const commandSchema = z.discriminatedUnion('type', [
  readingSchema,
  deliverySchema,
  tankQuestionSchema,
  runningLowSchema,
  overviewSchema,
  addTankSchema,
  addTankGuidedSchema,
  strappingRowsSchema,
  setupAnswerSchema,
  cancelSchema,
  removeTankSchema,
  renameTankSchema,
  setSchema,
  undoSchema,
  deleteReadingSchema,
  correctUnitSchema,
  confirmSchema,
  digestNowSchema,
  helpSchema,
]);

export type Command = z.infer<typeof commandSchema>;
export type CommandType = Command['type'];
/** The command of one type, e.g. `CommandOf<'reading'>`. */
export type CommandOf<T extends CommandType> = Extract<Command, { type: T }>;

/** A pending conversation step the bot keeps; the parser reads the next message in its light. */
export type AwaitingStep = 'strapping-rows' | 'setup-answer' | 'confirm-suspect';

export interface ParseContext {
  /** Epoch ms: times in words resolve against it. */
  now: number;
  /** The team's IANA zone (times without a zone are in it). */
  timeZone: string;
  /** The team's tank names and short codes, for matching and "did you mean". */
  tankNames: string[];
  awaiting?: AwaitingStep;
}
