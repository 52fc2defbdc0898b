import { defineHandler, privateError } from './handler.js';
import { resolveTank } from './resolve-tank.js';

export const removeTankHandler = defineHandler({
  type: 'remove-tank',
  adminOnly: true,
  run: (command, context) => {
    const { store, request, now } = context;
    const tank = resolveTank(context, command.tank);
    if (!tank.ok) return [privateError(tank.error)];
    store.tanks.remove(request.team, tank.value.id, now);
    store.audit.record(
      request.team,
      { userId: request.user, action: 'tank.remove', target: 'tanks', targetId: tank.value.id },
      now,
    );
    return [
      {
        kind: 'confirmation',
        visibility: 'channel',
        headline: `Removed ${tank.value.code}. Its readings stay in the store for the audit trail; the code is free again.`,
      },
    ];
  },
});
