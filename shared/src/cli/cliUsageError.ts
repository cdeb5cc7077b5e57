/** Thrown for a bad command line; `argument` names the offending option (printed, exit code 2). */
export class CliUsageError extends Error {
  override name = 'CliUsageError';
  constructor(
    public readonly argument: string,
    message: string,
  ) {
    super(`${argument}: ${message}`);
  }
}

/** Bad input that is not an option: an unreadable or invalid setup file, an export too large (exit 2, may span lines). */
export class CliInputError extends Error {
  override name = 'CliInputError';
}
