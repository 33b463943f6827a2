/**
 * Topology checks: each finding on a circuit built to have it, the nodes and elements it names, and
 * clean circuits that must pass.
 */
import { describe, expect, it } from 'vitest';
import { Circuit, checkTopology, assertTopology, SingularCircuitError } from '../../src/netlist/index';

const codes = (c: Circuit) => checkTopology(c).diagnostics.map((d) => `${d.severity}:${d.code}`);

describe('checkTopology', () => {
  it('passes an RC lowpass driven by a source', () => {
    const c = new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', 'out', 1).addResistor('R2', 'out', '0', 1);
    expect(checkTopology(c)).toEqual({ ok: true, diagnostics: [] });
  });

  it('finds a node only sensed (floating) and names it and its element', () => {
    const c = new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', '0', 1).addVcvs('E1', 'o', '0', 'x', '0', 2).addResistor('RL', 'o', '0', 1);
    const r = checkTopology(c);
    expect(r.ok).toBe(false);
    const d = r.diagnostics.find((x) => x.code === 'FLOATING_NODE')!;
    expect(d.nodes).toEqual(['x']);
    expect(d.elements).toEqual(['E1']);
  });

  it('finds a group of nodes with no connection to ground', () => {
    const c = new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', '0', 1).addResistor('R2', 'a', 'b', 1).addCapacitor('C2', 'a', 'b', 1);
    const d = checkTopology(c).diagnostics.find((x) => x.code === 'NO_PATH_TO_GROUND')!;
    expect(d.severity).toBe('error');
    expect(d.nodes).toEqual(['a', 'b']);
    expect(d.elements).toEqual(['R2', 'C2']);
  });

  it('warns (does not fail) when nodes reach ground only through capacitors or FDNRs', () => {
    const c = new Circuit().addVoltageSource('V1', 'in', '0').addCapacitor('C1', 'in', 'm', 1).addResistor('R1', 'm', 'n', 1).addFdnr('D1', 'n', '0', 1);
    const r = checkTopology(c);
    expect(r.ok).toBe(true);
    expect(codes(c)).toEqual(['warning:NO_DC_PATH']);
    expect(r.diagnostics[0].nodes).toEqual(['m', 'n']);
  });

  it('finds a loop of voltage sources and names its elements', () => {
    const c = new Circuit().addVoltageSource('V1', 'a', '0').addVoltageSource('V2', 'a', 'b').addVcvs('E1', 'b', '0', 'a', '0', 3);
    const d = checkTopology(c).diagnostics.find((x) => x.code === 'VOLTAGE_SOURCE_LOOP')!;
    expect(d.elements.slice().sort()).toEqual(['E1', 'V1', 'V2']);
    expect(d.nodes.slice().sort()).toEqual(['0', 'a', 'b']);
  });

  it('finds two op-amp outputs on one node, an op-amp output on a source, and on ground', () => {
    const base = () => new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', 'm', 1).addResistor('R2', 'm', 'o', 1);
    const two = base().addOpamp('U1', { plus: '0', minus: 'm', out: 'o' }).addOpamp('U2', { plus: '0', minus: 'm', out: 'o' });
    const d = checkTopology(two).diagnostics.find((x) => x.code === 'OUTPUTS_TIED')!;
    expect(d.elements.slice().sort()).toEqual(['U1', 'U2']);
    const onSource = base().addOpamp('U1', { plus: '0', minus: 'm', out: 'in' });
    expect(checkTopology(onSource).diagnostics.find((x) => x.code === 'OUTPUTS_TIED')!.elements.slice().sort()).toEqual(['U1', 'V1']);
    const onGround = base().addOpamp('U1', { plus: 'in', minus: 'm', out: '0' });
    expect(codes(onGround)).toContain('error:OUTPUTS_TIED');
  });

  it('finds shorted ideal op-amp inputs and a loop of ideal inputs with a source', () => {
    const c = new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', 'o', 1).addOpamp('U1', { plus: 'in', minus: 'in', out: 'o' });
    expect(codes(c)).toContain('error:NULLATOR_LOOP');
    const d = new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', 'o', 1).addOpamp('U1', { plus: 'in', minus: '0', out: 'o' });
    expect(checkTopology(d).diagnostics.find((x) => x.code === 'NULLATOR_LOOP')!.elements.slice().sort()).toEqual(['U1', 'V1']);
    // a finite-gain op-amp with the same connection is not a nullator: no finding
    const e = new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', 'o', 1).addOpamp('U1', { plus: 'in', minus: '0', out: 'o' }, { model: 'finite-gain', gain: 10 });
    expect(codes(e)).toEqual([]);
  });

  it('warns about a dangling node', () => {
    const c = new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', '0', 1).addResistor('R2', 'in', 'stub', 1);
    expect(codes(c)).toEqual(['warning:DANGLING_NODE']);
  });

  it('assertTopology throws SingularCircuitError (code SINGULAR_CIRCUIT) with the nodes and elements', () => {
    const c = new Circuit().addVoltageSource('V1', 'a', '0').addVoltageSource('V2', 'a', '0');
    try {
      assertTopology(c);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(SingularCircuitError);
      const err = e as SingularCircuitError;
      expect(err.code).toBe('SINGULAR_CIRCUIT');
      expect([...err.elements].sort()).toEqual(['V1', 'V2']);
      expect([...err.nodes].sort()).toEqual(['0', 'a']);
    }
  });

  it('a two-op-amp GIC with ideal op-amps passes', () => {
    const c = new Circuit()
      .addVoltageSource('V1', 'n1', '0')
      .addResistor('Z1', 'n1', 'n2', 1)
      .addCapacitor('Z2', 'n2', 'n3', 1)
      .addResistor('Z3', 'n3', 'n4', 1)
      .addResistor('Z4', 'n4', 'n5', 1)
      .addResistor('Z5', 'n5', '0', 1)
      .addOpamp('UA', { plus: 'n5', minus: 'n3', out: 'n2' })
      .addOpamp('UB', { plus: 'n1', minus: 'n3', out: 'n4' });
    expect(checkTopology(c).ok).toBe(true);
  });
});
