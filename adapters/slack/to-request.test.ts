import { describe, expect, it } from 'vitest';
import { slackTeam, slackTeamId, toRequest, withoutMentions } from './to-request.js';

describe('Slack -> Request', () => {
  it('qualifies the team and keeps only what the platform gave', () => {
    expect(
      toRequest({ teamId: 'T024BE7LD', channel: 'C1', user: 'U1', text: 'T4 60in', receivedAt: 5 }),
    ).toEqual({
      team: 'slack:T024BE7LD',
      channel: 'C1',
      user: 'U1',
      text: 'T4 60in',
      receivedAt: 5,
    });
  });

  it('maps team ids both ways and refuses other platforms', () => {
    expect(slackTeamId(slackTeam('T9'))).toBe('T9');
    expect(slackTeamId('discord:81384788765712384')).toBeUndefined();
    expect(slackTeamId('slack:')).toBeUndefined();
  });

  it('drops mentions wherever they are', () => {
    expect(withoutMentions('<@U0BOT> T4 60in')).toBe('T4 60in');
    expect(withoutMentions('<@U0BOT|tankrunway>   how long does T4 last?  <@U2>')).toBe(
      'how long does T4 last?',
    );
  });
});
