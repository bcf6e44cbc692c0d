/** Bad input to a report; the message names the memo, shipment, movement or field. */
export class ReportInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ReportInputError';
  }
}
