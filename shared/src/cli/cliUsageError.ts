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
