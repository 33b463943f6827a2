/**
 * `gicladder prototype --family F --order N [--ripple-db X] [--attenuation-db Y] [--form ...] [--json]`:
 * the normalised lowpass prototype (zeros/poles/gain) and its LC ladder, as a table or as the ladder
 * object of the contract in JSON. The lead wires this into the commander program in main.ts.
 */
import { GicladderError, InvalidInputError } from '../errors';
import { designLadderPrototype, type LadderPrototypeParams } from '../ladder/ladder-prototype';
import type { Complex } from '../algebra/complex';

export interface PrototypeCommandOptions {
  family: string;
  order: string | number;
  rippleDb?: string | number;
  attenuationDb?: string | number;
  form?: string;
  normalization?: string;
  sourceOhms?: string | number;
  loadOhms?: string | number;
  json?: boolean;
}

/** Exit codes as DESIGN.md: 0 success, 2 bad input (the message names the field). */
const EXIT_OK = 0;
const EXIT_BAD_INPUT = 2;
/** Significant digits shown in the table: element values are good to ~1e-12, 10 digits read well. */
const DIGITS = 10;

function toNumber(value: string | number | undefined, path: string): number | undefined {
  if (value === undefined) return undefined;
  const n = typeof value === 'number' ? value : Number(value);
  if (typeof value === 'string' && value.trim() === '') throw new InvalidInputError('INVALID_NUMBER', path, value, 'must be a number');
  if (!Number.isFinite(n)) throw new InvalidInputError('INVALID_NUMBER', path, value, 'must be a number');
  return n;
}

const fmt = (x: number | undefined): string => (x === undefined ? '' : x.toPrecision(DIGITS));
const fmtComplex = (z: Complex): string => `${z.re.toPrecision(DIGITS)} ${z.im < 0 ? '-' : '+'} ${Math.abs(z.im).toPrecision(DIGITS)}j`;

export function runPrototypeCommand(options: PrototypeCommandOptions): { stdout: string; stderr: string; exitCode: number } {
  try {
    const loadText = options.loadOhms;
    const params: LadderPrototypeParams = {
      family: options.family as LadderPrototypeParams['family'],
      order: toNumber(options.order, '--order') as number,
      passbandRippleDb: toNumber(options.rippleDb, '--ripple-db'),
      stopbandAttenuationDb: toNumber(options.attenuationDb, '--attenuation-db'),
      normalization: options.normalization as LadderPrototypeParams['normalization'],
      form: options.form as LadderPrototypeParams['form'],
      sourceOhms: toNumber(options.sourceOhms, '--source-ohms'),
      loadOhms: loadText === 'open' ? 'open' : toNumber(loadText, '--load-ohms'),
    };
    const d = designLadderPrototype(params);
    if (options.json) return { stdout: `${JSON.stringify(d.ladder, null, 2)}\n`, stderr: '', exitCode: EXIT_OK };
    const lines: string[] = [];
    lines.push(`${params.family} lowpass prototype, order ${params.order} (normalised: 1 ohm, 1 rad/s)`);
    lines.push(`gain: ${d.prototype.gain.toPrecision(DIGITS)}`);
    lines.push('zeros:');
    for (const z of d.prototype.zeros) lines.push(`  ${fmtComplex(z)}`);
    if (d.prototype.zeros.length === 0) lines.push('  (none)');
    lines.push('poles:');
    for (const p of d.prototype.poles) lines.push(`  ${fmtComplex(p)}`);
    lines.push('');
    lines.push(`ladder: source ${d.ladder.sourceOhms} ohm, load ${d.ladder.loadOhms === 'open' ? 'open' : `${fmt(d.ladder.loadOhms)} ohm`}`);
    const rows = [['#', 'placement', 'L (H)', 'C (F)', 'arrangement']];
    d.ladder.branches.forEach((b, i) => rows.push([String(i + 1), b.placement, fmt(b.inductanceH), fmt(b.capacitanceF), b.arrangement ?? '']));
    const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
    for (const r of rows) lines.push(r.map((cell, c) => cell.padEnd(widths[c])).join('  ').trimEnd());
    for (const diag of d.diagnostics) lines.push(`note [${diag.code}]: ${diag.message}`);
    return { stdout: `${lines.join('\n')}\n`, stderr: '', exitCode: EXIT_OK };
  } catch (err) {
    if (err instanceof GicladderError) return { stdout: '', stderr: `gicladder: ${err.message}\n`, exitCode: EXIT_BAD_INPUT };
    throw err;
  }
}
