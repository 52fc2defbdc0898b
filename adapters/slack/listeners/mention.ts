/**
 * Mentions of the bot carry the same language: `@tankrunway T4 60in`. Slack redelivers an event when our 2xx
 * is missing or slow; `channel:ts` names the message itself, so a redelivery (same event_id) and the same
 * message arriving again are handled once by the bot's dedupe.
 */
import type { App } from '@slack/bolt';
import type { SlackContext } from '../context.js';
import { toRequest, withoutMentions } from '../to-request.js';

export function listenForMentions(app: App, ctx: SlackContext): void {
  app.event('app_mention', async ({ event, body }) => {
    const receivedAt = ctx.clock();
    const teamId = event.team ?? body.team_id;
    const user = event.user;
    // A bot's or a system message, or one Slack sent without its parts: nobody to answer.
    if (!teamId || !user || !event.channel || typeof event.text !== 'string') return;
    const timeZone = await ctx.zones.zoneOf(teamId, user);
    const request = toRequest({
      teamId,
      channel: event.channel,
      user,
      text: withoutMentions(event.text),
      receivedAt,
      timeZone,
      dedupeKey: `message:${event.channel}:${event.ts}`,
    });
    const replies = await ctx.bot.handle(request);
    await ctx.outbox.send({ teamId, channel: event.channel, user, threadTs: event.thread_ts }, replies);
  });
}
