import { continueGuidedSetup, startGuidedSetup } from '../conversation-setup.js';
import { defineHandler } from './handler.js';

export const addTankGuidedHandler = defineHandler({
  type: 'add-tank-guided',
  adminOnly: true,
  run: (_command, context) => startGuidedSetup(context),
});

export const setupAnswerHandler = defineHandler({
  type: 'setup-answer',
  adminOnly: true,
  run: (command, context) => continueGuidedSetup(context, command.text),
});
