import { addTankHandler } from './commands/add-tank.js';
import type { CommandContext } from './commands/handler.js';
import type { ParseContext } from './language/command.js';
import { parseMessage } from './language/index.js';
import { isReservedWord, isTankNameShaped } from './language/tankName.js';
import { SHAPE_WORDS } from './language/tankSpecWords.js';
import type { Reply } from './replies/reply.js';
import { findTank, tankNamesOf } from './tank-lookup.js';

/**
 * The guided `add tank`: one question at a time, each answer checked before the next question; the answers
 * become one `add tank ...` line that goes through the same parser and handler as a typed one.
 */
type Step = 'code' | 'shape' | 'dimensions' | 'unit' | 'product';

interface SetupState {
  step: Step;
  code?: string;
  shape?: string;
  dimensions?: string;
  unit?: string;
}

const QUESTIONS: Record<Step, string> = {
  code: 'New tank: what short code should it have? (letters and digits, e.g. T4 or GEN-1)',
  shape:
    'Which shape is it? vertical-cylinder, horizontal-cylinder, sphere, rectangular, or strapping (you have a calibration table)',
  dimensions:
    'Its dimensions as key=value with units, e.g. `diameter=48in length=72in` (a rectangular tank: `width=1.2m length=2m height=1.5m`)',
  unit: 'Which volume unit should it report in? gal, L, m3, impgal or bbl',
  product: 'What does it hold? e.g. diesel, sodium hypochlorite 12.5%, water, backwash waste (or `skip`)',
};

function ask(step: Step, prefix = ''): Reply {
  return {
    kind: 'question',
    visibility: 'sender',
    headline: `${prefix}${QUESTIONS[step]}`,
    facts: [{ label: 'Stop', value: '`cancel` ends the setup; nothing is saved until the last answer' }],
  };
}

function save(context: CommandContext, state: SetupState): void {
  const { store, request, now } = context;
  store.pending.put({
    teamId: request.team,
    channel: request.channel,
    userId: request.user,
    kind: 'setup-answer',
    state: { ...state },
    createdAt: now,
  });
}

export function startGuidedSetup(context: CommandContext): Reply[] {
  save(context, { step: 'code' });
  return [ask('code')];
}

function lineOf(state: SetupState, product?: string): string {
  const parts = ['add tank', state.code, state.shape];
  if (state.dimensions) parts.push(state.dimensions);
  parts.push(`unit=${state.unit ?? 'L'}`);
  if (product) parts.push(`product="${product.replace(/"/g, "'")}"`);
  return parts.join(' ');
}

function parseContext(context: CommandContext): ParseContext {
  return {
    now: context.now,
    timeZone: context.timeZone,
    tankNames: tankNamesOf(context.store.tanks.list(context.request.team)),
  };
}

export function continueGuidedSetup(context: CommandContext, answer: string): Reply[] {
  const { store, request } = context;
  const pending = store.pending.get(request.team, request.channel, request.user);
  if (pending?.kind !== 'setup-answer') return startGuidedSetup(context);
  const state = pending.state as unknown as SetupState;
  const text = answer.trim();
  switch (state.step) {
    case 'code': {
      if (!isTankNameShaped(text)) return [ask('code', `"${text.slice(0, 40)}" cannot be a code. `)];
      // The same rule as the one-line `add tank`: a code such as "all" would be read as the bot's own word.
      if (isReservedWord(text)) return [ask('code', `"${text}" is one of the bot's own words. `)];
      if (findTank(store, request.team, text)) return [ask('code', `You already have ${text}. `)];
      save(context, { step: 'shape', code: text });
      return [ask('shape')];
    }
    case 'shape': {
      const shape = SHAPE_WORDS[text.toLowerCase()];
      if (!shape) return [ask('shape', `"${text.slice(0, 40)}" is not a shape I know. `)];
      save(context, { ...state, step: shape === 'strapping' ? 'unit' : 'dimensions', shape });
      return [ask(shape === 'strapping' ? 'unit' : 'dimensions')];
    }
    case 'dimensions':
    case 'unit': {
      const next: SetupState =
        state.step === 'dimensions'
          ? { ...state, dimensions: text, step: 'unit' }
          : { ...state, unit: text, step: 'product' };
      // Check the answers so far with the real parser before asking on.
      const trial = parseMessage(lineOf(next), parseContext(context));
      if (!trial.ok) return [ask(state.step, `${trial.error} `)];
      save(context, next);
      return [ask(next.step)];
    }
    case 'product': {
      const product = /^(skip|none|-)$/i.test(text) ? undefined : text.slice(0, 64);
      const parsed = parseMessage(lineOf(state, product), parseContext(context));
      if (!parsed.ok || parsed.value.type !== 'add-tank') {
        return [ask('product', `${parsed.ok ? 'That answer could not be used.' : parsed.error} `)];
      }
      store.pending.clear(request.team, request.channel, request.user);
      return addTankHandler.run(parsed.value, context);
    }
  }
}
