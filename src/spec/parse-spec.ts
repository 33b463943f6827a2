/**
 * Reading a design file: {@link parseSpec} validates an untrusted value (usually JSON.parse output)
 * against the schema and returns the normalised spec with every default filled in, or throws one
 * {@link SpecError} listing every problem.
 *
 * Safety: the input is first copied into fresh objects, key by key, with the keys `__proto__`,
 * `constructor` and `prototype` refused (an issue each) and never copied, so they cannot reach any
 * object's prototype or change behaviour; nesting deeper than {@link MAX_DEPTH} and more than
 * {@link MAX_NODES} values are refused before zod sees the input.
 */
import type { z } from 'zod';
import { MAX_ORDER } from '../approximation/prototype';
import { designSpecSchema, HALF_POWER_DB, type ParsedSpec } from './schema';
import { SpecError, type SpecIssue } from './spec-error';
import { suggestKey } from './suggest';

/** Deepest nesting accepted: the schema is 4 levels deep; 16 leaves room and stops stack abuse. */
export const MAX_DEPTH = 16;
/** Most values (objects, arrays, scalars) accepted: far above any real design file (test points included). */
export const MAX_NODES = 100_000;
/** Keys that could reach an object's prototype if copied naively. */
export const FORBIDDEN_KEYS: readonly string[] = Object.freeze(['__proto__', 'constructor', 'prototype']);
/** Longest C identifier prefix derived from a name: C99 guarantees 63 significant characters. */
export const MAX_IDENTIFIER_LENGTH = 40;
/** Default passband ripple of the equiripple families (chebyshev, elliptic), dB. */
export const DEFAULT_EQUIRIPPLE_DB = 0.5;
/** Default stopband attenuation, dB. */
export const DEFAULT_STOPBAND_ATTENUATION_DB = 40;
/** Default capacitor to build around when neither impedanceOhms nor capacitorF is given, F. */
export const DEFAULT_CAPACITOR_F = 10e-9;
/** Output headroom from each rail when outputSwingV is not given, V (common practice, no source). */
export const DEFAULT_OUTPUT_HEADROOM_V = 1.5;

type Edge = number | [number, number];

/** The design file, validated and normalised: every default filled in. */
export interface DesignSpec extends ParsedSpec {
  readonly response: ParsedSpec['response'] & { passbandRippleDb: number; stopbandAttenuationDb: number };
  readonly realization: ParsedSpec['realization'];
  readonly parts: ParsedSpec['parts'] & { opamp: ParsedSpec['parts']['opamp'] & { outputSwingV: number } };
  readonly evaluation: ParsedSpec['evaluation'] & { precompensationFrequencyHz: number };
  readonly trim: ParsedSpec['trim'] & { frequencyHz: number };
  readonly export: ParsedSpec['export'] & { identifierPrefix: string };
}

/**
 * Validates and normalises a design file. Throws {@link SpecError} (code 'INVALID_SPEC') with all
 * issues: wrong types, values out of range, quantity strings that do not parse or carry the wrong unit,
 * unknown keys (with the nearest valid key), forbidden keys, and the cross-field rules (edges as pairs
 * for bandpass/bandstop, an order or a stopband edge, attenuation above ripple, stopband outside the
 * passband, one of impedanceOhms and capacitorF, fdnr for lowpass only, ranges low < high).
 *
 * @example
 * const spec = parseSpec({ response: { type: 'lowpass', order: 3, passbandEdgeHz: '1 kHz' } });
 * // spec.response.passbandEdgeHz === 1000, spec.parts.selection === 'capacitors-first'
 */
export function parseSpec(input: unknown): DesignSpec {
  const issues: SpecIssue[] = [];
  if (typeof input !== 'object' || input === null || Array.isArray(input)) {
    throw new SpecError([{ path: '', message: 'a design file must be a JSON object', value: input }]);
  }
  const copy = safeCopy(input, '', 0, issues, { count: 0 });
  if (issues.length > 0 && issues.some((i) => i.message.startsWith('nesting') || i.message.startsWith('too many'))) throw new SpecError(issues);
  const result = designSpecSchema.safeParse(copy, { reportInput: true });
  if (!result.success) {
    issues.push(...result.error.issues.flatMap((i) => toSpecIssues(i, copy)));
    throw new SpecError(dedupe(issues));
  }
  crossFieldIssues(result.data, issues);
  if (issues.length > 0) throw new SpecError(issues);
  return normalise(result.data);
}

/** A fresh copy of plain JSON data without forbidden keys; functions, symbols and the like become issues. */
function safeCopy(value: unknown, path: string, depth: number, issues: SpecIssue[], counter: { count: number }): unknown {
  if (++counter.count > MAX_NODES) {
    if (counter.count === MAX_NODES + 1) issues.push({ path: path || '(file)', message: `too many values (more than ${MAX_NODES})`, value: undefined });
    return undefined;
  }
  if (depth > MAX_DEPTH) {
    issues.push({ path, message: `nesting deeper than ${MAX_DEPTH} levels`, value: undefined });
    return undefined;
  }
  if (Array.isArray(value)) return value.map((v, i) => safeCopy(v, `${path}[${i}]`, depth + 1, issues, counter));
  if (typeof value === 'object' && value !== null) {
    const out: Record<string, unknown> = {};
    for (const key of Object.keys(value)) {
      const p = path === '' ? key : `${path}.${key}`;
      if (FORBIDDEN_KEYS.includes(key)) {
        issues.push({ path: p, message: 'is not allowed (a reserved JavaScript property name)', value: undefined });
        continue;
      }
      const v = (value as Record<string, unknown>)[key];
      Object.defineProperty(out, key, { value: safeCopy(v, p, depth + 1, issues, counter), enumerable: true, writable: true, configurable: true });
    }
    return out;
  }
  return value;
}

function joinPath(path: readonly PropertyKey[]): string {
  let s = '';
  for (const seg of path) {
    if (typeof seg === 'number') s += `[${seg}]`;
    else s += s === '' ? String(seg) : `.${String(seg)}`;
  }
  return s;
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let v = root;
  for (const seg of path) {
    if (typeof v !== 'object' || v === null || !Object.prototype.hasOwnProperty.call(v, seg as string)) return undefined;
    v = (v as Record<string, unknown>)[seg as string];
  }
  return v;
}

function toSpecIssues(issue: z.core.$ZodIssue, root: unknown): SpecIssue[] {
  const path = joinPath(issue.path);
  if (issue.code === 'unrecognized_keys') {
    const valid = keysAt(issue.path, root).filter((k) => k !== '$schema');
    return issue.keys.map((key) => ({
      path: path === '' ? key : `${path}.${key}`,
      message: `is not a known field${valid.length > 0 ? ` here (known: ${valid.join(', ')})` : ''}`,
      value: valueAt(root, [...issue.path, key]),
      suggestion: suggestKey(key, valid),
    }));
  }
  const value = valueAt(root, issue.path);
  if (issue.code === 'invalid_union') {
    // Say what the field takes rather than zod's generic text; the first branch's own issue, if any, helps.
    const inner = issue.errors.flat().find((e) => e.code === 'custom');
    if (value === undefined) return [{ path, message: 'is required', value }];
    const message = inner?.message ?? (Array.isArray(value) ? 'must be a [low, high] pair of frequencies' : 'has the wrong type');
    return [{ path, message, value }];
  }
  if (issue.code === 'invalid_type' && value === undefined) return [{ path, message: 'is required', value }];
  return [{ path, message: issue.message, value }];
}

function dedupe(issues: SpecIssue[]): SpecIssue[] {
  const seen = new Set<string>();
  return issues.filter((i) => {
    const key = `${i.path}\u0000${i.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/** The schema node's definition (zod 4 keeps it on `_zod.def`). */
interface SchemaDef {
  type: string;
  shape?: Record<string, SchemaNode>;
  innerType?: SchemaNode;
  in?: SchemaNode;
  options?: SchemaNode[];
  element?: SchemaNode;
  items?: SchemaNode[];
}
interface SchemaNode {
  _zod: { def: SchemaDef };
}

/** The keys the schema allows for the object at `path` of `root` (empty if the path leads elsewhere). */
function keysAt(path: readonly PropertyKey[], root: unknown): string[] {
  const keys = new Set<string>();
  const visit = (node: SchemaNode, i: number, value: unknown): void => {
    const def = node._zod.def;
    switch (def.type) {
      case 'optional':
      case 'default':
      case 'prefault':
      case 'nullable':
        return visit(def.innerType!, i, value);
      case 'pipe':
        return visit(def.in!, i, value);
      case 'union': {
        const matching = def.options!.filter((o) => discriminatorMatches(o, value));
        for (const o of matching.length > 0 ? matching : def.options!) visit(o, i, value);
        return;
      }
      case 'object':
        if (i === path.length) {
          for (const k of Object.keys(def.shape!)) keys.add(k);
          return;
        }
        if (typeof path[i] === 'string' && def.shape![path[i] as string]) visit(def.shape![path[i] as string], i + 1, valueAt(value, [path[i]]));
        return;
      case 'array':
        if (i < path.length && typeof path[i] === 'number') visit(def.element!, i + 1, valueAt(value, [path[i]]));
        return;
      case 'tuple':
        if (i < path.length && typeof path[i] === 'number' && def.items![path[i] as number]) visit(def.items![path[i] as number], i + 1, valueAt(value, [path[i]]));
        return;
      default:
        return;
    }
  };
  visit(designSpecSchema as unknown as SchemaNode, 0, root);
  return [...keys];
}

/** For a discriminated union member: does its `model` literal equal the value's? (Other nodes: true.) */
function discriminatorMatches(option: SchemaNode, value: unknown): boolean {
  const def = option._zod.def;
  if (def.type !== 'object' || !def.shape || !('model' in def.shape)) return true;
  const lit = def.shape.model._zod.def as SchemaDef & { values?: unknown[] };
  const v = typeof value === 'object' && value !== null ? (value as Record<string, unknown>).model : undefined;
  return lit.type === 'literal' && Array.isArray(lit.values) ? lit.values.includes(v) : true;
}

// ---------------------------------------------------------------- cross-field rules

const isPair = (e: Edge | undefined): e is [number, number] => Array.isArray(e);

function crossFieldIssues(s: ParsedSpec, issues: SpecIssue[]): void {
  const r = s.response;
  const banded = r.type === 'bandpass' || r.type === 'bandstop';
  const edgeShape = (field: 'passbandEdgeHz' | 'stopbandEdgeHz'): boolean => {
    const e = r[field] as Edge | undefined;
    if (e === undefined) return true;
    if (banded && !isPair(e)) issues.push({ path: `response.${field}`, message: `must be a [low, high] pair for a ${r.type}`, value: e });
    else if (!banded && isPair(e)) issues.push({ path: `response.${field}`, message: `must be one frequency for a ${r.type}`, value: e });
    else return true;
    return false;
  };
  const shapesOk = edgeShape('passbandEdgeHz') && edgeShape('stopbandEdgeHz');
  if (r.order === undefined && r.stopbandEdgeHz === undefined) {
    issues.push({ path: 'response.order', message: 'give an order, or a stopbandEdgeHz (and stopbandAttenuationDb) to estimate it from', value: undefined });
  }
  if (r.family === 'elliptic' && r.order !== undefined && r.order < 2) {
    issues.push({ path: 'response.order', message: `an elliptic order must be 2..${MAX_ORDER}`, value: r.order });
  }
  const ripple = r.passbandRippleDb ?? defaultRippleDb(r.family);
  const attenuation = r.stopbandAttenuationDb ?? DEFAULT_STOPBAND_ATTENUATION_DB;
  if ((r.family === 'elliptic' || r.order === undefined) && !(attenuation > ripple)) {
    issues.push({ path: 'response.stopbandAttenuationDb', message: `must exceed the passband ripple (${ripple} dB)`, value: attenuation });
  }
  if (shapesOk && r.stopbandEdgeHz !== undefined && !stopbandOutside(r.type, r.passbandEdgeHz as Edge, r.stopbandEdgeHz as Edge)) {
    issues.push({ path: 'response.stopbandEdgeHz', message: `must lie outside the passband of the ${r.type} on each side`, value: r.stopbandEdgeHz });
  }
  if (s.realization.impedanceOhms !== undefined && s.realization.capacitorF !== undefined) {
    issues.push({ path: 'realization.capacitorF', message: 'give one of impedanceOhms and capacitorF: each sets the impedance level', value: s.realization.capacitorF });
  }
  if (s.realization.method === 'fdnr' && r.type !== 'lowpass') {
    issues.push({ path: 'realization.method', message: `the FDNR (Bruton) realisation is for lowpass filters; use 'auto', 'simulated-inductor' or 'gic-embedding' for a ${r.type}`, value: 'fdnr' });
  }
  const p = s.parts;
  if (!(p.resistors.minOhms < p.resistors.maxOhms)) issues.push({ path: 'parts.resistors.maxOhms', message: 'must exceed minOhms', value: p.resistors.maxOhms });
  if (!(p.capacitors.minF < p.capacitors.maxF)) issues.push({ path: 'parts.capacitors.maxF', message: 'must exceed minF', value: p.capacitors.maxF });
  const swing = p.opamp.outputSwingV;
  if (swing !== undefined && swing > p.opamp.supplyV / 2) {
    issues.push({ path: 'parts.opamp.outputSwingV', message: `cannot exceed half the supply (${p.opamp.supplyV / 2} V)`, value: swing });
  }
  if (p.opamp.supplyV / 2 <= DEFAULT_OUTPUT_HEADROOM_V && swing === undefined) {
    issues.push({ path: 'parts.opamp.supplyV', message: `leaves no output swing after ${DEFAULT_OUTPUT_HEADROOM_V} V headroom from each rail; give outputSwingV`, value: p.opamp.supplyV });
  }
}

function stopbandOutside(type: string, pass: Edge, stop: Edge): boolean {
  if (type === 'lowpass') return (stop as number) > (pass as number);
  if (type === 'highpass') return (stop as number) < (pass as number);
  const [p0, p1] = pass as [number, number];
  const [s0, s1] = stop as [number, number];
  return type === 'bandpass' ? s0 < p0 && p1 < s1 : p0 < s0 && s1 < p1;
}

/** The default passband ripple (loss at the passband edge) of a family, dB. */
export function defaultRippleDb(family: ParsedSpec['response']['family']): number {
  return family === 'chebyshev' || family === 'elliptic' ? DEFAULT_EQUIRIPPLE_DB : HALF_POWER_DB;
}

/**
 * A C identifier from any text: characters outside [A-Za-z0-9_] become '_', runs collapse, a leading
 * digit gets 'f_' in front, at most {@link MAX_IDENTIFIER_LENGTH} characters; 'filter' when nothing is left.
 */
export function sanitiseIdentifier(text: string): string {
  let id = text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '') // combining marks: 'ü' -> 'u'
    .replace(/[^A-Za-z0-9_]+/g, '_')
    .replace(/_+/g, '_')
    .replace(/^_+|_+$/g, '');
  if (id === '') id = 'filter';
  if (/^[0-9]/.test(id)) id = `f_${id}`;
  return id.slice(0, MAX_IDENTIFIER_LENGTH).replace(/_+$/, '');
}

/** The frequency the design's element values are compared at by default: the passband edge (upper for a band). */
function referenceEdgeHz(e: Edge): number {
  return isPair(e) ? e[1] : e;
}

function normalise(s: ParsedSpec): DesignSpec {
  const r = s.response;
  const pass = r.passbandEdgeHz as Edge;
  const centre = isPair(pass) ? Math.sqrt(pass[0] * pass[1]) : pass;
  const realization = { ...s.realization };
  if (realization.impedanceOhms === undefined && realization.capacitorF === undefined) realization.capacitorF = DEFAULT_CAPACITOR_F;
  return {
    ...s,
    response: {
      ...r,
      passbandRippleDb: r.passbandRippleDb ?? defaultRippleDb(r.family),
      stopbandAttenuationDb: r.stopbandAttenuationDb ?? DEFAULT_STOPBAND_ATTENUATION_DB,
    },
    realization,
    parts: { ...s.parts, opamp: { ...s.parts.opamp, outputSwingV: s.parts.opamp.outputSwingV ?? s.parts.opamp.supplyV / 2 - DEFAULT_OUTPUT_HEADROOM_V } },
    evaluation: { ...s.evaluation, precompensationFrequencyHz: s.evaluation.precompensationFrequencyHz ?? referenceEdgeHz(pass) },
    trim: { ...s.trim, frequencyHz: s.trim.frequencyHz ?? centre },
    export: { ...s.export, identifierPrefix: sanitiseIdentifier(s.export.identifierPrefix ?? s.name) },
  };
}
