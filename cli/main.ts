import { commands } from './commands/index.js';
import { type CliIo, UsageError } from './io.js';

function usage(): string {
  const lines = commands.map((c) => `  ${c.name.padEnd(10)} ${c.summary}`);
  return ['usage: tankrunway <command> [options]', '', 'commands:', ...lines, ''].join('\n');
}

export async function main(argv: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.stdout.write(usage());
    return 0;
  }
  const entry = commands.find((c) => c.name === name);
  if (!entry) {
    io.stderr.write(
      `tankrunway: unknown command "${name}"; try one of: ${commands.map((c) => c.name).join(', ')}\n`,
    );
    return 2;
  }
  const command = await entry.load();
  try {
    return await command.run(rest, io);
  } catch (error) {
    if (error instanceof UsageError || (error instanceof TypeError && 'code' in error)) {
      // node:util parseArgs throws TypeErrors with a code for unknown or malformed options.
      io.stderr.write(`tankrunway ${name}: ${error.message.split('\n')[0]}\n`);
      return 2;
    }
    throw error;
  }
}
