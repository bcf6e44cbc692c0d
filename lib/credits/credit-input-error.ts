/** One thing wrong with a credit input: `path` names the field ("parts[1].approvedQuantity"). */
export interface CreditInputIssue {
  path: string;
  message: string;
}

export class CreditInputError extends Error {
  readonly issues: CreditInputIssue[];

  constructor(issues: CreditInputIssue[]) {
    super(issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; '));
    this.name = 'CreditInputError';
    this.issues = issues;
  }
}

export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  return path
    .map((p, i) => (typeof p === 'number' ? `[${p}]` : `${i === 0 ? '' : '.'}${String(p)}`))
    .join('');
}
