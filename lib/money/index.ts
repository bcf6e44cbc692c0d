export {
  CURRENCY_CODES,
  assertCurrencyCode,
  isCurrencyCode,
  minorPerMajor,
  minorUnitExponent,
  type CurrencyCode,
} from './currency';
export { ROUNDING_RULE, roundQuotient } from './rounding';
export { compareDecimal, decimalToShortString, decimalToString, parseExactDecimal, type ExactDecimal, type Parsed } from './exact-decimal';
export {
  MoneyRangeError,
  addMinor,
  assertMinorUnits,
  exactProductText,
  fromBigInt,
  isMinorUnits,
  multiplyMinorByDecimal,
  multiplyMinorByInteger,
  negateMinor,
  sumMinor,
  type MinorUnits,
} from './minor-units';
export { parseAmount, type DecimalSeparator, type ParseAmountOptions } from './parse-amount';
export { formatMoney, toDecimalString, type FormatMoneyOptions } from './format-amount';
