/**
 * Integer polynomials as raw arrays of bigint (ascending coefficients, trimmed: the last entry is never
 * 0n; the zero polynomial is the empty array). The kernel of the fraction-free elimination: plain
 * arrays avoid the allocation and gcd work of Fraction objects. Inputs are never mutated.
 */
export type IntPoly = bigint[];

export function ipTrim(a: IntPoly): IntPoly {
  let n = a.length;
  while (n > 0 && a[n - 1] === 0n) n--;
  if (n !== a.length) a.length = n;
  return a;
}

export function ipMul(a: IntPoly, b: IntPoly): IntPoly {
  const la = a.length;
  const lb = b.length;
  if (la === 0 || lb === 0) return [];
  if (la === 1 && a[0] === 1n) return b.slice();
  if (lb === 1 && b[0] === 1n) return a.slice();
  const out: IntPoly = new Array(la + lb - 1).fill(0n);
  for (let i = 0; i < la; i++) {
    const x = a[i];
    if (x === 0n) continue;
    for (let j = 0; j < lb; j++) out[i + j] += x * b[j];
  }
  return ipTrim(out);
}

/** a*b - c*d in one pass (the Bareiss update's numerator), without the intermediate products. */
export function ipMulSub(a: IntPoly, b: IntPoly, c: IntPoly, d: IntPoly): IntPoly {
  const n = Math.max(a.length + b.length, c.length + d.length) - 1;
  if (n <= 0) return [];
  const out: IntPoly = new Array(n).fill(0n);
  for (let i = 0; i < a.length; i++) {
    const x = a[i];
    if (x === 0n) continue;
    for (let j = 0; j < b.length; j++) out[i + j] += x * b[j];
  }
  for (let i = 0; i < c.length; i++) {
    const x = c[i];
    if (x === 0n) continue;
    for (let j = 0; j < d.length; j++) out[i + j] -= x * d[j];
  }
  return ipTrim(out);
}

export function ipNeg(a: IntPoly): IntPoly {
  return a.map((x) => -x);
}

/**
 * The exact quotient a / b, for b dividing a in Z[s] (the Bareiss divisions are exact: Bareiss, "Sylvester's
 * identity and multistep integer-preserving Gaussian elimination", Math. Comp. 22, 1968). Long
 * division from the leading term; each coefficient division is an exact bigint division.
 */
export function ipExactDiv(a: IntPoly, b: IntPoly): IntPoly {
  const lb = b.length;
  if (lb === 1) {
    const d = b[0];
    if (d === 1n) return a.slice();
    if (d === -1n) return ipNeg(a);
    return a.map((x) => x / d);
  }
  const la = a.length;
  if (la === 0) return [];
  const r = a.slice();
  const lead = b[lb - 1];
  const q: IntPoly = new Array(la - lb + 1).fill(0n);
  for (let k = la - lb; k >= 0; k--) {
    const c = r[k + lb - 1] / lead;
    q[k] = c;
    if (c === 0n) continue;
    for (let j = 0; j < lb; j++) r[k + j] -= c * b[j];
  }
  return ipTrim(q);
}

/** The gcd of the coefficients (the content), 0n for the zero polynomial; always >= 0. */
export function ipContent(a: IntPoly): bigint {
  let g = 0n;
  for (const x of a) {
    let y = x < 0n ? -x : x;
    let z = g;
    while (y !== 0n) [z, y] = [y, z % y];
    g = z;
    if (g === 1n) return 1n;
  }
  return g;
}

/** A rough size for pivot choice: the bit length of the largest coefficient plus 64 per degree. */
export function ipCost(a: IntPoly): number {
  let bits = 0;
  for (const x of a) {
    const b = (x < 0n ? -x : x).toString(16).length * 4;
    if (b > bits) bits = b;
  }
  return bits + 64 * (a.length - 1);
}
