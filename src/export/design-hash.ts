/**
 * A small deterministic hash for the "design hash" line of generated files: FNV-1a, 64 bits
 * (G. Fowler, L. C. Noll, K.-P. Vo, D. Eastlake, "The FNV Non-Cryptographic Hash Algorithm",
 * draft-eastlake-fnv, section 2), over the UTF-8 bytes of a string. It identifies a design, it does not
 * protect anything (not a cryptographic hash). Pure TypeScript with BigInt: no node:crypto in the core.
 */

/** FNV-1a 64 offset basis and prime (draft-eastlake-fnv, section 2.3 and 5). */
const FNV64_OFFSET_BASIS = 0xcbf29ce484222325n;
const FNV64_PRIME = 0x100000001b3n;
const MASK_64 = (1n << 64n) - 1n;

/**
 * FNV-1a 64 of the UTF-8 bytes of `text`, as 16 lowercase hex digits.
 *
 * @example
 * fnv1a64('a'); // 'af63dc4c8601ec8c'
 */
export function fnv1a64(text: string): string {
  let h = FNV64_OFFSET_BASIS;
  for (const byte of new TextEncoder().encode(text)) {
    h ^= BigInt(byte);
    h = (h * FNV64_PRIME) & MASK_64;
  }
  return h.toString(16).padStart(16, '0');
}

/**
 * JSON with object keys sorted at every level, so equal data hashes equally whatever the key order.
 * Numbers use JavaScript's shortest round-trip form; undefined members are left out (as JSON.stringify).
 */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) => {
    if (v === null || typeof v !== 'object' || Array.isArray(v)) return v;
    const sorted: Record<string, unknown> = {};
    for (const k of Object.keys(v as Record<string, unknown>).sort()) sorted[k] = (v as Record<string, unknown>)[k];
    return sorted;
  });
}

/** `fnv1a64:<hex>` of the canonical JSON of a design (or of any JSON-able value). */
export function hashDesign(value: unknown): string {
  return `fnv1a64:${fnv1a64(canonicalJson(value) ?? 'undefined')}`;
}
