/**
 * The one error a design file that fails validation raises: {@link SpecError}, code 'INVALID_SPEC',
 * with every problem found (not only the first) in `issues`. `path` and `value` are the first issue's.
 */
import { GicladderError, describeValue } from '../errors';

/** One problem of a design file. */
export interface SpecIssue {
  /** Dotted path of the field ('response.passbandEdgeHz', 'parts.opamp.gainBandwidthHz', 'response.passbandEdgeHz[1]'). */
  readonly path: string;
  /** What is wrong. */
  readonly message: string;
  /** The offending value as given (undefined for a missing field). */
  readonly value: unknown;
  /** For an unknown key: the nearest valid key, if one is near. */
  readonly suggestion?: string;
}

/** A design file that fails validation. */
export class SpecError extends GicladderError {
  readonly issues: readonly SpecIssue[];

  constructor(issues: readonly SpecIssue[]) {
    const first = issues[0] ?? { path: 'spec', message: 'is invalid', value: undefined };
    super('INVALID_SPEC', first.path, first.value, summarise(issues));
    this.issues = Object.freeze([...issues]);
  }
}

function summarise(issues: readonly SpecIssue[]): string {
  const shown = issues.slice(0, 8).map(formatIssue);
  const more = issues.length > shown.length ? `; and ${issues.length - shown.length} more` : '';
  return `the design file has ${issues.length} problem${issues.length === 1 ? '' : 's'}: ${shown.join('; ')}${more}`;
}

/** One line for a person: 'response.passbandEdgeHz: must be > 0 (got -1)'. */
export function formatIssue(issue: SpecIssue): string {
  const hint = issue.suggestion === undefined ? '' : ` (did you mean '${issue.suggestion}'?)`;
  const got = issue.value === undefined ? '' : ` (got ${describeValue(issue.value)})`;
  return `${issue.path || '(file)'}: ${issue.message}${hint}${got}`;
}
