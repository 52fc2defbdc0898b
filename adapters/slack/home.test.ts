import { describe, expect, it } from 'vitest';
import type { Reply } from '../../bot/replies/reply.js';
import { homeView } from './home.js';

describe('homeView', () => {
  it('shows the overview under the setup and settings buttons, within 100 blocks', () => {
    const overview: Reply = {
      kind: 'answer',
      visibility: 'sender',
      headline: '3 tanks, shortest runway 4 days (Ridge Pump Station diesel)',
      facts: Array.from({ length: 2000 }, (_, i) => ({ label: `T${i}`, value: `${i} days` })),
    };
    const view = homeView([overview, overview]);
    expect(view.type).toBe('home');
    expect(view.blocks.length).toBeLessThanOrEqual(100);
    expect(JSON.stringify(view.blocks)).toContain('3 tanks, shortest runway 4 days');
    expect(JSON.stringify(view.blocks[1])).toContain('tankrunway:open-setup');
  });
});
