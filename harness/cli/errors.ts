/** Bad usage of the command line: exit code 2 with a one-line message, like bad input. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}
