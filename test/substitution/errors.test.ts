/**
 * Bad input to the substitution stage: typed errors (class and code, never message text) naming the
 * option or ladder field and carrying the value; and the documented edge cases (singly terminated FDNR
 * ladders, buffers, op-amp models).
 */
import { describe, expect, it } from 'vitest';
import { Fraction } from '../../src/algebra/rational';
import { InvalidInputError, UnrealizableError, GicladderError } from '../../src/errors';
import { lowpassPrototype } from '../../src/approximation/index';
import { synthesizeLadder } from '../../src/ladder/darlington';
import { brutonTransform, element, fromLadder, scaleFrequency, scaleImpedance, type NetworkLadder } from '../../src/transform/index';
import { realizeFdnr, realizeLadder, type RealizeOptions } from '../../src/substitution/index';
import { circuitTransferFunction, expectExactRealization } from './helpers';
import { transformedLadder } from './ladders';

function expectError(f: () => unknown, cls: typeof GicladderError, code: string, path: string, value?: unknown): void {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(cls);
    const g = e as GicladderError;
    expect({ code: g.code, path: g.path }).toEqual({ code, path });
    if (value !== undefined) expect(g.value).toEqual(value);
    return;
  }
  expect.fail(`expected ${cls.name} ${code} at ${path}`);
}

const lowpass = transformedLadder('chebyshev', 5, 'lowpass');
const highpass = transformedLadder('chebyshev', 5, 'highpass');
const bandpass = transformedLadder('butterworth', 3, 'bandpass');
const ok: RealizeOptions = { method: 'gic-embedding', capacitorF: '10n' };

describe('a ladder that does not suit the route', () => {
  it('a highpass ladder asked to go the FDNR route', () => {
    expectError(() => realizeLadder(highpass, { method: 'fdnr', capacitorF: '10n' }), UnrealizableError, 'UNREALIZABLE', 'options.method', 'fdnr');
  });
  it('a bandpass ladder (series L-C arms) asked to go the FDNR route', () => {
    expectError(() => realizeLadder(bandpass, { method: 'fdnr', capacitorF: '10n' }), UnrealizableError, 'UNREALIZABLE', 'options.method', 'fdnr');
  });
  it('a lowpass in the minimum-inductor form (series L||C tanks would give floating FDNRs) asked to go the FDNR route', () => {
    const s = synthesizeLadder(lowpassPrototype({ family: 'elliptic', order: 5, passbandRippleDb: 1, stopbandAttenuationDb: 60 }), { form: 'shunt-first' });
    expectError(() => realizeLadder(fromLadder(s.ladder), { method: 'fdnr', capacitorF: '10n' }), UnrealizableError, 'UNREALIZABLE', 'options.method', 'fdnr');
  });
  it('a non-grounded inductor with method simulated-inductor (lowpass series L, bandpass series arm)', () => {
    for (const l of [lowpass, bandpass]) {
      expectError(() => realizeLadder(l, { method: 'simulated-inductor', capacitorF: '10n' }), UnrealizableError, 'UNREALIZABLE', 'options.method', 'simulated-inductor');
    }
  });
  it('FDNRs already in the ladder (a Bruton-transformed ladder) for the inductor routes', () => {
    const b = brutonTransform(transformedLadder('butterworth', 3, 'lowpass'), 1000);
    expectError(() => realizeLadder(b, { method: 'simulated-inductor', capacitorF: '10n' }), UnrealizableError, 'UNREALIZABLE', 'options.method', 'simulated-inductor');
    expectError(() => realizeLadder(b, { method: 'gic-embedding', capacitorF: '10n' }), UnrealizableError, 'UNREALIZABLE', 'options.method', 'gic-embedding');
  });
  it('a termination that is not a single resistor for the FDNR route', () => {
    const l: NetworkLadder = { ...lowpass, source: { kind: 'series', parts: [element('R', 1000, 'Rs'), element('L', '1/1000', 'Lx')] } };
    expectError(() => realizeLadder(l, { method: 'fdnr', capacitorF: '10n' }), UnrealizableError, 'UNREALIZABLE', 'options.method', 'fdnr');
  });
  it('a ladder whose output is its ideal source', () => {
    const l: NetworkLadder = { source: null, load: element('R', 1, 'Rl'), branches: [{ placement: 'shunt', network: element('C', 1, 'C1') }] };
    expectError(() => realizeLadder(l, ok), UnrealizableError, 'UNREALIZABLE', 'ladder');
  });
});

describe('malformed options', () => {
  const cases: [string, Partial<Record<keyof RealizeOptions, unknown>>, string, string][] = [
    ['unknown method', { method: 'magic' }, 'INVALID_ARGUMENT', 'options.method'],
    ['unreadable capacitor', { capacitorF: '4.7.1n' }, 'INVALID_QUANTITY', 'options.capacitorF'],
    ['zero capacitor', { capacitorF: 0 }, 'OUT_OF_RANGE', 'options.capacitorF'],
    ['negative capacitor', { capacitorF: -1e-9 }, 'OUT_OF_RANGE', 'options.capacitorF'],
    ['NaN capacitor', { capacitorF: NaN }, 'INVALID_NUMBER', 'options.capacitorF'],
    ['missing capacitor', { capacitorF: undefined }, 'INVALID_NUMBER', 'options.capacitorF'],
    ['negative resistance', { resistanceOhms: -5 }, 'OUT_OF_RANGE', 'options.resistanceOhms'],
    ['capacitor position 3', { inductorCapacitorPosition: 3 }, 'INVALID_ARGUMENT', 'options.inductorCapacitorPosition'],
    ['FDNR positions 2-4', { fdnrCapacitorPositions: '2-4' }, 'INVALID_ARGUMENT', 'options.fdnrCapacitorPositions'],
    ['buffers', { buffers: 'sometimes' }, 'INVALID_ARGUMENT', 'options.buffers'],
    ['op-amp model', { opamp: { model: 'perfect' } }, 'INVALID_ARGUMENT', 'options.opamp.model'],
    ['op-amp GBW', { opamp: { model: 'integrator', gainBandwidthHz: -1 } }, 'OUT_OF_RANGE', 'options.opamp.gainBandwidthHz'],
    ['DC-path bound zero', { dcPathErrorDb: 0 }, 'OUT_OF_RANGE', 'options.dcPathErrorDb'],
    ['DC-path bound NaN', { dcPathErrorDb: NaN }, 'INVALID_NUMBER', 'options.dcPathErrorDb'],
    ['passband edge', { passbandEdgeHz: -1 }, 'OUT_OF_RANGE', 'options.passbandEdgeHz'],
    ['design frequency', { designFrequencyHz: Infinity }, 'INVALID_NUMBER', 'options.designFrequencyHz'],
  ];
  for (const [name, patch, code, path] of cases) {
    it(`${name}: ${code} at ${path}`, () => {
      expectError(() => realizeLadder(lowpass, { ...ok, ...patch } as RealizeOptions), InvalidInputError, code, path);
    });
  }
  it('options that are not an object', () => {
    expectError(() => realizeLadder(lowpass, null as unknown as RealizeOptions), InvalidInputError, 'INVALID_ARGUMENT', 'options');
  });
});

describe('malformed ladders', () => {
  it('not a ladder, branches not an array, a bad placement, a non-positive or non-exact value', () => {
    expectError(() => realizeLadder(null as unknown as NetworkLadder, ok), InvalidInputError, 'INVALID_ARGUMENT', 'ladder');
    expectError(() => realizeLadder({ ...lowpass, branches: 3 } as unknown as NetworkLadder, ok), InvalidInputError, 'INVALID_ARGUMENT', 'ladder.branches');
    const badPlacement = { ...lowpass, branches: [{ placement: 'diagonal', network: element('C', 1, 'C1') }] } as unknown as NetworkLadder;
    expectError(() => realizeLadder(badPlacement, ok), InvalidInputError, 'INVALID_ARGUMENT', 'ladder.branches[0].placement');
    const negative = { ...lowpass, branches: [{ placement: 'series', network: { kind: 'L', value: new Fraction(-1), origin: 'L1' } }] } as NetworkLadder;
    expectError(() => realizeLadder(negative, ok), InvalidInputError, 'OUT_OF_RANGE', 'ladder.branches[0].network.value');
    const float = { ...lowpass, branches: [{ placement: 'series', network: { kind: 'L', value: 1, origin: 'L1' } }] } as unknown as NetworkLadder;
    expectError(() => realizeLadder(float, ok), InvalidInputError, 'OUT_OF_RANGE', 'ladder.branches[0].network.value');
    const emptyCombination = { ...lowpass, branches: [{ placement: 'series', network: { kind: 'series', parts: [] } }] } as unknown as NetworkLadder;
    expectError(() => realizeLadder(emptyCombination, ok), InvalidInputError, 'INVALID_ARGUMENT', 'ladder.branches[0].network.kind');
  });
});

describe('documented edge cases', () => {
  const butterworth3 = (opts: { sourceOhms?: number; loadOhms?: number | 'open' }) =>
    scaleImpedance(scaleFrequency(fromLadder(synthesizeLadder(lowpassPrototype({ family: 'butterworth', order: 3 }), opts).ladder), 6283), 1000);

  it('FDNR, open load: no load DC-path resistor, the DC gain is exact', () => {
    const r = realizeFdnr(butterworth3({ loadOhms: 'open' }), { capacitorF: '10n' });
    expect(r.parts.filter((p) => p.role.kind === 'dc-path').map((p) => p.name)).toEqual(['RDC_Rs']);
    expect(circuitTransferFunction(r).evaluate(0).equals(r.reference.transferFunction.evaluate(0))).toBe(true);
    expect(r.diagnostics.some((d) => d.code === 'DC_GAIN_ERROR')).toBe(false);
  });

  it('FDNR, zero-impedance source: the DC gain cannot be exact, and the diagnostics say by how much', () => {
    const ladder = butterworth3({ sourceOhms: 0, loadOhms: 1 });
    expectExactRealization(realizeFdnr(ladder, { capacitorF: '10n', dcPathResistors: false }));
    const r = realizeFdnr(ladder, { capacitorF: '10n' });
    const d = r.diagnostics.find((x) => x.code === 'DC_GAIN_ERROR');
    expect(d).toBeDefined();
    const h0 = circuitTransferFunction(r).evaluate(0);
    expect(h0.compare(r.reference.transferFunction.evaluate(0))).toBeLessThan(0);
    expect(r.dcPath!.errorDb).toBeLessThanOrEqual(0.01);
  });

  it("buffers: 'auto' puts followers at both ends of the FDNR ladder and none in the inductor routes; 'none' removes them", () => {
    const fd = realizeLadder(lowpass, { method: 'fdnr', capacitorF: '10n' });
    expect([fd.circuit.element('UIN')?.kind, fd.circuit.element('UOUT')?.kind]).toEqual(['OPAMP', 'OPAMP']);
    const none = realizeLadder(lowpass, { method: 'fdnr', capacitorF: '10n', buffers: 'none' });
    expect([none.circuit.element('UIN'), none.circuit.element('UOUT')]).toEqual([undefined, undefined]);
    const si = realizeLadder(highpass, { method: 'simulated-inductor', capacitorF: '10n' });
    expect(si.circuit.element('UIN')).toBeUndefined();
  });

  it('every op-amp of the circuit uses the model asked for, and the result records it', () => {
    const opamp = { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 } as const;
    const r = realizeLadder(lowpass, { method: 'fdnr', capacitorF: '10n', opamp });
    const models = r.circuit.elements.filter((e) => e.kind === 'OPAMP').map((e) => (e.kind === 'OPAMP' ? e.model : null));
    expect(models.length).toBe(2 + 2 * 2); // two buffers, two GIC FDNRs of two op-amps (5th-order: C2, C4)
    for (const m of models) expect(m).toEqual(opamp);
    expect(r.opamp).toEqual(opamp);
  });
});
