// Per-tank refill settings: what the supplier needs and how careful to be. The keys are exactly those of
// ../shared/docs/cli-contract.md section 5; every one is optional but the threshold.
import { closest, distance } from 'fastest-levenshtein';
import { IANAZone } from 'luxon';
import { z } from 'zod';
import { fail, ok, type Result } from '../result.js';

const thresholdSchema = z.union([
  z.strictObject({ percent: z.number().min(0).max(100) }),
  z.strictObject({ volume: z.number().min(0) }),
  z.strictObject({ runwayDays: z.number().min(0).max(3650) }),
]);

export const refillSettingsSchema = z.strictObject({
  /** When the tank must be refilled by: a volume (litres inside the engine), a percent of capacity, or a
   * minimum runway in days of use left. A filling tank reads it as the level a pick-up must come before. */
  threshold: thresholdSchema,
  /** Days from the order to the delivery. Default 0: the threshold is then simply when to have the delivery.
   * The calendar works in whole days, so a fraction is rounded up (the safe side). */
  leadTimeDays: z.number().min(0).max(365).default(0),
  /** Count the lead time in business days (Saturday and Sunday skipped). */
  businessDays: z.boolean().default(false),
  /** An order placed after this local hour (0-24, fractions allowed) counts from the next day; 24 = none. */
  orderCutoffHour: z.number().min(0).max(24).default(24),
  /** ISO weekdays (1 = Monday .. 7 = Sunday) on which deliveries arrive; default every day. */
  deliveryWeekdays: z.array(z.number().int().min(1).max(7)).min(1).default([1, 2, 3, 4, 5, 6, 7]),
  /** Local hours [from, to) within which a delivery arrives on its day, e.g. [8, 12] for "mornings before
   * noon"; default the whole day. The plan needs the whole window before the threshold and sizes the order
   * on the volume at the window's opening (the fullest the tank can be when the truck comes). */
  deliveryHours: z
    .tuple([z.number().min(0).max(24), z.number().min(0).max(24)])
    .refine(([from, to]) => from < to, { message: 'the first hour must come before the second' })
    .default([0, 24]),
  minimumOrder: z.number().min(0).default(0),
  /** Orders come in whole multiples of this (totes, compartments); 0 = any amount. */
  orderIncrement: z.number().min(0).default(0),
  /** Fill no higher than this percent of capacity: 90% is common practice for liquids that expand. */
  safeFillPercent: z.number().gt(0).max(100).default(90),
  /** Chance of the delivery arriving before the threshold is reached (cycle service level). */
  serviceLevel: z.number().min(0.5).max(0.9999).default(0.95),
  /** IANA zone for weekdays, cut-off hours and daylight-saving days. */
  timeZone: z.string().refine(isKnownZone, { message: 'not a known IANA time zone' }).default('UTC'),
});

/** Settings with every default filled in. */
export type RefillSettings = z.output<typeof refillSettingsSchema>;
/** Settings as a person writes them (everything but the threshold optional). */
export type RefillSettingsInput = z.input<typeof refillSettingsSchema>;
export type RefillThreshold = RefillSettings['threshold'];

// Checking a zone builds an Intl formatter; plans are made often, from a handful of zones.
const zoneChecks = new Map<string, boolean>();
function isKnownZone(zone: string): boolean {
  let known = zoneChecks.get(zone);
  if (known === undefined) {
    known = IANAZone.isValidZone(zone);
    if (zoneChecks.size < 1000) zoneChecks.set(zone, known);
  }
  return known;
}

const settingKeys = Object.keys(refillSettingsSchema.shape);

const hints: Record<string, string> = {
  threshold: 'one of {"percent": 20}, {"volume": 150} or {"runwayDays": 5}',
  serviceLevel: 'a fraction between 0.5 and 0.9999, such as 0.95 (not 95)',
  deliveryWeekdays: 'ISO weekday numbers 1 (Monday) to 7 (Sunday), such as [2, 4]',
  timeZone: 'an IANA name such as "America/Chicago" or "Europe/Berlin"',
  orderCutoffHour: 'a local hour from 0 to 24, such as 12 for noon',
  deliveryHours: 'two local hours [from, to] with from before to, such as [8, 12] for mornings',
  safeFillPercent: 'a percent above 0 and at most 100, such as 90',
};

/** Validates settings from a file or the store; every problem comes back as one sentence a person can fix. */
export function parseRefillSettings(raw: unknown): Result<RefillSettings> {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    return fail('Refill settings must be a JSON object such as {"threshold": {"percent": 20}}.');
  }
  const parsed = refillSettingsSchema.safeParse(raw);
  if (parsed.success) return ok(parsed.data);
  const issue = parsed.error.issues[0];
  if (!issue) return fail('Refill settings are not valid.');
  if (issue.code === 'unrecognized_keys') {
    const where = issue.path.length > 0 ? ` in "${issue.path.join('.')}"` : '';
    const key = issue.keys[0] ?? '';
    const known = issue.path[0] === 'threshold' ? ['percent', 'volume', 'runwayDays'] : settingKeys;
    const near = closest(key, known);
    const suggestion = distance(key, near) <= Math.max(2, key.length / 3) ? `; did you mean "${near}"?` : '';
    return fail(`Unknown refill setting "${key}"${where}${suggestion} Known: ${known.join(', ')}.`);
  }
  const top = String(issue.path[0] ?? '');
  if (top === '') return fail(`Refill settings: ${issue.message}.`);
  const hint = hints[top];
  const value = valueAt(raw, issue.path);
  const reason = issue.message.charAt(0).toLowerCase() + issue.message.slice(1);
  const shown = value === undefined ? 'is missing' : `is ${JSON.stringify(value)} (${reason})`;
  return fail(`Refill setting "${issue.path.join('.')}" ${shown}${hint ? `; use ${hint}` : ''}.`);
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let at: unknown = root;
  for (const key of path) {
    if (typeof at !== 'object' || at === null) return undefined;
    at = (at as Record<PropertyKey, unknown>)[key];
  }
  return at;
}
