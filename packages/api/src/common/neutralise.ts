/**
 * Spreadsheet formula injection: a cell whose text begins with = + - @ (or
 * the Unicode minus, a tab, a carriage return or another control character)
 * may be run as a formula when the file is opened or re-saved as CSV. Every
 * text Cairn writes into a spreadsheet goes through `neutralise`, which puts
 * a leading apostrophe before such text (the usual defence, as in the OWASP
 * guidance on CSV injection). Plain numbers such as "-5" are left alone.
 */
// eslint-disable-next-line no-control-regex
const DANGEROUS = /^[=+\-@\u2212\uFF1D\uFF0B\uFF0D\uFF20\u0000-\u001f]/;
const PLAIN_NUMBER = /^[-+]?\d+([.,]\d+)?$/;

export function neutralise(text: string): string {
  if (text === '' || !DANGEROUS.test(text) || PLAIN_NUMBER.test(text)) return text;
  return `'${text}`;
}

export function isNeutralised(original: string, written: string): boolean {
  return written === neutralise(original);
}
