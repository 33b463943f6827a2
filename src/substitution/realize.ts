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
 * const ladder = scaleImpedance(lowpassToHighpass(fromLadder(ladderPrototype({ family: 'chebyshev', order: 5,
 *   passbandRippleDb: 0.5 })), 2 * Math.PI * 1000), 1000);
 * const r = realizeLadder(ladder, { method: 'simulated-inductor', capacitorF: '10n' });
 * // r.circuit: VIN -> 1 kOhm -> series capacitors, the shunt inductors as GICs; r.parts lists every R and C
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
