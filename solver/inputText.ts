/**
 * Pieces of the user's input inside one-line messages: never more than a few dozen characters
 * of it, and never a line break, however long or odd the input is, so that a message stays a
 * line of about 120 characters.
 */

/** Most characters of a typed value that a message quotes. */
export const QUOTED_TEXT_LENGTH = 40;

/** Most characters of a file's path or name that a message quotes (those messages are short). */
export const QUOTED_PATH_LENGTH = 80;

/** Most characters of an object key that a field path quotes (the real keys have at most 12). */
export const QUOTED_KEY_LENGTH = 16;

/**
 * `text` in double quotes with JSON's escapes (a quote or a line break inside shows as `\"` or
 * `\n`), at most `max` characters between the quotes, escapes included; when cut, an ellipsis
 * ends it. Reads only as far as it quotes, however long `text` is.
 */
export function quoteInput(text: string, max = QUOTED_TEXT_LENGTH): string {
  let quoted = '';
  for (const c of text) {
    const escaped = JSON.stringify(c).slice(1, -1);
    if (quoted.length + escaped.length > max) return `"${quoted}\u2026"`;
    quoted += escaped;
  }
  return `"${quoted}"`;
}

/**
 * An object key as a segment of a field path (`channels.x0`): as it is when it is a short plain
 * name (letters, digits, `_`, `.`, `-`), otherwise quoted by `quoteInput` and cut to
 * `QUOTED_KEY_LENGTH` characters.
 */
export function fieldKey(key: string): string {
  return key.length <= QUOTED_KEY_LENGTH && /^[\w.-]+$/.test(key)
    ? key
    : quoteInput(key, QUOTED_KEY_LENGTH);
}

/** What a JSON value is, for "expected ..., got ..." messages. */
export function describeInput(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'an array';
  if (typeof value === 'string') return `the string ${quoteInput(value)}`;
  if (typeof value === 'number') return String(value);
  return `a ${typeof value}`;
}
