/**
 * Generators for the robustness tests: design files that are structurally valid but extreme, design
 * files that are garbage or one field away from valid, hostile text, CSV text and CLI argument lists.
 *
 * The valid generators stay cheap to design (low orders, coarse sweeps, ideal or fast op-amp models)
 * so that a fuzz run can afford full designs; the extreme corners are covered one by one in
 * extreme-designs.test.ts.
 */
import fc from 'fast-check';
import { GicladderError } from '../../src/errors';

export const FILTER_TYPES = ['lowpass', 'highpass', 'bandpass', 'bandstop'] as const;
export const FAMILIES = ['butterworth', 'chebyshev', 'inverse-chebyshev', 'elliptic', 'bessel'] as const;

/** Text meant to break out of a C string or comment, a SPICE card, a JSON report or a shell line. */
export const HOSTILE_STRINGS: readonly string[] = [
  '"quoted" name',
  "it's",
  'line1\nline2',
  'cr\rlf\r\n',
  'end */ int evil = 1; /*',
  '/* open comment',
  '// line comment',
  '#define FILTER_H 1',
  '\n#include <stdio.h>\n',
  '??/ trigraph ??= ??( ??) ??\'',
  'back\\slash\\',
  '\\"escaped',
  '.control\nshell rm -rf x\n.endc',
  '* spice comment',
  '+ continuation',
  'R1 in 0 1k',
  '\u0000nul',
  '\u2028line separator\u2029',
  'Tiefpass für Geophon µ Ω',
  '\u{1F4A9} emoji',
  '\uD800 lone surrogate',
  'A'.repeat(1000),
  ' ',
  '$(touch pwned)',
  '`id`',
  '<script>alert(1)</script>',
  '%s%n%x',
  'constructor',
  '__proto__',
  'toString',
];

/** Arbitrary hostile text: the listed strings, mixes of them, and random unicode. */
export const hostileText: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...HOSTILE_STRINGS),
  fc.array(fc.constantFrom(...HOSTILE_STRINGS, 'x', '_', '1'), { minLength: 1, maxLength: 4 }).map((a) => a.join('')),
  fc.string({ unit: 'grapheme', minLength: 1, maxLength: 40 }),
  fc.string({ unit: 'binary', minLength: 1, maxLength: 40 }),
);

/** A frequency as a design file may write it: a number or a quantity string. */
function frequencyText(hz: number): fc.Arbitrary<number | string> {
  return fc.constantFrom<number | string>(hz, `${hz}`, `${hz} Hz`);
}

/**
 * A structurally valid design file that designs quickly: order 1..4, any type and family, edges from
 * 1 Hz to 10 MHz, ripple and attenuation anywhere in their legal ranges, any impedance level, an ideal,
 * finite-gain or single-pole op-amp, a coarse evaluation grid.
 */
export const cheapValidSpec: fc.Arbitrary<Record<string, unknown>> = fc
  .record({
    type: fc.constantFrom(...FILTER_TYPES),
    family: fc.constantFrom(...FAMILIES),
    order: fc.integer({ min: 1, max: 4 }),
    edgeExponent: fc.double({ min: 0, max: 7, noNaN: true }), // 1 Hz .. 10 MHz
    relativeBandwidth: fc.double({ min: 0.01, max: 2, noNaN: true }),
    ripple: fc.option(fc.double({ min: 0.001, max: 3, noNaN: true }), { nil: undefined }),
    attenuation: fc.option(fc.double({ min: 20, max: 120, noNaN: true }), { nil: undefined }),
    level: fc.oneof(
      fc.record({ impedanceOhms: fc.double({ min: 100, max: 1e7, noNaN: true }) }),
      fc.record({ capacitorF: fc.double({ min: 1e-12, max: 1e-5, noNaN: true }) }),
      fc.constant({}),
    ),
    opamp: fc.oneof(
      fc.constant({ model: 'ideal' }),
      fc.record({ model: fc.constant('finite-gain'), openLoopGainDb: fc.double({ min: 20, max: 160, noNaN: true }) }),
      fc.record({ model: fc.constant('single-pole'), gainBandwidthHz: fc.double({ min: 1e3, max: 1e10, noNaN: true }), openLoopGainDb: fc.double({ min: 40, max: 140, noNaN: true }) }),
    ),
    selection: fc.constantFrom('exact', 'round', 'capacitors-first'),
    name: fc.oneof(fc.constant('fuzz'), hostileText.filter((s) => s.length <= 1000)),
  })
  .chain((r) =>
    frequencyText(Number((10 ** r.edgeExponent).toPrecision(6))).map((edgeText) => {
      const edge = Number((10 ** r.edgeExponent).toPrecision(6));
      const banded = r.type === 'bandpass' || r.type === 'bandstop';
      const high = Number((edge * (1 + r.relativeBandwidth)).toPrecision(6));
      const order = r.family === 'elliptic' ? Math.max(2, r.order) : r.order;
      const response: Record<string, unknown> = { type: r.type, family: r.family, order, passbandEdgeHz: banded ? [edge, high] : edgeText };
      if (r.ripple !== undefined) response.passbandRippleDb = r.ripple;
      if (r.attenuation !== undefined) response.stopbandAttenuationDb = r.attenuation;
      return {
        name: r.name,
        response,
        realization: { method: 'auto', ...r.level },
        parts: { opamp: r.opamp, selection: r.selection },
        evaluation: { sweepPoints: 16 },
      };
    }),
  );

/** Values that are wrong almost everywhere in a design file. */
export const garbageValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(NaN, Infinity, -Infinity, -0, 0, -1, 1e308, 5e-324, 2 ** 53 + 1, -1e-300),
  fc.constantFrom('', ' ', 'NaN', 'Infinity', '1e999', '-1k', '4k7k', '1..2', '0x10', '10 nF', '10 Hz', '\u0000', 'µ'),
  fc.constantFrom(null, undefined, true, false, [], {}, [1], [2, 1], [1, 2, 3], [NaN, 1], ['1k', '2k']),
  fc.constantFrom({ __proto__: { polluted: true } }, JSON.parse('{"__proto__": {"polluted": true}}'), { constructor: { prototype: { polluted: true } } }),
  fc.double(),
  fc.integer(),
  fc.string({ maxLength: 80 }),
  fc.bigInt(),
  fc.anything({ maxDepth: 2 }),
);

/** The paths of a design file's fields, where a garbage value is put. */
const FIELD_PATHS: readonly (readonly string[])[] = [
  ['name'],
  ['response'],
  ['response', 'type'],
  ['response', 'family'],
  ['response', 'order'],
  ['response', 'passbandEdgeHz'],
  ['response', 'stopbandEdgeHz'],
  ['response', 'passbandRippleDb'],
  ['response', 'stopbandAttenuationDb'],
  ['response', 'besselNormalization'],
  ['realization'],
  ['realization', 'method'],
  ['realization', 'impedanceOhms'],
  ['realization', 'capacitorF'],
  ['realization', 'gicResistanceOhms'],
  ['realization', 'buffers'],
  ['realization', 'buffers', 'input'],
  ['parts'],
  ['parts', 'opamp'],
  ['parts', 'opamp', 'model'],
  ['parts', 'opamp', 'gainBandwidthHz'],
  ['parts', 'opamp', 'openLoopGainDb'],
  ['parts', 'opamp', 'supplyV'],
  ['parts', 'opamp', 'outputSwingV'],
  ['parts', 'resistors', 'series'],
  ['parts', 'resistors', 'minOhms'],
  ['parts', 'capacitors', 'maxF'],
  ['parts', 'selection'],
  ['parts', 'searchMaxEvaluations'],
  ['evaluation', 'sweepPoints'],
  ['evaluation', 'maxPassbandErrorDb'],
  ['evaluation', 'precompensate'],
  ['production', 'testPoints'],
  ['production', 'trials'],
  ['production', 'seed'],
  ['trim', 'element'],
  ['trim', 'device', 'steps'],
  ['export', 'identifierPrefix'],
  ['export', 'fixedPointFormat'],
  ['export', 'sampleRateHz'],
  ['__proto__'],
  ['constructor'],
  ['response', '__proto__'],
  ['parts', 'opamp', 'constructor'],
  ['prototype'],
  ['unknownField'],
  ['response', 'passbandEdgeHZ'],
];

/** A deep copy of `spec` with `value` at `path` (creating objects on the way); `__proto__` set as an own key. */
export function withField(spec: Record<string, unknown>, path: readonly string[], value: unknown): Record<string, unknown> {
  const root = structuredClone(spec);
  let node: Record<string, unknown> = root;
  for (let i = 0; i < path.length - 1; i++) {
    const next = Object.prototype.hasOwnProperty.call(node, path[i]) ? node[path[i]] : undefined;
    const child = typeof next === 'object' && next !== null && !Array.isArray(next) ? (next as Record<string, unknown>) : {};
    Object.defineProperty(node, path[i], { value: child, enumerable: true, writable: true, configurable: true });
    node = child;
  }
  Object.defineProperty(node, path[path.length - 1], { value, enumerable: true, writable: true, configurable: true });
  return root;
}

/** A valid cheap spec with one to three fields replaced by garbage: mostly invalid, sometimes still valid. */
export const mutatedSpec: fc.Arbitrary<Record<string, unknown>> = fc
  .tuple(cheapValidSpec, fc.array(fc.tuple(fc.constantFrom(...FIELD_PATHS), garbageValue), { minLength: 1, maxLength: 3 }))
  .map(([spec, edits]) => edits.reduce((s, [path, value]) => withField(s, path, value), spec));

/** Anything at all where a design file is expected. */
export const garbageSpec: fc.Arbitrary<unknown> = fc.oneof(
  fc.anything({ withBigInt: true, withMap: true, withSet: true, withDate: true, withTypedArray: true, withSparseArray: true, withNullPrototype: true, withObjectString: true }),
  fc.jsonValue(),
  fc.json().map((text) => JSON.parse(text) as unknown),
  fc.dictionary(fc.constantFrom('name', 'response', 'parts', 'realization', '__proto__', 'constructor', 'prototype', 'x'), fc.anything({ maxDepth: 3 })),
);

/** Deeply nested and very wide values: the reader must refuse them without blowing the stack. */
export function nested(depth: number): unknown {
  let v: unknown = 1;
  for (let i = 0; i < depth; i++) v = { response: v };
  return v;
}

export interface ErrorTally {
  /** Cases run. */
  runs: number;
  /** Cases that returned a result. */
  accepted: number;
  /** Typed errors by `ClassName/CODE`. */
  errors: Map<string, number>;
  /** Called with each typed error (for exploring a generator; unused by the tests). */
  onError?: (error: GicladderError, input: unknown) => void;
}

export function newTally(): ErrorTally {
  return { runs: 0, accepted: 0, errors: new Map() };
}

/**
 * Runs `f`; a result counts as accepted, a GicladderError with a string code and path is tallied by
 * class and code, anything else fails the test (rethrown with the input in the message).
 */
export function expectTyped<T>(tally: ErrorTally, input: unknown, f: () => T): T | undefined {
  tally.runs++;
  try {
    const r = f();
    tally.accepted++;
    return r;
  } catch (e) {
    if (!(e instanceof GicladderError) || typeof e.code !== 'string' || typeof e.path !== 'string' || !('value' in e)) {
      throw new Error(`untyped error ${(e as Error)?.constructor?.name}: ${(e as Error)?.stack ?? String(e)}\ninput: ${safeShow(input)}`);
    }
    const key = `${e.constructor.name}/${e.code}`;
    tally.errors.set(key, (tally.errors.get(key) ?? 0) + 1);
    tally.onError?.(e, input);
    return undefined;
  }
}

/** A one-line rendering of any value for failure messages (never throws). */
export function safeShow(v: unknown): string {
  try {
    const s = JSON.stringify(v, (_k, x: unknown) => (typeof x === 'bigint' ? `${x}n` : typeof x === 'number' && !Number.isFinite(x) ? String(x) : x));
    return s === undefined ? String(v) : s.length > 2000 ? `${s.slice(0, 2000)}...` : s;
  } catch {
    return Object.prototype.toString.call(v);
  }
}

/** Every number reachable in a JSON-like value that is NaN or infinite, with its path. */
export function nonFiniteNumbers(value: unknown, path = '', out: string[] = [], seen = new Set<unknown>()): string[] {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) out.push(`${path || '(root)'} = ${value}`);
    return out;
  }
  if (typeof value !== 'object' || value === null || seen.has(value)) return out;
  seen.add(value);
  if (Array.isArray(value) || ArrayBuffer.isView(value)) {
    const a = value as ArrayLike<unknown>;
    for (let i = 0; i < a.length; i++) nonFiniteNumbers(a[i], `${path}[${i}]`, out, seen);
    return out;
  }
  for (const [k, v] of Object.entries(value)) nonFiniteNumbers(v, path === '' ? k : `${path}.${k}`, out, seen);
  return out;
}

/** A snapshot of Object.prototype's own property names and descriptors' values, to compare after a run. */
export function prototypeSnapshot(): string {
  const protos = [Object.prototype, Array.prototype, Function.prototype, String.prototype, Number.prototype];
  return protos.map((p) => Object.getOwnPropertyNames(p).sort().join(',')).join('|');
}

/** Formats a tally for FIGURES.md and logs: runs, accepted, then each error class with its count. */
export function formatTally(name: string, t: ErrorTally): string {
  const errs = [...t.errors.entries()].sort((a, b) => b[1] - a[1]).map(([k, n]) => `${k} ${n}`).join(', ');
  return `${name}: ${t.runs} cases, ${t.accepted} accepted; errors: ${errs || 'none'}`;
}
