import { isTankNameShaped } from '../language/tankName.js';
import { findTank } from '../tank-lookup.js';
import { defineHandler, privateError } from './handler.js';
import { resolveTank } from './resolve-tank.js';

/** A new short code; the old one no longer answers. History stays with the tank. */
export const renameTankHandler = defineHandler({
  type: 'rename-tank',
  adminOnly: true,
  run: (command, context) => {
    const { store, request, now } = context;
    const tank = resolveTank(context, command.tank);
    if (!tank.ok) return [privateError(tank.error)];
    if (!isTankNameShaped(command.newName)) {
      return [privateError(`"${command.newName}" cannot be a code; use letters and digits, e.g. GEN-1.`)];
    }
    const clash = findTank(store, request.team, command.newName);
    if (clash && clash.id !== tank.value.id)
      return [privateError(`You already have a tank ${command.newName}.`)];
    store.tanks.rename(request.team, tank.value.id, command.newName, now);
    store.audit.record(
      request.team,
      {
        userId: request.user,
        action: 'tank.rename',
        target: 'tanks',
        targetId: tank.value.id,
        detail: { from: tank.value.code, to: command.newName },
      },
      now,
    );
    return [
      {
        kind: 'confirmation',
        visibility: 'channel',
        headline: `${tank.value.code} is now ${command.newName}.`,
      },
    ];
  },
});
