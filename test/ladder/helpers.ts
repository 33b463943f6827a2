/** Shared checks for the ladder tests: the exact chain-matrix response against the prototype. */
import { ladderTransferFunction } from '../../src/ladder/response';
import type { LadderSynthesis } from '../../src/ladder/darlington';
import { normalizedMagnitude } from '../../src/ladder/peak-gain';
import { cAbs } from '../../src/algebra/complex';

/** 200 log-spaced frequencies from 0.01 to 100 rad/s. */
export const FREQUENCIES = Array.from({ length: 200 }, (_, i) => 10 ** (-2 + (4 * i) / 199));

/**
 * Largest |T(jw)| - T0 |H(jw)|/|H(0)| over FREQUENCIES, relative to T0 (the passband level), where T is
 * the ladder's exact transfer function (evaluated in float from its exact coefficients) and H the
 * realised prototype in product form.
 */
export function responseError(s: LadderSynthesis): number {
  const T = ladderTransferFunction(s.ladder);
  let worst = 0;
  for (const w of FREQUENCIES) {
    const got = cAbs(T.evaluateComplex({ re: 0, im: w }));
    const want = s.dcTransfer * normalizedMagnitude(s.realizedPrototype, { re: 0, im: w });
    worst = Math.max(worst, Math.abs(got - want) / s.dcTransfer);
  }
  return worst;
}

/** All element values of a ladder in order (L then C within a branch), with the load when resistive. */
export function elementValues(s: LadderSynthesis): number[] {
  const out: number[] = [];
  for (const b of s.ladder.branches) {
    if (b.inductanceH !== undefined) out.push(b.inductanceH);
    if (b.capacitanceF !== undefined) out.push(b.capacitanceF);
  }
  return out;
}
