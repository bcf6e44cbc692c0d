/**
 * Luhn (mod 10) check digit, the ISO/IEC 7812-1 Annex B algorithm: it catches every single-digit
 * error and most swaps of neighbouring digits, the usual slips when a number is typed or read out.
 */
export function luhnCheckDigit(digits: string): number {
  if (!/^\d+$/.test(digits)) throw new RangeError(`luhnCheckDigit: ${JSON.stringify(digits)} is not a string of digits`);
  let sum = 0;
  // Double every second digit counting leftward from the rightmost payload digit.
  for (let i = digits.length - 1, double = true; i >= 0; i--, double = !double) {
    let d = digits.charCodeAt(i) - 48;
    if (double) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return (10 - (sum % 10)) % 10;
}

export function isLuhnValid(digitsWithCheck: string): boolean {
  if (!/^\d{2,}$/.test(digitsWithCheck)) return false;
  return luhnCheckDigit(digitsWithCheck.slice(0, -1)) === Number(digitsWithCheck.slice(-1));
}
