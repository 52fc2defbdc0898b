/**
 * Modals for tank setup and settings. A submitted modal becomes ordinary messages in the bot's language
 * (`add tank ...`, `set ...`), so the bot has one way in and the modal adds no rules of its own.
 */
import type { types } from '@slack/bolt';
import { fail, ok, type Result } from '../../engine/result.js';

type View = types.View;
type KnownBlock = types.KnownBlock;

export const setupCallbackId = 'tankrunway:setup';
export const settingsCallbackId = 'tankrunway:settings';
export const openSetupActionId = 'tankrunway:open-setup';
export const openSettingsActionId = 'tankrunway:open-settings';

/** What the modal remembers about where it was opened, so replies go back there. */
export interface ModalOrigin {
  channel?: string;
}

/** Slack's view.state.values: block id -> action id -> the element's state. */
export type ViewValues = Record<
  string,
  Record<string, { value?: string | null; selected_option?: { value: string } | null } | undefined>
>;

const shapes = ['vertical-cylinder', 'horizontal-cylinder', 'rectangular', 'sphere'] as const;
const volumeUnits = ['gal', 'L', 'impgal', 'm3', 'bbl'] as const;

const option = (value: string, text = value) => ({ text: { type: 'plain_text' as const, text }, value });

function textInput(id: string, label: string, hint: string, optional = true): KnownBlock {
  return {
    type: 'input',
    block_id: id,
    optional,
    label: { type: 'plain_text', text: label },
    element: {
      type: 'plain_text_input',
      action_id: 'value',
      max_length: 100,
      placeholder: { type: 'plain_text', text: hint },
    },
  };
}

function selectInput(id: string, label: string, values: readonly string[], initial: string): KnownBlock {
  return {
    type: 'input',
    block_id: id,
    label: { type: 'plain_text', text: label },
    element: {
      type: 'static_select',
      action_id: 'value',
      options: values.map((v) => option(v)),
      initial_option: option(initial),
    },
  };
}

function modal(callbackId: string, title: string, origin: ModalOrigin, blocks: KnownBlock[]): View {
  return {
    type: 'modal',
    callback_id: callbackId,
    private_metadata: JSON.stringify(origin),
    title: { type: 'plain_text', text: title },
    submit: { type: 'plain_text', text: 'Save' },
    close: { type: 'plain_text', text: 'Cancel' },
    blocks,
  };
}

// Placeholders use our own demo scenario (Kestrel Valley Water Co-op, invented).
export function setupModal(origin: ModalOrigin): View {
  return modal(setupCallbackId, 'Add a tank', origin, [
    textInput('tank', 'Short name', 'T4', false),
    selectInput('shape', 'Shape', shapes, 'vertical-cylinder'),
    textInput('diameter', 'Diameter', '48in (cylinders, sphere)'),
    textInput('length', 'Length or wall height', '72in (cylinders, rectangular)'),
    textInput('width', 'Width', '4ft (rectangular)'),
    textInput('height', 'Height', '5ft (rectangular)'),
    selectInput('unit', 'Volume unit', volumeUnits, 'gal'),
    textInput('product', 'Product', 'sodium hypochlorite'),
    textInput('site', 'Site', 'Mill Creek Lift Station'),
  ]);
}

export function settingsModal(origin: ModalOrigin): View {
  return modal(settingsCallbackId, 'Settings', origin, [
    textInput('tank', 'Tank', 'T4 (for the tank settings below)'),
    textInput('threshold', 'Threshold', '20% or 150 gal or 5 days'),
    textInput('lead-time', 'Lead time', '3 business days'),
    textInput('delivery-days', 'Delivery days', 'tue,thu'),
    textInput('time-zone', 'Team time zone', 'America/Chicago'),
    textInput('digest', 'Morning digest', '07:00 weekdays'),
  ]);
}

/** Origin stored in the view; a tampered or missing one is just "no channel". */
export function originOf(privateMetadata: string | undefined): ModalOrigin {
  try {
    const parsed: unknown = JSON.parse(privateMetadata ?? '{}');
    const channel = (parsed as { channel?: unknown }).channel;
    return typeof channel === 'string' && /^[A-Z0-9]{1,30}$/.test(channel) ? { channel } : {};
  } catch {
    return {};
  }
}

function field(values: ViewValues, block: string): string | undefined {
  const state = values[block]?.value;
  const raw = state?.selected_option?.value ?? state?.value ?? undefined;
  // One line, no quotes: a field must not be able to inject another key into the message.
  const clean = raw?.replace(/["\s]+/g, ' ').trim();
  return clean ? clean : undefined;
}

/** A key=value word, quoted when the value has spaces. */
const pair = (key: string, value: string) => (/\s/.test(value) ? `${key}="${value}"` : `${key}=${value}`);

/** The setup modal as one `add tank` message; errors are keyed by the block to show them on. */
export function setupMessage(values: ViewValues): Result<string> {
  const tank = field(values, 'tank');
  if (!tank) return fail('tank: Give the tank a short name, e.g. T4.');
  if (/\s/.test(tank)) return fail('tank: A short name has no spaces, e.g. T4 or HYPO-1.');
  const words = ['add tank', tank, field(values, 'shape') ?? 'vertical-cylinder'];
  for (const key of ['diameter', 'length', 'width', 'height'] as const) {
    const v = field(values, key);
    if (v) words.push(`${key}=${v.replace(/\s+/g, '')}`);
  }
  words.push(`unit=${field(values, 'unit') ?? 'gal'}`);
  for (const key of ['product', 'site'] as const) {
    const v = field(values, key);
    if (v) words.push(pair(key, v));
  }
  return ok(words.join(' '));
}

/** The settings modal as `set ...` messages, one per filled field, tank settings first. */
export function settingsMessages(values: ViewValues): Result<string[]> {
  const tank = field(values, 'tank');
  const messages: string[] = [];
  const tankKeys = [
    ['threshold', 'threshold'],
    ['lead-time', 'lead time'],
    ['delivery-days', 'delivery days'],
  ] as const;
  for (const [block, words] of tankKeys) {
    const v = field(values, block);
    if (!v) continue;
    if (!tank) return fail(`tank: Name the tank the ${words} is for.`);
    messages.push(`set ${tank} ${words} ${v}`);
  }
  const zone = field(values, 'time-zone');
  if (zone) messages.push(`set time zone ${zone}`);
  const digest = field(values, 'digest');
  if (digest) messages.push(`set digest ${digest} here`);
  if (messages.length === 0) return fail('tank: Fill in at least one setting.');
  return ok(messages);
}

/** Splits "block: message" errors into Slack's `response_action: errors` shape. */
export function modalErrors(error: string, fallbackBlock: string): Record<string, string> {
  const m = /^([a-z-]+): (.*)$/s.exec(error);
  return m?.[1] && m[2] ? { [m[1]]: m[2] } : { [fallbackBlock]: error.slice(0, 300) };
}
