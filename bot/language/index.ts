// The bot's message language: text -> a zod-checked Command.
export * from './command.js';
export { INTERNAL_PARSE_ERROR, parseMessage } from './parse.js';
