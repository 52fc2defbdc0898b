import type { Request } from '../../bot/request.js';

/** Our team id for a Slack workspace: every store row of that workspace is under it. */
export const slackTeam = (teamId: string) => `slack:${teamId}`;

/** The Slack team id back from ours, or undefined when the team is not a Slack one. */
export function slackTeamId(team: string): string | undefined {
  return team.startsWith('slack:') && team.length > 'slack:'.length ? team.slice('slack:'.length) : undefined;
}

/** `<@U123> T4 60in` -> `T4 60in`: mentions of anyone (the bot first of all) are not part of the message. */
export function withoutMentions(text: string): string {
  return text
    .replace(/<@[A-Z0-9]+(\|[^>]*)?>/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
}

export interface SlackOrigin {
  teamId: string;
  channel: string;
  user: string;
  userName?: string;
  text: string;
  timeZone?: string;
  dedupeKey?: string;
  receivedAt: number;
}

export function toRequest(o: SlackOrigin): Request {
  return {
    team: slackTeam(o.teamId),
    channel: o.channel,
    user: o.user,
    ...(o.userName ? { userName: o.userName } : {}),
    text: o.text,
    receivedAt: o.receivedAt,
    ...(o.timeZone ? { timeZone: o.timeZone } : {}),
    ...(o.dedupeKey ? { dedupeKey: o.dedupeKey } : {}),
  };
}
