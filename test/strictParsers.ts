import { DOMParser, XMLSerializer, type Document } from '@xmldom/xmldom';
import { parse } from 'csv-parse/sync';

/** Shared by the unit and browser tests (not a test file itself: vitest runs `*.test.ts`). */

/**
 * A code point outside XML 1.0's Char production (XML 1.0 Fifth Edition, section 2.2): written
 * out here from the specification, independently of the writers' own `xmlText`.
 */
const NOT_XML_CHAR = /[^\t\n\r\u0020-\ud7ff\ue000-\ufffd\u{10000}-\u{10ffff}]/u;

/**
 * Parses an SVG/XML document and throws on anything short of well-formed: every warning and
 * error of @xmldom/xmldom's parser, a character outside XML's Char production in the raw text,
 * and one written as a character reference (`&#1;`), which xmldom's serializer rejects under
 * `requireWellFormed` (its parser alone does not check characters).
 */
export function parseXmlStrictly(text: string): Document {
  const bad = NOT_XML_CHAR.exec(text);
  if (bad !== null) {
    const code = bad[0].codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0');
    throw new Error(`U+${code} at ${bad.index} is not an XML character`);
  }
  const problems: string[] = [];
  const doc = new DOMParser({
    onError: (level, message) => problems.push(`${level}: ${message.split('\n')[0]}`),
  }).parseFromString(text, 'image/svg+xml');
  if (problems.length > 0) throw new Error(`not well-formed XML: ${problems.join('; ')}`);
  new XMLSerializer().serializeToString(doc.documentElement!, { requireWellFormed: true });
  return doc;
}

/** Every text node's content under `doc`, in document order. */
export function textsOf(doc: Document, tag = 'text'): string[] {
  return Array.from(doc.getElementsByTagName(tag), (e) => e.textContent ?? '');
}

/**
 * Reads a CSV file as RFC 4180 with csv-parse's strict defaults (a quote inside an unquoted
 * field, an unclosed quote or a row with another number of cells is an error), skipping the
 * `#` comment lines above the header (only where a line starts with `#`). Returns the header
 * and the rows as strings, and the comment lines above the header as written.
 */
export function parseCsvStrictly(text: string): {
  header: string[];
  rows: string[][];
  comments: string[];
} {
  const records = parse(text, {
    comment: '#',
    comment_no_infix: true,
    record_delimiter: '\n',
    relax_quotes: false,
    relax_column_count: false,
    skip_empty_lines: false,
  });
  const lines = text.split('\n');
  const comments = lines.slice(
    0,
    Math.max(
      0,
      lines.findIndex((l) => !l.startsWith('#')),
    ),
  );
  const [header, ...rows] = records;
  if (header === undefined) throw new Error('no header row');
  return { header, rows, comments };
}
