/** Bad usage (of the command line or of the library's run options): exit code 2 with a one-line message, like bad input. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}
