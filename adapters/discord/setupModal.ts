/**
 * The tank setup form: five text inputs that together make one `add tank ...` message. A form must be the
 * first response to an interaction, so `setup` answers with it at once and the bot sees only the submit.
 */
import {
  type APIModalInteractionResponseCallbackData,
  ComponentType,
  type ModalSubmitInteraction,
  TextInputStyle,
} from 'discord.js';
import type { SetupForm } from './messageText.js';

export const SETUP_MODAL_ID = 'tr-setup';

const FIELDS: {
  id: keyof SetupForm;
  label: string;
  placeholder: string;
  paragraph?: boolean;
  required: boolean;
  max: number;
}[] = [
  { id: 'code', label: 'Short code', placeholder: 'T4', required: true, max: 32 },
  {
    id: 'shape',
    label: 'Shape and sizes (or strapping + table lines)',
    placeholder: 'vertical-cylinder diameter=48in length=72in',
    paragraph: true,
    required: true,
    max: 4000,
  },
  { id: 'unit', label: 'Volume unit', placeholder: 'gal, L, m3, bbl, impgal', required: true, max: 10 },
  {
    id: 'product',
    label: 'Product (optional)',
    placeholder: 'diesel, sodium hypochlorite, water',
    required: false,
    max: 64,
  },
  { id: 'site', label: 'Site (optional)', placeholder: 'Ridge Pump Station', required: false, max: 128 },
];

export function setupModal(): APIModalInteractionResponseCallbackData {
  return {
    custom_id: SETUP_MODAL_ID,
    title: 'Add a tank',
    components: FIELDS.map((f) => ({
      type: ComponentType.ActionRow,
      components: [
        {
          type: ComponentType.TextInput,
          custom_id: f.id,
          label: f.label,
          placeholder: f.placeholder,
          style: f.paragraph ? TextInputStyle.Paragraph : TextInputStyle.Short,
          required: f.required,
          max_length: f.max,
        },
      ],
    })),
  };
}

/** The submitted form; a field the client left out reads as empty (the message check then names it). */
export function readSetupForm(interaction: ModalSubmitInteraction): SetupForm {
  const value = (id: string): string => {
    try {
      return interaction.fields.getTextInputValue(id) ?? '';
    } catch {
      return '';
    }
  };
  return {
    code: value('code'),
    shape: value('shape'),
    unit: value('unit'),
    product: value('product'),
    site: value('site'),
  };
}
