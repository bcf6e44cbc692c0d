/** Bad input to a shipping rule: `field` names what is wrong. */
export class ShippingInputError extends Error {
  readonly field: string;

  constructor(field: string, problem: string) {
    super(`${field}: ${problem}`);
    this.name = 'ShippingInputError';
    this.field = field;
  }
}
