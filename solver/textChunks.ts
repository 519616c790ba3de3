/**
 * Pieces of text gathered into chunks of about `size` UTF-16 code units (a piece is never split,
 * so a surrogate pair inside one stays whole): what a writer hands to a file or a Blob, a few
 * large strings instead of millions of small ones.
 */
export function* textChunks(pieces: Iterable<string>, size = 1 << 20): Generator<string> {
  let chunk: string[] = [];
  let length = 0;
  for (const piece of pieces) {
    chunk.push(piece);
    length += piece.length;
    if (length >= size) {
      yield chunk.join('');
      chunk = [];
      length = 0;
    }
  }
  if (length > 0) yield chunk.join('');
}
