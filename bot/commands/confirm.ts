import { isLengthUnit } from '../../engine/units/index.js';
import { readingLitres } from '../reading-volume.js';
import { geometryOf } from '../tank-rate.js';
import { tankStatus } from '../tank-status.js';
import { defineHandler, privateError } from './handler.js';
import { readingConfirmation } from './reading.js';
import { changeReadingUnit, softDeleteReading } from './reading-edits.js';

/** yes / no to the "did you mean ...?" about a reading kept aside. */
export const confirmHandler = defineHandler({
  type: 'confirm',
  run: (command, context) => {
    const { store, request, now, timeZone } = context;
    const pending = store.pending.get(request.team, request.channel, request.user);
    const readingId = pending?.kind === 'confirm-suspect' ? Number(pending.state.readingId) : Number.NaN;
    store.pending.clear(request.team, request.channel, request.user);
    const reading = Number.isInteger(readingId) ? store.readings.byId(request.team, readingId) : undefined;
    if (!reading) return [privateError('Nothing is waiting for a yes or no from you.')];
    const tank = store.tanks.byId(request.team, reading.tankId);
    if (!tank) return [privateError('That reading’s tank was removed meanwhile; nothing was changed.')];
    const suggested = typeof pending?.state.unit === 'string' ? pending.state.unit : undefined;

    if (!command.answer && !suggested) {
      softDeleteReading(store, request, reading.id, 'reading.drop', now);
      return [
        {
          kind: 'confirmation',
          visibility: 'sender',
          headline: `Dropped "${reading.rawText}"; it is not used.`,
        },
      ];
    }
    let confirmed = reading;
    if (command.answer && suggested && isLengthUnit(suggested)) {
      const geometry = geometryOf(tank.spec);
      const fits = geometry.ok && readingLitres(geometry.value, { ...reading, unit: suggested }).ok;
      if (!fits)
        return [
          privateError(`${reading.value} ${suggested} does not fit ${tank.code}; send the reading again.`),
        ];
      const to = { kind: reading.kind, unit: suggested };
      changeReadingUnit(store, request, reading.id, to, { from: reading.unit, to: suggested }, now);
      confirmed = { ...reading, unit: suggested };
    }
    store.readings.setStatus(request.team, reading.id, 'ok');
    const status = tankStatus(store, request.team, tank.id, now)!;
    return [readingConfirmation(status, confirmed, now, timeZone)];
  },
});
