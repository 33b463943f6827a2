/**
 * Input and output buffers: unity-gain op-amp followers (output tied to the inverting input). With an
 * ideal op-amp a follower's output equals its input exactly, so buffers leave the transfer function
 * unchanged; with a real model they add its closed-loop response A/(1 + A).
 *
 * The FDNR ladder needs them (common practice, no source): its input is a capacitor (the Bruton image of
 * the source resistor), which a source impedance would change, and its output node is high-impedance
 * (the load capacitor with its DC-path resistor), which any load would change. The simulated-inductor
 * and embedding ladders keep resistive terminations and need none.
 */
import type { Circuit } from '../netlist/circuit';
import type { OpampModel } from '../netlist/opamp';
import type { BufferChoice } from './realization';

/** The nodes the ladder connects to once the buffers are in. */
export interface BufferedPorts {
  /** Where the ladder's source network starts ('in' without an input buffer). */
  readonly ladderInput: string;
  /** Where the ladder's load hangs ('out' without an output buffer). */
  readonly ladderOutput: string;
}

/** Adds followers UIN ('in' -> 'in_buf') and UOUT ('out_ladder' -> 'out') as `choice` asks. */
export function addBuffers(circuit: Circuit, choice: Exclude<BufferChoice, 'auto'>, opamp: OpampModel): BufferedPorts {
  const input = choice === 'input' || choice === 'both';
  const output = choice === 'output' || choice === 'both';
  if (input) circuit.addOpamp('UIN', { plus: 'in', minus: 'in_buf', out: 'in_buf' }, opamp);
  if (output) circuit.addOpamp('UOUT', { plus: 'out_ladder', minus: 'out', out: 'out' }, opamp);
  return { ladderInput: input ? 'in_buf' : 'in', ladderOutput: output ? 'out_ladder' : 'out' };
}
