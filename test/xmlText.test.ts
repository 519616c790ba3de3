import { describe, expect, test } from 'vitest';
import { xmlText } from '../app/figure/xmlText';
import { parseXmlStrictly } from './strictParsers';

/** What stands for a code point XML does not allow: its control picture, or U+2426. */
const SUBSTITUTE = '\u2426';
const picture = (code: number) => String.fromCharCode(0x2400 + code);

/** The text content of `<t>` after writing `text` with xmlText and parsing it back. */
function readBack(text: string): string {
  return parseXmlStrictly(`<t>${xmlText(text)}</t>`).documentElement!.textContent ?? '';
}

// XML 1.0 (Fifth Edition), section 2.2: Char ::= #x9 | #xA | #xD | [#x20-#xD7FF] |
// [#xE000-#xFFFD] | [#x10000-#x10FFFF].
describe('xmlText: any text becomes well-formed element content (XML 1.0 section 2.2)', () => {
  test('every C0 control but tab, LF and CR is replaced by its control picture', () => {
    for (let c = 0; c < 0x20; c++) {
      const ch = String.fromCharCode(c);
      const kept = c === 0x9 || c === 0xa || c === 0xd;
      expect(readBack(`a${ch}b`), `U+${c.toString(16)}`).toBe(kept ? `a${ch}b` : `a${picture(c)}b`);
    }
    expect(xmlText('\u0000\u001f')).toBe('\u2400\u241f');
  });

  test('lone surrogates, high or low, at the start, middle or end, are replaced', () => {
    for (const lone of ['\ud800', '\udbff', '\udc00', '\udfff']) {
      expect(readBack(`${lone}x`)).toBe(`${SUBSTITUTE}x`);
      expect(readBack(`x${lone}y`)).toBe(`x${SUBSTITUTE}y`);
      expect(readBack(`x${lone}`)).toBe(`x${SUBSTITUTE}`);
    }
    // Two lows, or a low before a high, are not a pair.
    expect(readBack('\udc00\ud800')).toBe(SUBSTITUTE.repeat(2));
  });

  test('U+FFFE and U+FFFF are replaced; U+FFFD, U+E000, U+D7FF and astral pairs stay', () => {
    expect(readBack('\ufffe\uffff')).toBe(SUBSTITUTE.repeat(2));
    const allowed = '\ud7ff\ue000 \u{1f600} \u{10ffff} \u0085\u007f \u22a5';
    expect(readBack(allowed)).toBe(allowed);
    // Allowed too, though xmldom warns about it (a sign of a mis-decoded file): kept as it is.
    expect(xmlText('\ufffd')).toBe('\ufffd');
  });

  test('markup characters are escaped, CR survives end-of-line handling, quotes stay readable', () => {
    expect(xmlText('a < b && c > d ]]> "q" \'s\'')).toBe(
      'a &lt; b &amp;&amp; c &gt; d ]]&gt; "q" \'s\'',
    );
    expect(xmlText('line\r\nnext')).toBe('line&#13;\nnext');
    expect(readBack('line\r\nnext\rend')).toBe('line\r\nnext\rend');
    // NEL and the line separator, line ends for XML 1.1 readers (as xmldom is), stay as well.
    expect(readBack('a\u0085b\u2028c')).toBe('a\u0085b\u2028c');
    expect(readBack('<b>&amp;</b>')).toBe('<b>&amp;</b>');
  });
});
