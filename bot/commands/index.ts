import type { Command, CommandType } from '../language/command.js';
import type { Reply } from '../replies/reply.js';
import { addTankHandler } from './add-tank.js';
import { cancelHandler } from './cancel.js';
import { confirmHandler } from './confirm.js';
import { correctUnitHandler } from './correct-unit.js';
import { deleteReadingHandler } from './delete-reading.js';
import { deliveryHandler } from './delivery.js';
import { digestNowHandler } from './digest-now.js';
import { addTankGuidedHandler, setupAnswerHandler } from './guided-setup.js';
import type { CommandContext, CommandHandler } from './handler.js';
import { helpHandler } from './help.js';
import { overviewHandler } from './overview.js';
import { readingHandler } from './reading.js';
import { removeTankHandler } from './remove-tank.js';
import { renameTankHandler } from './rename-tank.js';
import { runningLowHandler } from './running-low.js';
import { setHandler } from './set.js';
import { strappingRowsHandler } from './strapping-rows.js';
import { tankQuestionHandler } from './tank-question.js';
import { undoHandler } from './undo.js';

/** Every command of the language and its handler; the mapped type makes a missing one a compile error. */
const handlers: { [T in CommandType]: CommandHandler<T> } = {
  reading: readingHandler,
  delivery: deliveryHandler,
  'tank-question': tankQuestionHandler,
  'running-low': runningLowHandler,
  overview: overviewHandler,
  'add-tank': addTankHandler,
  'add-tank-guided': addTankGuidedHandler,
  'strapping-rows': strappingRowsHandler,
  'setup-answer': setupAnswerHandler,
  cancel: cancelHandler,
  'remove-tank': removeTankHandler,
  'rename-tank': renameTankHandler,
  set: setHandler,
  undo: undoHandler,
  'delete-reading': deleteReadingHandler,
  'correct-unit': correctUnitHandler,
  confirm: confirmHandler,
  'digest-now': digestNowHandler,
  help: helpHandler,
};

export function handlerFor<T extends CommandType>(type: T): CommandHandler<T> {
  return handlers[type];
}

/** Runs a command's handler, refusing admin-only commands to members. */
export function runCommand(command: Command, context: CommandContext): Reply[] {
  const handler = handlerFor(command.type) as CommandHandler;
  if (handler.adminOnly && context.member.role !== 'admin') {
    return [
      {
        kind: 'error',
        visibility: 'sender',
        headline:
          'Only a team admin can change tanks and settings. Members log readings and deliveries and ask questions; ask an admin to make this change.',
      },
    ];
  }
  // The union is correlated by `type`: this handler was looked up by this command's type.
  return handler.run(command as never, context);
}
