/**
 * Proofs, not samples: with ideal op-amps and unrounded rational values, the realised circuit's exact
 * V(out)/V(in) (src/analysis transferFunction, exact MNA) EQUALS the transformed ladder's
 * (src/transform networkLadderTransferFunction, chain matrices) as RationalFunctions, for every family at
 * orders 1 to 9 (elliptic from 2, where the prototype starts) and every response type the route supports:
 *   fdnr: lowpass (exactly without the DC-path resistors; with them, the DC gain exactly and the
 *         passband within the stated bound);
 *   simulated-inductor: highpass (the only type whose ladders have grounded inductors only);
 *   gic-embedding: lowpass, highpass, bandpass and bandstop.
 * The bandpass and bandstop embedding ladders (degree 2n, up to 11 GICs) cost most; they run every order
 * 1..9 with the family rotating, so each family and each order appears for each type (the full product
 * would add ~20 s, estimated from per-case costs measured while writing this); fast-check in
 * properties.test.ts draws further combinations.
 */
import { describe, expect, it } from 'vitest';
import { cAbs, cDiv } from '../../src/algebra/complex';
import { ladderCharacteristicOmega, realizeFdnr, realizeLadder, type RealizationMethod } from '../../src/substitution/index';
import { roundToSignificant } from '../../src/substitution/gic-choices';
import { element, ladderElements, type NetworkLadder } from '../../src/transform/index';
import { checkTopology } from '../../src/netlist/topology';
import { circuitStability } from '../../src/spec/stability';
import { circuitTransferFunction, expectExactRealization, expectPartsMatchCircuit } from './helpers';
import { FAMILIES, MIN_ORDER, transformedLadder, type Family, type ResponseType } from './ladders';

const ORDERS = [1, 2, 3, 4, 5, 6, 7, 8, 9];
const ordersOf = (f: Family) => ORDERS.filter((n) => n >= MIN_ORDER[f]);
const CAP = '10n';

describe('FDNR route: lowpass ladders of every family, orders 1 to 9', () => {
  for (const family of FAMILIES) {
    it(`${family}: exact without the DC-path resistors; DC gain exact and passband within 0.01 dB with them`, () => {
      for (const order of ordersOf(family)) {
        const ladder = transformedLadder(family, order, 'lowpass');
        expectExactRealization(realizeFdnr(ladder, { capacitorF: CAP, dcPathResistors: false }));

        const r = realizeFdnr(ladder, { capacitorF: CAP });
        expectPartsMatchCircuit(r);
        expect(r.parts.filter((p) => p.role.kind === 'dc-path').map((p) => p.name).sort()).toEqual(['RDC_Rl', 'RDC_Rs']);
        const h = circuitTransferFunction(r);
        const ref = r.reference.transferFunction;
        expect(h.evaluate(0).equals(ref.evaluate(0)), `DC gain, order ${order}`).toBe(true);
        // Independent check of the bound on the circuit's own exact H: 0 .. edge, linear and log points.
        const edge = 2 * Math.PI * r.dcPath!.passbandEdgeHz;
        let worst = 0;
        for (let i = 0; i <= 400; i++) {
          for (const w of [(edge * i) / 400, edge * 10 ** (-10 + (10 * i) / 400)]) {
            const s = { re: 0, im: w };
            worst = Math.max(worst, Math.abs(20 * Math.log10(cAbs(cDiv(h.evaluateComplex(s), ref.evaluateComplex(s))))));
          }
        }
        expect(worst, `order ${order}`).toBeLessThanOrEqual(0.01);
        expect(r.dcPath!.errorDb).toBeLessThanOrEqual(0.01);
        // The report is the same figure (finer grid here: it may find a slightly larger maximum).
        expect(Math.abs(worst - r.dcPath!.errorDb)).toBeLessThan(0.1 * worst + 1e-12);
        expect(r.diagnostics.some((d) => d.code === 'DC_PATH_ERROR')).toBe(true);
      }
    });
  }
});

describe('simulated-inductor route: highpass ladders of every family, orders 1 to 9', () => {
  for (const family of FAMILIES) {
    it(`${family}: exact`, () => {
      for (const order of ordersOf(family)) {
        const r = realizeLadder(transformedLadder(family, order, 'highpass'), { method: 'simulated-inductor', capacitorF: CAP });
        expectExactRealization(r);
        // Every inductor of the ladder became one GIC, its resistors at the optimum: R2 = R3, R5 = 1/(omega0 C4).
        const gics = new Set(r.parts.filter((p) => p.role.kind === 'gic').map((p) => p.role.gic));
        expect(gics.size).toBe(ladderElements(r.reference.ladder).filter((e) => e.kind === 'L').length);
        const omega0 = roundToSignificant(ladderCharacteristicOmega(r.reference.ladder));
        for (const g of gics) {
          const at = (k: number) => r.parts.find((p) => p.role.gic === g && p.role.position === k)!.exactValue;
          expect(at(2).equals(at(3))).toBe(true);
          expect(omega0.mul(at(4)).mul(at(5)).equals(1)).toBe(true);
        }
      }
    });
  }
});

const route = (method: RealizationMethod, type: ResponseType, family: Family, order: number) =>
  realizeLadder(transformedLadder(family, order, type), { method, capacitorF: CAP });

describe('GIC-embedding route: every response type', () => {
  for (const type of ['lowpass', 'highpass'] as const) {
    for (const family of FAMILIES) {
      it(`${type}, ${family}, orders 1 to 9: exact`, () => {
        for (const order of ordersOf(family)) expectExactRealization(route('gic-embedding', type, family, order));
      });
    }
  }
  for (const [t, type] of (['bandpass', 'bandstop'] as const).entries()) {
    it(`${type}, orders 1 to 9, every family in rotation: exact`, () => {
      for (const order of ORDERS) {
        let family = FAMILIES[(order + 2 * t) % FAMILIES.length];
        if (order < MIN_ORDER[family]) family = 'butterworth';
        expectExactRealization(route('gic-embedding', type, family, order));
      }
    });
  }
});

describe('GIC embedding: converters only where inductors meet other elements', () => {
  it('nodes joined by inductors alone stay inside the resistor network; shared nodes share one converter', () => {
    // in -Rs- n1 -L1- n2 -L2- n3(out), C3 at n3, shunt arm L4 + L5 in series at n1, load Rl:
    // n2 and the L4-L5 junction touch inductors only; n1 and n3 need a converter each (n1 serves L1 and L4).
    const L = (v: number, o: string) => element('L', v, o);
    const ladder: NetworkLadder = {
      source: element('R', 1000, 'Rs'),
      load: element('R', 1000, 'Rl'),
      branches: [
        { placement: 'shunt', network: { kind: 'series', parts: [L(0.02, 'L4'), L(0.03, 'L5')] } },
        { placement: 'series', network: L(0.05, 'L1') },
        { placement: 'series', network: L(0.01, 'L2') },
        { placement: 'shunt', network: element('C', '1e-7', 'C3') },
      ],
    };
    const r = realizeLadder(ladder, { method: 'gic-embedding', capacitorF: CAP });
    expectExactRealization(r);
    const converters = [...new Set(r.parts.filter((p) => p.role.kind === 'gic').map((p) => p.role.gic))].sort();
    expect(converters).toEqual(['X_n1', 'X_out']);
    expect(r.parts.find((p) => p.role.gic === 'X_n1')!.role.realises).toBe('L4,L1');
  });
});

describe('GIC embedding: every inductor has a DC reference behind its converters', () => {
  it('bandpass, series-first Butterworth: the series arms put their inductor at the tank, no DC reference needed, exact and stable', () => {
    // Regression: with the arm order L1 then C1, L1 alone sat between the first ladder node and the L1-C1
    // junction, both behind converters: their inner nodes had no DC path (an MNA root at s = 0).
    const r = route('gic-embedding', 'bandpass', 'butterworth', 3);
    expectExactRealization(r);
    expect(r.reference.withDcPath).toBeUndefined();
    expect(checkTopology(r.circuit).diagnostics.some((d) => d.code === 'NO_DC_PATH')).toBe(false);
    const converters = new Set(r.parts.filter((p) => p.role.kind === 'gic').map((p) => p.role.gic));
    expect(converters.size).toBe(3);
    const st = circuitStability(r.circuit);
    expect(st.stable && st.originRoots === 0).toBe(true);
  });

  it('bandstop and elliptic bandpass: DC references make the circuit stable with ideal and single-pole op-amps', () => {
    for (const [type, family] of [['bandstop', 'butterworth'], ['bandpass', 'elliptic']] as const) {
      for (const opamp of [undefined, { model: 'single-pole' as const, gainBandwidthHz: 10e6, openLoopGainDb: 100 }]) {
        const r = realizeLadder(transformedLadder(family, 4, type), { method: 'gic-embedding', capacitorF: CAP, opamp });
        if (!opamp) expectExactRealization(r);
        expect(r.diagnostics.some((d) => d.code === 'DC_REFERENCE'), `${type} ${family}`).toBe(true);
        expect(checkTopology(r.circuit).diagnostics.some((d) => d.code === 'NO_DC_PATH'), `${type} ${family}`).toBe(false);
        const st = circuitStability(r.circuit);
        expect(st.stable, `${type} ${family} ${opamp?.model ?? 'ideal'}`).toBe(true);
      }
    }
  });
});
