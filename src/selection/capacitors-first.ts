/**
 * The 'capacitors-first' strategy: capacitors from their (coarse) series, the resistors that set element
 * values computed exactly to suit them, then every resistor rounded to its (fine) series. Common
 * practice, no source: capacitors come in coarse steps and resistors in fine ones, so a capacitor's
 * rounding is moved into a resistor, where it is small.
 *
 * In order:
 * 1. every capacitor rounded to its series; every free resistor (role.free) rounded to its series;
 * 2. in each GIC, the one computed resistor (role.free false) solved exactly so that, with the chosen
 *    free parts, the GIC presents its target: a one-port GIC (simulated inductor, FDNR) its element
 *    value, retuned (3.) where its inductor shares a resonator with a ladder capacitor; an embedding
 *    converter the route's common k (gic-embedding.ts, Eq. (1));
 * 3. resonators: after LP -> BP or LP -> BS every prototype element becomes an L-C pair with one
 *    `origin` (transform/frequency.ts) resonating at the band centre, L C = 1/omega0^2. The inductance
 *    is retuned by C_exact / C_chosen, so L C, and with it the resonance, is kept exactly; only the
 *    pair's impedance level sqrt(L/C) moves (by C_exact / C_chosen). In a narrow band this is what
 *    matters: writing the pair's arm as the prototype's g p with p = (s^2 + omega0^2)/(s B), relative
 *    errors a in L and b in C add g p a to it plus, near the band, j g (omega0/B)(a + b): the resonance
 *    error a + b is magnified by the band's Q0 = omega0/B, the level error is not;
 * 4. embedding route: the converters' k realised with the chosen parts (every converter is the same
 *    design, so all get the same parts and the same k) and the resistor R = L/k of each inductor
 *    computed from that realised k, times its resonator's retuning: R = (L / k_chosen) C_exact / C_chosen;
 * 5. every computed resistor rounded to its series (the only rounding left on a resonance: half a
 *    resistor step, 1.2 % on E96, i.e. 0.6 % of the centre frequency at most).
 *
 * The GIC identity (converter/configurations.ts): Zin = K s^p with K = prod_odd k_i / prod_even k_i,
 * k_i = R_i or 1/C_i. Solving position j for K: k_j = K / K_rest (j odd) or K_rest / K (j even), with
 * K_rest the product with k_j = 1. A converter has no part in position 5; its k_5 is 1 and its K the k
 * of Eq. (1) of gic-embedding.ts.
 */
import { Fraction, Q1, fractionToNumber } from '../algebra/rational';
import { ladderElements } from '../transform/network';
import type { Realization, RealizedPart } from '../substitution/realization';
import type { SelectionDiagnostic } from './selected-part';

export interface CapacitorsFirstChoice {
  /** Element name -> chosen (preferred) value. */
  readonly chosen: ReadonlyMap<string, Fraction>;
  /** Element name -> the exact value computed for the chosen neighbours, before its own rounding. */
  readonly recomputed: ReadonlyMap<string, Fraction>;
  readonly diagnostics: readonly SelectionDiagnostic[];
}

const kOf = (kind: 'R' | 'C', value: Fraction): Fraction => (kind === 'R' ? value : Q1.div(value));

/** K of a GIC's parts with position `skip` (if any) counted as k = 1. */
export function gicCoefficient(parts: readonly { part: RealizedPart; value: Fraction }[], skip?: number): Fraction {
  let k = Q1;
  for (const { part, value } of parts) {
    const position = part.role.position!;
    if (position === skip) continue;
    const ki = kOf(part.kind, value);
    k = position % 2 === 1 ? k.mul(ki) : k.div(ki);
  }
  return k;
}

/** The GIC instances of a realisation: instance name -> its parts (positions 1..5). */
export function gicGroups(parts: readonly RealizedPart[]): Map<string, RealizedPart[]> {
  const gics = new Map<string, RealizedPart[]>();
  for (const p of parts) {
    if (p.role.kind === 'gic' && p.role.gic !== undefined && p.role.position !== undefined) gics.set(p.role.gic, [...(gics.get(p.role.gic) ?? []), p]);
  }
  return gics;
}

/**
 * The ladder capacitor of each resonator: origin -> the one passive ladder capacitor realising that
 * origin, for origins whose ladder element set (realization.reference.ladder) is exactly one L and one C.
 */
export function resonatorCapacitors(realization: Realization): Map<string, RealizedPart> {
  const kinds = new Map<string, string[]>();
  for (const e of ladderElements(realization.reference.ladder)) kinds.set(e.origin, [...(kinds.get(e.origin) ?? []), e.kind]);
  const out = new Map<string, RealizedPart>();
  for (const [origin, k] of kinds) {
    if (k.length !== 2 || !k.includes('L') || !k.includes('C')) continue;
    const caps = realization.parts.filter((p) => p.kind === 'C' && p.role.kind === 'ladder' && p.role.realises === origin);
    if (caps.length === 1) out.set(origin, caps[0]);
  }
  return out;
}

/**
 * Runs steps 1-5 above. `round(part, value)` gives the preferred value of `part`'s series nearest to
 * `value`.
 */
export function chooseCapacitorsFirst(realization: Realization, round: (p: RealizedPart, value: Fraction) => Fraction): CapacitorsFirstChoice {
  const diagnostics: SelectionDiagnostic[] = [];
  const chosen = new Map<string, Fraction>();
  const recomputed = new Map<string, Fraction>();
  // Step 1.
  for (const p of realization.parts) if (p.kind === 'C' || p.role.free) chosen.set(p.name, round(p, p.exactValue));
  // Step 3's factor: C_exact / C_chosen of an origin's resonator capacitor, 1 without one.
  const resonators = resonatorCapacitors(realization);
  const retune = (origin: string | undefined): Fraction => {
    const c = origin === undefined ? undefined : resonators.get(origin);
    return c === undefined ? Q1 : c.exactValue.div(chosen.get(c.name)!);
  };

  // Step 2.
  const gics = gicGroups(realization.parts);
  const converters: { gic: string; exactK: Fraction; chosenK: Fraction }[] = [];
  for (const [gic, parts] of gics) {
    const computed = parts.filter((p) => !p.role.free && p.kind === 'R');
    const exactK = gicCoefficient(parts.map((part) => ({ part, value: part.exactValue })));
    const isConverter = !parts.some((p) => p.role.position === 5);
    if (computed.length !== 1) {
      if (parts.some((p) => p.kind === 'C' && !chosen.get(p.name)!.equals(p.exactValue))) {
        diagnostics.push({ code: 'GIC_NOT_RECOMPUTED', message: `${gic}: ${computed.length} computed resistors (expected 1); its resistors were rounded without recomputation` });
      }
      for (const p of computed) chosen.set(p.name, round(p, p.exactValue));
    } else {
      const solved = computed[0];
      const position = solved.role.position!;
      // A simulated inductor realises one ladder inductor (realises = its origin); a converter keeps the common k.
      const target = realization.method === 'simulated-inductor' ? exactK.mul(retune(solved.role.realises)) : exactK;
      const restK = gicCoefficient(
        parts.map((part) => ({ part, value: chosen.get(part.name) ?? part.exactValue })),
        position,
      );
      const value = position % 2 === 1 ? target.div(restK) : restK.div(target);
      recomputed.set(solved.name, value);
      chosen.set(solved.name, round(solved, value)); // step 5
    }
    if (isConverter && realization.method === 'gic-embedding') {
      converters.push({ gic, exactK, chosenK: gicCoefficient(parts.map((part) => ({ part, value: chosen.get(part.name)! }))) });
    }
  }

  // Step 4.
  let kRatio = Q1; // k_exact / k_chosen
  if (converters.length > 0) {
    const first = converters[0];
    kRatio = first.exactK.div(first.chosenK);
    const differing = converters.filter((c) => !c.chosenK.equals(first.chosenK) || !c.exactK.equals(first.exactK));
    if (differing.length > 0) {
      const spread = converters.map((c) => fractionToNumber(c.chosenK.div(first.chosenK)) - 1);
      diagnostics.push({
        code: 'CONVERTER_K_MISMATCH',
        message: `converters ${differing.map((c) => c.gic).join(', ')} realise a k differing from ${first.gic}'s (relative ${Math.min(...spread).toExponential(2)} to ${Math.max(...spread).toExponential(2)}): the embedded inductors are computed from ${first.gic}'s k`,
      });
    }
  }
  const inductorOrigins = new Set(ladderElements(realization.reference.ladder).filter((e) => e.kind === 'L').map((e) => e.origin));
  for (const p of realization.parts) {
    if (chosen.has(p.name)) continue;
    if (realization.method === 'gic-embedding' && p.kind === 'R' && p.role.kind === 'ladder' && p.role.realises !== undefined && inductorOrigins.has(p.role.realises)) {
      const value = p.exactValue.mul(kRatio).mul(retune(p.role.realises));
      recomputed.set(p.name, value);
      chosen.set(p.name, round(p, value)); // step 5
    } else chosen.set(p.name, round(p, p.exactValue));
  }
  return { chosen, recomputed, diagnostics };
}
