/** Bad input to the coverage check: `field` names what is wrong (e.g. `policy.coverageMonths`). */
export class CoverageInputError extends Error {
  readonly field: string;
  readonly issues: readonly { field: string; message: string }[];

  constructor(issues: readonly { field: string; message: string }[]) {
    super(issues.map((i) => `${i.field}: ${i.message}`).join('; '));
    this.name = 'CoverageInputError';
    this.field = issues[0]?.field ?? '';
    this.issues = issues;
  }
}
