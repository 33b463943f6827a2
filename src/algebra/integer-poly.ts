/**
 * Integer polynomials as ascending arrays of bigint, trimmed (no trailing zeros; [] is zero), and the
 * modular gcd the exact core relies on. These are the kernels under {@link Poly}; they allocate plain
 * arrays and never throw on valid input.
 *
 * The gcd is the modular algorithm (W. S. Brown, "On Euclid's algorithm and the computation of
 * polynomial greatest common divisors", J. ACM 18(4), 1971; J. von zur Gathen and J. Gerhard, "Modern
 * Computer Algebra", 3rd ed., 2013, Algorithm 6.38): the gcd modulo many word-size primes, combined by
 * the Chinese remainder theorem and checked by trial division. Euclid's algorithm over Q, by contrast,
 * grows intermediate coefficients to thousands of digits at degree 20 (measured: a sum of 39 rational
 * functions of degree 2 took 160 s with rational Euclid, well under a second this way).
 */
export type IntPoly = bigint[];

/** Primes below 2^26: a product of two residues stays below 2^52 and is exact in a double. */
const PRIME_LIMIT = 2 ** 26;

const primeCache: number[] = [];
/** The k-th prime below PRIME_LIMIT counting down (deterministic, so results are reproducible). */
function prime(k: number): number {
  let c = primeCache.length === 0 ? PRIME_LIMIT - 1 : primeCache[primeCache.length - 1] - 2;
  while (primeCache.length <= k) {
    let isPrime = true;
    for (let d = 3; d * d <= c; d += 2) {
      if (c % d === 0) {
        isPrime = false;
        break;
      }
    }
    if (isPrime) primeCache.push(c);
    c -= 2;
  }
  return primeCache[k];
}

export function ipTrim(a: IntPoly): IntPoly {
  let n = a.length;
  while (n > 0 && a[n - 1] === 0n) n--;
  return n === a.length ? a : a.slice(0, n);
}

export const absBig = (x: bigint): bigint => (x < 0n ? -x : x);

export function gcdBig(a: bigint, b: bigint): bigint {
  let x = absBig(a);
  let y = absBig(b);
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}

/** Content: the gcd of the coefficients, positive (0 for the zero polynomial). */
export function ipContent(a: IntPoly): bigint {
  let g = 0n;
  for (const c of a) {
    g = gcdBig(g, c);
    if (g === 1n) return 1n;
  }
  return g;
}

export function ipMul(a: IntPoly, b: IntPoly): IntPoly {
  if (a.length === 0 || b.length === 0) return [];
  const out: bigint[] = new Array(a.length + b.length - 1).fill(0n);
  for (let i = 0; i < a.length; i++) {
    const ai = a[i];
    if (ai === 0n) continue;
    for (let j = 0; j < b.length; j++) out[i + j] += ai * b[j];
  }
  return out;
}

/** a * ka + b * kb, trimmed. */
export function ipLinear(a: IntPoly, ka: bigint, b: IntPoly, kb: bigint): IntPoly {
  const n = Math.max(a.length, b.length);
  const out: bigint[] = new Array(n);
  for (let i = 0; i < n; i++) out[i] = (i < a.length ? a[i] * ka : 0n) + (i < b.length ? b[i] * kb : 0n);
  return ipTrim(out);
}

/**
 * Pseudo-division: lc(b)^(deg a - deg b + 1) * a = q * b + r with integer q, r (deg r < deg b).
 * Requires b nonzero.
 */
export function ipPseudoDivide(a: IntPoly, b: IntPoly): { q: IntPoly; r: IntPoly; k: number } {
  const db = b.length - 1;
  const lead = b[db];
  if (a.length - 1 < db) return { q: [], r: a.slice(), k: 0 };
  const k = a.length - 1 - db + 1;
  const r = a.slice();
  const q: bigint[] = new Array(a.length - db).fill(0n);
  for (let i = a.length - 1; i >= db; i--) {
    // r <- lead * r - r[i] x^(i-db) b ; q <- lead * q + r[i] x^(i-db)
    const c = r[i];
    for (let j = 0; j < q.length; j++) q[j] *= lead;
    q[i - db] += c;
    for (let j = 0; j < i; j++) r[j] *= lead;
    r[i] = 0n;
    if (c !== 0n) for (let j = 0; j < db; j++) r[i - db + j] -= c * b[j];
  }
  return { q: ipTrim(q), r: ipTrim(r.slice(0, db)), k };
}

/** a / b when b divides a exactly over Z (quotient has integer coefficients), else null. */
export function ipExactQuotient(a: IntPoly, b: IntPoly): IntPoly | null {
  if (a.length === 0) return [];
  const db = b.length - 1;
  if (a.length - 1 < db) return null;
  const lead = b[db];
  const r = a.slice();
  const q: bigint[] = new Array(a.length - db).fill(0n);
  for (let i = a.length - 1; i >= db; i--) {
    const c = r[i];
    if (c === 0n) continue;
    if (c % lead !== 0n) return null;
    const f = c / lead;
    q[i - db] = f;
    for (let j = 0; j <= db; j++) r[i - db + j] -= f * b[j];
  }
  for (let j = 0; j < db; j++) if (r[j] !== 0n) return null;
  return q;
}

// ---- arithmetic modulo a word-size prime p (residues as doubles, products < 2^52) ----

const mulMod = (a: number, b: number, p: number): number => (a * b) % p;

function invMod(x: number, p: number): number {
  let r0 = p;
  let r1 = x % p;
  let t0 = 0;
  let t1 = 1;
  while (r1 !== 0) {
    const q = Math.floor(r0 / r1);
    [r0, r1] = [r1, r0 - q * r1];
    [t0, t1] = [t1, t0 - q * t1];
  }
  return ((t0 % p) + p) % p;
}

function reduceMod(a: IntPoly, p: number): number[] {
  const P = BigInt(p);
  const out = a.map((x) => {
    const r = Number(x % P);
    return r < 0 ? r + p : r;
  });
  let n = out.length;
  while (n > 0 && out[n - 1] === 0) n--;
  out.length = n;
  return out;
}

/** Monic gcd over GF(p) of residue polynomials (ascending). */
function gcdMod(a0: number[], b0: number[], p: number): number[] {
  let a = a0.slice();
  let b = b0.slice();
  if (a.length < b.length) [a, b] = [b, a];
  while (b.length > 0) {
    const inv = invMod(b[b.length - 1], p);
    while (a.length >= b.length && a.length > 0) {
      const f = mulMod(a[a.length - 1], inv, p);
      const shift = a.length - b.length;
      for (let j = 0; j < b.length; j++) {
        const v = a[shift + j] - mulMod(f, b[j], p);
        a[shift + j] = v < 0 ? v + p : v;
      }
      while (a.length > 0 && a[a.length - 1] === 0) a.pop();
    }
    [a, b] = [b, a];
  }
  if (a.length === 0) return a;
  const inv = invMod(a[a.length - 1], p);
  return a.map((c) => mulMod(c, inv, p));
}

/** The primitive part with a positive leading coefficient. */
export function ipPrimitive(a: IntPoly): IntPoly {
  if (a.length === 0) return a;
  let g = ipContent(a);
  if (a[a.length - 1] < 0n) g = -g;
  return g === 1n ? a : a.map((c) => c / g);
}

/**
 * gcd of two integer polynomials: primitive, positive leading coefficient; gcd(0, b) = pp(b), and
 * gcd(0, 0) = [].
 */
export function ipGcd(a0: IntPoly, b0: IntPoly): IntPoly {
  const a = ipPrimitive(ipTrim(a0));
  const b = ipPrimitive(ipTrim(b0));
  if (a.length === 0) return b;
  if (b.length === 0) return a;
  if (a.length === 1 || b.length === 1) return [1n];
  const lcA = a[a.length - 1];
  const lcB = b[b.length - 1];
  const h = gcdBig(lcA, lcB); // the gcd's leading coefficient divides h; scale images by it
  let minDegree = Math.min(a.length, b.length) - 1;
  let modulus = 1n;
  let combined: bigint[] | null = null; // CRT image of h * monic gcd, symmetric residues
  let lastCandidate: IntPoly | null = null;
  for (let k = 0; ; k++) {
    const p = prime(k);
    const P = BigInt(p);
    if (lcA % P === 0n || lcB % P === 0n) continue;
    const g = gcdMod(reduceMod(a, p), reduceMod(b, p), p);
    const d = g.length - 1;
    if (d === 0) return [1n];
    if (d > minDegree) continue; // an unlucky prime
    const hm = Number(((h % P) + P) % P);
    const image = g.map((c) => BigInt(mulMod(c, hm, p)));
    if (d < minDegree || combined === null) {
      minDegree = d;
      combined = image;
      modulus = P;
    } else {
      // Chinese remainder: x = combined (mod modulus), x = image (mod P)
      const inv = BigInt(invMod(Number(((modulus % P) + P) % P), p));
      combined = combined.map((c, i) => {
        const t = ((((image[i] - c) % P) + P) % P * inv) % P;
        return c + modulus * t;
      });
      modulus *= P;
    }
    const half = modulus / 2n;
    const symmetric = combined.map((c) => (c > half ? c - modulus : c));
    const candidate = ipPrimitive(symmetric);
    const same = lastCandidate !== null && lastCandidate.length === candidate.length && lastCandidate.every((c, i) => c === candidate[i]);
    lastCandidate = candidate;
    // Trial division once the image has stopped changing: a candidate dividing both is the gcd.
    if (same && ipExactQuotient(a, candidate) !== null && ipExactQuotient(b, candidate) !== null) return candidate;
  }
}
