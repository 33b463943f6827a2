/**
 * Test helper: runs ngspice (the open-source SPICE simulator, used as the outside reference for AC
 * responses) in batch mode on a netlist text and reads back the small-signal AC response of one node.
 *
 * How it drives ngspice: the netlist text (with its own `.ac` card and ending in `.end`) gets a
 * `.control` block inserted before `.end` that runs the analysis and writes
 * `frequency, real(v(node)), imag(v(node))` with `wrdata` at 17 significant digits; the file is written
 * in a fresh temporary directory which is removed afterwards. `option noopac` skips the DC operating
 * point, so circuits whose DC matrix is singular (an integrator op-amp model, capacitors isolating a
 * node) still get an AC solution; ngspice accepts it only for linear circuits, which exported netlists
 * are.
 *
 * When ngspice is not installed the runner reports `{ status: 'missing' }`; tests go through
 * `describeWithNgspice` (ngspice-vitest.ts), which skips with a clear message locally and fails when `CI=true`.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** The executable looked up on PATH; NGSPICE may name another one. */
const NGSPICE = process.env.NGSPICE ?? 'ngspice';
/** A whole cross-check netlist solves in well under a second; anything near this is a hang. */
const RUN_TIMEOUT_MS = 30_000;

export type NgspiceStatus = { available: true; version: string } | { available: false; reason: string };

let cachedStatus: NgspiceStatus | undefined;

/** Whether ngspice can be run here (cached after the first call). */
export function ngspiceStatus(): NgspiceStatus {
  if (cachedStatus) return cachedStatus;
  const r = spawnSync(NGSPICE, ['--version'], { encoding: 'utf8', timeout: RUN_TIMEOUT_MS });
  if (r.error || r.status !== 0) {
    cachedStatus = { available: false, reason: r.error ? r.error.message : `exit status ${r.status}` };
  } else {
    const m = /ngspice-(\S+)/.exec(r.stdout);
    cachedStatus = { available: true, version: m ? m[1] : 'unknown' };
  }
  return cachedStatus;
}

/** One row of an AC result: the frequency ngspice used and the complex voltage of the node. */
export interface AcPoint {
  frequencyHz: number;
  re: number;
  im: number;
}

export type NgspiceAcResult = { status: 'ok'; points: AcPoint[]; log: string } | { status: 'missing'; reason: string };

/** ngspice ran but did not produce a usable result (syntax error, singular matrix...). */
export class NgspiceRunError extends Error {
  constructor(message: string, readonly log: string) {
    super(`${message}\n--- ngspice output ---\n${log}`);
    this.name = 'NgspiceRunError';
  }
}

/**
 * Runs the netlist's `.ac` analysis and returns V(node) at every frequency point, in ngspice's order.
 * The node defaults to `out` (the exported netlists' output node). Throws {@link NgspiceRunError} when
 * ngspice fails; returns `{ status: 'missing' }` when it is not installed.
 */
export function runNgspiceAc(netlist: string, options: { node?: string } = {}): NgspiceAcResult {
  const status = ngspiceStatus();
  if (!status.available) return { status: 'missing', reason: status.reason };
  const node = options.node ?? 'out';
  if (!/^[A-Za-z0-9_]+$/.test(node)) throw new Error(`runNgspiceAc: unusable node name ${JSON.stringify(node)}`);
  const endMatch = /^\.end\s*$/im.exec(netlist);
  if (!endMatch) throw new Error('runNgspiceAc: the netlist has no .end line');
  const dir = mkdtempSync(join(tmpdir(), 'gicladder-ngspice-'));
  try {
    const dataFile = 'ac.txt';
    const control = [
      '.control',
      'set filetype=ascii',
      'set wr_singlescale',
      'option numdgt=17',
      'option noopac',
      'run',
      `wrdata ${dataFile} real(v(${node})) imag(v(${node}))`,
      'quit',
      '.endc',
      '',
    ].join('\n');
    const text = netlist.slice(0, endMatch.index) + control + netlist.slice(endMatch.index);
    writeFileSync(join(dir, 'circuit.cir'), text);
    const r = spawnSync(NGSPICE, ['-b', 'circuit.cir'], { cwd: dir, encoding: 'utf8', timeout: RUN_TIMEOUT_MS });
    const log = `${r.stdout ?? ''}${r.stderr ?? ''}`;
    if (r.error) throw new NgspiceRunError(`ngspice could not run: ${r.error.message}`, log);
    if (r.status !== 0) throw new NgspiceRunError(`ngspice exited with status ${r.status}`, log);
    if (/^\s*error/im.test(log)) throw new NgspiceRunError('ngspice reported an error', log);
    // ngspice "repairs" some bad input with a warning (a resistor without a value becomes 1 mOhm):
    // for a reference result that is a failure, not a result.
    if (/^\s*warning/im.test(log)) throw new NgspiceRunError('ngspice reported a warning', log);
    const path = join(dir, dataFile);
    if (!existsSync(path)) throw new NgspiceRunError('ngspice wrote no AC data', log);
    const points = parseWrdata(readFileSync(path, 'utf8'));
    if (points.length === 0) throw new NgspiceRunError('ngspice AC data is empty', log);
    return { status: 'ok', points, log };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Parses `wrdata` output with a single scale column: `freq re im` per line (a header line is skipped). */
export function parseWrdata(text: string): AcPoint[] {
  const points: AcPoint[] = [];
  for (const line of text.split(/\r?\n/)) {
    const fields = line.trim().split(/\s+/);
    if (fields.length !== 3) continue;
    const [f, re, im] = fields.map(Number);
    if (![f, re, im].every(Number.isFinite)) continue;
    points.push({ frequencyHz: f, re, im });
  }
  return points;
}
