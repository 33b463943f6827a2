import { describe, expect, it } from 'vitest';
import { Q1 } from '../../src/algebra/rational';
import { Circuit } from '../../src/netlist/circuit';
import { GicladderError } from '../../src/errors';
import { preferredValuesExact } from '../../src/units/eseries';
import { designFilter } from '../../src/spec/design-filter';
import { frequencyResponse } from '../../src/spec/frequency-response';
import { circuitStability } from '../../src/spec/stability';
import { SpecError } from '../../src/spec/spec-error';
import type { Fraction } from '../../src/algebra/rational';

const butterworth3 = (extra: Record<string, unknown> = {}) => ({
  name: 'b3',
  response: { type: 'lowpass', family: 'butterworth', order: 3, passbandEdgeHz: '1 kHz' },
  realization: { capacitorF: '10n' },
  ...extra,
});

/** Whether x is a preferred value of the series in some decade (exact). */
function isPreferred(x: Fraction, series: 'E12' | 'E96'): boolean {
  const decade = preferredValuesExact(series);
  let m = x;
  const ten = Q1.mul(10);
  while (m.compare(10) >= 0) m = m.div(ten);
  while (m.compare(1) < 0) m = m.mul(ten);
  return decade.some((d) => d.equals(m));
}

describe('designFilter', () => {
  it('exact parts and ideal op-amps: no rounding or op-amp error, the edge at the half-power point below nominal', () => {
    const d = designFilter(butterworth3({ parts: { selection: 'exact', opamp: { model: 'ideal' } } }));
    expect(d.evaluation.passbandErrorDb).toEqual({ rounding: 0, opamp: 0, total: 0 });
    const r = frequencyResponse(d, [1000]);
    // Butterworth: |H| = 1/sqrt(2) at the edge (-3.0103 dB, definition); DC-path resistors <= 0.01 dB.
    expect(r.gainDb[0] - d.nominalPassbandGainDb).toBeCloseTo(-3.0103, 1);
    expect(Math.abs(r.gainDb[0] - d.nominalPassbandGainDb + 3.0103)).toBeLessThan(0.011);
    expect(d.parts.every((p) => p.chosenValue.equals(p.exactValue))).toBe(true);
  });

  it('frequencyResponse is the compiled response of the chosen circuit (the evaluation C curve)', () => {
    const d = designFilter(butterworth3());
    const f = d.evaluation.frequencyHz.slice(0, 50);
    const r = frequencyResponse(d, f);
    r.gainDb.forEach((g, i) => expect(g).toBeCloseTo(d.evaluation.gainDb.chosenPartsRealOpamp[i], 10));
    expect(r.groupDelayS.every((t) => Number.isFinite(t))).toBe(true);
    expect(() => frequencyResponse(d, [1, -5])).toThrow(GicladderError);
  });

  it('capacitors-first: capacitors from E12, the computed GIC resistor recomputed for them, every resistor from E96', () => {
    const d = designFilter(butterworth3({ realization: { capacitorF: '9.1n' } }));
    expect(d.impedance.capacitorRounded).toBe(true); // 9.1n is E24, not E12: moved to 10n
    for (const p of d.parts) expect(isPreferred(p.chosenValue, p.kind === 'C' ? 'E12' : 'E96')).toBe(true);
    expect(d.parts.every((p) => p.series === (p.kind === 'C' ? 'E12' : 'E96'))).toBe(true);
    const roles = new Set(d.parts.map((p) => p.role.kind));
    expect(roles.has('gic')).toBe(true);
  });

  it("'round' and 'capacitors-first' agree on capacitors; 'exact' keeps every value", () => {
    const round = designFilter(butterworth3({ parts: { selection: 'round' } }));
    const first = designFilter(butterworth3());
    const caps = (d: typeof round) => d.parts.filter((p) => p.kind === 'C').map((p) => p.value);
    expect(caps(round)).toEqual(caps(first));
  });

  it("'search' is never worse after rounding than capacitors-first at the starting capacitor (which it includes)", () => {
    const first = designFilter(butterworth3({ realization: { capacitorF: '6.8n' } }));
    const search = designFilter(butterworth3({ realization: { capacitorF: '6.8n' }, parts: { selection: 'search', searchMaxEvaluations: 3 } }));
    expect(search.selection.strategy).toBe('search');
    expect(search.evaluation.passbandErrorDb.rounding).toBeLessThanOrEqual(first.evaluation.passbandErrorDb.rounding + 1e-12);
    expect(search.diagnostics.some((x) => x.code === 'SEARCH')).toBe(true);
  });

  it('reports the minimum GBW for the stated error, and a GBW below it as a warning', () => {
    const slow = designFilter(butterworth3({ parts: { opamp: { model: 'single-pole', gainBandwidthHz: '20k' } } }));
    expect(slow.evaluation.gainBandwidth.meets).toBe(false);
    expect(slow.diagnostics.some((x) => x.code === 'GBW_TOO_LOW' && x.severity === 'warning')).toBe(true);
    const req = slow.evaluation.gainBandwidth.requiredHz;
    expect(req).toBeGreaterThan(20e3);
    const ok = designFilter(butterworth3({ parts: { opamp: { model: 'single-pole', gainBandwidthHz: req * 1.01 } } }));
    expect(ok.evaluation.gainBandwidth.meets).toBe(true);
    expect(ok.evaluation.passbandErrorDb.opamp).toBeLessThanOrEqual(0.1 + 1e-9);
  });

  it('pre-compensation reduces the op-amp error of a 7th-order 10 kHz Chebyshev on 10 MHz op-amps', () => {
    const spec = {
      response: { type: 'lowpass', family: 'chebyshev', order: 7, passbandEdgeHz: '10k', passbandRippleDb: 0.1 },
      parts: { selection: 'exact', opamp: { model: 'single-pole', gainBandwidthHz: '10 MHz' } },
      evaluation: { precompensate: true, sweepPoints: 120 },
    };
    const d = designFilter(spec);
    const p = d.precompensation!;
    expect(p.adjusted.length).toBe(3); // the three FDNRs of the shunt arms 2, 4, 6
    expect(p.passbandErrorDb.after).toBeLessThan(p.passbandErrorDb.before / 2);
    expect(d.evaluation.passbandErrorDb.opamp).toBeCloseTo(p.passbandErrorDb.after, 6);
  }, 60_000);

  it('flags parts outside the practical ranges with a reason', () => {
    const d = designFilter(butterworth3({ realization: { capacitorF: '100u' } }));
    expect(d.diagnostics.some((x) => x.code === 'CAPACITOR_TOO_LARGE')).toBe(true);
    expect(d.diagnostics.some((x) => x.code === 'RESISTOR_TOO_SMALL')).toBe(true);
  });

  it('validates first: a bad file is a SpecError, nothing else runs', () => {
    expect(() => designFilter({ response: { order: 3 } })).toThrow(SpecError);
  });
});

describe('circuitStability (exact, MNA determinant)', () => {
  const follower = (plus: string, minus: string) =>
    new Circuit()
      .addVoltageSource('VIN', 'in', '0')
      .addResistor('R1', 'in', 'a', 1000)
      .addResistor('R2', 'a', 'out', 1000)
      .addOpamp('U1', { plus, minus, out: 'out' }, { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 });
  it('an inverting amplifier is stable; the same with the op-amp inputs swapped has a right-half-plane mode', () => {
    expect(circuitStability(follower('0', 'a')).stable).toBe(true);
    const wrong = circuitStability(follower('a', '0'));
    expect(wrong.stable).toBe(false);
    expect(wrong.rightHalfPlane).toBe(1);
  });
});
