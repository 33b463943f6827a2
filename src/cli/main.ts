/**
 * The `gicladder` command. Node-only: the core library never imports this file.
 * Exit codes: 0 success, 1 a check failed, 2 bad input (the message on stderr names the field).
 */
import { Command, CommanderError } from 'commander';
import { realpathSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { GicladderError } from '../errors';
import { runPrototypeCommand } from './prototype-command';

export const EXIT_OK = 0;
export const EXIT_CHECK_FAILED = 1;
export const EXIT_BAD_INPUT = 2;
/** An unexpected exception: a bug, not bad input (sysexits EX_SOFTWARE). */
export const EXIT_INTERNAL = 70;

export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
}

/** Thrown by command actions to end with an exit code after their output. */
class ExitRequest extends Error {
  constructor(readonly exitCode: number) {
    super(`exit ${exitCode}`);
  }
}

export function buildProgram(io: CliIo): Command {
  const program = new Command();
  program
    .name('gicladder')
    .description('Active GIC filters from LC ladders: design, export and production test from one design file.')
    .showHelpAfterError()
    .exitOverride()
    .configureOutput({ writeOut: io.stdout, writeErr: io.stderr });

  program
    .command('prototype')
    .description('the normalised lowpass prototype (zeros, poles, gain) and its LC ladder')
    .requiredOption('--family <family>', 'butterworth | chebyshev | inverse-chebyshev | elliptic | bessel')
    .requiredOption('--order <n>', 'filter order (1 to 15; elliptic 2 to 15)')
    .option('--ripple-db <dB>', 'passband ripple (chebyshev, elliptic)')
    .option('--attenuation-db <dB>', 'stopband attenuation (inverse-chebyshev, elliptic)')
    .option('--normalization <n>', 'bessel: delay | magnitude | phase')
    .option('--form <form>', 'shunt-first | series-first')
    .option('--source-ohms <ohm>', 'source resistance (default 1)')
    .option('--load-ohms <ohm>', "load resistance, or 'open'")
    .option('--json', 'print the ladder object as JSON')
    .addHelpText('after', '\nExample:\n  gicladder prototype --family chebyshev --order 5 --ripple-db 0.1\n')
    .action((opts) => {
      const r = runPrototypeCommand(opts);
      if (r.stdout) io.stdout(r.stdout);
      if (r.stderr) io.stderr(r.stderr);
      if (r.exitCode !== EXIT_OK) throw new ExitRequest(r.exitCode);
    });

  return program;
}

/** Runs the CLI on argv (without the node and script entries) and returns the exit code. */
export async function runCli(args: string[], io: CliIo): Promise<number> {
  const program = buildProgram(io);
  try {
    await program.parseAsync(args, { from: 'user' });
    return EXIT_OK;
  } catch (err) {
    if (err instanceof ExitRequest) return err.exitCode;
    if (err instanceof GicladderError) {
      io.stderr(`gicladder: ${err.message}\n`);
      return EXIT_BAD_INPUT;
    }
    if (err instanceof CommanderError) {
      if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') return EXIT_OK;
      return EXIT_BAD_INPUT;
    }
    io.stderr(`gicladder: internal error: ${(err as Error).stack ?? String(err)}\n`);
    return EXIT_INTERNAL;
  }
}

function isMain(): boolean {
  try {
    return process.argv[1] !== undefined && realpathSync(process.argv[1]) === realpathSync(fileURLToPath(import.meta.url));
  } catch {
    return false;
  }
}

if (isMain()) {
  runCli(process.argv.slice(2), { stdout: (t) => process.stdout.write(t), stderr: (t) => process.stderr.write(t) }).then((code) => {
    process.exitCode = code;
  });
}
