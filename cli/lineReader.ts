import { closeSync, openSync, readSync } from 'node:fs';

/** Bytes read from the file at a time. */
const READ_SIZE = 1 << 20;

/**
 * The lines of a text file (UTF-8, LF or CRLF), read a megabyte at a time, so that a file of any
 * size is read with memory for its longest line only. A line break byte (0x0A) never occurs
 * inside a multi-byte UTF-8 character, so lines are cut on bytes and decoded whole.
 */
export function* fileLines(path: string): Generator<string> {
  const fd = openSync(path, 'r');
  try {
    const buffer = Buffer.allocUnsafe(READ_SIZE);
    let pieces: Buffer[] = [];
    for (;;) {
      const read = readSync(fd, buffer, 0, READ_SIZE, null);
      if (read === 0) break;
      let start = 0;
      for (;;) {
        const end = buffer.indexOf(0x0a, start);
        if (end < 0 || end >= read) break;
        pieces.push(buffer.subarray(start, end));
        yield lineText(pieces);
        pieces = [];
        start = end + 1;
      }
      if (start < read) pieces.push(Buffer.from(buffer.subarray(start, read)));
    }
    if (pieces.length > 0) yield lineText(pieces);
  } finally {
    closeSync(fd);
  }
}

function lineText(pieces: Buffer[]): string {
  const text = (pieces.length === 1 ? pieces[0]! : Buffer.concat(pieces)).toString('utf8');
  return text.endsWith('\r') ? text.slice(0, -1) : text;
}
