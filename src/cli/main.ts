/**
 * The `gicladder` command. Node-only: the core library never imports this file.
 * Exit codes: 0 success, 1 a check failed, 2 bad input (the message on stderr names the field).
 */
import { Command } from 'commander';
import { GicladderError } from '../errors';

const EXIT_BAD_INPUT = 2;

export function buildProgram(): Command {
  const program = new Command();
  program.name('gicladder').description('Active GIC filters from LC ladders: design, export, production test.').showHelpAfterError();
  program.exitOverride();
  return program;
}

async function main(argv: string[]): Promise<number> {
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
    return 0;
  } catch (err) {
    if (err instanceof GicladderError) {
      process.stderr.write(`gicladder: ${err.message}\n`);
      return EXIT_BAD_INPUT;
    }
    const code = (err as { code?: string; exitCode?: number }).code;
    if (code === 'commander.helpDisplayed' || code === 'commander.version' || code === 'commander.help') return 0;
    if (typeof code === 'string' && code.startsWith('commander.')) return EXIT_BAD_INPUT;
    process.stderr.write(`gicladder: internal error: ${(err as Error).stack ?? String(err)}\n`);
    return 70;
  }
}

main(process.argv).then((code) => {
  process.exitCode = code;
});
