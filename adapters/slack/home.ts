/**
 * The App Home tab: the team's tanks by runway (bot/runway-board, given by the composition root; without it
 * the bot's answer to `status`), with buttons for the setup and settings modals.
 */
import type { types } from '@slack/bolt';
import type { Reply } from '../../bot/replies/reply.js';
import { replyBlocks } from './blocks.js';
import { openSettingsActionId, openSetupActionId } from './modals.js';

/** The message the home tab asks the bot when no board is given: the overview of every tank. */
export const homeQuestion = 'status';

/** Slack allows 100 blocks in a home view (Block Kit reference). */
const HOME_BLOCKS = 100;

export function homeView(replies: Reply[]): types.HomeView {
  const blocks: types.KnownBlock[] = [
    { type: 'header', text: { type: 'plain_text', text: 'Tanks by runway' } },
    {
      type: 'actions',
      elements: [
        {
          type: 'button',
          action_id: openSetupActionId,
          text: { type: 'plain_text', text: 'Add a tank' },
          style: 'primary',
        },
        { type: 'button', action_id: openSettingsActionId, text: { type: 'plain_text', text: 'Settings' } },
      ],
    },
    { type: 'divider' },
  ];
  replies.forEach((reply, i) => {
    const room = HOME_BLOCKS - blocks.length;
    if (room > 0) blocks.push(...replyBlocks(reply, room, `home${i}`));
  });
  return { type: 'home', blocks };
}
