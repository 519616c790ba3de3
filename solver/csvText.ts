/**
 * Cells and comment lines of Fourfold's CSV files (the Map's and the Cut's): RFC 4180 fields,
 * text that a spreadsheet would run as a formula neutralised, and `#` lines that stay one line.
 */

/**
 * First characters that make a spreadsheet read a cell as a formula or a command: `=`, `+`, `-`,
 * `@`, tab and carriage return (the list of the OWASP Foundation's "CSV Injection" guidance,
 * which also gives the remedy used here: a leading apostrophe).
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * A text cell (a label, an axis name): text that starts like a formula gets a leading
 * apostrophe (`=1+1` is written `'=1+1`, shown by a spreadsheet as text); then, as RFC 4180
 * section 2 asks, a field holding a comma, a double quote, CR or LF is enclosed in double quotes
 * with every double quote doubled. A field that starts with `#` is quoted as well, so that a
 * reader that skips `#` comment lines never takes a header for one. Numbers never come here: they
 * are written as JavaScript writes them, so `-1.5` stays the number it is.
 */
export function csvText(text: string): string {
  const safe = FORMULA_START.test(text) ? `'${text}` : text;
  return /[",\r\n]|^#/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/**
 * A `#` comment line above the header, without its line end. Line breaks and other control
 * characters in `text` (Unicode category Cc, and U+2028, U+2029; an axis label may hold them)
 * become spaces, so the line stays one line.
 */
export function csvComment(text: string): string {
  return `# ${text.replace(/[\p{Cc}\u2028\u2029]/gu, ' ')}`;
}
