/**
 * Exact stability of a whole realised circuit with its op-amp models. The natural frequencies are the
 * zeros of the MNA determinant det A(s) (input source shorted, as an ideal voltage source is), not only
 * of the transfer function's reduced denominator: a mode cancelled by a zero (a wrong op-amp input
 * polarity can give such right-half-plane modes while the AC response still looks plausible) is still a
 * mode of the circuit. The determinant comes from the exact fraction-free elimination
 * (analysis/exact-solve.ts, whose unreduced denominator is det A up to a constant), and its roots are
 * counted by the exact Routh-Hurwitz test (algebra/routh-hurwitz.ts; E. J. Routh, "A Treatise on the
 * Stability of a Given State of Motion", 1877; A. Hurwitz, Math. Ann. 46, 1895).
 */
import { Poly, routhHurwitz, type RouthHurwitzResult } from '../algebra/index';
import { eliminateExact, resolveTransfer } from '../analysis/index';
import { GicladderError } from '../errors';
import { SingularCircuitError, type Circuit } from '../netlist/index';

export interface CircuitStability extends RouthHurwitzResult {
  /** The characteristic polynomial det A(s), primitive, ascending coefficients as decimal strings. */
  readonly characteristicPolynomial: readonly string[];
  /** Roots at s = 0 (counted in imaginaryAxis). */
  readonly originRoots: number;
}

/** A circuit with natural frequencies in the right half-plane or on the imaginary axis. */
export class UnstableCircuitError extends GicladderError {
  readonly stability: CircuitStability;
  constructor(path: string, stability: CircuitStability, what: string) {
    super(
      'UNSTABLE',
      path,
      { rightHalfPlane: stability.rightHalfPlane, imaginaryAxis: stability.imaginaryAxis, degree: stability.degree },
      `${what} is unstable: ${stability.rightHalfPlane} natural frequencies in the right half-plane and ${stability.imaginaryAxis} on the imaginary axis (exact Routh-Hurwitz on det of the MNA matrix)`,
    );
    this.stability = stability;
  }
}

/** The exact root counts of the circuit's characteristic polynomial (VIN shorted). */
export function circuitStability(circuit: Circuit, input = 'VIN', output = 'out'): CircuitStability {
  const problem = resolveTransfer(circuit, { input, output });
  const r = eliminateExact(problem, problem.output);
  if (!r.ok) throw new SingularCircuitError('circuit', [], `the nodal equations are singular for every s (no pivot for ${r.unpivoted.join(', ')})`);
  let p = Poly.fromCoefficients(r.den).primitive();
  if (p.leading.s < 0n) p = p.neg();
  let originRoots = 0;
  while (p.coefficient(originRoots).n === 0n) originRoots++;
  const rh = routhHurwitz(p);
  return { ...rh, characteristicPolynomial: p.coefficients.map((c) => c.toFraction()), originRoots };
}
