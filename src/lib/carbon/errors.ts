/** One problem with an estimate request, naming the field (`path`) like a zod issue. */
export interface EstimateInputIssue {
  path: (string | number)[];
  message: string;
}

/**
 * Thrown by `estimateLandUseChange` when a request is valid in shape but cannot be
 * estimated with the chosen factor set: a soil class with no reference stock in the region,
 * a factor the tables mark "not applicable", or a set that lacks a value. API routes map it
 * to 422 with these issues.
 */
export class EstimateInputError extends Error {
  readonly issues: EstimateInputIssue[];
  constructor(issues: EstimateInputIssue[]) {
    super(issues.map((i) => `${i.path.join('.') || '(request)'}: ${i.message}`).join('; '));
    this.name = 'EstimateInputError';
    this.issues = issues;
  }
}
