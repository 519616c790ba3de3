/**
 * Code points outside the Char production of XML 1.0 (Fifth Edition, section 2.2 "Characters"):
 * Char ::= #x9 | #xA | #xD | [#x20-#xD7FF] | [#xE000-#xFFFD] | [#x10000-#x10FFFF]. That leaves
 * out the C0 controls other than tab, LF and CR, the surrogates (a lone UTF-16 surrogate is one
 * of them once the `u` flag reads the string by code points), U+FFFE and U+FFFF. No character
 * reference can stand for them either (section 4.1, well-formedness constraint "Legal
 * Character"), so they are replaced by visible symbols: a C0 control by its Unicode control
 * picture (U+2400 + its code: NUL shows as U+2400, SOH as U+2401, ...), anything else by U+2426
 * (symbol for substitute form two). Not by U+FFFD: XML readers take that as a sign of a file
 * decoded with the wrong encoding.
 */
const NOT_XML_CHAR = /[^\t\n\r\u0020-\ud7ff\ue000-\ufffd\u{10000}-\u{10ffff}]/gu;

function substitute(c: string): string {
  const code = c.codePointAt(0)!;
  return code < 0x20 ? String.fromCharCode(0x2400 + code) : '\u2426';
}

/** Markup characters as entity references; line ends other than LF as character references. */
const ESCAPES: Readonly<Record<string, string>> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '\r': '&#13;',
  '\u0085': '&#133;',
  '\u2028': '&#8232;',
};

/**
 * Any text as the content of an SVG/XML element, always well-formed: `&`, `<` and `>` escaped
 * (`>` too, so `]]>` never appears), a carriage return written as `&#13;` (a literal one would
 * become a line feed under the end-of-line handling of section 2.11; NEL and U+2028, which XML
 * 1.1 readers treat the same way, as `&#133;` and `&#8232;`), and every character that
 * XML 1.0 does not allow replaced by a visible symbol (above), so a stray control character in a
 * label shows as a mark instead of breaking the file. Quotes stay as they are:
 * this is for element content, never for attribute values. Every SVG writer of Fourfold (the
 * Map and Cut figures, the lattice picture) puts user text through it.
 */
export function xmlText(text: string): string {
  return text.replace(NOT_XML_CHAR, substitute).replace(/[&<>\r\u0085\u2028]/g, (c) => ESCAPES[c]!);
}
