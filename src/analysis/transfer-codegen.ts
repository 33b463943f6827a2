/**
 * A fused straight-line kernel for one number per frequency: H(j w) = c.x / r.x with A(j w) x = b.
 * Fill, factorisation, forward substitution and the back substitution of only the unknowns the output
 * (and reference) combinations need, in one generated function whose matrix entries are local
 * variables instead of array slots: no L and U are stored, nothing else is solved. This is what the
 * Monte Carlo and trim loops call (CompiledAc.transferAt), 16 to 30 times per trial.
 *
 * Every operation and its order are those of lu-codegen.ts's fill + factor and solve followed by the
 * engine's combination and Smith division, so H is the same bit for bit; only stores, loads and the
 * unused unknowns disappear. Returns false at a pivot that is zero or not finite (the caller reports
 * NaN, as the engine does).
 *
 * The text holds only numeric literals from the plan and the circuit's constant right-hand side and
 * output weights (printed with String(), which round-trips a double exactly).
 */
import { cachedFunction, fillExpressions, MAX_GENERATED_OPERATIONS, numberLiteral, type FillGroup } from './lu-codegen';
import type { SparseLuPlan } from './sparse-lu';

/** sum of weight * x[index], in list order. */
export interface LinearTerm {
  readonly index: number;
  readonly weight: number;
}

/** (w, group weights, out) -> false at a bad pivot; else out[0], out[1] = Re, Im of H(j w). */
export type TransferKernel = (w: number, gw: Float64Array, out: Float64Array) => boolean;

export interface TransferProblem {
  /** Right-hand side entries (row, value), added into a zero vector in this order. */
  readonly rhs: readonly { readonly row: number; readonly value: number }[];
  readonly output: readonly LinearTerm[];
  /** Empty: H = c.x; else H = c.x / r.x. */
  readonly reference: readonly LinearTerm[];
}

/** The kernel, or null where `new Function` is unavailable or the plan is too large to pay off. */
export function generateTransferKernel(plan: SparseLuPlan, groups: readonly FillGroup[], problem: TransferProblem): TransferKernel | null {
  if (plan.target.length + plan.uSlot.length + plan.lSlot.length > MAX_GENERATED_OPERATIONS) return null;
  try {
    return cachedFunction(['w', 'gw', 'out'], transferSource(plan, groups, problem)) as TransferKernel;
  } catch {
    return null;
  }
}

const lit = numberLiteral;

function transferSource(plan: SparseLuPlan, groups: readonly FillGroup[], problem: TransferProblem): string {
  const { n, pivotSlot, pivotRow, pivotCol, lStart, lSlot, lRow, uStart, uSlot, uCol, tStart, target } = plan;
  const { powers, re, im } = fillExpressions(plan, groups);
  const lines: string[] = [...powers];
  for (let s = 0; s < plan.slotCount; s++) lines.push(`let r${s} = ${re[s]}, i${s} = ${im[s]};`);
  lines.push('let ar, ai, t, d, lr, li, yr, yi;');
  // factorisation, as lu-codegen's factorSource with slots as locals; pivot inverses in p{k}/q{k}
  for (let k = 0; k < n; k++) {
    const ps = pivotSlot[k];
    lines.push(
      `let p${k}, q${k};`,
      `if (Math.abs(r${ps}) >= Math.abs(i${ps})) { t = i${ps} / r${ps}; d = r${ps} + i${ps} * t; p${k} = 1 / d; q${k} = -t / d; } else { t = r${ps} / i${ps}; d = r${ps} * t + i${ps}; p${k} = t / d; q${k} = -1 / d; }`,
      `if (p${k} - p${k} !== 0 || q${k} - q${k} !== 0) return false;`,
    );
    for (let e = lStart[k]; e < lStart[k + 1]; e++) {
      const ls = lSlot[e];
      lines.push(`lr = r${ls} * p${k} - i${ls} * q${k}; li = r${ls} * q${k} + i${ls} * p${k}; r${ls} = lr; i${ls} = li;`);
      let tt = tStart[e];
      for (let m = uStart[k]; m < uStart[k + 1]; m++, tt++) {
        const us = uSlot[m];
        const ts = target[tt];
        lines.push(`r${ts} -= lr * r${us} - li * i${us}; i${ts} -= lr * i${us} + li * r${us};`);
      }
    }
  }
  // b: rows that are structurally nonzero, as locals b{row}r / b{row}i
  const live = new Uint8Array(n);
  const init = new Map<number, string>();
  for (const { row, value } of problem.rhs) {
    live[row] = 1;
    const prev = init.get(row);
    init.set(row, prev === undefined ? `0 + ${lit(value)}` : `${prev} + ${lit(value)}`);
  }
  for (let row = 0; row < n; row++) lines.push(`let b${row}r = ${init.get(row) ?? '0'}, b${row}i = 0;`);
  // forward substitution (solveSparseLu's first loop), skipping steps whose y is structurally zero
  for (let k = 0; k < n; k++) {
    const pr = pivotRow[k];
    if (!live[pr] || lStart[k] === lStart[k + 1]) continue;
    const body: string[] = [];
    for (let e = lStart[k]; e < lStart[k + 1]; e++) {
      const ls = lSlot[e];
      const r = lRow[e];
      live[r] = 1;
      body.push(`b${r}r -= r${ls} * yr - i${ls} * yi; b${r}i -= r${ls} * yi + i${ls} * yr;`);
    }
    lines.push(`yr = b${pr}r; yi = b${pr}i;`, `if (yr !== 0 || yi !== 0) { ${body.join(' ')} }`);
  }
  // back substitution of the needed unknowns only: a step's unknown needs those of its U row (later steps)
  const stepOfCol = new Int32Array(n);
  for (let k = 0; k < n; k++) stepOfCol[pivotCol[k]] = k;
  const needed = new Uint8Array(n);
  for (const t of [...problem.output, ...problem.reference]) needed[stepOfCol[t.index]] = 1;
  for (let k = 0; k < n; k++) {
    if (!needed[k]) continue;
    for (let m = uStart[k]; m < uStart[k + 1]; m++) needed[stepOfCol[uCol[m]]] = 1;
  }
  for (let k = n - 1; k >= 0; k--) {
    if (!needed[k]) continue;
    const pr = pivotRow[k];
    lines.push(`ar = b${pr}r; ai = b${pr}i;`);
    for (let m = uStart[k]; m < uStart[k + 1]; m++) {
      const s = uSlot[m];
      const c = uCol[m];
      lines.push(`ar -= r${s} * x${c}r - i${s} * x${c}i; ai -= r${s} * x${c}i + i${s} * x${c}r;`);
    }
    const c = pivotCol[k];
    lines.push(`const x${c}r = ar * p${k} - ai * q${k}, x${c}i = ar * q${k} + ai * p${k};`);
  }
  // the combinations (ac-engine's combine: from 0, in list order) and Smith's division
  const combination = (terms: readonly LinearTerm[], name: string) => {
    lines.push(`let ${name}r = 0, ${name}i = 0;`);
    for (const t of terms) lines.push(`${name}r += ${lit(t.weight)} * x${t.index}r; ${name}i += ${lit(t.weight)} * x${t.index}i;`);
  };
  combination(problem.output, 'h');
  if (problem.reference.length === 0) {
    lines.push('out[0] = hr; out[1] = hi;');
  } else {
    combination(problem.reference, 'g');
    lines.push(
      'if (Math.abs(gr) >= Math.abs(gi)) { t = gi / gr; d = gr + gi * t; out[0] = (hr + hi * t) / d; out[1] = (hi - hr * t) / d; }',
      'else { t = gr / gi; d = gr * t + gi; out[0] = (hr * t + hi) / d; out[1] = (hi * t - hr) / d; }',
    );
  }
  lines.push('return true;');
  return lines.join('\n');
}
