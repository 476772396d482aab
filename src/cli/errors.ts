/** A user-facing failure of the CLI: its message is printed as one line, with this exit code. */
export class CliFailure extends Error {
  constructor(
    message: string,
    readonly exitCode = 2,
  ) {
    super(message);
  }
}
