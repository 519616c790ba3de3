/** A failure to report in one line, with the process exit code (1 input, 2 command line). */
export class CliError extends Error {
  constructor(
    message: string,
    readonly exitCode = 1,
  ) {
    super(message);
  }
}
