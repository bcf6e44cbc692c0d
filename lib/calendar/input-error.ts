/** Bad input to a calendar function: `field` names what is wrong, the message says why. */
export class CalendarInputError extends Error {
  readonly field: string;

  constructor(field: string, problem: string) {
    super(`${field}: ${problem}`);
    this.name = 'CalendarInputError';
    this.field = field;
  }
}
