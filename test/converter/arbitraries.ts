/**
 * fast-check generators shared by the converter tests: small positive rationals and random series/
 * parallel networks of R, L, C and D elements, each with an independent exact evaluator at a rational
 * point (element formulas applied directly to numbers, not through Poly/RationalFunction algebra).
 */
import fc from 'fast-check';
import { Fraction } from '../../src/algebra/rational';
import type { RationalFunction } from '../../src/algebra/rational-function';
import { elementImpedance, parallelImpedance, seriesImpedance, type ElementKind } from '../../src/converter/impedances';

export const positiveRational = (maxNum = 60, maxDen = 12): fc.Arbitrary<Fraction> =>
  fc.tuple(fc.integer({ min: 1, max: maxNum }), fc.integer({ min: 1, max: maxDen })).map(([n, d]) => new Fraction(BigInt(n), BigInt(d)));

export type Network =
  | { type: 'leaf'; kind: Exclude<ElementKind, 'E'>; value: Fraction }
  | { type: 'series' | 'parallel'; children: Network[] };

const leaf: fc.Arbitrary<Network> = fc.record({
  type: fc.constant('leaf' as const),
  kind: fc.constantFrom('R' as const, 'C' as const, 'L' as const, 'D' as const),
  value: positiveRational(),
});

/** Trees of depth <= maxDepth with 2..3 children per combination. */
export const network = (maxDepth: number): fc.Arbitrary<Network> =>
  maxDepth === 0
    ? leaf
    : fc.oneof(
        { weight: 2, arbitrary: leaf },
        {
          weight: 1,
          arbitrary: fc.record({
            type: fc.constantFrom('series' as const, 'parallel' as const),
            children: fc.array(network(maxDepth - 1), { minLength: 2, maxLength: 3 }),
          }),
        },
      );

/** The network's impedance through the library (RationalFunction algebra). */
export function networkImpedance(n: Network): RationalFunction {
  if (n.type === 'leaf') return elementImpedance(n.kind, n.value);
  const zs = n.children.map(networkImpedance);
  return n.type === 'series' ? seriesImpedance(...zs) : parallelImpedance(...zs);
}

/** The network's impedance at the rational point s = x, straight from the element laws. */
export function evaluateNetwork(n: Network, x: Fraction): Fraction {
  if (n.type === 'leaf') {
    switch (n.kind) {
      case 'R':
        return n.value;
      case 'C':
        return new Fraction(1).div(x.mul(n.value));
      case 'L':
        return x.mul(n.value);
      case 'D':
        return new Fraction(1).div(x.mul(x).mul(n.value));
    }
  }
  const vs = n.children.map((c) => evaluateNetwork(c, x));
  if (n.type === 'series') return vs.reduce((a, b) => a.add(b));
  return new Fraction(1).div(vs.reduce((a, v) => a.add(new Fraction(1).div(v)), new Fraction(0)));
}
