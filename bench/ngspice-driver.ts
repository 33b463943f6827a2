/**
 * Runs ngspice in batch mode (`ngspice -b`) on a netlist with a `.control` script for the benchmark,
 * and reads back what the script wrote, what ngspice reported about its own time, and the process's
 * wall and CPU time (bash's `time`; needs bash).
 *
 * ngspice's own timings come from its `rusage` command (ngspice manual, "rusage: Resource usage"):
 * `rusage acTime` prints "AC analysis time = x" (seconds, cumulative over every `ac` run of the loaded
 * circuit, millisecond resolution) and `rusage cputime` prints "Total elapsed time (seconds) = x"
 * (wall time since ngspice started, millisecond resolution). Scripts print markers with `echo` so the
 * values can be told apart.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseWrdata, type AcPoint } from '../test/helpers/ngspice';

/** The executable looked up on PATH; NGSPICE may name another one. */
const NGSPICE = process.env.NGSPICE ?? 'ngspice';
/** The slowest run here (1,000 Monte Carlo trials) takes seconds; anything near this is a hang. */
const RUN_TIMEOUT_MS = 300_000;

export interface NgspiceRun {
  /** Wall time of the whole `ngspice -b` process (ms), from bash's `time` (start to exit, millisecond resolution). */
  readonly wallMs: number;
  /** CPU time (user + system) of the ngspice process (ms), from bash's `time` (the children's rusage). */
  readonly cpuMs: number;
  /** stdout and stderr. */
  readonly log: string;
  /** Contents of the files the script was asked to leave, by name. */
  readonly files: Readonly<Record<string, string>>;
}

/** ngspice ran but did not produce what the benchmark needs. */
export class NgspiceBenchError extends Error {
  constructor(message: string, readonly log: string) {
    super(`${message}\n--- ngspice output (first 4000 characters) ---\n${log.slice(0, 4000)}`);
    this.name = 'NgspiceBenchError';
  }
}

/**
 * Inserts `control` (lines, without `.control`/`.endc`) before the netlist's `.end`, removes the
 * netlist's own `.ac` card when `dropAcCard` (the script runs its own `ac` commands), runs
 * `ngspice -b` in a fresh temporary directory and returns the wall time, the log and the `outputs`
 * files. Throws {@link NgspiceBenchError} on a failed run, an error or a warning in the log.
 */
export function runNgspiceScript(netlist: string, control: readonly string[], outputs: readonly string[] = [], dropAcCard = true): NgspiceRun {
  const end = /^\.end\s*$/im.exec(netlist);
  if (!end) throw new Error('runNgspiceScript: the netlist has no .end line');
  let body = netlist.slice(0, end.index);
  if (dropAcCard) body = body.replace(/^\.ac .*$/gim, '');
  const text = `${body}.control\n${control.join('\n')}\n.endc\n.end\n`;
  const dir = mkdtempSync(join(tmpdir(), 'gicladder-bench-'));
  try {
    writeFileSync(join(dir, 'circuit.cir'), text);
    // bash's `time` keyword reports the real, user and system time of the ngspice process alone
    const r = spawnSync('bash', ['-c', 'TIMEFORMAT="TIMES %3R %3U %3S"; time "$0" -b circuit.cir > ngspice.log 2>&1', NGSPICE], { cwd: dir, encoding: 'utf8', timeout: RUN_TIMEOUT_MS });
    const logPath = join(dir, 'ngspice.log');
    const log = existsSync(logPath) ? readFileSync(logPath, 'utf8') : '';
    if (r.error) throw new NgspiceBenchError(`ngspice could not run: ${r.error.message}`, `${log}${r.stderr ?? ''}`);
    if (r.status !== 0) throw new NgspiceBenchError(`ngspice exited with status ${r.status}`, `${log}${r.stderr ?? ''}`);
    const times = /TIMES ([0-9.]+) ([0-9.]+) ([0-9.]+)/.exec(r.stderr ?? '');
    if (!times) throw new NgspiceBenchError('no process times from bash', `${log}${r.stderr ?? ''}`);
    const wallMs = 1000 * Number(times[1]);
    const cpuMs = 1000 * (Number(times[2]) + Number(times[3]));
    if (/^\s*error/im.test(log)) throw new NgspiceBenchError('ngspice reported an error', log);
    if (/^\s*warning/im.test(log)) throw new NgspiceBenchError('ngspice reported a warning', log);
    const files: Record<string, string> = {};
    for (const name of outputs) {
      const path = join(dir, name);
      if (!existsSync(path)) throw new NgspiceBenchError(`ngspice wrote no ${name}`, log);
      files[name] = readFileSync(path, 'utf8');
    }
    return { wallMs, cpuMs, log, files };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Every "AC analysis time = x" value in the log, in seconds, in order (cumulative values). */
export function acAnalysisTimesS(log: string): number[] {
  return [...log.matchAll(/^\s*AC analysis time = ([0-9.eE+-]+)/gm)].map((m) => Number(m[1]));
}

/** Every "Total elapsed time (seconds) = x" value in the log (from `rusage cputime`), in order. */
export function elapsedTimesS(log: string): number[] {
  return [...log.matchAll(/^\s*Total elapsed time \(seconds\) = ([0-9.eE+-]+)/gm)].map((m) => Number(m[1]));
}

/** Script lines that set up AC runs: ASCII data with one scale column at 17 digits, no operating point. */
export const AC_SETUP: readonly string[] = ['set filetype=ascii', 'set wr_singlescale', 'option numdgt=17', 'option noopac'];

/** Parses wrdata text (`freq re im` per line); see test/helpers/ngspice.ts. */
export function readAcData(text: string): AcPoint[] {
  return parseWrdata(text);
}
