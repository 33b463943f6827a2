/**
 * Fuzzing the design-file reader (parseSpec). Whatever the input, the only way out is a normalised
 * spec or a SpecError (code INVALID_SPEC) whose issues each name a path; never another exception, a
 * stack overflow, a modified Object.prototype, or a spec with a non-finite number or an unsafe
 * identifier in it.
 *
 * Cases: 5,000 arbitrary values (fast-check's anything/json, dictionaries of the top-level keys and
 * the prototype-pollution keys), 6,000 valid files with one to three fields replaced by garbage, and
 * 1,000 valid files with hostile names: 12,000 in all (counted in FIGURES.md).
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseSpec, MAX_DEPTH, MAX_NODES } from '../../src/spec/parse-spec';
import { SpecError } from '../../src/spec/spec-error';
import { cheapValidSpec, expectTyped, formatTally, garbageSpec, hostileText, mutatedSpec, nested, newTally, nonFiniteNumbers, prototypeSnapshot, type ErrorTally } from './arbitraries';

const tallies: [string, ErrorTally][] = [];
const before = prototypeSnapshot();

/** One parseSpec call: a clean normalised spec, or a SpecError whose issues each have a path and a message. */
function checkOutcome(tally: ErrorTally, input: unknown): void {
  let error: unknown;
  const spec = expectTyped(tally, input, () => {
    try {
      return parseSpec(input);
    } catch (e) {
      error = e;
      throw e;
    }
  });
  expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  if (spec === undefined) {
    expect(error).toBeInstanceOf(SpecError);
    const err = error as SpecError;
    expect(err.code).toBe('INVALID_SPEC');
    expect(err.issues.length).toBeGreaterThan(0);
    for (const i of err.issues) {
      expect(typeof i.path).toBe('string');
      expect(i.message.length).toBeGreaterThan(0);
    }
    return;
  }
  expect(nonFiniteNumbers(spec)).toEqual([]);
  expect(spec.export.identifierPrefix).toMatch(/^[A-Za-z_][A-Za-z0-9_]{0,39}$/);
  expect(Object.getPrototypeOf(spec)).toBe(Object.prototype);
  for (const key of ['__proto__', 'constructor', 'prototype']) expect(Object.prototype.hasOwnProperty.call(spec, key)).toBe(false);
}

describe('parseSpec fuzzing', () => {
  afterAll(() => {
    for (const [name, t] of tallies) console.info(formatTally(`parseSpec ${name}`, t));
  });

  it('arbitrary values: a spec or a SpecError, nothing else (5,000 cases)', () => {
    const tally = newTally();
    tallies.push(['arbitrary values', tally]);
    fc.assert(
      fc.property(garbageSpec, (input) => {
        checkOutcome(tally, input);
      }),
      { numRuns: 5000 },
    );
    expect(tally.runs).toBe(5000);
  });

  it('valid files with one to three fields replaced by garbage (6,000 cases)', () => {
    const tally = newTally();
    tallies.push(['mutated files', tally]);
    fc.assert(
      fc.property(mutatedSpec, (input) => {
        checkOutcome(tally, input);
      }),
      { numRuns: 6000 },
    );
    // Some mutations leave a valid file (a garbage string is a fine name): both outcomes are exercised.
    expect(tally.accepted).toBeGreaterThan(0);
    expect(tally.accepted).toBeLessThan(tally.runs);
  });

  it('hostile names and identifier prefixes are kept as data and sanitised for identifiers (1,000 cases)', () => {
    const tally = newTally();
    tallies.push(['hostile names', tally]);
    fc.assert(
      fc.property(cheapValidSpec, hostileText, fc.boolean(), (spec, text, asPrefix) => {
        const input = asPrefix ? { ...spec, export: { identifierPrefix: text } } : { ...spec, name: text };
        checkOutcome(tally, input);
        if (text.length > 0 && text.length <= 1000) {
          const parsed = parseSpec(input);
          if (!asPrefix) expect(parsed.name).toBe(text); // the name is data: kept as given
        }
      }),
      { numRuns: 1000 },
    );
    expect(tally.accepted).toBeGreaterThan(900);
  });

  it('leaves Object.prototype and the other built-in prototypes unchanged', () => {
    expect(prototypeSnapshot()).toBe(before);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('refuses __proto__, constructor and prototype keys from JSON.parse at any depth, naming the path', () => {
    const valid = { response: { type: 'lowpass', order: 3, passbandEdgeHz: 1000 } };
    for (const [text, path] of [
      ['{"__proto__": {"polluted": 1}, "response": {"type": "lowpass", "order": 3, "passbandEdgeHz": 1000}}', '__proto__'],
      ['{"response": {"type": "lowpass", "order": 3, "passbandEdgeHz": 1000, "__proto__": {"order": 9}}}', 'response.__proto__'],
      ['{"response": {"type": "lowpass", "order": 3, "passbandEdgeHz": 1000}, "parts": {"constructor": {"prototype": {"polluted": 1}}}}', 'parts.constructor'],
      ['{"response": {"type": "lowpass", "order": 3, "passbandEdgeHz": 1000}, "prototype": 1}', 'prototype'],
    ] as const) {
      const input: unknown = JSON.parse(text);
      let error: unknown;
      try {
        parseSpec(input);
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(SpecError);
      expect((error as SpecError).issues.map((i) => i.path)).toContain(path);
      expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    }
    // Without the key the same file is valid: the refusal is because of the key alone.
    expect(parseSpec(valid).response.order).toBe(3);
    expect(prototypeSnapshot()).toBe(before);
  });

  it('refuses deep nesting and huge inputs without a stack overflow', () => {
    for (const depth of [MAX_DEPTH + 2, 10_000, 100_000]) {
      let error: unknown;
      try {
        parseSpec(nested(depth));
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(SpecError);
    }
    const wide = { response: { type: 'lowpass', order: 3, passbandEdgeHz: 1000 }, production: { testPoints: new Array(MAX_NODES + 10).fill(1000) } };
    expect(() => parseSpec(wide)).toThrow(SpecError);
    const cyclic: Record<string, unknown> = { response: { type: 'lowpass', order: 3, passbandEdgeHz: 1000 } };
    cyclic.self = cyclic;
    expect(() => parseSpec(cyclic)).toThrow(SpecError);
  });

  it('accessor properties and exotic objects are read as data or refused, never run into a TypeError', () => {
    let getterCalls = 0;
    const withGetter = {
      get response() {
        getterCalls++;
        return { type: 'lowpass', order: 3, passbandEdgeHz: 1000 };
      },
    };
    expect(parseSpec(withGetter).response.order).toBe(3);
    expect(getterCalls).toBe(1);
    const throwing = {
      get response(): unknown {
        throw new TypeError('hostile getter');
      },
    };
    // A getter that throws is the caller's own code; it propagates unchanged (not wrapped as a spec problem).
    expect(() => parseSpec(throwing)).toThrow(TypeError);
    for (const exotic of [new Map([['response', 1]]), new Date(0), /re/, new Uint8Array(4), Object.create(null), new (class X {})(), Symbol('s'), () => 1]) {
      expect(() => parseSpec(exotic)).toThrow(SpecError);
    }
  });
});
