/** The ladder stage: lowpass prototype -> doubly or singly terminated LC ladder (Darlington synthesis). */
export * from './types';
export { synthesizeLadder, toFloatLadder, type SynthesisOptions, type LadderSynthesis } from './darlington';
export { ladderPrototype, designLadderPrototype, type LadderPrototypeParams } from './ladder-prototype';
export { ladderTransferFunction } from './response';
export { toExactLadder } from './exact-ladder';
export type { PrototypeZpk } from './prototype-polynomials';
