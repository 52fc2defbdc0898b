/**
 * Modal submissions. The setup modal is checked by the bot before the modal closes, so a mistake shows on the
 * form (Slack allows 3 s for that answer); settings close at once and their replies follow in the channel.
 */
import { createHash } from 'node:crypto';
import type { App } from '@slack/bolt';
import type { Reply } from '../../../bot/replies/reply.js';
import type { SlackContext } from '../context.js';
import {
  modalErrors,
  originOf,
  settingsCallbackId,
  settingsMessages,
  setupCallbackId,
  setupMessage,
  type ViewValues,
} from '../modals.js';
import { toRequest } from '../to-request.js';

/** A view id is the same on a resubmission after a fix, so the message itself is part of the key. */
const keyOf = (viewId: string, text: string) =>
  `view:${viewId}:${createHash('sha256').update(text).digest('hex').slice(0, 16)}`;

/** Time we allow the bot before closing the form anyway (Slack's limit is 3 s). */
const FORM_DEADLINE_MS = 2_000;

export function listenForViews(app: App, ctx: SlackContext): void {
  app.view(setupCallbackId, async ({ ack, body, view }) => {
    const receivedAt = ctx.clock();
    const teamId = body.team?.id ?? body.user.team_id;
    const message = setupMessage(view.state.values as ViewValues);
    if (!message.ok) {
      await ack({ response_action: 'errors', errors: modalErrors(message.error, 'tank') });
      return;
    }
    if (!teamId) {
      await ack();
      return;
    }
    const origin = originOf(view.private_metadata);
    const channel = origin.channel ?? body.user.id;
    const handled = ctx.bot.handle(
      toRequest({
        teamId,
        channel,
        user: body.user.id,
        userName: body.user.name,
        text: message.value,
        receivedAt,
        dedupeKey: keyOf(view.id, message.value),
      }),
    );
    const inTime = await Promise.race([
      handled,
      new Promise<undefined>((r) => setTimeout(() => r(undefined), FORM_DEADLINE_MS).unref()),
    ]);
    const error = inTime?.find((r) => r.kind === 'error');
    if (error) {
      await ack({ response_action: 'errors', errors: { tank: error.headline.slice(0, 300) } });
      return;
    }
    await ack();
    await ctx.outbox.send({ teamId, channel, user: body.user.id }, await handled);
  });

  app.view(settingsCallbackId, async ({ ack, body, view }) => {
    const receivedAt = ctx.clock();
    const teamId = body.team?.id ?? body.user.team_id;
    const messages = settingsMessages(view.state.values as ViewValues);
    if (!messages.ok) {
      await ack({ response_action: 'errors', errors: modalErrors(messages.error, 'tank') });
      return;
    }
    await ack();
    if (!teamId) return;
    const channel = originOf(view.private_metadata).channel ?? body.user.id;
    const timeZone = await ctx.zones.zoneOf(teamId, body.user.id);
    const replies: Reply[] = [];
    for (const text of messages.value) {
      const request = toRequest({
        teamId,
        channel,
        user: body.user.id,
        userName: body.user.name,
        text,
        receivedAt,
        timeZone,
        dedupeKey: keyOf(view.id, text),
      });
      replies.push(...(await ctx.bot.handle(request)));
    }
    await ctx.outbox.send({ teamId, channel, user: body.user.id }, replies);
  });
}
