/**
 * The slash command: `/tankrunway T4 60in` carries the same message language as the console. `setup` and
 * `settings` alone open the modals instead (they need the command's trigger_id, which lives about 3 s).
 */
import type { App } from '@slack/bolt';
import type { SlackContext } from '../context.js';
import { settingsModal, setupModal } from '../modals.js';
import { toRequest } from '../to-request.js';

const modalWords: Record<string, typeof setupModal> = { setup: setupModal, settings: settingsModal };

export function listenForCommand(app: App, ctx: SlackContext, command: string): void {
  app.command(command, async ({ command: c, ack, respond }) => {
    // Acknowledge first: Slack shows an error after 3 s, and the work below may take longer.
    await ack();
    const receivedAt = ctx.clock();
    if (!c.team_id || !c.channel_id || !c.user_id || typeof c.text !== 'string') {
      ctx.logger.warn('slash command without a team, channel, user or text: ignored');
      return;
    }
    const openModal = modalWords[c.text.trim().toLowerCase()];
    if (openModal) {
      try {
        await ctx.clients.interactive.views.open({
          trigger_id: c.trigger_id,
          view: openModal({ channel: c.channel_id }),
        });
      } catch (error) {
        ctx.logger.warn(`views.open failed: ${String(error)}`);
        await respond({
          response_type: 'ephemeral',
          text: 'The form could not open in time. Type the message instead, e.g. `add tank T4 vertical-cylinder diameter=48in length=72in unit=gal`.',
        });
      }
      return;
    }
    const timeZone = await ctx.zones.zoneOf(c.team_id, c.user_id);
    const request = toRequest({
      teamId: c.team_id,
      channel: c.channel_id,
      user: c.user_id,
      userName: c.user_name,
      text: c.text,
      receivedAt,
      timeZone,
      // Each invocation has its own trigger_id; a redelivered one has the same.
      dedupeKey: `command:${c.trigger_id}`,
    });
    const replies = await ctx.bot.handle(request);
    await ctx.outbox.send({ teamId: c.team_id, channel: c.channel_id, user: c.user_id, respond }, replies);
  });
}
