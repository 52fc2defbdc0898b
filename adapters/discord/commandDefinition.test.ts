import { describe, expect, it } from 'vitest';
import { commandDefinition, commandNameFrom, SUBCOMMANDS } from './commandDefinition.js';

interface Option {
  type: number;
  name: string;
  description: string;
  options?: Option[];
  choices?: { name: string; value: string }[];
  max_length?: number;
}

// Limits from Discord's developer documentation ("Application Commands": names 1-32 of
// ^[-_\p{L}\p{N}]{1,32}$ in lowercase, descriptions 1-100, at most 25 options and 25 choices), as recorded
// in ../shared/docs/chat-platforms.md; the 100-character description limit is from memory.
const NAME = /^[-_\p{Ll}\p{N}]{1,32}$/u;

function walk(options: Option[], visit: (o: Option) => void) {
  for (const o of options) {
    visit(o);
    walk(o.options ?? [], visit);
  }
}

describe('commandDefinition', () => {
  const [command] = commandDefinition('tankrunway') as unknown as (Option & { options: Option[] })[];

  it('is one chat-input command with every subcommand', () => {
    expect(command?.name).toBe('tankrunway');
    expect(command?.options.map((o) => o.name)).toEqual([...SUBCOMMANDS]);
  });

  it('keeps within Discord limits for names, descriptions, options and choices', () => {
    expect(command?.description.length).toBeLessThanOrEqual(100);
    expect(command?.options.length).toBeLessThanOrEqual(25);
    walk(command?.options ?? [], (o) => {
      expect(o.name).toMatch(NAME);
      expect(o.description.length).toBeGreaterThan(0);
      expect(o.description.length).toBeLessThanOrEqual(100);
      expect((o.options ?? []).length).toBeLessThanOrEqual(25);
      expect((o.choices ?? []).length).toBeLessThanOrEqual(25);
    });
  });

  it('puts required options before optional ones, as Discord demands', () => {
    walk(command?.options ?? [], (o) => {
      const required = (o.options ?? []).map((x) => (x as { required?: boolean }).required === true);
      expect(required).toEqual([...required].sort((a, b) => Number(b) - Number(a)));
    });
  });
});

describe('commandNameFrom', () => {
  it('drops the slash and refuses names Discord would refuse', () => {
    expect(commandNameFrom('/tankrunway')).toBe('tankrunway');
    expect(commandNameFrom('tank')).toBe('tank');
    expect(commandNameFrom('/Tank')).toBeUndefined();
    expect(commandNameFrom('tank runway')).toBeUndefined();
    expect(commandNameFrom('x'.repeat(33))).toBeUndefined();
    expect(commandNameFrom('')).toBeUndefined();
  });
});
