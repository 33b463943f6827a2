/**
 * Hand-built GIC circuits shared by the ngspice cross-check and the engine benchmark, independent of
 * the substitution stage (so that they test the engine, not the synthesis).
 *
 * The GIC (A. Antoniou, "Realisation of gyrators using operational amplifiers, and their use in
 * RC-active-network synthesis", Proc. IEE 116(11), 1969; from memory): nodes p (the port), 2, 3, 4, 5;
 * Z1 p-2, Z2 2-3, Z3 3-4, Z4 4-5, Z5 5-ground; op-amp A drives node 2 with + on 5 and - on 3, op-amp B
 * drives node 4 with + on p and - on 3. With ideal op-amps Zin = Z1 Z3 Z5 / (Z2 Z4).
 */
import { Circuit } from '../../src/netlist/circuit';
import type { OpampModel } from '../../src/netlist/opamp';

type Part = { kind: 'R'; ohms: string } | { kind: 'C'; farads: string };

/** Adds a grounded GIC at `port` with parts z1..z5, its nodes prefixed `${name}_`. */
export function addGic(c: Circuit, name: string, port: string, z: readonly [Part, Part, Part, Part, Part], opamp: OpampModel): Circuit {
  const n = (k: number) => (k === 1 ? port : `${name}_${k}`);
  const ends: [number, number][] = [
    [1, 2],
    [2, 3],
    [3, 4],
    [4, 5],
    [5, 0],
  ];
  z.forEach((part, i) => {
    const [a, b] = ends[i];
    const nb = b === 0 ? '0' : n(b);
    if (part.kind === 'R') c.addResistor(`${name}_R${i + 1}`, n(a), nb, part.ohms);
    else c.addCapacitor(`${name}_C${i + 1}`, n(a), nb, part.farads);
  });
  c.addOpamp(`${name}_UA`, { plus: n(5), minus: n(3), out: n(2) }, opamp);
  c.addOpamp(`${name}_UB`, { plus: n(1), minus: n(3), out: n(4) }, opamp);
  return c;
}

/**
 * A GIC simulated inductor (C in position 4: L = C4 R1 R3 R5 / R2 = 10 mH with 1 kOhm and 10 nF) as the
 * shunt arm of an RLC bandpass: in -R 1 kOhm- p, p -C 253.3 nF- ground, L from p to ground.
 * Resonance near 10 kHz.
 */
export function gicInductorBandpass(opamp: OpampModel): Circuit {
  const c = new Circuit().addResistor('RS', 'in', 'out', '1000').addCapacitor('CP', 'out', '0', '2.533e-8');
  return addGic(c, 'G1', 'out', [{ kind: 'R', ohms: '1000' }, { kind: 'R', ohms: '1000' }, { kind: 'R', ohms: '1000' }, { kind: 'C', farads: '1e-8' }, { kind: 'R', ohms: '1000' }], opamp);
}

/** The passive part of {@link gicFdnrLowpass}: everything but the FDNR at node b. */
export function fdnrLowpassTerminations(): Circuit {
  return new Circuit()
    .addCapacitor('CS', 'in', 'a', '1e-8')
    .addResistor('RDCS', 'in', 'a', '968170')
    .addResistor('R1', 'a', 'b', '15915')
    .addResistor('R3', 'b', 'out', '15915')
    .addCapacitor('CL', 'out', '0', '1e-8')
    .addResistor('RDCL', 'out', '0', '1e6');
}

/**
 * A GIC FDNR (C in positions 1 and 3: D = C1 C3 R2 R4 / R5) in the third-order Butterworth lowpass
 * L1 = 1, C2 = 2, L3 = 1 (1 ohm, 1 rad/s) after the Bruton transform, at 1 kHz with 10 nF:
 * in -CS- a -R1- b -R3- out, the FDNR at b, CL from out to ground, DC-path resistors across CS and CL.
 */
export function gicFdnrLowpass(opamp: OpampModel): Circuit {
  return addGic(fdnrLowpassTerminations(), 'G1', 'b', [{ kind: 'C', farads: '1e-8' }, { kind: 'R', ohms: '15915' }, { kind: 'C', farads: '1e-8' }, { kind: 'R', ohms: '31831' }, { kind: 'R', ohms: '15915' }], opamp);
}

/** A 7th-order Butterworth lowpass ladder value g_k = 2 sin((2k - 1) pi / 14) (closed form, e.g. Zverev, "Handbook of Filter Synthesis", 1967; from memory). */
function butterworthG(k: number, n: number): number {
  return 2 * Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
}

/** Rounds to 4 significant digits as a decimal string (exact value, like a trimmed production part). */
function dec4(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

/**
 * A 7th-order FDNR realisation of the series-first Butterworth ladder L1 C2 L3 C4 L5 C6 L7 (1 ohm,
 * 1 rad/s) by the Bruton transform (every impedance divided by s: L -> R, C -> FDNR, terminations ->
 * C), denormalised to a 1 kHz cutoff with 10 nF capacitors: the three shunt capacitors become three
 * grounded GIC FDNRs (six op-amps), with DC-path resistors across the source and load capacitors chosen
 * so the DC gain stays 1/2. 24 nodes, 31 MNA unknowns.
 */
export function fdnrLadder7(opamp: OpampModel): Circuit {
  const n = 7;
  const cutoffRadPerS = 2 * Math.PI * 1000;
  const capacitorF = 1e-8;
  const k = 1 / (cutoffRadPerS * capacitorF); // impedance level that makes the 1 F terminations 10 nF
  const c = new Circuit().addCapacitor('CS', 'in', 'a0', dec4(capacitorF));
  let node = 'a0';
  let seriesOhms = 0;
  for (let i = 1; i <= n; i++) {
    const g = butterworthG(i, n);
    if (i % 2 === 1) {
      const next = i === n ? 'out' : `a${i}`;
      const ohms = dec4(g * k);
      seriesOhms += Number(ohms);
      c.addResistor(`R${i}`, node, next, ohms);
      node = next;
    } else {
      // FDNR D = g * (1 / (k wc^2)) realised as D = C1 C3 R2 R4 / R5 with C1 = C3 = 10 nF, R2 = R5.
      const d = g / (k * cutoffRadPerS * cutoffRadPerS);
      const r4 = dec4(d / (capacitorF * capacitorF));
      addGic(c, `G${i / 2}`, node, [{ kind: 'C', farads: dec4(capacitorF) }, { kind: 'R', ohms: dec4(k) }, { kind: 'C', farads: dec4(capacitorF) }, { kind: 'R', ohms: r4 }, { kind: 'R', ohms: dec4(k) }], opamp);
    }
  }
  c.addCapacitor('CL', 'out', '0', dec4(capacitorF));
  const rLoad = 1e6; // DC-path resistors: R_load/(R_source + sum R + R_load) = 1/2
  c.addResistor('RDCL', 'out', '0', String(rLoad));
  c.addResistor('RDCS', 'in', 'a0', String(rLoad - seriesOhms));
  return c;
}
