import type { App } from '@slack/bolt';
import type { SlackContext } from '../context.js';
import { homeQuestion, homeView } from '../home.js';
import { slackTeam, toRequest } from '../to-request.js';

/** The home tab is drawn each time it is opened, so it always shows the current runways. */
export function listenForHome(app: App, ctx: SlackContext): void {
  app.event('app_home_opened', async ({ event, body }) => {
    if (event.tab !== 'home') return;
    const teamId = body.team_id;
    const receivedAt = ctx.clock();
    const replies = ctx.home
      ? await ctx.home(slackTeam(teamId), receivedAt)
      : await ctx.bot.handle(
          toRequest({
            teamId,
            channel: event.channel,
            user: event.user,
            text: homeQuestion,
            receivedAt,
            timeZone: await ctx.zones.zoneOf(teamId, event.user),
          }),
        );
    await ctx.clients.interactive.views.publish({ user_id: event.user, view: homeView(replies) });
  });
}
