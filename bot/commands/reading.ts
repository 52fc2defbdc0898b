import type { Tank as TankGeometry } from '../../engine/geometry/index.js';
import { fromLitres, isLengthUnit, LENGTH_UNITS } from '../../engine/units/index.js';
import { type RawMeasurement, readingLitres } from '../reading-volume.js';
import { formatChange, formatDateTime, formatPercent, formatVolume } from '../replies/format.js';
import type { Fact, Reply } from '../replies/reply.js';
import type { Reading, Tank } from '../store/types.js';
import { type TankStatus, tankStatus } from '../tank-status.js';
import { type CommandContext, defineHandler, privateError } from './handler.js';
import { measurementWords, rawMeasurementOf } from './measurement-input.js';
import { resolveTankGeometry, statedTimeOf } from './resolve-tank.js';
import { runwayText, statusCaution } from './status-reply.js';

const DAY_MS = 86_400_000;

/**
 * Stores one reading, raw, after it was fully checked; then either confirms it with the new figures, or,
 * when the rate estimator does not trust it, keeps it aside and asks the sender.
 */
export const readingHandler = defineHandler({
  type: 'reading',
  run: (command, context) => {
    const found = resolveTankGeometry(context, command.tank);
    if (!found.ok) return [privateError(found.error)];
    const { tank, geometry } = found.value;
    const raw = rawMeasurementOf(command.measurement);
    const litres = readingLitres(geometry, raw);
    if (!litres.ok) return [privateError(`${tank.code}: ${litres.error}`)];
    const time = statedTimeOf(context, command.time);
    if (!time.ok) return [privateError(time.error)];
    const reading = storeReading(context, tank, raw, time.value, command.raw);
    return replyForNewReading(context, tank, geometry, reading);
  },
});

export function storeReading(
  { store, request, now }: CommandContext,
  tank: Tank,
  raw: RawMeasurement,
  time: number,
  rawText: string,
): Reading {
  const reading = store.readings.add(
    request.team,
    { tankId: tank.id, time, ...raw, rawText, userId: request.user },
    now,
  );
  store.audit.record(
    request.team,
    { userId: request.user, action: 'reading.add', target: 'readings', targetId: reading.id },
    now,
  );
  return reading;
}

/** The confirmation, or the "did you mean?" question for a reading the estimator set aside. */
export function replyForNewReading(
  context: CommandContext,
  tank: Tank,
  geometry: TankGeometry,
  reading: Reading,
): Reply[] {
  const { store, request, now, timeZone } = context;
  const status = tankStatus(store, request.team, tank.id, now)!;
  if (status.latest?.readingId === reading.id && status.latest.suspect) {
    store.readings.setStatus(request.team, reading.id, 'held');
    const suggestion = suggestUnit(geometry, status, reading);
    store.pending.put({
      teamId: request.team,
      channel: request.channel,
      userId: request.user,
      kind: 'confirm-suspect',
      state: { readingId: reading.id, ...(suggestion ? { unit: suggestion.unit } : {}) },
      createdAt: now,
    });
    return [suspectQuestion(status, reading, suggestion)];
  }
  return [readingConfirmation(status, reading, now, timeZone)];
}

export function readingConfirmation(
  status: TankStatus,
  reading: Reading,
  now: number,
  timeZone: string,
): Reply {
  const facts: Fact[] = [];
  const isLatest = status.latest?.readingId === reading.id;
  if (isLatest && status.previous) {
    facts.push({
      label: 'Change',
      value: `${formatChange(status.latest!.volume - status.previous.volume, status.volumeUnit)} since ${formatDateTime(status.previous.time, timeZone)}`,
    });
  } else if (!isLatest) {
    facts.push({
      label: 'Note',
      value: 'an earlier reading than the latest one; the figures were recomputed',
    });
  }
  facts.push({ label: 'Runway', value: runwayText(status, now, timeZone) });
  facts.push({ label: 'Read at', value: formatDateTime(reading.time, timeZone) });
  // Routine readings stay short: the product caution comes with answers, deliveries and setup, while the
  // overfill caution comes with every reading above the safe fill level.
  const caution = status.overSafeFill ? statusCaution(status) : undefined;
  return {
    kind: 'confirmation',
    visibility: 'channel',
    headline: `${status.tank.code}: ${readingHeadline(status, reading, isLatest)}`,
    facts,
    actions: [{ label: 'Undo', command: 'undo', style: 'danger' }],
    ...(caution ? { caution } : {}),
  };
}

/** "60 in = 470 gal (83%)", "62% = 1,753 L", "1,560 L (55%)". */
function readingHeadline(status: TankStatus, reading: Reading, isLatest: boolean): string {
  if (!isLatest || !status.latest) return `${measurementWords(reading)} logged`;
  const volume = formatVolume(status.latest.volume, status.volumeUnit);
  const percent = formatPercent(status.latest.fraction);
  if (reading.kind === 'percent') return `${measurementWords(reading)} = ${volume}`;
  if (reading.kind === 'volume') return `${volume} (${percent})`;
  return `${measurementWords(reading)} = ${volume} (${percent})`;
}

interface UnitSuggestion {
  unit: string;
  volume: number;
}

/** For a level typed in the wrong unit (cm for in...), the unit whose volume fits the forecast best. */
function suggestUnit(
  geometry: TankGeometry,
  status: TankStatus,
  reading: Reading,
): UnitSuggestion | undefined {
  if (
    !status.rate ||
    (reading.kind !== 'level' && reading.kind !== 'ullage') ||
    !isLengthUnit(reading.unit)
  ) {
    return undefined;
  }
  const sign = status.filling ? 1 : -1;
  const expected = status.rate.volume + (sign * status.rate.value * (reading.time - status.rate.at)) / DAY_MS;
  const unit = status.volumeUnit as Parameters<typeof fromLitres>[1];
  let best: UnitSuggestion | undefined;
  for (const candidate of LENGTH_UNITS) {
    if (candidate === reading.unit) continue;
    const litres = readingLitres(geometry, { kind: reading.kind, value: reading.value, unit: candidate });
    if (!litres.ok) continue;
    const volume = fromLitres(litres.value, unit);
    if (!best || Math.abs(volume - expected) < Math.abs(best.volume - expected))
      best = { unit: candidate, volume };
  }
  // Only a suggestion that lands near the forecast (within 10% of the tank) is worth asking about.
  return best && Math.abs(best.volume - expected) < 0.1 * status.capacity ? best : undefined;
}

function suspectQuestion(
  status: TankStatus,
  reading: Reading,
  suggestion: UnitSuggestion | undefined,
): Reply {
  const code = status.tank.code;
  const gives = status.latest ? formatVolume(status.latest.volume, status.volumeUnit) : 'an unusual volume';
  const why = status.latest?.suspect ?? 'far from the forecast';
  if (suggestion) {
    const alt = `${reading.kind === 'ullage' ? 'ullage ' : ''}${reading.value} ${suggestion.unit}`;
    return {
      kind: 'question',
      visibility: 'sender',
      headline: `${code}: ${measurementWords(reading)} gives ${gives}, which does not fit the recent readings. Did you mean ${alt} (${formatVolume(suggestion.volume, status.volumeUnit)})?`,
      facts: [
        { label: 'Why', value: why },
        {
          label: 'Answer',
          value: `yes = use ${alt}; no = keep ${measurementWords(reading)} as typed; undo = drop it`,
        },
      ],
      actions: [
        { label: `Yes, ${alt}`, command: 'yes', style: 'primary' },
        { label: 'No, keep it', command: 'no' },
      ],
    };
  }
  return {
    kind: 'question',
    visibility: 'sender',
    headline: `${code}: ${measurementWords(reading)} gives ${gives}, which does not fit the recent readings. Keep it?`,
    facts: [
      { label: 'Why', value: why },
      { label: 'Answer', value: 'yes = keep it (e.g. an unlogged delivery); no = drop it' },
    ],
    actions: [
      { label: 'Yes, keep it', command: 'yes', style: 'primary' },
      { label: 'No, drop it', command: 'no', style: 'danger' },
    ],
  };
}
