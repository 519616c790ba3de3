import { closeSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { QUOTED_PATH_LENGTH, quoteInput } from '../solver/index';
import { CliError } from './cliError';

/**
 * Files being written that are not finished yet. They are removed when the process ends before
 * they are (an error, Ctrl-C, a scheduler's SIGTERM at the end of a job's time), so that an
 * interrupted run leaves no half-written file under a name that looks finished.
 */
const unfinished = new Set<string>();
let handlersInstalled = false;

function removeUnfinished(): void {
  for (const path of unfinished) rmSync(path, { force: true });
  unfinished.clear();
}

function installHandlers(): void {
  if (handlersInstalled) return;
  handlersInstalled = true;
  process.on('exit', removeUnfinished);
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
    process.once(signal, () => {
      removeUnfinished();
      process.exit(signal === 'SIGINT' ? 130 : 143);
    });
  }
}

/** A temporary file beside `path` (same folder, so the final rename stays on one disk). */
export function siblingPath(path: string, suffix: string): string {
  return join(dirname(path), `.${basename(path)}.${process.pid}.${suffix}`);
}

/** Registers a temporary file to remove if the process ends early; returns its path. */
export function temporaryFile(path: string): string {
  installHandlers();
  unfinished.add(path);
  return path;
}

/** Removes a temporary file now. */
export function removeTemporary(path: string): void {
  rmSync(path, { force: true });
  unfinished.delete(path);
}

/** An error of the file system as one line naming the file and the flag that gave it. */
export function fileError(error: unknown, flag: string, path: string, doing: string): Error {
  const code = (error as NodeJS.ErrnoException).code;
  if (code === undefined) return error instanceof Error ? error : new Error(String(error));
  return new CliError(`${flag} ${quoteInput(path, QUOTED_PATH_LENGTH)}: cannot ${doing} (${code})`);
}

/** Text gathered up to this many UTF-16 units before it goes to the file. */
const CHUNK = 1 << 20;

/**
 * An output file written in pieces: it is written under a temporary name beside it and renamed
 * to its own name only when `commit` is called, so that the name always holds a whole file (an
 * earlier one, or the finished new one) and a rerun can trust any file it finds.
 */
export class OutputFile {
  private readonly temporary: string;
  private fd: number | undefined;
  private pending: string[] = [];
  private pendingLength = 0;

  constructor(
    readonly path: string,
    private readonly flag = '--out',
  ) {
    this.temporary = temporaryFile(siblingPath(path, 'partial'));
    try {
      this.fd = openSync(this.temporary, 'w');
    } catch (error) {
      unfinished.delete(this.temporary);
      throw fileError(error, flag, path, 'write');
    }
  }

  write(text: string): void {
    this.pending.push(text);
    this.pendingLength += text.length;
    if (this.pendingLength >= CHUNK) this.flush();
  }

  writeAll(pieces: Iterable<string>): void {
    for (const piece of pieces) this.write(piece);
  }

  private flush(): void {
    if (this.pendingLength === 0) return;
    const bytes = Buffer.from(this.pending.join(''), 'utf8');
    this.pending = [];
    this.pendingLength = 0;
    try {
      for (let done = 0; done < bytes.length;) done += writeSync(this.fd!, bytes, done);
    } catch (error) {
      throw fileError(error, this.flag, this.path, 'write');
    }
  }

  /** Finishes the file and gives it its name. */
  commit(): void {
    this.flush();
    try {
      closeSync(this.fd!);
      this.fd = undefined;
      renameSync(this.temporary, this.path);
      unfinished.delete(this.temporary);
    } catch (error) {
      throw fileError(error, this.flag, this.path, 'write');
    }
  }

  /** Drops the unfinished file (after a failure). */
  abandon(): void {
    if (this.fd !== undefined) closeSync(this.fd);
    this.fd = undefined;
    removeTemporary(this.temporary);
  }
}

/** Writes a whole file (text or pieces) through an `OutputFile`. */
export function writeWholeFile(
  path: string,
  content: string | Iterable<string>,
  flag = '--out',
): void {
  const file = new OutputFile(path, flag);
  try {
    if (typeof content === 'string') file.write(content);
    else file.writeAll(content);
    file.commit();
  } catch (error) {
    file.abandon();
    throw error;
  }
}
