/** One field-level problem, `path` dotted like "compensator.poles.0" (DESIGN.md error shape). */
export interface DspIssue {
  path: string;
  message: string;
}

/**
 * Semantic bad input the request schema cannot catch (e.g. a tf-form root beyond
 * Nyquist, found only after root finding). The route answers 400 with
 * `{"error": {"message", "issues"}}` from `message` and `issues`.
 */
export class DspInputError extends Error {
  readonly issues: DspIssue[];
  constructor(message: string, issues: DspIssue[]) {
    super(message);
    this.name = 'DspInputError';
    this.issues = issues;
  }
}
