import { fromLitres, toLitres } from '../../engine/units/index.js';
import { readingLitres } from '../reading-volume.js';
import { formatDateTime, formatVolume } from '../replies/format.js';
import type { Fact, Reply } from '../replies/reply.js';
import { tankStatus } from '../tank-status.js';
import { defineHandler, privateError } from './handler.js';
import { rawMeasurementOf } from './measurement-input.js';
import { replyForNewReading, storeReading } from './reading.js';
import { resolveTankGeometry, statedTimeOf } from './resolve-tank.js';
import { runwayText, statusCaution } from './status-reply.js';

/** A delivery (or, on a filling tank, a pick-up) someone logged, optionally with the level read after it. */
export const deliveryHandler = defineHandler({
  type: 'delivery',
  run: (command, context) => {
    const { store, request, now, timeZone } = context;
    const found = resolveTankGeometry(context, command.tank);
    if (!found.ok) return [privateError(found.error)];
    const { tank, geometry } = found.value;
    const litres = toLitres(command.volume.value, command.volume.unit);
    if (!(litres > 0))
      return [privateError('A delivery needs a volume above zero, e.g. `delivered 150 gal to T4`.')];
    const unit = geometry.spec.units.volume;
    if (litres > geometry.capacity * 1.000001) {
      return [
        privateError(
          `${tank.code} holds ${formatVolume(fromLitres(geometry.capacity, unit), unit)} in all; ${command.volume.raw} cannot go in. Check the number and unit.`,
        ),
      ];
    }
    const time = statedTimeOf(context, command.time);
    if (!time.ok) return [privateError(time.error)];
    const after = command.levelAfter ? rawMeasurementOf(command.levelAfter) : undefined;
    if (after) {
      const check = readingLitres(geometry, after);
      if (!check.ok) return [privateError(`${tank.code}, level after the delivery: ${check.error}`)];
    }
    // Validated in full: now write, all in this command's one transaction.
    const delivery = store.deliveries.add(
      request.team,
      {
        tankId: tank.id,
        time: time.value,
        volume: command.volume.value,
        unit: command.volume.unit,
        ticket: command.ticket ?? null,
        rawText: command.raw,
        userId: request.user,
      },
      now,
    );
    store.audit.record(
      request.team,
      { userId: request.user, action: 'delivery.add', target: 'deliveries', targetId: delivery.id },
      now,
    );
    const word = tank.settings.filling ? 'Pick-up' : 'Delivery';
    const facts: Fact[] = [{ label: 'When', value: formatDateTime(time.value, timeZone) }];
    if (command.ticket) facts.push({ label: 'Ticket', value: command.ticket });
    const replies: Reply[] = [];
    if (after) {
      const reading = storeReading(context, tank, after, time.value, command.raw);
      replies.push(...replyForNewReading(context, tank, geometry, reading));
    }
    const status = tankStatus(store, request.team, tank.id, now)!;
    if (!after) facts.push({ label: 'Runway', value: runwayText(status, now, timeZone) });
    const caution = statusCaution(status, 'delivery');
    replies.unshift({
      kind: 'confirmation',
      visibility: 'channel',
      headline: `${word} logged: ${tank.code} ${tank.settings.filling ? '-' : '+'}${formatVolume(command.volume.value, command.volume.unit)}`,
      facts,
      actions: [{ label: 'Undo', command: 'undo', style: 'danger' }],
      ...(caution ? { caution } : {}),
    });
    return replies;
  },
});
