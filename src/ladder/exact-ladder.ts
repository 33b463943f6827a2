/** The exact twin of a float ladder: every value converted exactly (every double is a rational). */
import { fractionFromDouble } from '../algebra/rational';
import type { ExactBranch, ExactLadder, Ladder } from './types';

export function toExactLadder(ladder: Ladder): ExactLadder {
  return {
    sourceOhms: fractionFromDouble(ladder.sourceOhms, 'ladder.sourceOhms'),
    loadOhms: ladder.loadOhms === 'open' ? 'open' : fractionFromDouble(ladder.loadOhms, 'ladder.loadOhms'),
    branches: ladder.branches.map((b, i) => {
      const out: ExactBranch = { placement: b.placement };
      if (b.inductanceH !== undefined) out.inductanceH = fractionFromDouble(b.inductanceH, `ladder.branches[${i}].inductanceH`);
      if (b.capacitanceF !== undefined) out.capacitanceF = fractionFromDouble(b.capacitanceF, `ladder.branches[${i}].capacitanceF`);
      if (b.arrangement !== undefined) out.arrangement = b.arrangement;
      return out;
    }),
  };
}
