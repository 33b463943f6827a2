/**
 * FDNR realisation of a lowpass ladder (L. T. Bruton, "Network transfer functions using the concept of
 * frequency-dependent negative resistance", IEEE Trans. Circuit Theory CT-16(3), 1969): the Bruton
 * transform (every impedance times k/s, src/transform/bruton.ts) turns the source and load resistors into
 * capacitors, the inductors into resistors and the capacitors into FDNRs; V(out)/V(in) is unchanged.
 * Every FDNR must be grounded, so every capacitor of the ladder must lie in a shunt arm at the ground end:
 * the all-pole ladders (series L, shunt C) and the minimum-capacitor form of elliptic and inverse
 * Chebyshev ladders (series L, shunt series-L-C arms, src/ladder's 'series-first' form), whose arms become
 * R in series with a grounded D. Each grounded D is a GIC FDNR (capacitors in positions 1 and 3 by
 * default, 1-5 or 3-5 as options; gic-choices.ts).
 *
 * The Bruton constant is k = 1/(R0 C) with R0 the source resistance (the load's without one) and C the
 * chosen capacitor, so the source capacitor is exactly options.capacitorF. DC-path resistors across the
 * termination capacitors (dc-path.ts) restore a DC path with the prototype's DC gain and a passband error
 * within options.dcPathErrorDb (computed for the ladder itself, i.e. with ideal op-amps);
 * `dcPathResistors: false` leaves them out (the exact proof's circuit).
 * Buffers: 'auto' means both (see buffers.ts).
 */
import { Q1, fractionToNumber } from '../algebra/rational';
import { UnrealizableError } from '../errors';
import { Circuit } from '../netlist/circuit';
import { brutonTransform } from '../transform/bruton';
import { isElement, type Network, type NetworkLadder } from '../transform/network';
import { networkLadderTransferFunction } from '../transform/response';
import { addBuffers } from './buffers';
import { chooseDcPath, passbandGrid, toFloatHalfPowerOmega, toFloatPassbandErrorDb } from './dc-path';
import { chooseFdnrGic, ladderCharacteristicOmega, ladderResistanceLevel } from './gic-choices';
import { addGic } from './gic-instance';
import { ElementNames, GROUND, placeLadder } from './ladder-placement';
import type { ResolvedOptions } from './options';
import { addPassive } from './passive-parts';
import { passiveLadderTransferFunction } from './passive-ladder';
import type { DcPathReport, Realization, RealizationDiagnostic, RealizedPart } from './realization';

const refuse = (message: string): never => {
  throw new UnrealizableError('UNREALIZABLE', 'options.method', 'fdnr', message);
};

function singleResistor(n: Network | null | 'open', where: string): void {
  if (n === null || n === 'open') return;
  if (!isElement(n) || n.kind !== 'R') refuse(`ladder.${where} must be a single resistor (or absent) for the FDNR route`);
}

export function realizeFdnrResolved(ladder: NetworkLadder, o: ResolvedOptions, withDcPath = true): Realization {
  singleResistor(ladder.source, 'source');
  singleResistor(ladder.load, 'load');
  ladder.branches.forEach((br, i) => {
    // Lowpass shape: series branches must conduct at DC (no capacitor in them), or a D would float.
    const hasC = (n: Network): boolean => (isElement(n) ? n.kind === 'C' || n.kind === 'D' : n.parts.some(hasC));
    if (br.placement === 'series' && hasC(br.network)) {
      refuse(`ladder.branches[${i}] is a series branch with a capacitor, which the Bruton transform makes a floating FDNR; the FDNR route needs a lowpass ladder with every capacitor in a shunt arm (a highpass, bandpass or bandstop ladder goes the 'simulated-inductor' or 'gic-embedding' route)`);
    }
  });
  const k = Q1.div(ladderResistanceLevel(ladder).mul(o.capacitorF)); // Cs = 1/(k Rs) = capacitorF (or Cl, without a source)
  const bruton = brutonTransform(ladder, k);
  const h = networkLadderTransferFunction(ladder);
  const diagnostics: RealizationDiagnostic[] = [
    { code: 'BRUTON_CONSTANT', message: `Bruton transform with k = ${fractionToNumber(k)} rad/s (every impedance times k/s)` },
  ];

  let dcPath: DcPathReport | undefined;
  let built = bruton;
  let dcNames: { source: boolean; load: boolean } = { source: false, load: false };
  if (withDcPath) {
    const omegaEdge = o.passbandEdgeHz !== undefined ? 2 * Math.PI * o.passbandEdgeHz : toFloatHalfPowerOmega(h, ladderCharacteristicOmega(ladder));
    if (!Number.isFinite(omegaEdge)) refuse('the ladder has no -3 dB frequency, so it is not a lowpass; give options.passbandEdgeHz if it is one');
    const choice = chooseDcPath(bruton, h, omegaEdge, o.dcPathErrorDb);
    built = choice.ladder;
    dcNames = { source: choice.sourceOhms !== null, load: choice.loadOhms !== null };
    const errorDb = toFloatPassbandErrorDb(passiveLadderTransferFunction(choice.ladder), h, passbandGrid(omegaEdge));
    dcPath = { errorDb, boundDb: o.dcPathErrorDb, passbandEdgeHz: omegaEdge / (2 * Math.PI) };
    diagnostics.push({ code: 'DC_PATH_ERROR', message: `DC-path resistors change the passband gain by at most ${errorDb.toExponential(3)} dB (bound ${o.dcPathErrorDb} dB, 0 to ${dcPath.passbandEdgeHz.toPrecision(6)} Hz)` });
    if (errorDb > o.dcPathErrorDb) diagnostics.push({ code: 'DC_PATH_ERROR_ABOVE_BOUND', message: 'no DC-path level up to 1e9 reactances meets the bound' });
    if (choice.dcGainError !== 0) diagnostics.push({ code: 'DC_GAIN_ERROR', message: `the DC gain differs from the prototype's by ${(choice.dcGainError * 100).toPrecision(3)} % (a zero-impedance source leaves no exact choice)` });
  } else diagnostics.push({ code: 'NO_DC_PATH', message: 'DC-path resistors left out: exact transfer function, but no DC path to bias the op-amps' });

  const circuit = new Circuit().addVoltageSource('VIN', 'in', GROUND);
  const ports = addBuffers(circuit, o.buffers === 'auto' ? 'both' : o.buffers, o.opamp);
  const placed = placeLadder(built, ports.ladderInput, ports.ladderOutput, (e) => e.kind === 'D');
  const names = new ElementNames();
  const parts: RealizedPart[] = [];
  for (const p of placed.elements) {
    const e = p.element;
    if (e.kind === 'D') {
      if (p.b !== GROUND) refuse(`ladder.${p.where}: the FDNR from ${e.origin} would float; the FDNR route needs every capacitor in a shunt arm`);
      const { design, free } = chooseFdnrGic(e.value, o.capacitorF, o.fdnrCapacitorPositions, o.resistanceOhms);
      parts.push(...addGic(circuit, names.make('X', e.origin), p.a, design.parts, o.opamp, { realises: e.origin, free }));
    } else if (e.kind === 'R' && (p.where === 'source' || p.where === 'load')) {
      // The only resistors at the terminations are the DC-path resistors.
      const name = names.make('RDC', e.origin);
      circuit.addResistor(name, p.a, p.b, e.value);
      parts.push({ name, kind: 'R', exactValue: e.value, role: { kind: 'dc-path', realises: e.origin, free: p.where === 'source' || !dcNames.source } });
    } else if (e.kind === 'R' || e.kind === 'C') parts.push(addPassive(circuit, names, p));
    else refuse(`ladder.${p.where}: an inductor remains after the Bruton transform`); // L -> R always; unreachable for valid ladders
  }
  return { method: 'fdnr', circuit, parts, reference: { ladder, transferFunction: h }, opamp: o.opamp, dcPath, diagnostics };
}
