/**
 * The contract function of this stage (DESIGN.md): a normalised lowpass prototype of a family and order
 * (approximation stage), synthesised as an LC ladder (darlington.ts).
 */
import { lowpassCharacteristic, lowpassPrototype, type LowpassPrototypeParams } from '../approximation/index';
import { InvalidInputError } from '../errors';
import { synthesizeLadder, type LadderSynthesis, type SynthesisOptions } from './darlington';
import type { Ladder } from './types';

export type LadderPrototypeParams = LowpassPrototypeParams & SynthesisOptions;

/**
 * The prototype and its synthesis, with diagnostics (the even-order modifications, a computed load...).
 * The approximation stage's exact reflection zeros (`lowpassCharacteristic`) go with it, so equally
 * terminated elliptic and inverse Chebyshev ladders keep their accuracy to order 15.
 */
export function designLadderPrototype(p: LadderPrototypeParams): LadderSynthesis & { prototype: ReturnType<typeof lowpassPrototype> } {
  if (typeof p !== 'object' || p === null) throw new InvalidInputError('INVALID_ARGUMENT', 'prototype', p, 'must be an object');
  const prototype = lowpassPrototype(p);
  const synthesis = synthesizeLadder(prototype, {
    sourceOhms: p.sourceOhms,
    loadOhms: p.loadOhms,
    form: p.form,
    reflectionZeros: p.reflectionZeros,
    tankOrder: p.tankOrder,
    evenOrder: p.evenOrder,
    characteristic: lowpassCharacteristic(p),
  });
  return { ...synthesis, prototype };
}

/**
 * The LC ladder of a normalised lowpass prototype (1 ohm source, 1 rad/s), listed from the source end.
 *
 * @example
 * ladderPrototype({ family: 'butterworth', order: 3 }).branches
 * // [{ placement: 'series', inductanceH: 1 }, { placement: 'shunt', capacitanceF: 2 }, { placement: 'series', inductanceH: 1 }]
 */
export function ladderPrototype(p: LadderPrototypeParams): Ladder {
  return designLadderPrototype(p).ladder;
}
