/**
 * The substitution stage's entry point: a network ladder (already transformed to its response type and
 * scaled to hertz and ohms, src/transform) to an active circuit by the route `options.method` names.
 *
 * - 'simulated-inductor' (simulated-inductor.ts): grounded inductors -> grounded GIC inductors;
 * - 'fdnr' (fdnr.ts): lowpass ladders -> Bruton transform, grounded FDNRs -> GIC FDNRs, DC-path resistors;
 * - 'gic-embedding' (gic-embedding.ts): every inductor, floating or grounded, -> resistors behind GIC
 *   converters (Gorski-Popiel).
 *
 * Throws InvalidInputError for malformed input (path 'ladder...' or 'options...') and UnrealizableError
 * (code UNREALIZABLE, path 'options.method', value the method) when the ladder does not suit the route.
 *
 * @example
 * // The 3rd-order Butterworth ladder C1 = 1, L2 = 2, C3 = 1 (1 ohm, 1 rad/s) as a 1 kHz, 1 kOhm highpass:
 * const ladder = scaleImpedance(lowpassToHighpass(fromLadder({ sourceOhms: 1, loadOhms: 1, branches: [
 *   { placement: 'shunt', capacitanceF: 1 }, { placement: 'series', inductanceH: 2 }, { placement: 'shunt', capacitanceF: 1 },
 * ] }), 2 * Math.PI * 1000), 1000);
 * const r = realizeLadder(ladder, { method: 'simulated-inductor', capacitorF: '10n' });
 * r.parts.filter((p) => p.role.kind === 'gic').length; // 10: the two shunt inductors, five parts each
 * transferFunction(r.circuit, { input: 'VIN', output: 'out' }).equals(r.reference.transferFunction); // true
 */
import type { NetworkLadder } from '../transform/network';
import { realizeFdnrResolved } from './fdnr';
import { realizeGicEmbeddingResolved } from './gic-embedding';
import { resolveOptions, validateNetworkLadder } from './options';
import type { Realization, RealizeOptions } from './realization';
import { realizeSimulatedInductorResolved } from './simulated-inductor';

export function realizeLadder(ladder: NetworkLadder, options: RealizeOptions): Realization {
  const l = validateNetworkLadder(ladder);
  const o = resolveOptions(options, l);
  switch (o.method) {
    case 'simulated-inductor':
      return realizeSimulatedInductorResolved(l, o);
    case 'fdnr':
      return realizeFdnrResolved(l, o);
    case 'gic-embedding':
      return realizeGicEmbeddingResolved(l, o);
  }
}

/** realizeLadder with method 'simulated-inductor'. */
export const realizeSimulatedInductor = (ladder: NetworkLadder, options: Omit<RealizeOptions, 'method'>): Realization =>
  realizeLadder(ladder, { ...options, method: 'simulated-inductor' });

/**
 * realizeLadder with method 'fdnr'. `dcPathResistors: false` leaves the DC-path resistors out: the circuit
 * then has no DC path (not buildable) but realises the ladder's transfer function exactly.
 */
export function realizeFdnr(ladder: NetworkLadder, options: Omit<RealizeOptions, 'method'> & { dcPathResistors?: boolean }): Realization {
  const l = validateNetworkLadder(ladder);
  const o = resolveOptions({ ...options, method: 'fdnr' }, l);
  return realizeFdnrResolved(l, o, options.dcPathResistors ?? true);
}

/** realizeLadder with method 'gic-embedding'. */
export const realizeGicEmbedding = (ladder: NetworkLadder, options: Omit<RealizeOptions, 'method'>): Realization =>
  realizeLadder(ladder, { ...options, method: 'gic-embedding' });
