/**
 * RFC 4180 writing: a field is quoted when it holds a comma, a double quote, CR or LF (§2 rule 6),
 * or leading/trailing spaces (which some readers trim); a double quote inside is doubled (rule 7).
 * Records end in CRLF (rule 1), the last one included.
 */
export function csvField(value: string): string {
  return /[",\r\n]|^\s|\s$/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

export function csvRecord(fields: readonly string[]): string {
  return `${fields.map(csvField).join(',')}\r\n`;
}

/**
 * Free text that a spreadsheet would run as a formula (=, +, -, @, tab, CR first) gets a leading
 * apostrophe. Applied to description-like columns only, never to amounts, numbers or dates.
 */
export function defuseFormula(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}
