import { readingLitres } from '../reading-volume.js';
import type { ReadingKind } from '../store/types.js';
import { geometryOf } from '../tank-rate.js';
import { tankStatus } from '../tank-status.js';
import { defineHandler, privateError } from './handler.js';
import { readingConfirmation } from './reading.js';
import { changeReadingUnit } from './reading-edits.js';

/** "that was cm": the sender's last reading keeps its number and takes this unit. */
export const correctUnitHandler = defineHandler({
  type: 'correct-unit',
  run: (command, context) => {
    const { store, request, now, timeZone } = context;
    const entry = store.audit.lastUndoable(request.team, request.user);
    const reading =
      entry?.action === 'reading.add' && entry.targetId !== null
        ? store.readings.byId(request.team, entry.targetId)
        : undefined;
    if (!reading)
      return [privateError('You have no recent reading to correct; send the reading again with its unit.')];
    const tank = store.tanks.byId(request.team, reading.tankId);
    const geometry = tank ? geometryOf(tank.spec) : undefined;
    if (!tank || !geometry?.ok)
      return [privateError('That reading’s tank cannot be used any more; nothing was changed.')];
    const u = command.unit;
    const kind: ReadingKind =
      u.kind === 'percent'
        ? 'percent'
        : u.kind === 'volume'
          ? 'volume'
          : reading.kind === 'ullage'
            ? 'ullage'
            : 'level';
    const unit = u.kind === 'percent' ? '%' : u.unit;
    const litres = readingLitres(geometry.value, { kind, value: reading.value, unit });
    if (!litres.ok) return [privateError(`${tank.code}: ${litres.error}`)];
    const from = { kind: reading.kind, unit: reading.unit };
    changeReadingUnit(store, request, reading.id, { kind, unit }, { from, to: { kind, unit } }, now);
    store.readings.setStatus(request.team, reading.id, 'ok');
    store.pending.clear(request.team, request.channel, request.user);
    const status = tankStatus(store, request.team, tank.id, now)!;
    return [readingConfirmation(status, { ...reading, kind, unit }, now, timeZone)];
  },
});
