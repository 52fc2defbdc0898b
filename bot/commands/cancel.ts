import { defineHandler } from './handler.js';

export const cancelHandler = defineHandler({
  type: 'cancel',
  run: (_command, { store, request }) => {
    const cleared = store.pending.clear(request.team, request.channel, request.user);
    return [
      {
        kind: 'confirmation',
        visibility: 'sender',
        headline: cleared ? 'Cancelled; nothing more was saved.' : 'There was nothing to cancel.',
      },
    ];
  },
});
