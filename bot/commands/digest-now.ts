import { previewDigest } from '../schedule/digest.js';
import { defineHandler } from './handler.js';

/** "digest now": the morning digest on demand, composed by bot/schedule exactly as the scheduled one. */
export const digestNowHandler = defineHandler({
  type: 'digest-now',
  run: (_command, { store, team, now }) => [previewDigest(store, team, now)],
});
