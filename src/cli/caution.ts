/** The caution printed with designs a design file marks as mains-connected or safety-related. */
import type { DesignSpec } from '../spec/index';

export const CAUTION_TEXT = [
  'CAUTION: this design is marked as mains-connected or safety-related.',
  'gicladder computes component values, responses and test limits; it does not make a product safe.',
  'Design, build and verify it under the codes and standards that apply where it is used (isolation,',
  'creepage and clearance, leakage current, functional safety), by people licensed or qualified to do so,',
  'and verify every figure on real boards. Local codes and licensed practice take precedence over this tool.',
].join('\n');

export function cautionFor(spec: DesignSpec): string | null {
  return spec.safety.mainsConnected || spec.safety.safetyRelated ? CAUTION_TEXT : null;
}
