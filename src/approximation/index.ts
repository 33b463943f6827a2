/** The approximation stage: mask -> normalised lowpass prototype (zeros/poles/gain), and order estimation. */

export {
  lowpassPrototype,
  APPROXIMATION_FAMILIES,
  BESSEL_NORMALIZATIONS,
  MAX_ORDER,
  MIN_ELLIPTIC_ORDER,
  type ApproximationFamily,
  type LowpassPrototypeParams,
} from './prototype.js';
export type { BesselNormalization } from './bessel.js';
export { reverseBesselCoefficients } from './bessel.js';
export { lowpassCharacteristic, type LowpassCharacteristic } from './characteristic.js';
export { estimateOrder, FILTER_TYPES, type FilterType, type OrderMask, type OrderEstimate, type BandEdgesHz } from './order.js';
export { type Zpk, evaluateZpk, gainDbAt, frequencyAtAttenuation } from './zpk.js';
export {
  arithmeticGeometricMean,
  complementaryModulus,
  completeEllipticK,
  jacobiElliptic,
  inverseJacobiSc,
  modulusFromPeriodRatio,
  periodRatio,
  ellipticDegree,
  ellipticDiscrimination,
  type JacobiValues,
  type ModulusPair,
} from './elliptic-functions.js';
