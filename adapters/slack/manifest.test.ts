import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { defaultCommand } from '../../cli/serve-settings.js';
import { botScopes, manifestYaml, slackManifest, toYaml } from './manifest.js';

describe('Slack app manifest', () => {
  it('is committed exactly as the code builds it for the default command', () => {
    const committed = readFileSync(new URL('./manifest.yaml', import.meta.url), 'utf8');
    expect(committed).toBe(manifestYaml({ command: defaultCommand }));
  });

  it('asks for five bot scopes and no more', () => {
    expect(botScopes).toEqual(['app_mentions:read', 'chat:write', 'commands', 'files:write', 'users:read']);
  });

  it('points the command, events and buttons at /slack/events in HTTP mode', () => {
    const m = slackManifest({ command: '/tanks', publicUrl: 'https://bot.kestrel.example/' });
    const text = toYaml(m);
    expect(text.match(/https:\/\/bot\.kestrel\.example\/slack\/events/g)).toHaveLength(3);
    expect(text).toContain('command: "/tanks"');
    expect(text).toContain('socket_mode_enabled: false');
  });

  it('writes nested maps and lists of maps as YAML blocks', () => {
    expect(toYaml({ a: { b: [{ c: 'x', d: true }, 'y'] } })).toBe(
      'a:\n  b:\n    - c: "x"\n      d: true\n    - "y"\n',
    );
  });
});
