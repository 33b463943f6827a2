/**
 * Validation of the substitution stage's input: the network ladder and {@link RealizeOptions}. Every
 * error is an InvalidInputError naming the field ('options.capacitorF', 'ladder.branches[2]'...).
 * Options become exact here: the capacitor and resistance as rationals (quantity strings such as '10n'
 * are read exactly), the working frequency omega0 = 2 pi f as a rational of CHOICE_SIGNIFICANT_DIGITS
 * digits (2 pi is irrational; that rounding moves the optimum by < 1e-5 relative, which is invisible).
 */
import { Fraction, Q1 } from '../algebra/rational';
import { InvalidInputError, requireOneOf, requirePositive } from '../errors';
import { toPositiveValue } from '../converter/component-value';
import { IDEAL_OPAMP, validateOpampModel, type OpampModel } from '../netlist/opamp';
import { isElement, type Network, type NetworkLadder } from '../transform/network';
import { ladderCharacteristicOmega, roundToSignificant } from './gic-choices';
import {
  BUFFER_CHOICES,
  FDNR_CAPACITOR_POSITIONS,
  REALIZATION_METHODS,
  type BufferChoice,
  type FdnrCapacitorPositions,
  type RealizationMethod,
  type RealizeOptions,
} from './realization';

/** The passband error the DC-path resistors may cause by default, dB (issue 5: "e.g. 0.01 dB"). */
export const DEFAULT_DC_PATH_ERROR_DB = 0.01;

export interface ResolvedOptions {
  readonly method: RealizationMethod;
  readonly capacitorF: Fraction;
  readonly resistanceOhms?: Fraction;
  /** The working frequency of the resistor optimum, rad/s, exact. */
  readonly omega0: Fraction;
  readonly inductorCapacitorPosition: 2 | 4;
  readonly fdnrCapacitorPositions: FdnrCapacitorPositions;
  readonly opamp: OpampModel;
  readonly buffers: BufferChoice;
  readonly dcPathErrorDb: number;
  readonly passbandEdgeHz?: number;
}

export function resolveOptions(options: unknown, ladder: NetworkLadder): ResolvedOptions {
  if (typeof options !== 'object' || options === null) throw new InvalidInputError('INVALID_ARGUMENT', 'options', options, 'must be an object');
  const o = options as RealizeOptions;
  const method = requireOneOf(o.method, 'options.method', REALIZATION_METHODS);
  const capacitorF = toPositiveValue(o.capacitorF, 'options.capacitorF', 'F');
  const resistanceOhms = o.resistanceOhms === undefined ? undefined : toPositiveValue(o.resistanceOhms, 'options.resistanceOhms', 'ohm');
  let omega0: Fraction;
  if (o.designFrequencyHz !== undefined) omega0 = roundToSignificant(2 * Math.PI * requirePositive(o.designFrequencyHz, 'options.designFrequencyHz'));
  else {
    const w = ladderCharacteristicOmega(ladder);
    omega0 = Number.isFinite(w) && w > 0 ? roundToSignificant(w) : Q1;
  }
  const position = o.inductorCapacitorPosition ?? 4;
  if (position !== 2 && position !== 4) throw new InvalidInputError('INVALID_ARGUMENT', 'options.inductorCapacitorPosition', position, 'must be 2 or 4');
  const fdnrCapacitorPositions = requireOneOf(o.fdnrCapacitorPositions ?? '1-3', 'options.fdnrCapacitorPositions', FDNR_CAPACITOR_POSITIONS);
  const opamp = o.opamp === undefined ? IDEAL_OPAMP : validateOpampModel(o.opamp, 'options.opamp');
  const buffers = requireOneOf(o.buffers ?? 'auto', 'options.buffers', BUFFER_CHOICES);
  const dcPathErrorDb = o.dcPathErrorDb === undefined ? DEFAULT_DC_PATH_ERROR_DB : requirePositive(o.dcPathErrorDb, 'options.dcPathErrorDb');
  const passbandEdgeHz = o.passbandEdgeHz === undefined ? undefined : requirePositive(o.passbandEdgeHz, 'options.passbandEdgeHz');
  return { method, capacitorF, resistanceOhms, omega0, inductorCapacitorPosition: position, fdnrCapacitorPositions, opamp, buffers, dcPathErrorDb, passbandEdgeHz };
}

/** Checks the shape of a network ladder (elements with positive exact values). */
export function validateNetworkLadder(ladder: unknown): NetworkLadder {
  if (typeof ladder !== 'object' || ladder === null) throw new InvalidInputError('INVALID_ARGUMENT', 'ladder', ladder, 'must be a NetworkLadder');
  const l = ladder as NetworkLadder;
  if (!Array.isArray(l.branches)) throw new InvalidInputError('INVALID_ARGUMENT', 'ladder.branches', l.branches, 'must be an array');
  if (l.source !== null) validateNetwork(l.source, 'ladder.source');
  if (l.load !== 'open') validateNetwork(l.load, 'ladder.load');
  l.branches.forEach((b, i) => {
    const path = `ladder.branches[${i}]`;
    if (typeof b !== 'object' || b === null || (b.placement !== 'series' && b.placement !== 'shunt')) {
      throw new InvalidInputError('INVALID_ARGUMENT', `${path}.placement`, b?.placement, "must be 'series' or 'shunt'");
    }
    validateNetwork(b.network, `${path}.network`);
  });
  return l;
}

function validateNetwork(n: Network, path: string): void {
  if (typeof n !== 'object' || n === null) throw new InvalidInputError('INVALID_ARGUMENT', path, n, 'must be a network');
  if (isElement(n)) {
    if (!(n.value instanceof Fraction) || n.value.s <= 0n || n.value.n === 0n) {
      throw new InvalidInputError('OUT_OF_RANGE', `${path}.value`, n.value, 'must be a positive Fraction');
    }
    return;
  }
  if ((n.kind !== 'series' && n.kind !== 'parallel') || !Array.isArray(n.parts) || n.parts.length === 0) {
    throw new InvalidInputError('INVALID_ARGUMENT', `${path}.kind`, (n as { kind?: unknown }).kind, "must be an element kind or 'series'/'parallel' with parts");
  }
  n.parts.forEach((p, i) => validateNetwork(p, `${path}.parts[${i}]`));
}
