/**
 * Buttons. A reply's action button carries a message in the bot's language as its value, so a tap is the same
 * as typing it. The home tab's buttons open the setup and settings modals.
 */
import type { App, BlockAction, ButtonAction } from '@slack/bolt';
import { commandActionPrefix } from '../blocks.js';
import type { SlackContext } from '../context.js';
import { openSettingsActionId, openSetupActionId, settingsModal, setupModal } from '../modals.js';
import { toRequest } from '../to-request.js';

export function listenForActions(app: App, ctx: SlackContext): void {
  app.action<BlockAction<ButtonAction>>(
    new RegExp(`^${commandActionPrefix}`),
    async ({ ack, body, action, respond }) => {
      await ack();
      const receivedAt = ctx.clock();
      const teamId = body.team?.id ?? body.user.team_id;
      if (!teamId || !action.value) return;
      // From the home tab there is no channel: answer in the app's direct messages.
      const channel = body.channel?.id ?? body.user.id;
      const timeZone = await ctx.zones.zoneOf(teamId, body.user.id);
      const request = toRequest({
        teamId,
        channel,
        user: body.user.id,
        userName: body.user.name,
        text: action.value,
        receivedAt,
        timeZone,
        dedupeKey: `action:${body.trigger_id}`,
      });
      const replies = await ctx.bot.handle(request);
      await ctx.outbox.send(
        { teamId, channel, user: body.user.id, ...(body.response_url ? { respond } : {}) },
        replies,
      );
    },
  );

  for (const [actionId, view] of [
    [openSetupActionId, setupModal],
    [openSettingsActionId, settingsModal],
  ] as const) {
    app.action<BlockAction<ButtonAction>>(actionId, async ({ ack, body }) => {
      await ack();
      await ctx.clients.interactive.views.open({
        trigger_id: body.trigger_id,
        view: view(body.channel?.id ? { channel: body.channel.id } : {}),
      });
    });
  }
}
