/**
 * The `gicladder` command. Node-only: the core library never imports this file.
 * Exit codes: 0 success, 1 a check failed, 2 bad input (the message on stderr names the field).
 */
import { Command, CommanderError } from 'commander';
import { realpathSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { GicladderError } from '../errors';
import { runPrototypeCommand } from './prototype-command';
import type { CliIo } from './io';
import { runDesignCommand, runHeaderCommand, runNetlistCommand } from './design-command';
import { createProgress } from './progress';
import { runCheckCommand } from './check-command';

export const EXIT_OK = 0;
export const EXIT_CHECK_FAILED = 1;
export const EXIT_BAD_INPUT = 2;
/** An unexpected exception: a bug, not bad input (sysexits EX_SOFTWARE). */
export const EXIT_INTERNAL = 70;

export type { CliIo } from './io';

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
    .command('design')
    .description('design from a design file and write everything: report.json, <name>.h, <name>.cir and the plots')
    .argument('<spec.json>', 'the design file')
    .option('--out <dir>', 'output folder', 'out')
    .addHelpText('after', '\nExample:\n  gicladder design examples/vibration-antialias-lowpass.json --out build/filter\n')
    .action((specPath: string, opts: { out: string }) => {
      const progress = createProgress('Monte Carlo');
      try {
        const code = runDesignCommand(specPath, opts, io, (done, total) => progress.update(done, total));
        if (code !== EXIT_OK) throw new ExitRequest(code);
      } finally {
        progress.finish();
      }
    });

  program
    .command('header')
    .description('the C header alone; with -o, the file is rewritten only if its content changed')
    .argument('<spec.json>', 'the design file')
    .option('-o, --output <file>', 'write to this file instead of stdout')
    .addHelpText('after', '\nExample (in a Makefile or CMake custom command):\n  gicladder header filter.json -o generated/filter.h\n')
    .action((specPath: string, opts: { output?: string }) => {
      runHeaderCommand(specPath, opts, io);
    });

  program
    .command('netlist')
    .description("the SPICE netlist alone (VIN drives node 'in', the output node is 'out')")
    .argument('<spec.json>', 'the design file')
    .option('-o, --output <file>', 'write to this file instead of stdout')
    .addHelpText('after', '\nExample:\n  gicladder netlist filter.json -o filter.cir && ngspice -b filter.cir\n')
    .action((specPath: string, opts: { output?: string }) => {
      runNetlistCommand(specPath, opts, io);
    });

  program
    .command('check')
    .description('production-test verdicts for measured boards; exit 1 if any board fails')
    .argument('<spec.json>', 'the design file (with production.enabled)')
    .argument('<measured.csv>', 'CSV with a header: board, frequency_hz, gain_db[, phase_deg]')
    .option('--json', 'print every verdict as JSON')
    .addHelpText('after', '\nExample (on the test station):\n  gicladder check filter.json station3.csv || echo "some boards failed"\n')
    .action(async (specPath: string, csvPath: string, opts: { json?: boolean }) => {
      const code = await runCheckCommand(specPath, csvPath, opts, io);
      if (code !== EXIT_OK) throw new ExitRequest(code);
    });

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
  // A reader that stops early (`gicladder netlist x.json | head`) closes the pipe: end quietly, as
  // command-line tools do, instead of an unhandled EPIPE.
  for (const stream of [process.stdout, process.stderr]) {
    stream.on('error', (err: NodeJS.ErrnoException) => {
      if (err.code === 'EPIPE') process.exit(process.exitCode ?? 0);
      throw err;
    });
  }
  runCli(process.argv.slice(2), { stdout: (t) => process.stdout.write(t), stderr: (t) => process.stderr.write(t) }).then((code) => {
    process.exitCode = code;
  });
}
