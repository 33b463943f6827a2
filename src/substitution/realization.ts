/**
 * The substitution stage's result: an active circuit that realises a (transformed, denormalised)
 * network ladder, with every resistor and capacitor listed and labelled by what it does. The next stages
 * (preferred values, tolerance, production test, export) consume this and nothing else from here.
 *
 * The circuit's interface is fixed (DESIGN.md, "The design file"): the voltage source `VIN` drives node
 * `in` from ground, and the response is V(out)/V(in). Every value is an exact rational; with ideal
 * op-amps the circuit's exact transfer function equals `reference.transferFunction` (for the FDNR
 * route up to the DC-path resistors, whose effect `dcPath` bounds).
 *
 * Naming: ladder elements that stay passive are `${kind}_${origin}` (`R_L2` is the resistor realising
 * prototype element L2 after the Bruton transform; `C_L2` a capacitor from L2 after LP -> BP); GIC
 * instances are `X_${origin}` (the element they realise) or `X_${node}` (an embedding converter at a
 * ladder node), their parts `X_L2.R1` ... `X_L2.R5` by GIC position; DC-path resistors `RDC_Rs` and
 * `RDC_Rl`; buffers `UIN` and `UOUT`.
 */
import type { Fraction } from '../algebra/rational';
import type { RationalFunction } from '../algebra/rational-function';
import type { Circuit } from '../netlist/circuit';
import type { OpampModel } from '../netlist/opamp';
import type { NetworkLadder } from '../transform/network';

/** The three routes from an LC ladder to an active circuit. */
export type RealizationMethod = 'simulated-inductor' | 'fdnr' | 'gic-embedding';
export const REALIZATION_METHODS: readonly RealizationMethod[] = Object.freeze(['simulated-inductor', 'fdnr', 'gic-embedding']);

/** What a part is for. */
export type PartRoleKind = 'termination' | 'ladder' | 'gic' | 'dc-path' | 'buffer';

export interface PartRole {
  readonly kind: PartRoleKind;
  /** For parts of a GIC: its instance name (e.g. 'X_L2'). */
  readonly gic?: string;
  /** For parts of a GIC: its position 1..5 (Z1 at the port, Z5 to ground or to the converted network). */
  readonly position?: 1 | 2 | 3 | 4 | 5;
  /**
   * The prototype element (origin, e.g. 'L2', 'Rs') the part, or its GIC, realises, where there is one;
   * comma-separated for an embedding converter shared by several inductors ('L2,L4').
   */
  readonly realises?: string;
  /**
   * True for a free choice (a GIC capacitor, a resistance level, the DC-path level): the next stage may
   * round it to a preferred value and recompute the parts that are not free. False for a value computed
   * from the others and the ladder (rounding it changes the response).
   */
  readonly free: boolean;
}

/** One resistor or capacitor of the realised circuit. `name` is its element name in `circuit`. */
export interface RealizedPart {
  readonly name: string;
  readonly kind: 'R' | 'C';
  /** Ohms or farads, exact. */
  readonly exactValue: Fraction;
  readonly role: PartRole;
}

/** A note about what the realisation did (never printed). */
export interface RealizationDiagnostic {
  readonly code: string;
  readonly message: string;
}

/**
 * The DC-path resistors (FDNR route, dc-path.ts) or DC references (embedding route, dc-reference.ts) and
 * the passband error they cause (float).
 */
export interface DcPathReport {
  /** The largest |gain change| in dB over the checked passband, with and without the DC-path resistors. */
  readonly errorDb: number;
  /** The bound it was chosen to meet (options.dcPathErrorDb). */
  readonly boundDb: number;
  /** The passband checked: passbandLowHz (default 0) .. passbandEdgeHz. */
  readonly passbandEdgeHz: number;
  /** The lower end of the band checked, Hz (embedding route: a bandpass's lower -3.01 dB point). */
  readonly passbandLowHz?: number;
}

export interface Realization {
  readonly method: RealizationMethod;
  /** VIN drives 'in'; the output node is 'out'. */
  readonly circuit: Circuit;
  readonly parts: readonly RealizedPart[];
  /**
   * The ladder realised (as given) and its exact V(out)/V(in); for the embedding route with DC references
   * also the exact V(out)/V(in) of the ladder with their passive equivalents in (dc-reference.ts), which
   * the ideal circuit equals exactly and which is within `dcPath.boundDb` of `transferFunction`.
   */
  readonly reference: { readonly ladder: NetworkLadder; readonly transferFunction: RationalFunction; readonly withDcPath?: RationalFunction };
  /** The op-amp model every op-amp of `circuit` uses. */
  readonly opamp: OpampModel;
  /** FDNR route; embedding route when some inductors needed a DC reference. */
  readonly dcPath?: DcPathReport;
  readonly diagnostics: readonly RealizationDiagnostic[];
}

/** Where the FDNR route's GIC capacitors sit. */
export type FdnrCapacitorPositions = '1-3' | '1-5' | '3-5';
export const FDNR_CAPACITOR_POSITIONS: readonly FdnrCapacitorPositions[] = Object.freeze(['1-3', '1-5', '3-5']);

/** Op-amp followers at the input, the output, both or neither; 'auto' as each route documents. */
export type BufferChoice = 'auto' | 'none' | 'input' | 'output' | 'both';
export const BUFFER_CHOICES: readonly BufferChoice[] = Object.freeze(['auto', 'none', 'input', 'output', 'both']);

export interface RealizeOptions {
  readonly method: RealizationMethod;
  /** Every GIC capacitor (and the FDNR route's termination capacitors), F: '10n', 1e-8, a Fraction... */
  readonly capacitorF: number | string | bigint | Fraction;
  /**
   * The resistance level of each GIC's equal pair (R2 = R3 for the inductor with C4; R3 = R4 with C2;
   * the two non-solved resistors of an FDNR), ohms. Default: the optimum of each route (see there).
   */
  readonly resistanceOhms?: number | string | bigint | Fraction;
  /**
   * The working frequency of the GIC resistor optimum (omega C R5 = 1, see converter/gic-nonideal.ts),
   * Hz. Default: the ladder's characteristic frequency ({@link ladderCharacteristicOmega}).
   */
  readonly designFrequencyHz?: number;
  /** Simulated inductor and embedding converter: the capacitor in position 4 (default) or 2. */
  readonly inductorCapacitorPosition?: 2 | 4;
  /** FDNR route: the capacitor positions, default '1-3'. */
  readonly fdnrCapacitorPositions?: FdnrCapacitorPositions;
  /** Every op-amp's model; default ideal. */
  readonly opamp?: OpampModel;
  /** Default 'auto'. */
  readonly buffers?: BufferChoice;
  /** FDNR route and the embedding route's DC references: the largest passband error they may cause, dB; default 0.01. */
  readonly dcPathErrorDb?: number;
  /**
   * The passband edge (a lowpass) for that check, Hz; default the ladder's -3.01 dB frequency (FDNR) or
   * the band where the ladder is within 3.01 dB of its peak (embedding).
   */
  readonly passbandEdgeHz?: number;
}
