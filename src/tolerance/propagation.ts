/**
 * Linear propagation of uncertainty (JCGM 100:2008, "GUM", clause 5): the standard uncertainty of the
 * gain (dB) and phase (degrees) at each frequency from the parts' standard uncertainties and the
 * sensitivity coefficients c_i = dY/dX_i at the nominal values (sensitivity.ts, adjoint method).
 *
 * Inputs X_i are the relative deviations d_i of each toleranced value (spec.ts's value model,
 * linearised: d_i = delta_group + delta_i + alpha_i (T - T_ref)). Their covariance matrix is
 *
 *   u(d_i, d_j) = [i = j] u_i^2 + [same group] u_g^2 + alpha_i alpha_j u_T^2,
 *
 * with u_T = (T_max - T_min) / sqrt(12) for a temperature uniform over its range (GUM 4.3.7), and the
 * combined uncertainty is u_c^2(y) = sum_i sum_j c_i c_j u(d_i, d_j) (GUM eq. (13); without groups and
 * temperature it reduces to eq. (10), sum_i c_i^2 u_i^2). The first-order expectation shift
 * sum_i c_i alpha_i (T_mid - T_ref) is reported as `meanShift` (zero when T_ref is the range's middle).
 */
import { InvalidInputError } from '../errors';
import { resolveTransfer, type TransferSpec } from '../analysis/index';
import { assertTopology, type Circuit } from '../netlist/index';
import { resolveTolerances, type ResolvedTolerances, type ToleranceSpec } from './spec';
import { standardUncertainty } from './distributions';
import { DB_PER_NEPER, DEG_PER_RAD, sensitivitiesOfProblem, validateFrequencies, type SensitivityResult } from './sensitivity';

/** sqrt(12): the standard deviation of a uniform distribution of full width w is w / sqrt(12). */
const SQRT12 = Math.sqrt(12);

/** One input's entry in the uncertainty budget (GUM 8, the table of u_i(y) = |c_i| u(x_i)). */
export interface BudgetEntry {
  /** Element name, `${opamp}.gainBandwidth`, `group:${name}` or 'temperature'. */
  readonly name: string;
  /** Standard uncertainty of the input (relative, or kelvin for temperature). */
  readonly standardUncertainty: number;
  /** |c_i| u(x_i) per frequency: the contribution to the gain (dB) and the phase (degrees). */
  readonly gainDb: Float64Array;
  readonly phaseDeg: Float64Array;
}

export interface PropagationResult {
  readonly frequencyHz: Float64Array;
  readonly nominalGainDb: Float64Array;
  readonly nominalPhaseDeg: Float64Array;
  /** Combined standard uncertainty u_c(y) per frequency. */
  readonly gainDbStandardUncertainty: Float64Array;
  readonly phaseDegStandardUncertainty: Float64Array;
  /** First-order expectation shift from the temperature range (see the module comment). */
  readonly gainDbMeanShift: Float64Array;
  readonly phaseDegMeanShift: Float64Array;
  readonly budget: readonly BudgetEntry[];
  readonly sensitivities: SensitivityResult;
}

/** The covariance matrix of the relative deviations of the inputs (module comment), row-major. */
export function inputCovariance(tol: ResolvedTolerances): Float64Array {
  const n = tol.inputs.length;
  const v = new Float64Array(n * n);
  const ug = tol.groups.map((g) => standardUncertainty(g));
  const t = tol.temperature;
  const uT = t ? (t.maxC - t.minC) / SQRT12 : 0;
  for (let i = 0; i < n; i++) {
    const a = tol.inputs[i];
    for (let j = 0; j < n; j++) {
      const b = tol.inputs[j];
      let c = a.tempcoPerK * b.tempcoPerK * uT * uT;
      if (i === j) c += standardUncertainty(a) ** 2;
      if (a.group >= 0 && a.group === b.group) c += ug[a.group] ** 2;
      v[i * n + j] = c;
    }
  }
  return v;
}

/**
 * Propagates the tolerances of `spec` to the gain and phase of V(output)/V(input) at each frequency.
 *
 * @example
 * propagateUncertainty(circuit, { input: 'in', output: 'out' }, { parts: [{ element: 'R1', tolerance: 0.01 }] }, [1000])
 *   .gainDbStandardUncertainty[0];
 */
export function propagateUncertainty(circuit: Circuit, transfer: TransferSpec, spec: ToleranceSpec, frequenciesHz: ArrayLike<number>): PropagationResult {
  const f = validateFrequencies(frequenciesHz);
  const tol = resolveTolerances(circuit, spec);
  if (tol.inputs.length === 0) throw new InvalidInputError('INVALID_ARGUMENT', 'spec.parts', spec.parts, 'must list at least one toleranced part or op-amp');
  assertTopology(circuit);
  const problem = resolveTransfer(circuit, transfer);
  const sens = sensitivitiesOfProblem(problem, tol.inputs.map((i) => ({ name: i.name, parameter: i.parameter })), f);
  const n = tol.inputs.length;
  const m = f.length;
  const cov = inputCovariance(tol);
  const uGain = new Float64Array(m);
  const uPhase = new Float64Array(m);
  const shiftGain = new Float64Array(m);
  const shiftPhase = new Float64Array(m);
  const t = tol.temperature;
  const dTmid = t ? (t.minC + t.maxC) / 2 - t.referenceC : 0;
  const cg = new Float64Array(n);
  const cp = new Float64Array(n);
  for (let p = 0; p < m; p++) {
    for (let i = 0; i < n; i++) {
      cg[i] = DB_PER_NEPER * sens.parameters[i].relativeRe[p]; // dB per unit relative change
      cp[i] = DEG_PER_RAD * sens.parameters[i].relativeIm[p]; // degrees per unit relative change
    }
    let sg = 0;
    let sp = 0;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        sg += cg[i] * cg[j] * cov[i * n + j]; // Eq. (13)
        sp += cp[i] * cp[j] * cov[i * n + j];
      }
      shiftGain[p] += cg[i] * tol.inputs[i].tempcoPerK * dTmid;
      shiftPhase[p] += cp[i] * tol.inputs[i].tempcoPerK * dTmid;
    }
    uGain[p] = Math.sqrt(sg);
    uPhase[p] = Math.sqrt(sp);
  }
  const budget: BudgetEntry[] = tol.inputs.map((inp, i) => {
    const u = standardUncertainty(inp);
    return {
      name: inp.name,
      standardUncertainty: u,
      gainDb: Float64Array.from({ length: m }, (_, p) => Math.abs(DB_PER_NEPER * sens.parameters[i].relativeRe[p]) * u),
      phaseDeg: Float64Array.from({ length: m }, (_, p) => Math.abs(DEG_PER_RAD * sens.parameters[i].relativeIm[p]) * u),
    };
  });
  // correlated inputs: the group offset and the temperature as budget lines of their own
  tol.groups.forEach((g, gi) => {
    const members = tol.inputs.map((inp, i) => (inp.group === gi ? i : -1)).filter((i) => i >= 0);
    const u = standardUncertainty(g);
    budget.push({
      name: `group:${g.name}`,
      standardUncertainty: u,
      gainDb: Float64Array.from({ length: m }, (_, p) => Math.abs(members.reduce((s, i) => s + DB_PER_NEPER * sens.parameters[i].relativeRe[p], 0)) * u),
      phaseDeg: Float64Array.from({ length: m }, (_, p) => Math.abs(members.reduce((s, i) => s + DEG_PER_RAD * sens.parameters[i].relativeIm[p], 0)) * u),
    });
  });
  if (t && t.maxC > t.minC) {
    const uT = (t.maxC - t.minC) / SQRT12;
    budget.push({
      name: 'temperature',
      standardUncertainty: uT,
      gainDb: Float64Array.from({ length: m }, (_, p) => Math.abs(tol.inputs.reduce((s, inp, i) => s + DB_PER_NEPER * sens.parameters[i].relativeRe[p] * inp.tempcoPerK, 0)) * uT),
      phaseDeg: Float64Array.from({ length: m }, (_, p) => Math.abs(tol.inputs.reduce((s, inp, i) => s + DEG_PER_RAD * sens.parameters[i].relativeIm[p] * inp.tempcoPerK, 0)) * uT),
    });
  }
  return {
    frequencyHz: f,
    nominalGainDb: sens.gainDb,
    nominalPhaseDeg: sens.phaseDeg,
    gainDbStandardUncertainty: uGain,
    phaseDegStandardUncertainty: uPhase,
    gainDbMeanShift: shiftGain,
    phaseDegMeanShift: shiftPhase,
    budget,
    sensitivities: sens,
  };
}
