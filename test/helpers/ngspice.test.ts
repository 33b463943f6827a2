/**
 * Checks of the ngspice test helper itself: that it drives ngspice in batch mode, reads the AC data at
 * full precision and reports failures instead of returning nonsense.
 */
import { expect, it } from 'vitest';
import { parseWrdata, runNgspiceAc, NgspiceRunError } from './ngspice';
import { describeWithNgspice } from './ngspice-vitest';

it('parseWrdata reads "freq re im" rows and skips a header line', () => {
  const text = ' frequency  real(v(out)) imag(v(out))\n 1.0e+01  9.9e-01 -6.2e-02 \n 2.5e+01 -1.5e-01 0.0e+00\n';
  expect(parseWrdata(text)).toEqual([
    { frequencyHz: 10, re: 0.99, im: -0.062 },
    { frequencyHz: 25, re: -0.15, im: 0 },
  ]);
});

describeWithNgspice('ngspice helper', () => {
  it('an RC lowpass matches the closed form 1/(1 + j w R C) to 1e-12 relative', () => {
    const r = 1000;
    const c = 1e-6;
    const netlist = ['rc lowpass', 'VIN in 0 DC 0 AC 1', `R1 in out ${r}`, `C1 out 0 ${c}`, '.ac dec 10 10 100000', '.end', ''].join('\n');
    const result = runNgspiceAc(netlist);
    if (result.status !== 'ok') throw new Error('ngspice missing');
    expect(result.points.length).toBe(41);
    for (const p of result.points) {
      // closed form (circuit theory, no source needed): H = 1 / (1 + j x), x = w R C
      const x = 2 * Math.PI * p.frequencyHz * r * c;
      const re = 1 / (1 + x * x);
      const im = -x / (1 + x * x);
      expect(Math.hypot(p.re - re, p.im - im)).toBeLessThan(1e-12 * Math.hypot(re, im));
    }
  });

  it('two linear E sources form an exact nullor: an inverting amplifier gives exactly -R2/R1', () => {
    const netlist = [
      'nullor',
      'VIN in 0 DC 0 AC 1',
      'R1 in m 1000',
      'R2 m out 4700',
      'E2 y 0 m 0 1',
      'E1 out 0 out y 1',
      '.ac dec 1 10 1000',
      '.end',
    ].join('\n');
    const result = runNgspiceAc(netlist);
    if (result.status !== 'ok') throw new Error('ngspice missing');
    for (const p of result.points) {
      expect(p.re).toBeCloseTo(-4.7, 14);
      expect(p.im).toBe(0);
    }
  });

  it('a netlist ngspice cannot read raises NgspiceRunError', () => {
    const netlist = ['broken', 'VIN in 0 DC 0 AC 1', 'X1 in out NOSUCH', 'R1 out 0 1', '.ac dec 1 10 100', '.end'].join('\n');
    expect(() => runNgspiceAc(netlist)).toThrow(NgspiceRunError);
  });

  it('a netlist ngspice only accepts with a warning (a resistor without value) raises NgspiceRunError', () => {
    const netlist = ['lenient', 'VIN in 0 DC 0 AC 1', 'R1 in out', 'R2 out 0 1', '.ac dec 1 10 100', '.end'].join('\n');
    expect(() => runNgspiceAc(netlist)).toThrow(NgspiceRunError);
  });
});
