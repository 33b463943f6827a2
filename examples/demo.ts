/**
 * `npm run demo`: the main job on a bundled example. Designs the elliptic FDNR anti-aliasing lowpass
 * of examples/vibration-antialias-lowpass.json (a scenario of our own: the front end of a 48 kS/s
 * vibration-sensor ADC) and writes its outputs to out/: the JSON report, the C header, the SPICE
 * netlist and the plots, printing the parts list, the error budget, stability and swing.
 */
import { fileURLToPath } from 'node:url';
import { runCli } from '../src/cli/main';

const example = fileURLToPath(new URL('./vibration-antialias-lowpass.json', import.meta.url));
const out = fileURLToPath(new URL('../out/', import.meta.url));

process.stdout.write(`gicladder demo: designing ${example.split(/[\\/]/).slice(-2).join('/')}\n\n`);
runCli(['design', example, '--out', out], {
  stdout: (t) => process.stdout.write(t.replaceAll(out, 'out/')),
  stderr: (t) => process.stderr.write(t),
}).then((code) => {
  process.exitCode = code;
});
