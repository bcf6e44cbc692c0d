/** Bad input to a reconciliation function; the message names the line, memo or field. */
export class ReconciliationInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ReconciliationInputError';
  }
}
