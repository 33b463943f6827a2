/**
 * The capacitors-first strategy keeps each resonator's L C exactly (before the last resistor rounding)
 * and gives every embedding converter the same k. Exact checks are rational equalities; the response
 * checks use the float AC engine with ideal op-amps.
 */
import { describe, expect, it } from 'vitest';
import type { Fraction } from '../../src/algebra/rational';
import { compileAc } from '../../src/analysis/ac-engine';
import { ladderPrototype } from '../../src/ladder/index';
import { fromLadder, lowpassToBandpass, scaleImpedance } from '../../src/transform/index';
import { ladderElements } from '../../src/transform/network';
import { realizeLadder } from '../../src/substitution/realize';
import type { Realization } from '../../src/substitution/realization';
import { gicCoefficient, gicGroups, resonatorCapacitors } from '../../src/selection/capacitors-first';
import { selectParts } from '../../src/selection/select-parts';
import type { Selection } from '../../src/selection/selected-part';

const families = {
  resistors: { series: 'E96', tolerancePercent: 1, temperatureCoefficientPpmPerK: 50 },
  capacitors: { series: 'E12', tolerancePercent: 5, temperatureCoefficientPpmPerK: 30 },
} as const;
/** Half an E96 step on a log scale, as a ratio - 1 (10^(1/192) - 1): the largest rounding left on a resonance. */
const HALF_E96_STEP = 10 ** (1 / 192) - 1;

// A 3rd-order Butterworth bandpass 37-43 kHz (Q0 = 6.7) at 4 kOhm, by GIC embedding around 1.1 nF (not
// preferred, so the converters' set resistor is recomputed too).
const w1 = 2 * Math.PI * 37e3;
const w2 = 2 * Math.PI * 43e3;
const bandpass = scaleImpedance(lowpassToBandpass(fromLadder(ladderPrototype({ family: 'butterworth', order: 3 })), w1 * w2, w2 - w1), 4000);
const embedded = realizeLadder(bandpass, { method: 'gic-embedding', capacitorF: '1.1n' });
const omega0 = Math.sqrt(w1 * w2);

const byName = (s: Selection) => new Map(s.parts.map((p) => [p.name, p]));
const exactL = (r: Realization, origin: string): Fraction => ladderElements(r.reference.ladder).find((e) => e.origin === origin && e.kind === 'L')!.value;

/** |H(j omega)| with the given element values and ideal op-amps (float AC engine). */
function gainAt(r: Realization, values: Record<string, Fraction>, omegaRadPerS: number): number {
  const g = compileAc(r.circuit.withValues(values), { input: 'VIN', output: 'out' }).sweep([omegaRadPerS / (2 * Math.PI)], { nodes: 'none' }).gainDb[0];
  return 10 ** (g / 20);
}

describe('capacitors-first on the GIC-embedding route', () => {
  const s = selectParts(embedded, { strategy: 'capacitors-first', ...families });
  const parts = byName(s);
  const converters = [...gicGroups(embedded.parts).values()];

  it('gives every converter the same realised k (same parts in every position)', () => {
    expect(converters.length).toBe(3);
    const ks = converters.map((c) => gicCoefficient(c.map((part) => ({ part, value: parts.get(part.name)!.chosenValue }))));
    for (const k of ks) expect(k.equals(ks[0])).toBe(true);
    expect(s.diagnostics).toEqual([]);
  });

  it("keeps each resonator's L C exactly with the realised k and the chosen capacitor, before the resistor's own rounding", () => {
    const kChosen = gicCoefficient(converters[0].map((part) => ({ part, value: parts.get(part.name)!.chosenValue })));
    const resonators = resonatorCapacitors(embedded);
    expect([...resonators.keys()].sort()).toEqual(['C2', 'L1', 'L3']);
    for (const [origin, cap] of resonators) {
      const resistor = embedded.parts.find((p) => p.kind === 'R' && p.role.kind === 'ladder' && p.role.realises === origin)!;
      const r = parts.get(resistor.name)!;
      const c = parts.get(cap.name)!;
      // L_realised = k_chosen R (gic-embedding.ts, Eq. (2)); L C kept: k R C_chosen = L_exact C_exact.
      expect(kChosen.mul(r.recomputedValue!).mul(c.chosenValue).equals(exactL(embedded, origin).mul(cap.exactValue))).toBe(true);
      // After rounding R to E96, the product is off by at most half an E96 step.
      const after = kChosen.mul(r.chosenValue).mul(c.chosenValue).div(exactL(embedded, origin).mul(cap.exactValue)).valueOf();
      expect(Math.abs(after - 1)).toBeLessThanOrEqual(HALF_E96_STEP);
    }
    // The E12 capacitor C2 (13.3 nF) really moved, so this is not the trivial case.
    expect(Math.abs(parts.get(resonators.get('C2')!.name)!.deviation)).toBeGreaterThan(0.05);
  });

  it('with the recomputed resistors, every resonator is exactly at omega0: the centre gain is Rl/(Rs+Rl) of the chosen terminations', () => {
    // The converters as built (chosen parts, their R1 rounded); the inductor resistors before their rounding.
    const values: Record<string, Fraction> = {};
    for (const p of s.parts) values[p.name] = p.role.kind === 'ladder' ? (p.recomputedValue ?? p.chosenValue) : p.chosenValue;
    const rs = parts.get('R_Rs')!.chosenValue.valueOf();
    const rl = parts.get('R_Rl')!.chosenValue.valueOf();
    // Series arms short and the shunt tank open at omega0; float engine: 1e-9 covers its rounding at this conditioning.
    expect(gainAt(embedded, values, omega0)).toBeCloseTo(rl / (rs + rl), 9);
    // The old rounding (every part to its series) detunes the resonators: the centre gain is visibly off.
    const round = selectParts(embedded, { strategy: 'round', ...families });
    expect(Math.abs(gainAt(embedded, { ...round.values }, omega0) / (rl / (rs + rl)) - 1)).toBeGreaterThan(0.05);
  });
});

describe('capacitors-first on the simulated-inductor route', () => {
  // A 1st-order Butterworth bandpass (shunt tank, grounded inductor) at 10 kHz, B = 2 kHz, 1 kOhm, GIC around 12 nF x 1.1.
  const w0 = 2 * Math.PI * 10e3;
  const tank = scaleImpedance(lowpassToBandpass(fromLadder(ladderPrototype({ family: 'butterworth', order: 1, form: 'shunt-first' })), w0 * w0, 2 * Math.PI * 2e3), 1000);
  const r = realizeLadder(tank, { method: 'simulated-inductor', capacitorF: '13.2n' });
  const s = selectParts(r, { strategy: 'capacitors-first', ...families });
  const parts = byName(s);

  it("retunes the GIC's set resistor so that L C of the tank is exact with the chosen capacitors", () => {
    const [gic] = [...gicGroups(r.parts).values()];
    const origin = gic[0].role.realises!;
    const cap = resonatorCapacitors(r).get(origin)!;
    expect(cap).toBeDefined();
    expect(parts.get(cap.name)!.chosenValue.equals(cap.exactValue)).toBe(false);
    const l = gicCoefficient(gic.map((part) => ({ part, value: parts.get(part.name)!.recomputedValue ?? parts.get(part.name)!.chosenValue })));
    expect(l.mul(parts.get(cap.name)!.chosenValue).equals(exactL(r, origin).mul(cap.exactValue))).toBe(true);
    // With the recomputed set resistor the tank is open at omega0: gain Rl/(Rs+Rl) (float engine, 1e-9).
    const values: Record<string, Fraction> = {};
    for (const p of s.parts) values[p.name] = p.recomputedValue ?? p.chosenValue;
    const rs = parts.get('R_Rs')!.chosenValue.valueOf();
    const rl = parts.get('R_Rl')!.chosenValue.valueOf();
    expect(gainAt(r, values, w0)).toBeCloseTo(rl / (rs + rl), 9);
  });
});
