/**
 * The dealer list queries the benchmark cycles through: what the claims table asks for (a stage
 * filter from its chips, a sort from its column headers, a page of 50).
 */
export const SHAPES = [
  { name: 'with the brand, newest first, page 1', query: 'stage=submitted,in_review,appealed&sort=updated&dir=desc&page=1&pageSize=50' },
  { name: 'all, newest first, page 1', query: 'sort=updated&dir=desc&page=1&pageSize=50' },
  { name: 'all, newest first, page 4', query: 'sort=updated&dir=desc&page=4&pageSize=50' },
  { name: 'drafts, newest first, page 2', query: 'stage=draft&sort=updated&dir=desc&page=2&pageSize=50' },
  { name: 'waiting on you, oldest first, page 1', query: 'stage=waiting_on_dealer&sort=updated&dir=asc&page=1&pageSize=50' },
  { name: 'approved, by failure date, page 1', query: 'stage=approved&sort=failure&dir=desc&page=1&pageSize=50' },
  { name: 'credit, by claim number, page 1', query: 'stage=credit_pending,credited,reconciled&sort=number&dir=asc&page=1&pageSize=50' },
] as const;
