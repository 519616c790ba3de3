import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import type { Boundary } from '../solver/index';

/**
 * What a series needs back from a Map's JSON file that it wrote earlier: whether the file is
 * whole and of the right Map, and its labels and boundaries for the figure. The file can be far
 * larger than a string may be (1.5 GB at 2048 x 2048), so it is read in pieces: the writer
 * (`mapRowsJsonPieces`) puts `"phase"` right after the coordinates and `"phases"` right after
 * the boundaries, and labels hold no quotes, so those fields are found by their keys.
 */

/** Bytes read at a time. */
const READ_SIZE = 1 << 20;

function withFile<T>(path: string, use: (fd: number, size: number) => T): T {
  const fd = openSync(path, 'r');
  try {
    return use(fd, fstatSync(fd).size);
  } finally {
    closeSync(fd);
  }
}

function readBytes(fd: number, position: number, length: number): Buffer {
  const bytes = Buffer.alloc(length);
  for (let done = 0; done < length;) {
    const read = readSync(fd, bytes, done, length - done, position + done);
    if (read === 0) break;
    done += read;
  }
  return bytes;
}

/**
 * Whether the file at `path` begins with `start` and ends with `end` (bytes, compared exactly):
 * a Map's JSON is whole and of the expected Map when it ends with that Map's model, plane,
 * series value, version and caution. False when the file is missing or shorter.
 */
export function fileFramedBy(path: string, start: string, end: string): boolean {
  try {
    return withFile(path, (fd, size) => {
      const head = Buffer.from(start, 'utf8');
      const tail = Buffer.from(end, 'utf8');
      if (size < head.length + tail.length) return false;
      return (
        readBytes(fd, 0, head.length).equals(head) &&
        readBytes(fd, size - tail.length, tail.length).equals(tail)
      );
    });
  } catch {
    return false;
  }
}

/** Byte offset of the first `marker` at or after `from`, or -1. */
function findMarker(fd: number, size: number, marker: Buffer, from: number): number {
  for (let position = from; position < size; position += READ_SIZE - marker.length) {
    const chunk = readBytes(fd, position, Math.min(READ_SIZE, size - position));
    const at = chunk.indexOf(marker);
    if (at >= 0) return position + at;
    if (position + chunk.length >= size) break;
  }
  return -1;
}

/** The JSON value between the keys `open` and `close` (`,"key":`), parsed. */
function fieldBetween(
  fd: number,
  size: number,
  open: string,
  close: string,
  from: number,
): { value: unknown; end: number } {
  const openBytes = Buffer.from(open, 'utf8');
  const start = findMarker(fd, size, openBytes, from);
  if (start < 0) throw new Error(`no ${open} in the file`);
  const end = findMarker(fd, size, Buffer.from(close, 'utf8'), start + openBytes.length);
  if (end < 0) throw new Error(`no ${close} in the file`);
  const text = readBytes(fd, start + openBytes.length, end - start - openBytes.length).toString(
    'utf8',
  );
  return { value: JSON.parse(text) as unknown, end };
}

/** The labels (row-major) and boundaries of a Map's JSON file written by `map` or `series`. */
export function readMapOutline(path: string): { labels: string[]; boundaries: Boundary[] } {
  return withFile(path, (fd, size) => {
    const phase = fieldBetween(fd, size, ',"phase":', ',"energy":', 0);
    const boundaries = fieldBetween(fd, size, ',"boundaries":', ',"phases":', phase.end);
    return {
      labels: (phase.value as string[][]).flat(),
      boundaries: boundaries.value as Boundary[],
    };
  });
}
