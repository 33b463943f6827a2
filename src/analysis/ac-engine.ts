/**
 * The compiled float AC engine. `compileAc` builds the circuit's MNA description once (the same stamps
 * the exact analysis uses), fixes a sparse pattern and a pivot order, and returns an engine whose
 * per-frequency work is: fill the preallocated value arrays from the terms, replay the LU operation
 * list, substitute. Nothing is allocated per frequency. Component values live in a Float64Array of
 * parameters and can change without recompiling (Monte Carlo, trimming).
 *
 * Float boundary: this is where exact component values become doubles (each correctly rounded, see
 * `fractionToNumber`). Frequencies are in hertz; omega = 2 * Math.PI * frequencyHz.
 *
 * Group delay is exact, not a finite difference: with A(j w) x = b, dx/dw = -A^-1 (dA/dw) x, solved
 * with the same factors, and tau = -Im(H'/H) for H = c.x (for a ratio H = c.x / r.x,
 * H'/H = (c.x')/(c.x) - (r.x')/(r.x)).
 */
import { fractionToNumber, jwPower } from '../algebra/index';
import { InvalidInputError, requireFinite } from '../errors';
import { assertTopology, SingularCircuitError, validateOpampModel, type Circuit, type OpampModel, type TopologyDiagnostic } from '../netlist/index';
import { resolveImpedance, resolveTransfer, type Combination, type MnaProblem, type TransferSpec } from './mna-system';
import { assertTopologyWithPort } from './transfer-function';
import { factorSparseLu, planSparseLu, solveSparseLu, type ComplexSample, type SparseLuPlan } from './sparse-lu';
import { generateLuKernels, type LuKernels } from './lu-codegen';
import { generateTransferKernel, type TransferKernel } from './transfer-codegen';
import { generateWeightKernel, type WeightKernel } from './weight-codegen';

/**
 * Frequencies (Hz) at which the pivot order is checked numerically at compile time: six decades apart
 * pairs from 0.01 Hz to 100 MHz cover normalised prototypes (about 0.16 Hz) and audio-to-RF designs.
 */
export const DEFAULT_CHECK_FREQUENCIES_HZ: readonly number[] = [1e-2, 1, 1e2, 1e4, 1e6, 1e8];

export interface CompileAcOptions {
  /** Frequencies (Hz) at which the pivot order must be numerically sound; default {@link DEFAULT_CHECK_FREQUENCIES_HZ}. */
  readonly checkFrequenciesHz?: readonly number[];
  /**
   * Generate straight-line kernels for the fixed plan (lu-codegen.ts; default true). They give the
   * same results bit for bit; false keeps the interpreted kernels (e.g. under a CSP without eval).
   */
  readonly generateKernels?: boolean;
}

/** One frequency's solution: every unknown (node voltages first) relative to the input, and H. */
export interface AcSolution {
  /** Real parts, indexed like {@link CompiledAc.unknowns}. */
  readonly re: Float64Array;
  readonly im: Float64Array;
  /** H(j w) = V(out) relative to the input. */
  hRe: number;
  hIm: number;
}

export interface AcSweepOptions {
  /** Node voltages to return: 'all' non-ground nodes (default), a list, or 'none'. */
  readonly nodes?: 'all' | 'none' | readonly string[];
}

export interface AcSweep {
  readonly frequencyHz: Float64Array;
  readonly gainDb: Float64Array;
  /** Unwrapped along the sweep (in the order the frequencies were given). */
  readonly phaseDeg: Float64Array;
  readonly groupDelayS: Float64Array;
  /** Node voltage relative to the input, per requested node. */
  readonly nodes: Readonly<Record<string, { readonly re: Float64Array; readonly im: Float64Array }>>;
}

/** A circuit compiled for repeated AC solves. */
export interface CompiledAc {
  /** Unknown names: node names first (in circuit order), then `${element}#${label}` branch currents. */
  readonly unknowns: readonly string[];
  readonly nodeCount: number;
  /** Parameter names ('R1', 'U1.openLoopGain', ...), indexed like {@link CompiledAc.parameters}. */
  readonly parameterNames: readonly string[];
  /** The live parameter values (read-only view; change them with setValue/setParameter). */
  readonly parameters: Readonly<Float64Array>;
  /** The index of a parameter by name (throws InvalidInputError for an unknown name). */
  parameterIndex(name: string): number;
  /** Sets a component value ('R1' ohms, 'C3' farads, 'U1.unityGainRadPerS', ...). */
  setValue(name: string, value: number): void;
  /** Sets a parameter by index (no name lookup). */
  setParameter(index: number, value: number): void;
  /**
   * Sets values[k] into parameter indices[k] for every k, then recomputes the weights once (the Monte
   * Carlo inner loop: cheaper than one setParameter per value when many change). Same result, bit for
   * bit, as setParameter for each in turn. Indices and values are not validated here.
   */
  setParameters(indices: ArrayLike<number>, values: ArrayLike<number>): void;
  getValue(name: string): number;
  /** Replaces an op-amp's model; it must be of the same kind as the compiled one (same terms). */
  setOpampModel(name: string, model: OpampModel): void;
  /** Solves at one frequency, filling `out` (allocated when omitted). Non-finite values signal a singular point. */
  solveAt(frequencyHz: number, out?: AcSolution): AcSolution;
  /** H(j w) at one frequency, as [re, im] in `out` (allocated when omitted). */
  transferAt(frequencyHz: number, out?: Float64Array): Float64Array;
  sweep(frequenciesHz: ArrayLike<number>, options?: AcSweepOptions): AcSweep;
  /** Allocates a solution record for {@link CompiledAc.solveAt}. */
  createSolution(): AcSolution;
  /** Topology warnings found at compile time (NO_DC_PATH: the engine is singular at f = 0, ...). */
  readonly diagnostics: readonly TopologyDiagnostic[];
}

/**
 * Compiles a circuit for AC analysis of V(output) relative to the input (see {@link TransferSpec}).
 * Throws SingularCircuitError when the topology is singular or no pivot order exists.
 */
export function compileAc(circuit: Circuit, spec: TransferSpec, options: CompileAcOptions = {}): CompiledAc {
  const diagnostics = assertTopology(circuit);
  const problem = resolveTransfer(circuit, spec);
  return new AcEngine(circuit, problem, options.checkFrequenciesHz ?? DEFAULT_CHECK_FREQUENCIES_HZ, options.generateKernels ?? true, diagnostics);
}

/**
 * Compiles the driving-point impedance between nodePlus and nodeMinus (default ground) for AC sweeps:
 * H is V(plus) - V(minus) per ampere injected, every independent source off (as
 * drivingPointImpedance); gainDb is then 20 log10 |Z / 1 ohm| and node voltages are per ampere.
 */
export function compileImpedance(circuit: Circuit, nodePlus: string, nodeMinus = '0', options: CompileAcOptions = {}): CompiledAc {
  const problem = resolveImpedance(circuit, nodePlus, nodeMinus);
  const diagnostics = assertTopologyWithPort(circuit, nodePlus, nodeMinus);
  return new AcEngine(circuit, problem, options.checkFrequenciesHz ?? DEFAULT_CHECK_FREQUENCIES_HZ, options.generateKernels ?? true, diagnostics);
}

class AcEngine implements CompiledAc {
  readonly unknowns: readonly string[];
  readonly nodeCount: number;
  readonly parameterNames: readonly string[];
  readonly parameters: Float64Array;
  private readonly n: number;
  private readonly nameIndex: Map<string, number>;
  private readonly plan: SparseLuPlan;
  // terms: coefficient * prod(parameter^exponent), cached per term
  private readonly tCoef: Float64Array;
  private readonly tWeight: Float64Array;
  private readonly tFactorStart: Int32Array;
  private readonly fSlot: Int32Array;
  private readonly fExp: Int32Array;
  private readonly tGroup: Int32Array;
  // groups: the terms sharing a matrix slot and a power of s, summed; sorted by (power mod 4, slot)
  private readonly gSlot: Int32Array;
  private readonly gRow: Int32Array;
  private readonly gCol: Int32Array;
  private readonly gPow: Int32Array;
  private readonly gWeight: Float64Array;
  private readonly gTermStart: Int32Array;
  private readonly gTerms: Int32Array;
  /** Group index ranges of the four classes of j^k: [cls[c], cls[c + 1]). */
  private readonly cls: Int32Array;
  // parameter -> the terms it enters
  private readonly pTermStart: Int32Array;
  private readonly pTerms: Int32Array;
  private readonly maxPow: number;
  // right-hand side and combinations
  private readonly bRow: Int32Array;
  private readonly bVal: Float64Array;
  private readonly outIdx: Int32Array;
  private readonly outW: Float64Array;
  private readonly refIdx: Int32Array;
  private readonly refW: Float64Array;
  // work arrays
  private readonly vr: Float64Array;
  private readonly vi: Float64Array;
  private readonly invRe: Float64Array;
  private readonly invIm: Float64Array;
  private readonly br: Float64Array;
  private readonly bi: Float64Array;
  private readonly xr: Float64Array;
  private readonly xi: Float64Array;
  private readonly dr: Float64Array;
  private readonly di: Float64Array;
  private readonly wPow: Float64Array;
  private readonly opampKinds: Map<string, OpampModel['model']>;
  private readonly tmp = new Float64Array(8);
  private readonly kernels: LuKernels | null;
  /** The fused fill-factor-solve of H alone (transfer-codegen.ts), for transferAt. */
  private readonly transferKernel: TransferKernel | null;
  /** Every term and group weight from the parameters (weight-codegen.ts), for setParameters. */
  private readonly weightKernel: WeightKernel | null;

  constructor(
    circuit: Circuit,
    problem: MnaProblem,
    checkHz: readonly number[],
    generate: boolean,
    readonly diagnostics: readonly TopologyDiagnostic[],
  ) {
    const sys = problem.system;
    const n = sys.size;
    this.n = n;
    this.unknowns = sys.unknowns;
    this.nodeCount = sys.nodeCount;
    this.parameterNames = sys.parameterNames;
    this.parameters = Float64Array.from(sys.parameterValues.map((v) => fractionToNumber(v)));
    this.nameIndex = new Map(sys.parameterIndex);
    this.opampKinds = new Map();
    for (const e of circuit.elements) if (e.kind === 'OPAMP') this.opampKinds.set(e.name, e.model.model);

    const terms = sys.terms;
    const nt = terms.length;
    this.tCoef = Float64Array.from(terms.map((t) => t.coefficient));
    this.tWeight = new Float64Array(nt);
    const fs: number[] = [];
    const fe: number[] = [];
    const starts: number[] = [0];
    const byParam: number[][] = sys.parameterNames.map(() => []);
    terms.forEach((t, i) => {
      for (const f of t.factors) {
        fs.push(f.slot);
        fe.push(f.exponent);
        if (!byParam[f.slot].includes(i)) byParam[f.slot].push(i);
      }
      starts.push(fs.length);
    });
    this.fSlot = Int32Array.from(fs);
    this.fExp = Int32Array.from(fe);
    this.tFactorStart = Int32Array.from(starts);
    this.pTermStart = Int32Array.from([0, ...cumulative(byParam.map((l) => l.length))]);
    this.pTerms = Int32Array.from(byParam.flat());
    this.maxPow = terms.reduce((m, t) => Math.max(m, t.sPower), 0);
    this.wPow = new Float64Array(this.maxPow + 2);
    // groups keyed by (row, col, power)
    const key = (t: { row: number; col: number; sPower: number }) => (t.row * n + t.col) * (this.maxPow + 1) + t.sPower;
    const groupOf = new Map<number, number[]>();
    terms.forEach((t, i) => {
      const k = key(t);
      if (!groupOf.has(k)) groupOf.set(k, []);
      groupOf.get(k)!.push(i);
    });
    const groupList = [...groupOf.values()].sort((a, b) => {
      const ta = terms[a[0]];
      const tb = terms[b[0]];
      return (ta.sPower & 3) - (tb.sPower & 3) || ta.row * n + ta.col - (tb.row * n + tb.col) || ta.sPower - tb.sPower;
    });
    const ng = groupList.length;
    this.gRow = Int32Array.from(groupList.map((g) => terms[g[0]].row));
    this.gCol = Int32Array.from(groupList.map((g) => terms[g[0]].col));
    this.gPow = Int32Array.from(groupList.map((g) => terms[g[0]].sPower));
    this.gWeight = new Float64Array(ng);
    this.gTermStart = Int32Array.from([0, ...cumulative(groupList.map((g) => g.length))]);
    this.gTerms = Int32Array.from(groupList.flat());
    this.tGroup = new Int32Array(nt);
    groupList.forEach((g, gi) => g.forEach((t) => (this.tGroup[t] = gi)));
    this.cls = new Int32Array(5);
    for (let c = 0; c <= 4; c++) {
      let i = 0;
      while (i < ng && (this.gPow[i] & 3) < c) i++;
      this.cls[c] = i;
    }
    for (let t = 0; t < nt; t++) this.updateTerm(t);
    for (let g = 0; g < ng; g++) this.updateGroup(g);

    this.bRow = Int32Array.from(problem.rhs.map((r) => r.row));
    this.bVal = Float64Array.from(problem.rhs.map((r) => fractionToNumber(r.value)));
    this.outIdx = Int32Array.from(problem.output.map((c) => c.index));
    this.outW = Float64Array.from(problem.output.map((c) => c.weight));
    const ref: Combination = problem.reference ?? [];
    this.refIdx = Int32Array.from(ref.map((c) => c.index));
    this.refW = Float64Array.from(ref.map((c) => c.weight));

    // Structure and sample matrices for the ordering.
    const keys = Array.from(this.gRow, (r, g) => r * n + this.gCol[g]);
    const samples: ComplexSample[] = checkHz.map((f) => {
      const re = new Float64Array(n * n);
      const im = new Float64Array(n * n);
      const w = 2 * Math.PI * f;
      for (let g = 0; g < ng; g++) {
        const [cr, ci] = jwPower(w, this.gPow[g]);
        re[keys[g]] += this.gWeight[g] * cr;
        im[keys[g]] += this.gWeight[g] * ci;
      }
      return { re, im };
    });
    const planned = planSparseLu(n, keys, samples);
    if (!planned.plan) {
      const names = [...new Set([...planned.cols.map((c) => sys.unknowns[c])])];
      throw new SingularCircuitError('circuit', [], `the nodal equations are singular (no pivot left for ${names.map((u) => `'${u}'`).join(', ')})`);
    }
    this.plan = planned.plan;
    this.gSlot = Int32Array.from(keys.map((k) => this.plan.slotOf[k]));
    const groups = Array.from(this.gSlot, (slot, g) => ({ weight: g, slot, power: this.gPow[g] }));
    this.kernels = generate ? generateLuKernels(this.plan, groups) : null;
    const linear = (idx: Int32Array, w: Float64Array) => Array.from(idx, (index, k) => ({ index, weight: w[k] }));
    this.weightKernel = generate
      ? generateWeightKernel({
          coefficient: this.tCoef,
          factorStart: this.tFactorStart,
          factorParameter: this.fSlot,
          factorExponent: this.fExp,
          groupStart: this.gTermStart,
          groupTerms: this.gTerms,
        })
      : null;
    this.transferKernel = generate
      ? generateTransferKernel(this.plan, groups, {
          rhs: Array.from(this.bRow, (row, i) => ({ row, value: this.bVal[i] })),
          output: linear(this.outIdx, this.outW),
          reference: linear(this.refIdx, this.refW),
        })
      : null;
    this.vr = new Float64Array(this.plan.slotCount);
    this.vi = new Float64Array(this.plan.slotCount);
    this.invRe = new Float64Array(n);
    this.invIm = new Float64Array(n);
    this.br = new Float64Array(n);
    this.bi = new Float64Array(n);
    this.xr = new Float64Array(n);
    this.xi = new Float64Array(n);
    this.dr = new Float64Array(n);
    this.di = new Float64Array(n);
  }

  parameterIndex(name: string): number {
    const i = this.nameIndex.get(name);
    if (i === undefined) throw new InvalidInputError('INVALID_ARGUMENT', 'name', name, 'is not a parameter of the compiled circuit');
    return i;
  }

  setValue(name: string, value: number): void {
    this.setParameter(this.parameterIndex(name), requireFinite(value, name));
  }

  setParameter(index: number, value: number): void {
    this.parameters[index] = value;
    for (let i = this.pTermStart[index]; i < this.pTermStart[index + 1]; i++) {
      const t = this.pTerms[i];
      this.updateTerm(t);
      this.updateGroup(this.tGroup[t]);
    }
  }

  setParameters(indices: ArrayLike<number>, values: ArrayLike<number>): void {
    const p = this.parameters;
    for (let k = 0; k < indices.length; k++) p[indices[k]] = values[k];
    if (this.weightKernel) {
      this.weightKernel(p, this.tWeight, this.gWeight);
      return;
    }
    for (let t = 0; t < this.tWeight.length; t++) this.updateTerm(t);
    for (let g = 0; g < this.gWeight.length; g++) this.updateGroup(g);
  }

  getValue(name: string): number {
    return this.parameters[this.parameterIndex(name)];
  }

  setOpampModel(name: string, model: OpampModel): void {
    validateOpampModel(model, `${name}.model`);
    const kind = this.opampKinds.get(name);
    if (kind === undefined) throw new InvalidInputError('INVALID_ARGUMENT', 'name', name, 'is not an op-amp of the compiled circuit');
    if (kind !== model.model) throw new InvalidInputError('INVALID_ARGUMENT', `${name}.model`, model.model, `must stay '${kind}' (recompile to change the model kind)`);
    // The same doubles the exact side takes (netlist/opamp.ts).
    if ('gain' in model) this.setValue(`${name}.openLoopGain`, model.gain);
    if ('openLoopGainDb' in model) this.setValue(`${name}.openLoopGain`, 10 ** (model.openLoopGainDb / 20));
    if ('gainBandwidthHz' in model) this.setValue(`${name}.unityGainRadPerS`, 2 * Math.PI * model.gainBandwidthHz);
    if ('secondPoleHz' in model) this.setValue(`${name}.secondPoleRadPerS`, 2 * Math.PI * model.secondPoleHz);
  }

  createSolution(): AcSolution {
    return { re: new Float64Array(this.n), im: new Float64Array(this.n), hRe: NaN, hIm: NaN };
  }

  /** Recomputes one term's weight from the parameters. */
  private updateTerm(t: number): void {
    const p = this.parameters;
    let w = this.tCoef[t];
    for (let f = this.tFactorStart[t]; f < this.tFactorStart[t + 1]; f++) {
      const e = this.fExp[f];
      const v = p[this.fSlot[f]];
      w = e === 1 ? w * v : e === -1 ? w / v : w * v ** e;
    }
    this.tWeight[t] = w;
  }

  /** Re-sums one group from its terms (summed afresh, so repeated changes do not drift). */
  private updateGroup(g: number): void {
    let w = 0;
    for (let i = this.gTermStart[g]; i < this.gTermStart[g + 1]; i++) w += this.tWeight[this.gTerms[i]];
    this.gWeight[g] = w;
  }

  /** Fills and factorises A(j w); returns false at a singular point. */
  private factorAt(w: number): boolean {
    const { vr, vi, wPow, gSlot, gPow, gWeight, cls } = this;
    wPow[0] = 1;
    for (let k = 1; k < wPow.length; k++) wPow[k] = wPow[k - 1] * w;
    if (this.kernels) return this.kernels.fillFactor(w, gWeight, vr, vi, this.invRe, this.invIm);
    vr.fill(0);
    vi.fill(0);
    // (j w)^k = w^k j^k, j^k = 1, j, -1, -j by k mod 4
    for (let g = cls[0]; g < cls[1]; g++) vr[gSlot[g]] += gWeight[g] * wPow[gPow[g]];
    for (let g = cls[1]; g < cls[2]; g++) vi[gSlot[g]] += gWeight[g] * wPow[gPow[g]];
    for (let g = cls[2]; g < cls[3]; g++) vr[gSlot[g]] -= gWeight[g] * wPow[gPow[g]];
    for (let g = cls[3]; g < cls[4]; g++) vi[gSlot[g]] -= gWeight[g] * wPow[gPow[g]];
    return factorSparseLu(this.plan, vr, vi, this.invRe, this.invIm);
  }

  /** x = A^-1 b into xr/xi (after factorAt). */
  private solveRhs(): void {
    const { br, bi } = this;
    br.fill(0);
    bi.fill(0);
    for (let i = 0; i < this.bRow.length; i++) br[this.bRow[i]] += this.bVal[i];
    if (this.kernels) this.kernels.solve(this.vr, this.vi, this.invRe, this.invIm, br, bi, this.xr, this.xi);
    else solveSparseLu(this.plan, this.vr, this.vi, this.invRe, this.invIm, br, bi, this.xr, this.xi);
  }

  /** dx/dw = -A^-1 (dA/dw) x into dr/di (after solveRhs). d/dw of w^k j^k is k w^(k-1) j^k. */
  private solveDerivative(): void {
    const { br, bi, xr, xi, wPow, gRow, gCol, gPow, gWeight } = this;
    br.fill(0);
    bi.fill(0);
    for (let g = 0; g < gRow.length; g++) {
      const k = gPow[g];
      if (k === 0) continue;
      const d = k * gWeight[g] * wPow[k - 1]; // times j^k
      const c = gCol[g];
      const r = gRow[g];
      // y_r += d j^k x_c, with the right-hand side -y
      switch (k & 3) {
        case 0:
          br[r] -= d * xr[c];
          bi[r] -= d * xi[c];
          break;
        case 1: // j * (a + jb) = -b + ja
          br[r] += d * xi[c];
          bi[r] -= d * xr[c];
          break;
        case 2:
          br[r] += d * xr[c];
          bi[r] += d * xi[c];
          break;
        default: // -j * (a + jb) = b - ja
          br[r] -= d * xi[c];
          bi[r] += d * xr[c];
      }
    }
    if (this.kernels) this.kernels.solve(this.vr, this.vi, this.invRe, this.invIm, br, bi, this.dr, this.di);
    else solveSparseLu(this.plan, this.vr, this.vi, this.invRe, this.invIm, br, bi, this.dr, this.di);
  }

  solveAt(frequencyHz: number, out: AcSolution = this.createSolution()): AcSolution {
    const ok = this.factorAt(2 * Math.PI * frequencyHz);
    if (!ok) {
      out.re.fill(NaN);
      out.im.fill(NaN);
      out.hRe = NaN;
      out.hIm = NaN;
      return out;
    }
    this.solveRhs();
    const { xr, xi, tmp } = this;
    if (this.refIdx.length === 0) {
      out.re.set(xr);
      out.im.set(xi);
    } else {
      combine(this.refIdx, this.refW, xr, xi, tmp, 0);
      const rr = tmp[0];
      const ri = tmp[1];
      for (let i = 0; i < this.n; i++) {
        cdiv(xr[i], xi[i], rr, ri, tmp, 2);
        out.re[i] = tmp[2];
        out.im[i] = tmp[3];
      }
    }
    combine(this.outIdx, this.outW, out.re, out.im, tmp, 0);
    out.hRe = tmp[0];
    out.hIm = tmp[1];
    return out;
  }

  transferAt(frequencyHz: number, out: Float64Array = new Float64Array(2)): Float64Array {
    if (this.transferKernel) {
      if (!this.transferKernel(2 * Math.PI * frequencyHz, this.gWeight, out)) {
        out[0] = NaN;
        out[1] = NaN;
      }
      return out;
    }
    const ok = this.factorAt(2 * Math.PI * frequencyHz);
    if (!ok) {
      out[0] = NaN;
      out[1] = NaN;
      return out;
    }
    this.solveRhs();
    const { tmp } = this;
    combine(this.outIdx, this.outW, this.xr, this.xi, out, 0);
    if (this.refIdx.length > 0) {
      combine(this.refIdx, this.refW, this.xr, this.xi, tmp, 0);
      cdiv(out[0], out[1], tmp[0], tmp[1], out, 0);
    }
    return out;
  }

  sweep(frequenciesHz: ArrayLike<number>, options: AcSweepOptions = {}): AcSweep {
    const m = frequenciesHz.length;
    const which = options.nodes ?? 'all';
    const nodeNames = which === 'all' ? this.unknowns.slice(0, this.nodeCount) : which === 'none' ? [] : which;
    const nodeIdx = nodeNames.map((name) => {
      const i = this.unknowns.indexOf(name);
      if (i < 0 || i >= this.nodeCount) throw new InvalidInputError('INVALID_ARGUMENT', 'options.nodes', name, 'is not a node of the compiled circuit');
      return i;
    });
    const frequencyHz = Float64Array.from(frequenciesHz);
    const gainDb = new Float64Array(m);
    const phaseDeg = new Float64Array(m);
    const groupDelayS = new Float64Array(m);
    const nodes: Record<string, { re: Float64Array; im: Float64Array }> = {};
    const nodeArrays = nodeNames.map((name) => (nodes[name] = { re: new Float64Array(m), im: new Float64Array(m) }));
    let prevRaw = NaN;
    let prevPhase = 0;
    let offset = 0;
    for (let p = 0; p < m; p++) {
      const f = frequencyHz[p];
      if (!this.factorAt(2 * Math.PI * f)) {
        gainDb[p] = phaseDeg[p] = groupDelayS[p] = NaN;
        for (const a of nodeArrays) a.re[p] = a.im[p] = NaN;
        continue;
      }
      this.solveRhs();
      this.solveDerivative();
      const { tmp, xr, xi } = this;
      combine(this.outIdx, this.outW, xr, xi, tmp, 0); // c.x
      combine(this.outIdx, this.outW, this.dr, this.di, tmp, 2); // c.x'
      cdiv(tmp[2], tmp[3], tmp[0], tmp[1], tmp, 4); // H'/H = c.x'/c.x
      let hr = tmp[0];
      let hi = tmp[1];
      let gi = tmp[5];
      if (this.refIdx.length > 0) {
        combine(this.refIdx, this.refW, xr, xi, tmp, 2); // r.x
        const rr = tmp[2];
        const ri = tmp[3];
        cdiv(hr, hi, rr, ri, tmp, 0);
        hr = tmp[0];
        hi = tmp[1];
        combine(this.refIdx, this.refW, this.dr, this.di, tmp, 4);
        cdiv(tmp[4], tmp[5], rr, ri, tmp, 6);
        gi -= tmp[7]; // - r.x'/r.x
        for (let k = 0; k < nodeArrays.length; k++) {
          cdiv(xr[nodeIdx[k]], xi[nodeIdx[k]], rr, ri, tmp, 0);
          nodeArrays[k].re[p] = tmp[0];
          nodeArrays[k].im[p] = tmp[1];
        }
      } else {
        for (let k = 0; k < nodeArrays.length; k++) {
          nodeArrays[k].re[p] = xr[nodeIdx[k]];
          nodeArrays[k].im[p] = xi[nodeIdx[k]];
        }
      }
      gainDb[p] = 20 * Math.log10(Math.hypot(hr, hi));
      groupDelayS[p] = -gi; // tau = -d arg H / dw = -Im(H'/H)
      const raw = Math.atan2(hi, hr);
      // Unwrap: remove the multiple of 2 pi that makes each step smaller than pi in magnitude.
      if (Number.isFinite(prevRaw)) offset -= 2 * Math.PI * Math.round((raw + offset - prevPhase) / (2 * Math.PI));
      prevRaw = raw;
      prevPhase = raw + offset;
      phaseDeg[p] = (prevPhase * 180) / Math.PI;
    }
    return { frequencyHz, gainDb, phaseDeg, groupDelayS, nodes };
  }
}

function cumulative(xs: readonly number[]): number[] {
  let acc = 0;
  return xs.map((x) => (acc += x));
}


/** sum w_k x[idx_k] into out[at], out[at + 1] (no allocation). */
function combine(idx: Int32Array, w: Float64Array, xr: ArrayLike<number>, xi: ArrayLike<number>, out: Float64Array, at: number): void {
  let r = 0;
  let i = 0;
  for (let k = 0; k < idx.length; k++) {
    r += w[k] * xr[idx[k]];
    i += w[k] * xi[idx[k]];
  }
  out[at] = r;
  out[at + 1] = i;
}

/** (ar + j ai) / (br + j bi) into out[at], out[at + 1], by Smith's scaled division (R. L. Smith, CACM 5(8), 1962). */
function cdiv(ar: number, ai: number, br: number, bi: number, out: Float64Array, at: number): void {
  if (Math.abs(br) >= Math.abs(bi)) {
    const t = bi / br;
    const d = br + bi * t;
    out[at] = (ar + ai * t) / d;
    out[at + 1] = (ai - ar * t) / d;
    return;
  }
  const t = br / bi;
  const d = br * t + bi;
  out[at] = (ar * t + ai) / d;
  out[at + 1] = (ai * t - ar) / d;
}
