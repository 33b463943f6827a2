/** The TSDoc @example of realizeLadder (src/substitution/realize.ts), run as written. */
import { expect, it } from 'vitest';
import { transferFunction } from '../../src/analysis/index';
import { fromLadder, lowpassToHighpass, scaleImpedance } from '../../src/transform/index';
import { realizeLadder } from '../../src/substitution/index';

it('realizeLadder @example: a 3rd-order Butterworth highpass with two GIC inductors', () => {
  const ladder = scaleImpedance(lowpassToHighpass(fromLadder({ sourceOhms: 1, loadOhms: 1, branches: [
    { placement: 'shunt', capacitanceF: 1 }, { placement: 'series', inductanceH: 2 }, { placement: 'shunt', capacitanceF: 1 },
  ] }), 2 * Math.PI * 1000), 1000);
  const r = realizeLadder(ladder, { method: 'simulated-inductor', capacitorF: '10n' });
  expect(r.parts.filter((p) => p.role.kind === 'gic').length).toBe(10);
  expect(transferFunction(r.circuit, { input: 'VIN', output: 'out' }).equals(r.reference.transferFunction)).toBe(true);
  // The terminations stay resistors of the ladder's level, the series capacitor stays a capacitor.
  expect(r.parts.filter((p) => p.role.kind === 'termination').map((p) => [p.name, p.exactValue.valueOf()])).toEqual([['R_Rs', 1000], ['R_Rl', 1000]]);
  expect(r.parts.filter((p) => p.role.kind === 'ladder').map((p) => p.name)).toEqual(['C_L2']);
});
