/**
 * The production stage of a design: Monte Carlo boards of the circuit to build (every part within its
 * tolerance and temperature coefficient from the design file, uniform distributions; op-amps nominal),
 * test points (automatic from the spec mask, or the design file's), acceptance limits by the decision
 * rule with the measurement uncertainty (ILAC-G8), per-point yield, global risks (JCGM 106) and Cpk,
 * and the firmware trim when the design file asks for one. Its `plan` is what checkMeasurements reads.
 */
import {
  planProductionTest,
  sampleBoards,
  normalQuantile,
  checkMeasurements as checkPlanMeasurements,
  type CheckOptions,
  type CheckResult,
  type DecisionRule,
  type ProductionPlan,
  type ProductionTestDesign,
  type TrimSpec,
  type TrimTarget,
} from '../production/index';
import type { SpecMask, ToleranceSpec } from '../tolerance/index';
import { InvalidInputError, UnrealizableError } from '../errors';
import type { FilterDesign } from './design-filter';

const TRANSFER = { input: 'VIN', output: 'out' } as const;

export interface DesignProduction {
  /** The tolerance model the boards were drawn from. */
  readonly tolerances: ToleranceSpec;
  readonly mask: SpecMask;
  readonly test: ProductionTestDesign;
  /** What `checkMeasurements` and `gicladder check` read. */
  readonly plan: ProductionPlan;
  /** The resistors on the trim code (ganged), when a trim was asked for. */
  readonly trimTargets: readonly TrimTarget[];
}

/** The spec mask of a design in absolute dB (the nominal passband gain included), for yields and test points. */
export function designMask(design: FilterDesign): SpecMask {
  const r = design.spec.response;
  const g0 = design.nominalPassbandGainDb;
  const f = design.evaluation.frequencyHz;
  const lo = f[0];
  const hi = f[f.length - 1];
  const pass = (fromHz: number, toHz: number) => ({ fromHz, toHz, minGainDb: g0 - r.passbandRippleDb, maxGainDb: g0 });
  const stop = (fromHz: number, toHz: number) => ({ fromHz, toHz, maxGainDb: g0 - r.stopbandAttenuationDb });
  const p = r.passbandEdgeHz as number | [number, number];
  const s = r.stopbandEdgeHz as number | [number, number] | undefined;
  switch (r.type) {
    case 'lowpass':
      // From DC: the automatic test points then take the reference point a decade below the edge.
      return { passband: [pass(0, p as number)], stopband: s === undefined ? [] : [stop(s as number, hi)] };
    case 'highpass':
      return { passband: [pass(p as number, hi)], stopband: s === undefined ? [] : [stop(lo, s as number)] };
    case 'bandpass': {
      const [a, b] = p as [number, number];
      const st = s as [number, number] | undefined;
      return { passband: [pass(a, b)], stopband: st === undefined ? [] : [stop(lo, st[0]), stop(st[1], hi)] };
    }
    case 'bandstop': {
      const [a, b] = p as [number, number];
      const st = s as [number, number] | undefined;
      return { passband: [pass(0, a), pass(b, hi)], stopband: st === undefined ? [] : [stop(st[0], st[1])] };
    }
  }
}

/** Every resistor and capacitor of the design with its tolerance (uniform) and temperature coefficient. */
export function designTolerances(design: FilterDesign): ToleranceSpec {
  return {
    parts: design.parts.map((p) => ({
      element: p.name,
      tolerance: p.tolerancePercent / 100,
      distribution: 'uniform' as const,
      tempcoPpmPerK: p.temperatureCoefficientPpmPerK,
    })),
  };
}

function decisionRule(name: string): DecisionRule {
  switch (name) {
    case 'simple-acceptance':
      return { rule: 'simple-acceptance' };
    case 'guarded-acceptance':
      return { rule: 'guarded-acceptance' };
    case 'guarded-rejection':
      return { rule: 'guarded-rejection' };
    default:
      throw new InvalidInputError('INVALID_ARGUMENT', 'production.decisionRule', name, 'is not a decision rule');
  }
}

/**
 * The resistors the trim code moves. 'auto': the set (computed, not free) resistor of every GIC, ganged
 * on one code, so one code scales every simulated element together; a name: that resistor alone.
 */
export function trimTargetsOf(design: FilterDesign): TrimTarget[] {
  const element = design.spec.trim.element;
  if (element !== 'auto') {
    const part = design.parts.find((p) => p.name === element);
    if (!part || part.kind !== 'R') {
      throw new InvalidInputError('INVALID_ARGUMENT', 'trim.element', element, `must be 'auto' or the name of a resistor of the design (${design.parts.filter((p) => p.kind === 'R').slice(0, 6).map((p) => p.name).join(', ')}, ...)`);
    }
    return [{ element, placement: 'series' }];
  }
  const set = design.parts.filter((p) => p.kind === 'R' && p.role.kind === 'gic' && !p.role.free);
  const seen = new Set<string>();
  const targets: TrimTarget[] = [];
  for (const p of set) {
    if (seen.has(p.role.gic ?? p.name)) continue; // one resistor per GIC
    seen.add(p.role.gic ?? p.name);
    targets.push({ element: p.name, placement: 'series' });
  }
  if (targets.length === 0) throw new UnrealizableError('UNREALIZABLE', 'trim.element', element, 'the design has no GIC set resistor to trim; name a resistor');
  return targets;
}

/**
 * Plans the production test (and the trim) of a design. Returns null when the design file does not ask
 * for it (`production.enabled` and `trim.enabled` both false).
 */
export function planDesignProduction(design: FilterDesign): DesignProduction | null {
  const spec = design.spec;
  if (!spec.production.enabled && !spec.trim.enabled) return null;
  const pr = spec.production;
  const tolerances = designTolerances(design);
  const mask = designMask(design);
  const boards = sampleBoards(design.circuit, TRANSFER, tolerances, { trials: pr.trials, seed: pr.seed });
  const coverageFactor = normalQuantile((1 + pr.coverageProbability) / 2);
  const uncertainty = { standardUncertainty: pr.measurementUncertaintyDb, coverageFactor };
  const source = pr.limits === 'mask' ? ('mask' as const) : ({ kind: 'statistical' as const, coverage: pr.limitCoverage });
  let trimTargets: TrimTarget[] = [];
  let trim: { spec: TrimSpec; options: { measurementUncertaintyDb: number; seed: number } } | undefined;
  if (spec.trim.enabled) {
    trimTargets = trimTargetsOf(design);
    const d = spec.trim.device;
    trim = {
      spec: {
        device: { kind: 'rheostat', endToEndOhms: d.endToEndOhms, steps: d.steps, wiperOhms: d.wiperOhms, tolerance: d.endToEndTolerancePercent / 100 },
        targets: trimTargets,
        frequencyHz: spec.trim.frequencyHz,
      },
      options: { measurementUncertaintyDb: pr.measurementUncertaintyDb, seed: pr.seed },
    };
  }
  const test = planProductionTest(boards, {
    testPoints: pr.testPoints === 'auto' ? 'auto' : (pr.testPoints as number[]),
    mask,
    trimFrequencyHz: spec.trim.enabled ? spec.trim.frequencyHz : undefined,
    gain: { source, rule: decisionRule(pr.decisionRule), uncertainty },
    trim,
  });
  return { tolerances, mask, test, plan: test.plan, trimTargets };
}

/**
 * Checks measured boards (CSV: board, frequency_hz, gain_db[, phase_deg]) against a design's production
 * plan: a verdict per board and per point and a summary. Throws CsvError (INVALID_CSV, with the line)
 * for malformed data, and InvalidInputError when the design file does not plan a production test.
 */
export function checkMeasurements(design: FilterDesign | DesignProduction | ProductionPlan, csvText: string, options: CheckOptions = {}): CheckResult {
  return checkPlanMeasurements(planOf(design), csvText, options);
}

/** The production plan of a design, a planned production, or a plan. */
export function planOf(x: FilterDesign | DesignProduction | ProductionPlan): ProductionPlan {
  if ('testPoints' in x) return x;
  if ('plan' in x) return x.plan;
  const p = planDesignProduction(x);
  if (!p) throw new InvalidInputError('INVALID_ARGUMENT', 'production.enabled', false, 'the design file plans no production test: set production.enabled to true');
  return p.plan;
}
