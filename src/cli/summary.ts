/** The readable summary of a design that `gicladder design` and the demo print. */
import { formatQuantity } from '../units/index';
import type { FilterDesign } from '../spec/index';

const fmtDb = (x: number | null | undefined, digits = 3): string => (x === null || x === undefined || !Number.isFinite(x) ? 'n/a' : `${x.toFixed(digits)} dB`);
const fmtHz = (x: number): string => (Number.isFinite(x) ? formatQuantity(x, 'Hz', { digits: 3 }) : 'unbounded');

function edges(design: FilterDesign): string {
  const e = design.spec.response.passbandEdgeHz;
  return Array.isArray(e) ? `${fmtHz(e[0])} to ${fmtHz(e[1])}` : fmtHz(e as number);
}

function roleText(p: FilterDesign['parts'][number]): string {
  const r = p.role;
  const parts: string[] = [r.kind];
  if (r.gic) parts.push(`${r.gic}${r.position ? ` Z${r.position}` : ''}`);
  if (r.realises) parts.push(`for ${r.realises}`);
  return parts.join(', ');
}

/** A table of aligned columns. */
export function table(rows: string[][]): string {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => (r[c] ?? '').length)));
  return rows.map((r) => r.map((cell, c) => (c === r.length - 1 ? cell : cell.padEnd(widths[c]))).join('  ')).join('\n');
}

export function designSummary(design: FilterDesign): string {
  const s = design.spec;
  const e = design.evaluation;
  const lines: string[] = [];
  const raised = design.diagnostics.some((d) => d.code === 'ORDER_RAISED') ? `; raised from ${design.order.order - 1}, whose modified even-order ladder misses the stopband` : '';
  lines.push(`${s.name}: ${s.response.family} ${s.response.type}, order ${design.order.order}${design.order.estimate ? ` (estimated from the mask${raised})` : ''}, passband ${edges(design)}`);
  lines.push(`realisation: ${design.method}, ${design.opampCount} op-amps (${design.opamp.model}${'gainBandwidthHz' in design.opamp ? `, GBW ${fmtHz(design.opamp.gainBandwidthHz)}` : ''}), nominal passband gain ${fmtDb(design.nominalPassbandGainDb, 2)}`);
  lines.push('');
  lines.push('parts:');
  const rows = [['name', 'value', 'series', 'tol', 'role']];
  for (const p of design.parts) {
    rows.push([p.name, formatQuantity(p.value, p.kind === 'R' ? 'ohm' : 'F', { digits: 4 }), p.series ?? 'exact', `${p.tolerancePercent}%`, roleText(p)]);
  }
  lines.push(table(rows).replace(/^/gm, '  '));
  lines.push('');
  lines.push('error budget (worst over the passband, against the ideal design):');
  lines.push(`  preferred values  ${fmtDb(e.passbandErrorDb.rounding)}`);
  lines.push(`  op-amp model      ${fmtDb(e.passbandErrorDb.opamp)}`);
  lines.push(`  total             ${fmtDb(e.passbandErrorDb.total)}`);
  if (e.stopband) lines.push(`  stopband: at least ${fmtDb(e.stopband.minAttenuationDb.chosenPartsRealOpamp, 1)} below nominal (ideal ${fmtDb(e.stopband.minAttenuationDb.ideal, 1)})`);
  const g = e.gainBandwidth;
  lines.push(`op-amp gain-bandwidth: ${fmtHz(g.requiredHz)} needed for ${g.forPassbandErrorDb} dB; chosen ${fmtHz(g.chosenHz)}: ${g.meets ? 'meets it' : 'DOES NOT meet it'}`);
  const st = design.stability;
  lines.push(`stability (exact Routh-Hurwitz, degree ${st.degree}): ${st.stable ? 'stable' : 'UNSTABLE'}, ${st.rightHalfPlane} right-half-plane and ${st.imaginaryAxis} imaginary-axis roots`);
  if (e.swing) lines.push(`signal swing: ${e.swing.opamp} reaches ${e.swing.maxGain.toFixed(2)} V per V of input at ${fmtHz(e.swing.frequencyHz)}; inputs above ${e.swing.clippingInputV.toFixed(2)} V peak clip (${e.swing.outputSwingV} V swing)`);
  if (design.precompensation) {
    const pc = design.precompensation;
    lines.push(`pre-compensation at ${fmtHz(pc.frequencyHz)}: op-amp error ${fmtDb(pc.passbandErrorDb.before)} -> ${fmtDb(pc.passbandErrorDb.after)}`);
  }
  const warnings = design.diagnostics.filter((d) => d.severity !== 'info');
  if (warnings.length > 0) {
    lines.push('');
    lines.push('warnings:');
    for (const d of warnings) lines.push(`  ${d.code}: ${d.message}`);
  }
  return `${lines.join('\n')}\n`;
}
