/**
 * The TSDoc @example blocks of the netlist and analysis entry points, run as written.
 */
import { expect, it } from 'vitest';
import { Circuit } from '../../src/netlist/index';
import { transferFunction } from '../../src/analysis/index';

it('Circuit and transferFunction examples (circuit.ts, transfer-function.ts)', () => {
  const c = new Circuit()
    .addVoltageSource('VIN', 'in', '0')
    .addResistor('R1', 'in', 'out', '1000')
    .addCapacitor('C1', 'out', '0', '1e-6');
  expect(transferFunction(c, { input: 'VIN', output: 'out' }).toString()).toBe('(1000) / (s + 1000)');
});
