// Formula-injection escape for cells a spreadsheet might run as a formula (OWASP "CSV Injection": cells
// starting with =, +, -, @, tab or carriage return). DESIGN §5's "= + − @" means the ASCII hyphen-minus.
// The writer prefixes one apostrophe and the reader removes one, so export → import is lossless: a cell
// that already starts with apostrophes before such a character gets one more, and comes back as it was.

const TRIGGER = /^'*[=+\-@\t\r]/;

// A plain decimal number ("-0.012", "+.5", "-1.2e-3") cannot be a formula, and printed figures are
// exactly what the sheet is for, so they are left alone rather than made unreadable as numbers.
const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

export function escapeFormula(cell: string): string {
  return TRIGGER.test(cell) && !PLAIN_NUMBER.test(cell) ? "'" + cell : cell;
}

export function unescapeFormula(cell: string): string {
  // charCodeAt first: almost no cell starts with an apostrophe, so the regex rarely runs
  return cell.charCodeAt(0) === 39 && /^'+[=+\-@\t\r]/.test(cell) ? cell.slice(1) : cell;
}
