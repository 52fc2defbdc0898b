/**
 * Web API clients. On a 429 the WebClient pauses its whole request queue until Retry-After has passed, so one
 * shared client would make every team wait for the one that hit the limit. Each team gets its own client
 * (its own queue) for posting; interactive calls (views.open/publish, whose trigger expires in about 3 s) use a
 * client that fails fast on 429 instead of waiting.
 */
import type { Logger, LogLevel, webApi } from '@slack/bolt';
import { webApi as web } from '@slack/bolt';

export interface ClientSettings {
  token: string;
  /** Web API base ending in `/api/`; the platform's when absent. */
  apiUrl?: string;
  retryConfig?: webApi.RetryOptions;
  logger?: Logger;
  logLevel?: LogLevel;
}

export interface TeamClients {
  /** The posting client of one Slack team (team id without our `slack:` prefix). */
  forTeam(teamId: string): webApi.WebClient;
  /** Fails fast on 429 and does not retry: for calls that are useless once the person has moved on. */
  interactive: webApi.WebClient;
  /** Options every client shares (the receivers take them too). */
  options: webApi.WebClientOptions;
}

/** Bound on cached clients: a client is small, but a forged stream of team ids must not grow memory forever. */
const MAX_TEAMS = 5_000;

export function createTeamClients(settings: ClientSettings): TeamClients {
  const options: webApi.WebClientOptions = {
    ...(settings.apiUrl ? { slackApiUrl: settings.apiUrl } : {}),
    ...(settings.retryConfig ? { retryConfig: settings.retryConfig } : {}),
    ...(settings.logger ? { logger: settings.logger } : {}),
    ...(settings.logLevel ? { logLevel: settings.logLevel } : {}),
  };
  const clients = new Map<string, webApi.WebClient>();
  return {
    options,
    // No retries either: a modal's trigger is dead long before a retry, and a sender's zone is not worth a wait.
    interactive: new web.WebClient(settings.token, {
      ...options,
      rejectRateLimitedCalls: true,
      retryConfig: { retries: 0 },
    }),
    forTeam(teamId) {
      let client = clients.get(teamId);
      if (!client) {
        if (clients.size >= MAX_TEAMS) {
          const oldest = clients.keys().next().value;
          if (oldest !== undefined) clients.delete(oldest);
        }
        client = new web.WebClient(settings.token, options);
        clients.set(teamId, client);
      }
      return client;
    },
  };
}
