import type { TankSpecInput } from '../language/command.js';
import { createTank, type NewTankRequest } from './add-tank.js';
import { defineHandler, privateError } from './handler.js';

/** Lines of a strapping table sent after `add tank T9 strapping unit=L`; `done` builds the tank. */
export const strappingRowsHandler = defineHandler({
  type: 'strapping-rows',
  adminOnly: true,
  run: (command, context) => {
    const { store, request, now } = context;
    const pending = store.pending.get(request.team, request.channel, request.user);
    if (pending?.kind !== 'strapping-rows') {
      return [
        privateError('No strapping table is being entered; start with `add tank T9 strapping unit=L`.'),
      ];
    }
    const state = pending.state as unknown as NewTankRequest & { rows: [number, number][] };
    const rows = [...(Array.isArray(state.rows) ? state.rows : []), ...command.rows];
    if (!command.done) {
      store.pending.put({ ...pending, state: { ...state, rows }, createdAt: now });
      return [
        {
          kind: 'question',
          visibility: 'sender',
          headline: `${state.code}: ${rows.length} row${rows.length === 1 ? '' : 's'} so far. Send more lines, or \`done\`.`,
        },
      ];
    }
    const sorted = [...rows].sort((a, b) => a[0] - b[0]);
    const spec: TankSpecInput = { ...state.spec, table: sorted };
    const replies = createTank(context, { ...state, spec });
    // A table the geometry refuses stays pending so the sender can add or fix rows.
    if (replies[0]?.kind === 'error') {
      store.pending.put({ ...pending, state: { ...state, rows }, createdAt: now });
      return [{ ...replies[0], headline: `${replies[0].headline} Send corrected lines, or \`cancel\`.` }];
    }
    store.pending.clear(request.team, request.channel, request.user);
    return replies;
  },
});
